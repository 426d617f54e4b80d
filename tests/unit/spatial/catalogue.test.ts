import { mkdtempSync, readFileSync, writeFileSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { spawnSync } from 'node:child_process';
import { XMLValidator } from 'fast-xml-parser';
import { describe, expect, it } from 'vitest';
import { openCatalogue } from '../../../core/catalogue/catalogue';
import { emptySpecimenFields } from '../../../core/catalogue/records';
import { SiteDefinitionRepository } from '../../../core/catalogue/site-definitions';
import { KnitboneError } from '../../../core/host/errors';
import { Host } from '../../../core/host/host';

// Spatial analysis through the real catalogue (SQLite), the host API and the command line.
// The measured values are the hand-worked case of issue 8: (0, 0, 1.20) -> (3, 4, 1.05) is
// 5.00 m horizontal, 0.15 m vertical, 5.002 m in space (Pythagoras), bearing atan(3/4) = 36.87.

const bin = join(import.meta.dirname, '../../../bin/knitbone.js');
const run = (...args: string[]) => spawnSync(process.execPath, [bin, ...args], { encoding: 'utf8' });
const temp = () => mkdtempSync(join(tmpdir(), 'knitbone-spatial-'));

/** A catalogue with four specimens and three accepted joins (plus one proposed, one rejected). */
function smallCatalogue(): string {
  const file = join(temp(), 'site.sqlite');
  const cat = openCatalogue(file, { create: true, who: 'test' });
  try {
    const [a, b, c, d] = cat.specimens.insertMany([
      { ...emptySpecimenFields('KB-1'), unit: 'N0E0', level: '3', layer: 'B', x: 0, y: 0, z: 1.2, taxon: 'Cervus elaphus' },
      { ...emptySpecimenFields('KB-2'), unit: 'N4E3', level: '4', layer: 'B', x: 3, y: 4, z: 1.05, taxon: 'Cervus elaphus' },
      // Sieved: unit and level only; unit N0E2 spans x 2..4, y 0..2 (centre 3, 1), level 5: 1.00..0.90 (mid 0.95).
      { ...emptySpecimenFields('KB-3'), unit: 'N0E2', level: '5', layer: 'C', taxon: 'Bos primigenius' },
      { ...emptySpecimenFields('KB-4'), unit: 'N9E9', layer: 'C' },
    ]);
    cat.joins.insert({ specimenA: a.id, specimenB: b.id, status: 'accepted', type: 'conjoin', breakAge: 'dry' });
    cat.joins.insert({ specimenA: a.id, specimenB: c.id, status: 'accepted', type: 'articulation' });
    cat.joins.insert({ specimenA: c.id, specimenB: d.id, status: 'accepted', type: 'pair' });
    cat.joins.insert({ specimenA: b.id, specimenB: d.id, status: 'proposed', type: 'conjoin' });
    cat.joins.insert({ specimenA: b.id, specimenB: c.id, status: 'rejected', type: 'conjoin' });
    new SiteDefinitionRepository(cat.db, cat.history, cat.who).store({
      units: [{ unit: 'N0E2', xMin: 2, yMin: 0, xMax: 4, yMax: 2 }],
      levels: [{ unit: null, level: '5', topZ: 1.0, bottomZ: 0.9 }],
      layerBoundaries: [{ layer: 'B', x: 0, y: 0, z: 1.25 }, { layer: 'B', x: 4, y: 0, z: 1.2 }],
    });
  } finally {
    cat.close();
  }
  return file;
}

describe('spatial analysis of a catalogue', () => {
  it('spatial.analyse measures accepted joins only, placing a sieved find at its unit centre and level mid-depth', async () => {
    const file = smallCatalogue();
    const r = await new Host().call('spatial.analyse', { catalogue: file });
    expect(r.joins.map((j) => j.id)).toEqual([1, 2]);
    expect(r.joins[0]).toMatchObject({
      a: 'KB-1', b: 'KB-2', type: 'conjoin', breakAge: 'dry',
      horizontalM: 5, verticalM: 0.15, distance3dM: 5.002, bearingDeg: 36.87,
      crossesUnit: true, crossesLevel: true, crossesLayer: false, approximate: false,
    });
    // KB-1 (0, 0, 1.20) -> KB-3 at (3, 1, 0.95): sqrt(10) = 3.162 m, 0.25 m down, atan2(3, 1) = 71.57 deg.
    expect(r.joins[1]).toMatchObject({ horizontalM: 3.162, verticalM: 0.25, bearingDeg: 71.57, approximate: true, crossesLayer: true });
    // KB-3 -> KB-4: unit N9E9 is not defined, KB-4 has no level: left out, counted, and still a layer C-C join.
    expect(r.summary).toMatchObject({ count: 2, approximateCount: 1, excludedCount: 1 });
    expect(r.excluded[0].reason).toMatch(/KB-4/);
    expect(r.layerMatrix).toEqual({ B: { B: 1, C: 1 }, C: { B: 1, C: 1 } });
    expect(r.summary.shareCrossingLayer).toBeCloseTo(1 / 3, 4);
  });

  it('filters by type, taxon and layer', async () => {
    const file = smallCatalogue();
    const host = new Host();
    expect((await host.call('spatial.analyse', { catalogue: file, types: ['conjoin'] })).joins.map((j) => j.id)).toEqual([1]);
    expect((await host.call('spatial.analyse', { catalogue: file, taxa: ['Bos primigenius'] })).joins.map((j) => j.id)).toEqual([2]);
    expect((await host.call('spatial.analyse', { catalogue: file, layers: ['C'] })).summary).toMatchObject({ count: 1, excludedCount: 1 });
  });

  it('spatial.figure returns SVG with one refit line per measured join', async () => {
    const file = smallCatalogue();
    for (const kind of ['plan', 'section'] as const) {
      const { svg } = await new Host().call('spatial.figure', { catalogue: file, kind });
      expect(XMLValidator.validate(svg)).toBe(true);
      expect(svg.match(/<line /g)?.length).toBe(2);
    }
  });

  it('imports definitions from CSV all or nothing, reporting every bad row by line and column', async () => {
    const file = smallCatalogue();
    const dir = temp();
    const bad = join(dir, 'units.csv');
    writeFileSync(bad, 'unit,x_min,y_min,x_max,y_max\nN2E0,0,2,2,4\nN2E2,2,2,abc,4\nN2E4,4,2,3,4\n');
    const host = new Host();
    const err = await host.call('spatial.definitions.import', { catalogue: file, file: bad }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(KnitboneError);
    const problems = (err as KnitboneError).problems;
    expect(problems.map((p) => [p.line, p.column])).toEqual([[3, 'x_max'], [4, 'x_max']]);
    // Nothing of the file was stored, not even its good first row.
    expect((await host.call('spatial.definitions', { catalogue: file })).units.map((u) => u.unit)).toEqual(['N0E2']);

    const good = join(dir, 'levels.csv');
    writeFileSync(good, 'Unit,Level,Top Z,Bottom Z\n,5,1.10,0.90\nN0E2,6,0.9,0.8\n');
    const r = await host.call('spatial.definitions.import', { catalogue: file, file: good, who: 'analyst' });
    expect(r).toMatchObject({ levelsAdded: 1, levelsChanged: 1 });
    const levels = (await host.call('spatial.definitions', { catalogue: file })).levels;
    expect(levels).toEqual([
      { unit: null, level: '5', topZ: 1.1, bottomZ: 0.9 },
      { unit: 'N0E2', level: '6', topZ: 0.9, bottomZ: 0.8 },
    ]);
    // The change is in the history with what it replaced.
    const cat = openCatalogue(file);
    try {
      const h = cat.history.list({ entity: 'excavation_level' });
      expect(h.at(-2)).toMatchObject({ who: 'analyst', action: 'update', before: { topZ: 1.0 }, after: { topZ: 1.1 } });
    } finally {
      cat.close();
    }
  });

  it('imports JSON definitions and refuses impossible ones', async () => {
    const file = smallCatalogue();
    const dir = temp();
    const json = join(dir, 'site.json');
    writeFileSync(json, JSON.stringify({ units: [{ unit: 'X', xMin: 0, yMin: 0, xMax: 1, yMax: 1 }], levels: [{ level: '1', topZ: 1, bottomZ: 2 }] }));
    const err = await new Host().call('spatial.definitions.import', { catalogue: file, file: json }).catch((e: unknown) => e);
    expect((err as KnitboneError).problems.map((p) => p.field)).toEqual(['levels.0.topZ']);
    writeFileSync(json, JSON.stringify({ layerBoundaries: [{ layer: 'B', x: 1, y: 1, z: 1.3 }] }));
    const r = await new Host().call('spatial.definitions.import', { catalogue: file, file: json });
    // Layer B's two earlier points are replaced by the one in the file.
    expect(r).toMatchObject({ layersReplaced: ['B'], boundaryPoints: 1 });
  });

  it('knitbone spatial --json prints one JSON document; --figures writes SVG files', () => {
    const file = smallCatalogue();
    const out = temp();
    const r = run('spatial', file, '--json', '--type', 'conjoin', '--figures', out);
    expect(r.status).toBe(0);
    const doc = JSON.parse(r.stdout);
    expect(Object.keys(doc)).toEqual(expect.arrayContaining(['joins', 'summary', 'layerMatrix']));
    expect(doc.joins).toHaveLength(1);
    expect(readdirSync(out).sort()).toEqual(['refits-histogram.svg', 'refits-layers.svg', 'refits-plan.svg', 'refits-rose.svg', 'refits-section.svg']);
    const plan = readFileSync(join(out, 'refits-plan.svg'), 'utf8');
    expect(plan.match(/<line /g)?.length).toBe(1);
    expect(plan).toContain('conjoin only'); // the figure says which joins it shows
  });

  it('knitbone spatial exits 1 for a missing catalogue and 2 for a bad option value', () => {
    const missing = run('spatial', join(temp(), 'none.sqlite'), '--json');
    expect(missing.status).toBe(1);
    expect(missing.stdout).toBe('');
    const usage = run('spatial', smallCatalogue(), '--figures', temp(), '--section-bearing', 'east');
    expect(usage.status).toBe(2);
  });
});

describe('knitbone import site', () => {
  it('imports a units CSV and lists it with knitbone site --json', () => {
    const file = smallCatalogue();
    const csv = join(temp(), 'units.csv');
    writeFileSync(csv, 'unit,x_min,y_min,x_max,y_max\nN2E0,0,2,2,4\n');
    const r = run('import', 'site', file, csv, '--json');
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout)).toMatchObject({ unitsAdded: 1 });
    const shown = JSON.parse(run('site', file, '--json').stdout);
    expect(shown.units.map((u: { unit: string }) => u.unit)).toEqual(['N0E2', 'N2E0']);
    const bad = run('import', 'site', file, join(temp(), 'missing.csv'));
    expect(bad.status).toBe(1);
    expect(bad.stderr).toMatch(/missing\.csv/);
  });
});

describe('spatial analysis after joins recorded with knitbone link', () => {
  it('measures a join linked by hand', () => {
    const file = join(temp(), 'linked.sqlite');
    const cat = openCatalogue(file, { create: true, who: 'test' });
    cat.specimens.insertMany([
      { ...emptySpecimenFields('KB-1'), x: 0, y: 0, z: 1.2, taxon: 'Cervus elaphus' },
      { ...emptySpecimenFields('KB-2'), x: 3, y: 4, z: 1.05, taxon: 'Cervus elaphus' },
    ]);
    cat.close();
    // KB-2 (3, 4, 1.05) -> KB-1 (0, 0, 1.20): 5 m, 0.15 m, bearing atan2(-3, -4) = 216.87 deg.
    const linked = run('link', file, 'KB-2', 'KB-1', '--type', 'conjoin-green', '--json');
    expect(linked.stderr).toBe('');
    expect(linked.status).toBe(0);
    const r = run('spatial', file, '--json', '--type', 'conjoin-green');
    expect(r.status).toBe(0);
    const doc = JSON.parse(r.stdout);
    expect(doc.joins).toHaveLength(1);
    expect(doc.joins[0]).toMatchObject({ a: 'KB-2', b: 'KB-1', type: 'conjoin', breakAge: 'fresh', horizontalM: 5, verticalM: 0.15, bearingDeg: 216.87 });
  });
});
