/**
 * Where the misread area of generated folders lies relative to the predicted fracture /
 * original border: area by ring distance (triangle steps) from the nearest triangle of the
 * other predicted kind, split by direction (fracture read as original and the reverse).
 * Run: npx tsx tests/bench/segmentation-margins.ts DIR[,DIR...] [settings JSON]
 */
import { readFileSync } from 'node:fs';
import { join, basename } from 'node:path';
import { analyseFragment } from '../../core/geometry/analyse-fragment';
import { triangleNormalsAndAreas } from '../../core/geometry/mesh';
import { parseMeshFile } from '../../core/geometry/parse/index';
import { buildTopology } from '../../core/geometry/topology';

const dirs = (process.argv[2] ?? '').split(',').filter(Boolean);
const settings = JSON.parse(process.argv[3] ?? '{}');
const bins = [0, 1, 2, 3, 5, 8, 1e9];
for (const dir of dirs) {
  const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { fragments: Array<{ scanFile: string; triangleLabels: string }> };
  let total = 0;
  const fo = new Float64Array(bins.length), of = new Float64Array(bins.length);
  for (const frag of truth.fragments) {
    const parsed = parseMeshFile(readFileSync(join(dir, frag.scanFile)), frag.scanFile);
    const labels = Buffer.from(frag.triangleLabels, 'base64');
    const a = analyseFragment(parsed.mesh, settings);
    const { areas } = triangleNormalsAndAreas(parsed.mesh);
    for (let f = 0; f < labels.length; f++) total += areas[f];
    const nb = buildTopology(a.mesh).neighbours;
    const nt = a.triangleClass.length;
    const isF = (f: number): boolean => a.triangleClass[f] === 0;
    const dist = new Int32Array(nt).fill(-1);
    let queue: number[] = [];
    for (let f = 0; f < nt; f++) {
      for (let j = 0; j < 3; j++) { const g = nb[3 * f + j]; if (g >= 0 && isF(g) !== isF(f)) { dist[f] = 0; queue.push(f); break; } }
    }
    while (queue.length) {
      const next: number[] = [];
      for (const f of queue) for (let j = 0; j < 3; j++) { const g = nb[3 * f + j]; if (g >= 0 && dist[g] < 0 && isF(g) === isF(f)) { dist[g] = dist[f] + 1; next.push(g); } }
      queue = next;
    }
    for (let f = 0; f < nt; f++) {
      const src = a.sourceTriangle[f];
      const tf = labels[src] >= 2;
      if (tf === isF(f)) continue;
      const d = dist[f] < 0 ? 1e8 : dist[f];
      let b = 0; while (b + 1 < bins.length && d >= bins[b + 1]) b++;
      (tf ? fo : of)[b] += areas[src];
    }
  }
  const row = (x: Float64Array): string => bins.map((b, i) => `${b}+:${(100 * x[i] / total).toFixed(2)}`).join(' ');
  process.stdout.write(`${basename(dir)} F->O ${row(fo)}\n${basename(dir)} O->F ${row(of)}\n`);
}
