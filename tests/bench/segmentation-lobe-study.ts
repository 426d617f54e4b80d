/**
 * Lobed shaft centre study (issue 5): for one fragment, a grid of axis centres across the
 * fitted axis; at each, the pipeline's per-triangle agreement with the centre imposed
 * (axisOverride) beside section-model fit residuals about that centre: polar profiles r(θ) of
 * the wall (outer and cavity faces, from the truth labels or from head-on wall-ray pairs)
 * fitted by a Fourier series with harmonics `H` (comma list, e.g. 0,2,3), own or shared
 * (log r, the same relative harmonics for both faces) coefficients.
 * Run: npx tsx tests/bench/segmentation-lobe-study.ts DIR CATALOGUE_NO [step mm] [half-width mm]
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { Matrix, solve } from 'ml-matrix';
import { analyseFragment } from '../../core/geometry/analyse-fragment';
import { triangleNormalsAndAreas } from '../../core/geometry/mesh';
import { triangleCentroids } from '../../core/geometry/normal-filter';
import { parseMeshFile } from '../../core/geometry/parse/index';
import { castWallRays } from '../../core/geometry/wall-rays';

interface Truth { fragments: Array<{ catalogueNo: string; scanFile: string; triangleLabels: string; element: string }> }
const [dir, no, stepArg, halfArg] = process.argv.slice(2);
const step = Number(stepArg ?? 2), half = Number(halfArg ?? 12);
const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as Truth;
const frag = truth.fragments.find((f) => f.catalogueNo === no)!;
const parsed = parseMeshFile(readFileSync(join(dir, frag.scanFile)), frag.scanFile);
const labels = Buffer.from(frag.triangleLabels, 'base64');
const a = analyseFragment(parsed.mesh);
const { normals, areas } = triangleNormalsAndAreas(a.mesh);
const centroids = triangleCentroids(a.mesh.positions, a.mesh.triangles);
const nt = areas.length;
const [ax, ay, az] = a.axis.direction;
let ux: number, uy: number, uz: number;
if (Math.abs(ax) < 0.9) { ux = 0; uy = az; uz = -ay; } else { ux = -az; uy = 0; uz = ax; }
const ul = Math.hypot(ux, uy, uz); ux /= ul; uy /= ul; uz /= ul;
const vx = ay * uz - az * uy, vy = az * ux - ax * uz, vz = ax * uy - ay * ux;
const pu = (f: number): number => centroids[3 * f] * ux + centroids[3 * f + 1] * uy + centroids[3 * f + 2] * uz;
const pv = (f: number): number => centroids[3 * f] * vx + centroids[3 * f + 1] * vy + centroids[3 * f + 2] * vz;
const c0u = a.axis.point[0] * ux + a.axis.point[1] * uy + a.axis.point[2] * uz;
const c0v = a.axis.point[0] * vx + a.axis.point[1] * vy + a.axis.point[2] * vz;
const t0 = a.axis.point[0] * ax + a.axis.point[1] * ay + a.axis.point[2] * az;
// Truth wall: outer (label 0) and cavity (1) triangles; ray wall: head-on pairs.
const truthRows: Array<[number, number, number]> = []; // u, v, face (0 outer 1 inner)
for (let f = 0; f < nt; f += Math.max(1, Math.floor(nt / 3000))) {
  const l = labels[a.sourceTriangle[f]];
  if (l <= 1) truthRows.push([pu(f), pv(f), l]);
}
const rays = castWallRays(a.mesh, normals, centroids, 4000);
const pairs: Array<[number, number, number, number]> = [];
for (let k = 0; k < rays.triangles.length; k++) {
  const g = rays.exitTriangle[k];
  if (g < 0 || rays.exitCosine[k] < 0.8) continue;
  const f = rays.triangles[k];
  if (Math.abs(normals[3 * f] * ax + normals[3 * f + 1] * ay + normals[3 * f + 2] * az) > 0.342) continue;
  pairs.push([pu(f), pv(f), pu(g), pv(g)]);
}
const harmonics = (process.env.H ?? '2,3').split(',').map(Number);
/** RMS residual (mm, or log for shared) of the profile fit about (cu, cv); rows: u, v, face. */
function fit(rows: Array<[number, number, number]>, cu: number, cv: number, shared: boolean, first: boolean): [number, number, number] {
  const cols: Array<(th: number, face: number) => number> = [(_, k) => (k === 0 ? 1 : 0), (_, k) => (k === 1 ? 1 : 0)];
  const hs = first ? [1, ...harmonics] : harmonics;
  for (const h of hs) for (const face of shared ? [-1] : [0, 1]) {
    cols.push((th, k) => (face < 0 || face === k ? Math.cos(h * th) : 0), (th, k) => (face < 0 || face === k ? Math.sin(h * th) : 0));
  }
  const m = cols.length;
  const A = Matrix.zeros(m, m), b = Matrix.zeros(m, 1);
  const xs: number[][] = [], ys: number[] = [];
  for (const [u, v, k] of rows) {
    const th = Math.atan2(v - cv, u - cu), r = Math.hypot(u - cu, v - cv);
    const y = shared ? Math.log(r) : r;
    const x = cols.map((c) => c(th, k));
    xs.push(x); ys.push(y);
    for (let i = 0; i < m; i++) { b.set(i, 0, b.get(i, 0) + x[i] * y); for (let j = 0; j < m; j++) A.set(i, j, A.get(i, j) + x[i] * x[j]); }
  }
  for (let i = 0; i < m; i++) A.set(i, i, A.get(i, i) + 1e-9);
  const c = solve(A, b).to1DArray();
  let ss = 0;
  xs.forEach((x, n) => { const e = ys[n] - x.reduce((s, xi, i) => s + xi * c[i], 0); ss += e * e; });
  return [Math.sqrt(ss / Math.max(1, xs.length)), first ? c[2] : 0, first ? c[3] : 0];
}
function rayRows(cu: number, cv: number): Array<[number, number, number]> {
  const rows: Array<[number, number, number]> = [];
  for (const [su, sv, eu, ev] of pairs) {
    const outerFirst = Math.hypot(su - cu, sv - cv) > Math.hypot(eu - cu, ev - cv);
    rows.push([su, sv, outerFirst ? 0 : 1], [eu, ev, outerFirst ? 1 : 0]);
  }
  return rows;
}
console.log(`${no} ${frag.element} fitted centre (${c0u.toFixed(1)}, ${c0v.toFixed(1)}) R ${a.axis.radius.toFixed(1)} truth rows ${truthRows.length} ray pairs ${pairs.length} harmonics ${harmonics}`);
const out: string[] = [];
const oi = Number(process.env.OI ?? 0), oj = Number(process.env.OJ ?? 0);
for (let i = oi - half; i <= oi + half + 1e-9; i += step) for (let j = oj - half; j <= oj + half + 1e-9; j += step) {
  const cu = c0u + i, cv = c0v + j;
  const point: [number, number, number] = [cu * ux + cv * vx + t0 * ax, cu * uy + cv * vy + t0 * ay, cu * uz + cv * vz + t0 * az];
  const b = analyseFragment(parsed.mesh, {}, new Map(), (fitted) => ({ ...fitted, point, medial: undefined }));
  let ok = 0, all = 0;
  for (let f = 0; f < b.triangleClass.length; f++) {
    const l = labels[b.sourceTriangle[f]];
    all += areas[f];
    if ((b.triangleClass[f] === 0) === (l >= 2)) ok += areas[f];
  }
  const tOwn = fit(truthRows, cu, cv, false, false)[0], tSh = fit(truthRows, cu, cv, true, false)[0];
  const rr = rayRows(cu, cv);
  const rOwn = fit(rr, cu, cv, false, false)[0], rSh = fit(rr, cu, cv, true, false)[0];
  const [, d1u, d1v] = fit(rr, cu, cv, false, true);
  out.push(`${i.toFixed(1).padStart(6)} ${j.toFixed(1).padStart(6)} agree ${(100 * ok / all).toFixed(1).padStart(5)} truth own ${tOwn.toFixed(3)} shared ${(1000 * tSh).toFixed(2)} rays own ${rOwn.toFixed(3)} shared ${(1000 * rSh).toFixed(2)} first ${d1u.toFixed(2)},${d1v.toFixed(2)}`);
}
console.log(out.join('\n'));
