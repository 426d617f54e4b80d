import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseSiteDefinitions } from '../../../core/catalogue/site-definitions-import';
import { generateAssemblage } from '../../../demo-data/generate';
import { SITE_DEFINITIONS_FILE } from '../../../demo-data/site-definitions';

// A small, coarse assemblage (deer radius and metatarsal, 2 mm spacing) made twice: on the
// main thread and on two worker threads.
const options = { fragments: 7, seed: 'threads', pointSpacing: 2, elements: [3, 4] };
let one: string;
let two: string;
beforeAll(async () => {
  one = mkdtempSync(join(tmpdir(), 'knitbone-demo-w1-'));
  two = mkdtempSync(join(tmpdir(), 'knitbone-demo-w2-'));
  await generateAssemblage({ outDir: one, ...options, workers: 1 });
  await generateAssemblage({ outDir: two, ...options, workers: 2 });
}, 240_000);
afterAll(() => {
  rmSync(one, { recursive: true, force: true });
  rmSync(two, { recursive: true, force: true });
});

const files = (dir: string): string[] => [...readdirSync(dir).filter((f) => f !== 'scans'), ...readdirSync(join(dir, 'scans')).map((f) => `scans/${f}`)].sort();

describe('demo generator on worker threads', () => {
  it('writes the same bytes with one worker and with two', () => {
    expect(files(one)).toEqual(files(two));
    expect(files(one).filter((f) => f.endsWith('.ply')).length).toBe(options.fragments);
    for (const f of files(one)) expect(readFileSync(join(two, f)).equals(readFileSync(join(one, f))), f).toBe(true);
  });
});

describe('demo site definitions', () => {
  it('are read by the catalogue importer and place every specimen in its own unit, spit and layer', () => {
    const defs = parseSiteDefinitions(readFileSync(join(one, SITE_DEFINITIONS_FILE), 'utf8'), SITE_DEFINITIONS_FILE);
    expect(defs.units.length).toBe(48);
    const [header, ...rows] = readFileSync(join(one, 'specimens.csv'), 'utf8').trim().split('\n');
    const col = (name: string) => header.split(',').indexOf(name);
    // a layer's top between its defined points at the whole metres either side of x
    const layerTop = (layer: string, x: number) => {
      const at = (gx: number) => defs.layerBoundaries.find((b) => b.layer === layer && b.x === gx)!.z;
      const x0 = Math.min(Math.floor(x), 7);
      return at(x0) + (at(x0 + 1) - at(x0)) * (x - x0);
    };
    const layers = [...new Set(defs.layerBoundaries.map((b) => b.layer))];
    for (const row of rows) {
      const f = row.split(',');
      const [unit, level, layer] = [f[col('unit')], f[col('level')], f[col('layer')]];
      const [x, y, z] = ['x', 'y', 'z'].map((c) => Number(f[col(c)]));
      const u = defs.units.find((d) => d.unit === unit)!;
      expect(x >= u.xMin && x <= u.xMax && y >= u.yMin && y <= u.yMax, `${f[0]} in ${unit}`).toBe(true);
      const l = defs.levels.find((d) => d.unit === unit && d.level === level)!;
      expect(z > l.bottomZ - 1e-9 && z <= l.topZ + 1e-9, `${f[0]} in spit ${level} of ${unit}`).toBe(true);
      const k = layers.indexOf(layer);
      expect(z <= layerTop(layer, x) + 1e-9, `${f[0]} below the top of layer ${layer}`).toBe(true);
      if (k + 1 < layers.length) expect(z > layerTop(layers[k + 1], x) - 1e-9, `${f[0]} above layer ${layers[k + 1]}`).toBe(true);
    }
  });
});
