/**
 * Precision of the fine step on the true joins of generated assemblages, for variants of the
 * matching parameters side by side (beside coarse-miss-exp.ts). For every true join, every face
 * pair of its fragment pair is screened once with the default parameters (as the pairwise
 * benchmark does); then for each variant every screened motion goes through the fine step
 * (refineFacePair), and the best motion of the fragment pair, when correct (within 5 degrees
 * and 5 mm at B's centroid), gives a rotation and translation error. Also the fine step started
 * at the truth itself on the face pair that holds most of the break (how far the fine step's
 * own optimum lies from the truth). Prints median and 95th percentile per variant, the CPU of
 * the fine step, and the joins with the largest rotation errors.
 *
 *   npx tsx tests/bench/fine-precision-exp.ts <demo-dir>[,<demo-dir>...] '[{"name":"base","p":{}}]'
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { loadavg } from 'node:os';
import { DEFAULT_MATCH_PARAMETERS, distinctBest, faceOverlapUnder, refineFacePair, screenFacePair, type CoarseMotion, type FaceMatch, type MatchParameters } from '../../core/geometry/proposals/pairwise-match';
import { DEFAULT_FPFH_RADIUS_SPACINGS, prepareFragment, runSpacing, type PreparedFragment } from '../../core/geometry/proposals/prepared-fragment';
import { displacementAt, rotationErrorDegrees, type RigidTransform } from '../../core/geometry/registration/rigid-transform';
import type { TruthFragment, TruthJoin } from './face-pair-study';
import { loadCached } from './pairwise.bench';
import type { FragmentInput } from '../../core/geometry/proposals/prepared-fragment';

/** The analysis as the pairwise benchmark caches it (same cache, same spacing), or null when refused. */
function analysed(dir: string, no: string): { input: FragmentInput } | null {
  try {
    return { input: loadCached(join(dir, 'scans', `${no}.ply`)) };
  } catch {
    return null;
  }
}

const variants = JSON.parse(process.argv[3] ?? '[{"name":"base","p":{}}]') as Array<{ name: string; p: Partial<MatchParameters> }>;
const q = (xs: number[], p: number): number => (xs.length ? [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor(p * xs.length))] : NaN);
const f = (x: number, d = 2): string => (Number.isFinite(x) ? x.toFixed(d) : '-');
interface Row { join: string; rot: number; trans: number; ok: boolean; truthRot: number; truthTrans: number; area: number; score: number; interlock: number; nA: number; nB: number }
const rows = variants.map(() => [] as Row[]);
const cpu = variants.map(() => 0);
const c0 = process.cpuUsage();
for (const dir of process.argv[2].split(',')) {
  const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { fragments: TruthFragment[]; joins: Array<TruthJoin & { contactAreaMm2?: number }> };
  const frags = new Map(truth.fragments.map((x) => [x.catalogueNo, analysed(dir, x.catalogueNo)]));
  const spacing = runSpacing([...frags.values()].flatMap((x) => (x ? x.input.faces.map((y) => y.area ?? 0) : [])));
  const prepared = new Map<string, PreparedFragment>();
  const prep = (no: string): PreparedFragment => prepared.get(no) ?? prepared.set(no, prepareFragment(frags.get(no)!.input, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS })).get(no)!;
  for (const j of truth.joins) {
    if (j.type !== 'conjoin' || j.survivingFraction < 0.3 || !frags.get(j.a) || !frags.get(j.b)) continue;
    const A = prep(j.a), B = prep(j.b);
    const T = j.transformBToA as RigidTransform;
    const screened: Array<{ i: number; j: number; m: CoarseMotion }> = [];
    let held: [number, number] = [0, 0], heldShare = -1;
    for (let fa = 0; fa < A.faces.length; fa++) for (let fb = 0; fb < B.faces.length; fb++) {
      for (const m of screenFacePair(A, fa, B, fb)) screened.push({ i: fa, j: fb, m });
      const o = faceOverlapUnder(A, fa, B, fb, T);
      if (o.share > heldShare) { heldShare = o.share; held = [fa, fb]; }
    }
    variants.forEach((v, vi) => {
      const params = { ...DEFAULT_MATCH_PARAMETERS, ...v.p };
      const t0 = process.cpuUsage();
      const all: FaceMatch[] = [];
      for (const s of screened) all.push(...refineFacePair(A, s.i, B, s.j, [s.m], params));
      const d = process.cpuUsage(t0);
      cpu[vi] += (d.user + d.system) / 1e6;
      const best = distinctBest(all, 2 * spacing)[0];
      const [fromTruth] = refineFacePair(A, held[0], B, held[1], [{ transform: T, overlap: 1 }], params);
      const rot = best ? rotationErrorDegrees(best.transform, T) : NaN, trans = best ? displacementAt(best.transform, T, B.centroid) : NaN;
      rows[vi].push({
        join: `${dir.split('/').pop()} ${j.a}|${j.b} ${j.pattern}`, rot, trans, ok: rot < 5 && trans < 5,
        truthRot: fromTruth ? rotationErrorDegrees(fromTruth.transform, T) : NaN, truthTrans: fromTruth ? displacementAt(fromTruth.transform, T, B.centroid) : NaN,
        area: (j.contactAreaMm2 ?? NaN) * j.survivingFraction, score: best?.score ?? 0, interlock: best?.interlock ?? 0,
        nA: A.faces[held[0]].points.length / 3, nB: B.faces[held[1]].points.length / 3,
      });
    });
  }
}
variants.forEach((v, vi) => {
  const ok = rows[vi].filter((r) => r.ok);
  const all = rows[vi];
  console.log(`${v.name}: correct ${ok.length}/${all.length}; rot med ${f(q(ok.map((r) => r.rot), 0.5))} p95 ${f(q(ok.map((r) => r.rot), 0.95))} deg, trans med ${f(q(ok.map((r) => r.trans), 0.5))} p95 ${f(q(ok.map((r) => r.trans), 0.95))} mm; from truth rot med ${f(q(all.map((r) => r.truthRot), 0.5))} p95 ${f(q(all.map((r) => r.truthRot), 0.95))}, trans med ${f(q(all.map((r) => r.truthTrans), 0.5))} p95 ${f(q(all.map((r) => r.truthTrans), 0.95))}; fine CPU ${f(cpu[vi], 1)} s`);
  if (process.env.KNITBONE_FINE_VERBOSE) for (const r of [...ok].sort((p, s) => s.rot - p.rot).slice(0, 12)) console.log(`   ${r.join} rot ${f(r.rot)} trans ${f(r.trans)} (from truth ${f(r.truthRot)} / ${f(r.truthTrans)}) contact ${f(r.area, 0)} mm2 faces ${r.nA}/${r.nB} interlock ${f(r.interlock, 3)} score ${f(r.score)}`);
});
// joins on which the variants disagree (correct or not)
rows[0].forEach((r, k) => {
  const marks = rows.map((rs) => (rs[k].ok ? 'ok' : '--'));
  if (new Set(marks).size > 1) console.log(`differs: ${r.join} ${marks.join(' ')} (${rows.map((rs) => `${f(rs[k].rot, 1)}/${f(rs[k].trans, 1)} s${f(rs[k].score)}`).join(', ')})`);
});
const d = process.cpuUsage(c0);
console.log(`total CPU ${((d.user + d.system) / 1e6).toFixed(1)} s (load ${loadavg()[0].toFixed(2)})`);
