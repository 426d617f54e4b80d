/**
 * Why `knitbone propose` finds fewer true joins than the pairwise benchmark, per true join of
 * one generated assemblage: the best motion over every face pair of the fragment pair through
 * each face pair's own fine step (as pairwise.bench.ts) against the fragment pair's fine
 * shortlist (matchFragments, as the propose worker). Usage:
 *   npx tsx tests/bench/propose-gap.ts <generated-dir>[,<dir>...] [params-json]
 * KNITBONE_PATCH_OPTIONS='{"minShare":0.05}' changes how faces are split into patches (prepared-fragment.ts).
 * SKIP_PF=1 leaves out the per-face-pair side, SKIP_SL=1 the shortlist side; QUIET=1 prints only the totals.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { matchFacePair, matchFragments, distinctBest, DEFAULT_MATCH_PARAMETERS, type FaceMatch } from '../../core/geometry/proposals/pairwise-match';
import { prepareFragment, runSpacing, DEFAULT_FPFH_RADIUS_SPACINGS, type PreparedFragment } from '../../core/geometry/proposals/prepared-fragment';
import { invert } from '../../core/geometry/registration/rigid-transform';
import type { FragmentInput } from '../../core/geometry/proposals/prepared-fragment';
import { loadCached } from './pairwise.bench';
import { isCorrectMotion } from './correct-motion';

interface TruthJoin { a: string; b: string; type: string; pattern: string; survivingFraction: number; contactAreaMm2?: number; transformBToA: number[] }
const [dirs, extra] = process.argv.slice(2);
let perFace = 0, shortlist = 0, perFaceOrigin = 0, cpuPF = 0, cpuSL = 0, joins = 0;
for (const dir of dirs.split(',')) {
const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { fragments: Array<{ catalogueNo: string }>; joins: TruthJoin[] };
const inputs = new Map<string, FragmentInput>();
for (const fr of truth.fragments) {
  try { inputs.set(fr.catalogueNo, loadCached(join(dir, 'scans', `${fr.catalogueNo}.ply`))); } catch { /* refused */ }
}
const spacing = runSpacing([...inputs.values()].flatMap((x) => x.faces.map((y) => y.area ?? 0)));
const params = { ...DEFAULT_MATCH_PARAMETERS, ...(extra ? JSON.parse(extra) : {}) };
const prepared = new Map<string, PreparedFragment>();
const prep = (no: string): PreparedFragment => prepared.get(no) ?? prepared.set(no, prepareFragment(inputs.get(no)!, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS, ...(process.env.KNITBONE_PATCH_OPTIONS ? { patchOptions: JSON.parse(process.env.KNITBONE_PATCH_OPTIONS) as object } : {}) })).get(no)!;
const eligible = truth.joins.filter((j) => j.type === 'conjoin' && j.survivingFraction >= 0.3 && inputs.has(j.a) && inputs.has(j.b));
joins += eligible.length;
const ok = (m: FaceMatch | undefined, t: number[], c: [number, number, number]): boolean => !!m && isCorrectMotion(m.transform, t, c);
for (const j of eligible) {
  const A = prep(j.a), B = prep(j.b);
  const t = j.transformBToA;
  let c0 = process.cpuUsage();
  const all: FaceMatch[] = [];
  if (!process.env.SKIP_PF) for (let i = 0; i < A.faces.length; i++) for (let k = 0; k < B.faces.length; k++) all.push(...matchFacePair(A, i, B, k, params));
  const pf = distinctBest(all, 2 * spacing)[0];
  let c1 = process.cpuUsage(c0); cpuPF += (c1.user + c1.system) / 1e6;
  c0 = process.cpuUsage();
  const sl = process.env.SKIP_SL ? undefined : matchFragments(A, B, params)[0];
  c1 = process.cpuUsage(c0); cpuSL += (c1.user + c1.system) / 1e6;
  const okPF = ok(pf, t, B.centroid), okSL = ok(sl, t, B.centroid), okO = ok(pf, t, [0, 0, 0]);
  perFace += +okPF; shortlist += +okSL; perFaceOrigin += +okO;
  const anyCorrect = all.filter((m) => ok(m, t, B.centroid)).sort((p, q) => q.score - p.score)[0];
  if (!process.env.QUIET) console.log(`${dir.split('/').pop()} ${j.a}|${j.b} ${j.pattern} area ${j.contactAreaMm2} faces ${A.faces.length}x${B.faces.length} perFace ${okPF ? 'ok' : '--'} ${pf?.score.toFixed(2)} shortlist ${okSL ? 'ok' : '--'} ${sl?.score.toFixed(2)} bestCorrect ${anyCorrect?.score.toFixed(2) ?? '-'} originCrit ${okO ? 'ok' : '--'}`);
}
}
console.log(`${joins} true joins: best of pair per face pair ${perFace} (origin criterion ${perFaceOrigin}), fragment shortlist ${shortlist}; CPU s ${cpuPF.toFixed(1)} vs ${cpuSL.toFixed(1)}`);
void invert;
