/**
 * Fracture-angle replay study (issue 5, point 7): the angle class depends only on the analysed
 * mesh, its triangle classes, the face groups and the shaft axis, so this study analyses each
 * generated fragment once, keeps those parts in a cache file per sample folder, and then
 * re-measures the faces' angles (fractureFaces) under setting overrides in seconds instead of
 * re-running the segmentation. Scored as the segmentation benchmark scores the angle class
 * (tests/bench/segmentation.bench.ts: each found face takes the break covering most of its
 * triangles; expected class from the break's nominalBevelDeg against rightAngleToleranceDeg),
 * and broken down by break pattern and age, axis support, angle sample count and face purity.
 *
 * KNITBONE_SAMPLE_DIR: sample folders, comma-separated. KNITBONE_REPLAY_CACHE: cache folder
 * (default $TMPDIR/angle-replay; delete it after a change to the segmentation or the axis).
 * KNITBONE_REPLAY_VARIANTS: JSON object name -> setting overrides (the baseline, {}, is always run).
 * KNITBONE_REPLAY_LIST=1 lists every face misread by the baseline (development folders only).
 * Run: KNITBONE_SAMPLE_DIR=/tmp/g5/s12 npx tsx tests/bench/fracture-angle-replay.ts
 */
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { basename, join } from 'node:path';
import { deserialize, serialize } from 'node:v8';
import { analyseFragment } from '../../core/geometry/analyse-fragment';
import { fractureFaces, type AngleSampleTrace, type FractureFace } from '../../core/geometry/fracture-faces';
import { triangleNormalsAndAreas, type TriangleMesh } from '../../core/geometry/mesh';
import { triangleCentroids } from '../../core/geometry/normal-filter';
import { parseMeshFile } from '../../core/geometry/parse/index';
import { analysisSettings, type AnalysisSettings } from '../../core/geometry/settings';
import type { ShaftAxis } from '../../core/geometry/shaft-axis';
import { buildTopology } from '../../core/geometry/topology';
import type { Truth, TruthBreak } from './fracture-angle.bench';

interface Cached {
  no: string;
  boneId: string;
  mesh: TriangleMesh;
  triangleClass: Uint8Array;
  faceGroup: Int32Array;
  axis: ShaftAxis;
  /** Truth label per analysed triangle. */
  labels: Uint8Array;
  triRoughness: Float32Array;
  medianRoughness: number;
}

const sides = process.env.KNITBONE_REPLAY_SIDES === '1';
const sideTally = new Map<string, number>();
const cacheDir = process.env.KNITBONE_REPLAY_CACHE ?? join(tmpdir(), 'angle-replay');

function load(dir: string): { truth: Truth; frags: Cached[] } {
  const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as Truth;
  const file = join(cacheDir, `${basename(dir)}.v8`);
  if (existsSync(file)) return { truth, frags: deserialize(readFileSync(file)) as Cached[] };
  const frags: Cached[] = [];
  for (const frag of truth.fragments) {
    const parsed = parseMeshFile(readFileSync(join(dir, frag.scanFile)), frag.scanFile);
    const a = analyseFragment(parsed.mesh);
    const input = Buffer.from(frag.triangleLabels, 'base64');
    const nt = a.triangleClass.length;
    const labels = new Uint8Array(nt);
    for (let f = 0; f < nt; f++) labels[f] = input[a.sourceTriangle[f]];
    const faceGroup = new Int32Array(nt).fill(-1);
    for (const face of a.fractureFaces) for (const t of face.triangleIds) faceGroup[t] = face.id;
    // Roughness only feeds the face's roughness ratio, not its angle: a constant will do.
    frags.push({ no: frag.catalogueNo, boneId: frag.boneId, mesh: a.mesh, triangleClass: a.triangleClass, faceGroup, axis: a.axis, labels, triRoughness: new Float32Array(nt).fill(1), medianRoughness: 1 });
  }
  mkdirSync(cacheDir, { recursive: true });
  writeFileSync(file, serialize(frags));
  return { truth, frags };
}

interface FaceRow { sample: string; no: string; face: number; ok: boolean; exp: string; got: string; age: string; pattern: string; bevel: number; support: number; n: number; purity: number; area: number; median: number }

function measure(dir: string, overrides: Partial<AnalysisSettings>): FaceRow[] {
  const { truth, frags } = load(dir);
  const settings = analysisSettings(overrides);
  const breaks = new Map<string, Map<number, TruthBreak>>();
  for (const b of truth.bones) breaks.set(b.boneId, new Map(b.breaks.map((x) => [x.id, x])));
  const rows: FaceRow[] = [];
  for (const c of frags) {
    const topo = buildTopology(c.mesh);
    const { normals, areas } = triangleNormalsAndAreas(c.mesh);
    const centroids = triangleCentroids(c.mesh.positions, c.mesh.triangles);
    const noSamples = { spacing: 1, points: new Float32Array(0), normals: new Float32Array(0), triangle: new Uint32Array(0) };
    const traces: AngleSampleTrace[] = [];
    const faces: FractureFace[] = fractureFaces({
      faceGroup: c.faceGroup, mesh: c.mesh, neighbours: topo.neighbours, triNormals: normals, areas, centroids, triClass: c.triangleClass,
      triRoughness: c.triRoughness, medianRoughness: c.medianRoughness, axis: c.axis, samples: noSamples, settings,
      angleTrace: sides ? (t) => traces.push(t) : undefined,
    });
    // What the bone-surface side of each sample truly is: truth labels of the outer-classed triangles within 2 mm.
    const sideOf = (pt: number[]): string => {
      const byLabel = new Map<string, number>();
      for (let t = 0; t < areas.length; t++) {
        if (c.triangleClass[t] === 0) continue;
        const d2 = (centroids[3 * t] - pt[0]) ** 2 + (centroids[3 * t + 1] - pt[1]) ** 2 + (centroids[3 * t + 2] - pt[2]) ** 2;
        if (d2 > 4) continue;
        const l = c.labels[t] === 0 ? 'outer' : c.labels[t] === 1 ? 'medullary' : c.labels[t] === 2 ? 'damage' : 'break';
        byLabel.set(l, (byLabel.get(l) ?? 0) + areas[t]);
      }
      return [...byLabel.entries()].sort((x, y) => y[1] - x[1])[0]?.[0] ?? 'none';
    };
    for (const face of faces) {
      // As segmentation.bench.ts: the break with most of the face's triangles.
      const count = new Map<number, number>(), byArea = new Map<number, number>();
      let faceArea = 0;
      for (const t of face.triangleIds) {
        faceArea += areas[t];
        if (c.labels[t] >= 10) { count.set(c.labels[t] - 10, (count.get(c.labels[t] - 10) ?? 0) + 1); byArea.set(c.labels[t] - 10, (byArea.get(c.labels[t] - 10) ?? 0) + areas[t]); }
      }
      if (count.size === 0) continue;
      const breakId = [...count.entries()].sort((x, y) => y[1] - x[1])[0][0];
      const br = breaks.get(c.boneId)?.get(breakId);
      if (!br) continue;
      const exp = Math.abs(br.nominalBevelDeg) > settings.rightAngleToleranceDeg ? 'oblique' : 'right';
      if (sides) {
        for (const t of traces.filter((x) => x.face === face.id)) {
          const a = Math.min(t.angleDeg, 180 - t.angleDeg);
          const key = `${exp} side ${sideOf(t.point)} ${a < 30 ? '<30' : a < 60 ? '30-60' : a < 78 ? '60-78' : '>=78'}`;
          sideTally.set(key, (sideTally.get(key) ?? 0) + 1);
        }
      }
      rows.push({
        sample: basename(dir), no: c.no, face: face.id, ok: face.angleClass === exp, exp, got: face.angleClass, age: br.age, pattern: br.pattern, bevel: br.nominalBevelDeg,
        support: c.axis.support, n: face.anglesDeg.length, purity: Math.max(0, ...byArea.values()) / faceArea, area: face.area, median: face.medianAngleDeg,
      });
    }
  }
  return rows;
}

const pct = (ok: number, n: number): string => (n ? `${((100 * ok) / n).toFixed(1)} (${ok}/${n})` : '-');
function groupBy(rows: FaceRow[], key: (r: FaceRow) => string): Record<string, string> {
  const m = new Map<string, [number, number]>();
  for (const r of rows) { const k = key(r); const v = m.get(k) ?? [0, 0]; v[1]++; if (r.ok) v[0]++; m.set(k, v); }
  return Object.fromEntries([...m.entries()].sort().map(([k, [ok, n]]) => [k, `${pct(ok, n)} wrong ${n - ok}`]));
}

const dirs = (process.env.KNITBONE_SAMPLE_DIR ?? '').split(',').filter(Boolean);
const variants: Record<string, Partial<AnalysisSettings>> = { baseline: {}, ...(JSON.parse(process.env.KNITBONE_REPLAY_VARIANTS ?? '{}') as Record<string, Partial<AnalysisSettings>>) };
const table: Array<Record<string, string>> = [];
let base: FaceRow[] = [];
for (const [name, ov] of Object.entries(variants)) {
  const row: Record<string, string> = { variant: name };
  let all: FaceRow[] = [];
  for (const dir of dirs) {
    const rows = measure(dir, ov);
    all = all.concat(rows);
    row[basename(dir)] = pct(rows.filter((r) => r.ok).length, rows.length);
  }
  row.pooled = pct(all.filter((r) => r.ok).length, all.length);
  row['right ok'] = pct(all.filter((r) => r.ok && r.exp === 'right').length, all.filter((r) => r.exp === 'right').length);
  row['oblique ok'] = pct(all.filter((r) => r.ok && r.exp === 'oblique').length, all.filter((r) => r.exp === 'oblique').length);
  table.push(row);
  if (name === 'baseline') base = all;
  else {
    const changed = all.filter((r, i) => base[i] && r.ok !== base[i].ok);
    if (process.env.KNITBONE_REPLAY_LIST === '1') for (const r of changed) console.log(`${name}: ${r.ok ? 'fixed' : 'broke'} ${r.sample} ${r.no} face ${r.face} ${r.age} ${r.pattern} bevel ${r.bevel} n ${r.n} support ${r.support.toFixed(2)} purity ${r.purity.toFixed(2)} area ${r.area.toFixed(0)} median ${r.median.toFixed(0)} (was ${base[all.indexOf(r)].median.toFixed(0)})`);
  }
}
console.table(table);
if (sides) console.table(Object.fromEntries([...sideTally.entries()].sort()));
if (process.env.KNITBONE_REPLAY_BREAKDOWN === '1') {
  console.log('baseline by break:'); console.table(groupBy(base, (r) => `${r.age} ${r.pattern} expect ${r.exp}`));
  console.log('by support:'); console.table(groupBy(base, (r) => (r.support < 0.5 ? '<0.5' : r.support < 0.67 ? '0.5-0.67' : r.support < 0.75 ? '0.67-0.75' : '>=0.75') + ` ${r.exp}`));
  console.log('by samples:'); console.table(groupBy(base, (r) => (r.n < 3 ? '<3' : r.n < 5 ? '3-4' : r.n < 10 ? '5-9' : r.n < 20 ? '10-19' : '>=20') + ` ${r.exp}`));
  console.log('by purity:'); console.table(groupBy(base, (r) => (r.purity < 0.5 ? '<0.5' : r.purity < 0.8 ? '0.5-0.8' : '>=0.8') + ` ${r.exp}`));
  console.log('wrong by got:'); console.table(groupBy(base.filter((r) => !r.ok), (r) => `expect ${r.exp} got ${r.got}`));
}
if (process.env.KNITBONE_REPLAY_LIST === '1') for (const r of base.filter((x) => !x.ok)) console.log(`wrong ${r.sample} ${r.no} face ${r.face} ${r.age} ${r.pattern} bevel ${r.bevel} expect ${r.exp} got ${r.got} median ${r.median.toFixed(0)} n ${r.n} support ${r.support.toFixed(2)} purity ${r.purity.toFixed(2)} area ${r.area.toFixed(0)}`);
