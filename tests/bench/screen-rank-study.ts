/**
 * Why a correct motion is dropped by the screen's overlap ranking (class c2 of the pairwise
 * benchmark): for every true join of the given assemblages, each face pair is screened with a
 * trace; where some refined motion is correct (within 5 degrees and 5 mm) but none is kept, the
 * refined motions of that face pair are listed best overlap first with cheap measures that
 * could rank them instead: the screen's interlock (screen-measures.ts) and the agreement of
 * the two fitted shaft axes under the motion (score.ts axisAgreement).
 *
 *   npx tsx tests/bench/screen-rank-study.ts <demo-dir>[,<demo-dir>...]
 *
 * With COMPARE=1 it studies every true join instead: for each face pair with a correct refined
 * motion, the place of the first correct one when the refined motions are ranked as the screen
 * ranks them (overlap share times axis consistency) and by the tight contact share
 * (tightContactShare: contact within a fraction of a spacing point-to-plane), and whether it would
 * be kept (within screenKeepRatio of the best, among the first fineHypotheses).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { DEFAULT_MATCH_PARAMETERS, screenFacePair, type MatchTrace } from '../../core/geometry/proposals/pairwise-match';
import { DEFAULT_FPFH_RADIUS_SPACINGS, prepareFragment, runSpacing, type FragmentInput, type PreparedFragment } from '../../core/geometry/proposals/prepared-fragment';
import { applyToPoints, displacementAt, invert, rotationErrorDegrees, type RigidTransform } from '../../core/geometry/registration/rigid-transform';
import { axisAgreement } from '../../core/geometry/registration/score';
import { screenAxisConsistency, screenInterlock } from '../../core/geometry/proposals/screen-measures';
import type { PreparedFace } from '../../core/geometry/proposals/prepared-fragment';
import type { TruthFragment, TruthJoin } from './face-pair-study';
import { loadCached } from './pairwise.bench';

const f = (x: number, d = 2): string => (Number.isFinite(x) ? x.toFixed(d) : '-');
function analysed(dir: string, no: string): FragmentInput | null {
  try { return loadCached(join(dir, 'scans', `${no}.ply`)); } catch { return null; }
}
let c2 = 0;
const compareRows: string[] = [];
for (const dir of process.argv[2].split(',')) {
  const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { fragments: TruthFragment[]; joins: TruthJoin[] };
  const inputs = new Map(truth.fragments.map((x) => [x.catalogueNo, analysed(dir, x.catalogueNo)]));
  const spacing = runSpacing([...inputs.values()].flatMap((x) => (x ? x.faces.map((y) => y.area ?? 0) : [])));
  const prepared = new Map<string, PreparedFragment>();
  const prep = (no: string): PreparedFragment => prepared.get(no) ?? prepared.set(no, prepareFragment(inputs.get(no)!, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS })).get(no)!;
  for (const j of truth.joins) {
    if (j.type !== 'conjoin' || j.survivingFraction < 0.3 || !inputs.get(j.a) || !inputs.get(j.b)) continue;
    const A = prep(j.a), B = prep(j.b);
    const T = j.transformBToA as RigidTransform;
    const near = (m: RigidTransform): boolean => rotationErrorDegrees(m, T) < 5 && displacementAt(m, T, B.centroid) < 5;
    const traces: Array<{ fa: number; fb: number; tr: MatchTrace }> = [];
    for (let fa = 0; fa < A.faces.length; fa++) for (let fb = 0; fb < B.faces.length; fb++) {
      const tr: MatchTrace = { coarse: [], refined: [], kept: [] };
      screenFacePair(A, fa, B, fb, DEFAULT_MATCH_PARAMETERS, tr);
      traces.push({ fa, fb, tr });
    }
    if (process.env.COMPARE) {
      for (const { fa, fb, tr } of traces) {
        if (!tr.refined.some((r) => near(r.transform))) continue;
        const FA = A.faces[fa], FB = B.faces[fb];
        const tau = Number(process.env.TAU ?? 0.25);
        const rows = tr.refined.filter((r) => r.overlap >= DEFAULT_MATCH_PARAMETERS.minOverlap).map((r) => {
          const cons = screenAxisConsistency(A.axis, B.axis, r.transform, FB.centroid, DEFAULT_MATCH_PARAMETERS.screenAxisTiltDeg);
          const tight = tightContactShare(FA, FB, r.transform, spacing, tau);
          return { ok: near(r.transform), old: r.overlap * cons, tight: tight * cons, ov: r.overlap, t: tight };
        });
        const place = (key: 'old' | 'tight'): string => {
          const sorted = [...rows].sort((p, q) => q[key] - p[key]);
          const i = sorted.findIndex((r) => r.ok);
          const kept = i >= 0 && i < DEFAULT_MATCH_PARAMETERS.fineHypotheses && sorted[i][key] >= DEFAULT_MATCH_PARAMETERS.screenKeepRatio * sorted[0][key];
          return `${i}${kept ? 'k' : ''}`;
        };
        const c = rows.find((r) => r.ok);
        const w = [...rows].sort((p, q) => q.old - p.old)[0];
        compareRows.push(`${dir.split('/').pop()} ${j.a}|${j.b} ${j.pattern} f${fa}/${fb} n ${FA.points.length / 3}/${FB.points.length / 3} old ${place('old')} tight ${place('tight')} correct ov ${f(c?.ov ?? NaN)} t ${f(c?.t ?? NaN)} | top ov ${f(w?.ov ?? NaN)} t ${f(w?.t ?? NaN)} ${w?.ok ? '*' : ''}`);
      }
      continue;
    }
    if (traces.some((t) => t.tr.kept.some(near)) || !traces.some((t) => t.tr.refined.some((r) => near(r.transform)))) continue;
    c2++;
    console.log(`${dir.split('/').pop()} ${j.a}|${j.b} ${j.pattern} shafts ${!!A.axis && !!B.axis}`);
    for (const { fa, fb, tr } of traces) {
      if (!tr.refined.some((r) => near(r.transform))) continue;
      const FA = A.faces[fa], FB = B.faces[fb];
      const rows = [...tr.refined].sort((p, q) => q.overlap - p.overlap).slice(0, 8).map((r) => {
        const ax = axisAgreement(A.axis, B.axis, r.transform, applyToPoints(r.transform, FB.points));
        return `  ${near(r.transform) ? '*' : ' '} ov ${f(r.overlap)} il ${f(screenInterlock(FA, FB, r.transform, spacing), 3)} axAng ${f(ax.axisAngleDeg, 1)} off ${f(ax.axisOffset)} side ${f(ax.axisSide)} rr ${f(ax.radiusRatio)} rot ${f(rotationErrorDegrees(r.transform, T), 1)}`;
      });
      console.log(` face ${fa}/${fb} n ${FA.points.length / 3}/${FB.points.length / 3}\n${rows.join('\n')}`);
    }
  }
}
if (process.env.COMPARE) {
  console.log(compareRows.join('\n'));
  const kept = (k: string): number => compareRows.filter((r) => new RegExp(` ${k} \\d+k`).test(r)).length;
  console.log(`face pairs with a correct refined motion: ${compareRows.length}; kept by overlap ${kept('old')}, by tight contact ${kept('tight')}`);
} else console.log(`c2 joins ${c2}`);

/**
 * Share of the smaller face in tight contact under a screened motion: B's samples moved by T
 * (and A's moved back by its inverse) whose nearest sample of the other face lies within one
 * spacing, with opposed normals, and within `tightSpacings` spacings of that sample's tangent
 * plane (point-to-plane). The better side counts, as the overlap share.
 */
function tightContactShare(FA: PreparedFace, FB: PreparedFace, T: RigidTransform, spacing: number, tightSpacings: number): number {
  const one = (P: Float32Array, N: Float32Array, M: RigidTransform, other: PreparedFace): number => {
    const n = P.length / 3;
    const step = Math.max(1, Math.floor(n / 150));
    const q = [0, 0, 0];
    let k = 0, m = 0;
    for (let i = 0; i < n; i += step) {
      m++;
      const x = P[3 * i], y = P[3 * i + 1], z = P[3 * i + 2];
      q[0] = M[0] * x + M[1] * y + M[2] * z + M[3];
      q[1] = M[4] * x + M[5] * y + M[6] * z + M[7];
      q[2] = M[8] * x + M[9] * y + M[10] * z + M[11];
      const hit = other.tree.nearestOne(q, spacing * spacing);
      if (hit.index < 0) continue;
      const j = hit.index;
      const on = other.normals;
      const a = N[3 * i], b = N[3 * i + 1], c = N[3 * i + 2];
      const nx = M[0] * a + M[1] * b + M[2] * c, ny = M[4] * a + M[5] * b + M[6] * c, nz = M[8] * a + M[9] * b + M[10] * c;
      if (nx * on[3 * j] + ny * on[3 * j + 1] + nz * on[3 * j + 2] >= -0.5) continue;
      const d = (q[0] - other.points[3 * j]) * on[3 * j] + (q[1] - other.points[3 * j + 1]) * on[3 * j + 1] + (q[2] - other.points[3 * j + 2]) * on[3 * j + 2];
      if (Math.abs(d) <= tightSpacings * spacing) k++;
    }
    return m ? k / m : 0;
  };
  const inv = invert(T);
  return Math.max(one(FB.points, FB.normals, T, FA), one(FA.points, FA.normals, inv, FB));
}
