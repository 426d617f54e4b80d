/**
 * Why the search about the shared axis misses true joins whose pieces fit different radii
 * (session 26): on a folder studied by candidate-restudy.ts and the records of stored-gap-study.ts
 * (KNITBONE_STUDY_OUT), for each join the screen missed (cause "coarse") whose best true face pair
 * scores at least KNITBONE_STUDY_MIN (0.05) at the truth, the two fitted radii, each face's outer
 * radius (the quantile KNITBONE_STUDY_Q, 0.9, of its samples' distances from its own axis), and,
 * for the samples the truth pairs (B's strided samples within 1.5 spacings of one of A's), the
 * median radial gap (A's radius minus B's, each about its own axis), how many lie within the
 * vote's radial tolerance and how many have opposed normals (shaft-axis-search.ts). Then the
 * search itself, the axes on one line and with the outer surfaces meeting (outerQuantile), with
 * KNITBONE_STUDY_PEAKS (10) peaks per flip: the hypotheses within 15 degrees and 8 mm of the truth,
 * by rank.
 *   npx tsx tests/bench/shared-axis-radius-study.ts <studied-dir> <records.jsonl>
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { WHOLE_FACE_PARTNERS } from '../../core/geometry/proposals/candidate-index';
import { DEFAULT_MATCH_PARAMETERS } from '../../core/geometry/proposals/pairwise-match';
import { acrossAxisBasis } from '../../core/geometry/shaft-axis';
import { kthSmallest } from '../../core/geometry/kth-smallest';
import { searchAboutSharedAxis, type ShaftFrame } from '../../core/geometry/registration/shaft-axis-search';
import { applyToPoint, displacementAt, rotationErrorDegrees, type RigidTransform } from '../../core/geometry/registration/rigid-transform';
import { orderedJoin, readStudiedFolder } from './studied-folder';

interface Join { a: string; b: string; breakId: number; transformBToA: RigidTransform }
interface Rec { join: string; pattern: string; cause: string; truePairs?: Array<{ faces: [number, number]; fromTruth?: { score: number } }> }
const [dir, recFile] = process.argv.slice(2);
const MIN = Number(process.env.KNITBONE_STUDY_MIN ?? 0.05), Q = Number(process.env.KNITBONE_STUDY_Q ?? 0.9), PEAKS = Number(process.env.KNITBONE_STUDY_PEAKS ?? 10);
const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { joins: Join[] };
const folder = readStudiedFolder(dir, { k: 30, wholeFacePartners: WHOLE_FACE_PARTNERS });
const recs = readFileSync(recFile, 'utf8').split('\n').filter((l) => l.startsWith('{')).map((l) => JSON.parse(l) as Rec).filter((r) => r.cause === 'coarse' && r.truePairs?.length);
const f1 = (x: number): string => x.toFixed(1);
const radii = (axis: ShaftFrame, P: ArrayLike<number>): Float64Array => {
  const [x, y] = acrossAxisBasis(axis.direction), o = axis.point;
  const out = new Float64Array(P.length / 3);
  for (let i = 0; i < out.length; i++) {
    const v = [P[3 * i] - o[0], P[3 * i + 1] - o[1], P[3 * i + 2] - o[2]];
    out[i] = Math.hypot(v[0] * x[0] + v[1] * x[1] + v[2] * x[2], v[0] * y[0] + v[1] * y[1] + v[2] * y[2]);
  }
  return out;
};
const quantile = (v: Float64Array, q: number): number => kthSmallest(v, Math.min(v.length - 1, Math.floor(q * v.length)));
let studied = 0, predicted = 0;
for (const r of recs) {
  const best = r.truePairs!.reduce((p, q) => ((q.fromTruth?.score ?? 0) > (p.fromTruth?.score ?? 0) ? q : p));
  if ((best.fromTruth?.score ?? 0) < MIN) continue;
  const [na, nb] = r.join.split('|');
  const j = truth.joins.find((x) => x.a === na && x.b === nb);
  if (!j) continue;
  const { ia, ib, want } = orderedJoin(folder, j);
  const A = folder.prep(ia), B = folder.prep(ib);
  if (!A.axis || !B.axis) { console.log(`${r.join} ${r.pattern}: axes ${!!A.axis}/${!!B.axis}`); continue; }
  studied++;
  const FA = A.faces[best.faces[0]], FB = B.faces[best.faces[1]];
  const spacing = Math.max(A.spacing, B.spacing);
  const rA = radii(A.axis, FA.points), rB = radii(B.axis, FB.points);
  const qa = quantile(rA, Q), qb = quantile(rB, Q);
  let rMean = 0;
  for (const x of rA) rMean += x / rA.length;
  const rTol = Math.max(2 * spacing, 0.12 * rMean);
  const gaps: number[] = [];
  let radial = 0, opposed = 0;
  const nB = rB.length;
  for (let i = 0; i < nB; i += Math.max(1, Math.floor(nB / 200))) {
    const p = applyToPoint(want, FB.points[3 * i], FB.points[3 * i + 1], FB.points[3 * i + 2]);
    let k = -1, bd = 1.5 * spacing;
    for (let m = 0; m < rA.length; m++) {
      const d = Math.hypot(FA.points[3 * m] - p[0], FA.points[3 * m + 1] - p[1], FA.points[3 * m + 2] - p[2]);
      if (d < bd) { bd = d; k = m; }
    }
    if (k < 0) continue;
    gaps.push(rA[k] - rB[i]);
    if (Math.abs(rA[k] - rB[i]) <= rTol) radial++;
    const n = [FB.normals[3 * i], FB.normals[3 * i + 1], FB.normals[3 * i + 2]];
    const nw = [want[0] * n[0] + want[1] * n[1] + want[2] * n[2], want[4] * n[0] + want[5] * n[1] + want[6] * n[2], want[8] * n[0] + want[9] * n[1] + want[10] * n[2]];
    if (-(nw[0] * FA.normals[3 * k] + nw[1] * FA.normals[3 * k + 1] + nw[2] * FA.normals[3 * k + 2]) >= 0.6) opposed++;
  }
  const gap = gaps.length ? quantile(Float64Array.from(gaps), 0.5) : NaN;
  if (Math.abs(gap - (qa - qb)) <= 1.1) predicted++;
  const near = (q?: number): string => searchAboutSharedAxis(A.axis!, FA.points, FA.normals, B.axis!, FB.points, FB.normals, { spacing, peaks: PEAKS, maxSamples: DEFAULT_MATCH_PARAMETERS.icpSamples, ...(q !== undefined ? { outerQuantile: q } : {}) })
    .map((h, k) => ({ k, rot: rotationErrorDegrees(h.transform, want), disp: displacementAt(h.transform, want, B.centroid) }))
    .filter((h) => h.rot < 15 && h.disp < 8).map((h) => `#${h.k} ${f1(h.rot)}/${f1(h.disp)}`).join(' ') || '-';
  console.log(`${r.join} ${r.pattern} truth ${best.fromTruth!.score} radii ${f1(A.axis.radius)}/${f1(B.axis.radius)} outer ${f1(qa)}/${f1(qb)} (diff ${f1(qa - qb)}) truth-paired ${gaps.length}: radial gap ${f1(gap)}, within ${f1(rTol)} mm ${radial}, opposed ${opposed}; near truth: one line ${near()}, meeting ${near(Q)}`);
}
console.log(`${studied} joins with both axes; radial gap at the truth within 1.1 mm of the outer radii's difference on ${predicted}`);
