/**
 * Why RANSAC finds no motion near the truth on a true face pair: for the joins of
 * stored-gap-study.ts records (KNITBONE_STUDY_OUT) of the given causes (default coarse), each true
 * candidate face pair's FPFH correspondences built as ransacAlignFaces builds them (each moving
 * sample's 2 nearest, each fixed sample's nearest, on the featureIndex subsets), both ways round,
 * and how many are right under the true motion (within RANSAC's inlier distance, 1.5 spacings):
 * `f` their share, `p3` the expected draws of three right ones in 1,500 iterations (f^3 x 1,500),
 * `loc10`/`loc20` the same for a local draw (the second and third correspondence drawn among those
 * whose moving sample lies within 10 / 20 mm of the first's).
 *   npx tsx tests/bench/ransac-corr-study.ts <studied-dir> <records.jsonl> [causes]
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { WHOLE_FACE_PARTNERS } from '../../core/geometry/proposals/candidate-index';
import { featureCorrespondences } from '../../core/geometry/registration/feature-correspondences';
import { FPFH_DIM } from '../../core/geometry/registration/fpfh';
import { applyToPoints, invert } from '../../core/geometry/registration/rigid-transform';
import { orderedJoin, readStudiedFolder } from './studied-folder';

const [dir, recordsFile, causesArg] = process.argv.slice(2);
const causes = (causesArg ?? 'coarse').split(',');
const recs = readFileSync(recordsFile, 'utf8').split('\n').filter((l) => l.startsWith('{')).map((l) => JSON.parse(l) as { join: string; cause: string; truePairs?: Array<{ faces: number[]; fromTruth?: { score: number } }> });
const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { joins: Array<{ a: string; b: string; type: string; breakId: number; survivingFraction: number; transformBToA: number[] }> };
const { study, spacing, fragOf, pairsOf, prep } = readStudiedFolder(dir, { k: 30, wholeFacePartners: WHOLE_FACE_PARTNERS, keepFragments: 40 });
for (const r of recs) {
  if (!causes.includes(r.cause)) continue;
  const [na, nb] = r.join.split('|');
  const j = truth.joins.find((x) => x.a === na && x.b === nb && x.type === 'conjoin')!;
  const { ia, ib, want, on } = orderedJoin({ study, fragOf }, j);
  const A = prep(ia), B = prep(ib);
  for (const [x, y] of pairsOf.get(`${ia}:${ib}`) ?? []) {
    if (!on(ia, x) || !on(ib, y)) continue;
    const FA = A.faces[x], FB = B.faces[y];
    const eps = 1.5 * spacing;
    const stats = (S: typeof FA, T: typeof FB, M: number[]): string => {
      const found = featureCorrespondences(S.mirroredFeatureFpfh!, T.featureFpfh!, FPFH_DIM);
      const si = S.featureIndex, ti = T.featureIndex;
      const corr: number[] = [];
      for (let k = 0; k < found.sourceBest.length; k++) for (const t of [found.sourceBest[k], found.sourceSecond[k]]) if (t >= 0) corr.push(si ? si[k] : k, ti ? ti[t] : t);
      for (let k = 0; k < found.targetBest.length; k++) if (found.targetBest[k] >= 0) corr.push(si ? si[found.targetBest[k]] : found.targetBest[k], ti ? ti[k] : k);
      const P = applyToPoints(M, S.points);
      let inl = 0;
      const inIdx: number[] = [];
      for (let c = 0; c < corr.length / 2; c++) {
        const i = corr[2 * c], t = corr[2 * c + 1];
        const d = Math.hypot(P[3 * i] - T.points[3 * t], P[3 * i + 1] - T.points[3 * t + 1], P[3 * i + 2] - T.points[3 * t + 2]);
        if (d < eps) { inl++; inIdx.push(i); }
      }
      const nc = corr.length / 2, f = inl / nc;
      // a local draw: c1, c2 within R of c0's source point
      const loc = (R: number): number => {
        let num = 0, den = 0;
        for (let c = 0; c < nc; c++) {
          const i = corr[2 * c];
          let n = 0, ni = 0;
          for (let e = 0; e < nc; e++) {
            const k = corr[2 * e];
            const d = Math.hypot(S.points[3 * i] - S.points[3 * k], S.points[3 * i + 1] - S.points[3 * k + 1], S.points[3 * i + 2] - S.points[3 * k + 2]);
            if (d < R && d > 2 * eps) { n++; const t = corr[2 * e + 1]; const dd = Math.hypot(P[3 * k] - T.points[3 * t], P[3 * k + 1] - T.points[3 * t + 1], P[3 * k + 2] - T.points[3 * t + 2]); if (dd < eps) ni++; }
          }
          const t = corr[2 * c + 1];
          const ok = Math.hypot(P[3 * i] - T.points[3 * t], P[3 * i + 1] - T.points[3 * t + 1], P[3 * i + 2] - T.points[3 * t + 2]) < eps;
          den++;
          if (ok && n > 1) num += (ni / n) ** 2;
        }
        return num / den;
      };
      return `nc ${nc} in ${inl} f ${f.toFixed(3)} p3 ${(f ** 3 * 1500).toFixed(2)} loc10 ${(loc(10) * 1500).toFixed(2)} loc20 ${(loc(20) * 1500).toFixed(2)}`;
    };
    console.log(r.join, r.cause, [x, y], 'samples', FA.points.length / 3, FB.points.length / 3, 'B->A', stats(FB, FA, want), '| A->B', stats(FA, FB, invert(want)));
  }
}
