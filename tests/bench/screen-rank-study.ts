/**
 * Why a correct motion is dropped by the screen's overlap ranking (class c2 of the pairwise
 * benchmark): for every true join of the given assemblages, each face pair is screened with a
 * trace; where some refined motion is correct (within 5 degrees and 5 mm) but none is kept, the
 * refined motions of that face pair are listed best overlap first with cheap measures that
 * could rank them instead: the screen's interlock (screen-measures.ts) and the agreement of
 * the two fitted shaft axes under the motion (score.ts axisAgreement).
 *
 *   npx tsx tests/bench/screen-rank-study.ts <demo-dir>[,<demo-dir>...]
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { DEFAULT_MATCH_PARAMETERS, screenFacePair, type MatchTrace } from '../../core/geometry/proposals/pairwise-match';
import { DEFAULT_FPFH_RADIUS_SPACINGS, prepareFragment, runSpacing, type FragmentInput, type PreparedFragment } from '../../core/geometry/proposals/prepared-fragment';
import { applyToPoints, displacementAt, rotationErrorDegrees, type RigidTransform } from '../../core/geometry/registration/rigid-transform';
import { axisAgreement } from '../../core/geometry/registration/score';
import { screenInterlock } from '../../core/geometry/proposals/screen-measures';
import type { TruthFragment, TruthJoin } from './face-pair-study';
import { loadCached } from './pairwise.bench';

const f = (x: number, d = 2): string => (Number.isFinite(x) ? x.toFixed(d) : '-');
function analysed(dir: string, no: string): FragmentInput | null {
  try { return loadCached(join(dir, 'scans', `${no}.ply`)); } catch { return null; }
}
let c2 = 0;
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
console.log(`c2 joins ${c2}`);
