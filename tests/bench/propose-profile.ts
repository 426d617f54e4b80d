/**
 * The alignment step of `knitbone propose`, in one thread, for profiling and for checking that a
 * speed change leaves results as they were: `npx tsx tests/bench/propose-profile.ts DIR [OUT.json]`.
 * Fragments of a `knitbone demo` folder are analysed (cached in the temp folder), prepared at the
 * run's spacing, pruned by the candidate index as propose does, and each fragment pair goes
 * through matchFragments split into its stages (screen every face pair, shortlist, fine step).
 * Prints CPU seconds per stage and per face pair; OUT.json gets every fragment pair's best 3.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import { join } from 'node:path';
import { DEFAULT_MATCH_PARAMETERS, distinctBest, fineShortlist, refineFacePair, screenFacePair, type CoarseMotion, type FaceMatch } from '../../core/geometry/proposals/pairwise-match';
import { DEFAULT_FPFH_RADIUS_SPACINGS, prepareFragment } from '../../core/geometry/proposals/prepared-fragment';
import { candidateGroups, readStudyScans } from './study-assemblage';
import { displacementAt, invert as invertRigid, rotationErrorDegrees } from '../../core/geometry/registration/rigid-transform';

const dir = process.argv[2];
const out = process.argv[3];
const maxPairs = Number(process.env.KNITBONE_PROFILE_PAIRS ?? Infinity);
interface TruthJoin { a: string; b: string; type: string; survivingFraction: number; transformBToA: number[] }
const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { fragments: Array<{ catalogueNo: string }>; joins: TruthJoin[] };
const { nos, inputs, spacing } = readStudyScans(dir);
const cpu = (): number => { const u = process.cpuUsage(); return (u.user + u.system) / 1e6; };
let t = cpu();
const prepared = inputs.map((x) => prepareFragment(x, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS }));
const prepCpu = cpu() - t;
const grouped = candidateGroups(prepared).slice(0, maxPairs);
const params = { ...DEFAULT_MATCH_PARAMETERS, ...(JSON.parse(process.env.KNITBONE_PROFILE_PARAMS ?? '{}') as object) };
let screenCpu = 0, fineCpu = 0, facePairs = 0, fineRuns = 0;
const results: Record<string, Array<{ score: number; faceA: number; faceB: number; transform: number[] }>> = {};
for (const list of grouped) {
  const a = prepared[list[0].a], b = prepared[list[0].b];
  t = cpu();
  const screened: Array<{ i: number; j: number; motion: CoarseMotion }> = [];
  for (const c of list) for (const motion of screenFacePair(a, c.faceA, b, c.faceB, params)) screened.push({ i: c.faceA, j: c.faceB, motion });
  facePairs += list.length;
  const t1 = cpu();
  screenCpu += t1 - t;
  const all: FaceMatch[] = [];
  for (const s of fineShortlist(a, b, screened, params)) { all.push(...refineFacePair(a, s.i, b, s.j, [s.motion], params)); fineRuns++; }
  const best = distinctBest(all, 2 * spacing).slice(0, 3);
  fineCpu += cpu() - t1;
  results[`${nos[list[0].a]}|${nos[list[0].b]}`] = best.map((m) => ({ score: m.score, faceA: m.faceA, faceB: m.faceB, transform: [...m.transform] }));
}
// recall as the pairwise benchmark counts it: a true join (at least 30% of the break surviving)
// whose fragment pair's best motion is within 5 degrees and 5 mm (at B's centroid) of the truth,
// and that pair among the 3 best scored pairs of either piece
const index = new Map(nos.map((no, i) => [no, i]));
const bestOf = new Map<string, number>();
for (const [k, list] of Object.entries(results)) if (list.length) bestOf.set(k, list[0].score);
const top3 = (no: string): string[] => [...bestOf.entries()].filter(([k]) => k.split('|').includes(no)).sort((x, y) => y[1] - x[1]).slice(0, 3).map(([k]) => k);
let eligible = 0, asBest = 0, inTop3 = 0;
for (const j of truth.joins) {
  if (j.type !== 'conjoin' || j.survivingFraction < 0.3 || !index.has(j.a) || !index.has(j.b)) continue;
  eligible++;
  const swap = index.get(j.a)! > index.get(j.b)!;
  const k = swap ? `${j.b}|${j.a}` : `${j.a}|${j.b}`;
  const m = results[k]?.[0];
  if (!m) continue;
  const want = swap ? invertRigid(j.transformBToA) : j.transformBToA;
  const B = prepared[index.get(swap ? j.a : j.b)!];
  if (!(rotationErrorDegrees(m.transform, want) < 5 && displacementAt(m.transform, want, B.centroid) < 5)) continue;
  asBest++;
  if (top3(j.a).includes(k) || top3(j.b).includes(k)) inTop3++;
}
process.stdout.write(`true joins ${eligible}: best of their pair ${asBest}, in the top 3 of a piece ${inTop3}\n`);
process.stdout.write(`spacing ${spacing}  fragments ${prepared.length}  fragment pairs ${grouped.length}  face pairs ${facePairs}  fine runs ${fineRuns}  load ${loadavg()[0].toFixed(2)}\n`);
process.stdout.write(`CPU s: prepare ${prepCpu.toFixed(1)}  screen ${screenCpu.toFixed(1)}  fine ${fineCpu.toFixed(1)}  per face pair ${((1000 * (screenCpu + fineCpu)) / facePairs).toFixed(2)} ms (screen ${((1000 * screenCpu) / facePairs).toFixed(2)}, fine ${((1000 * fineCpu) / Math.max(1, fineRuns)).toFixed(2)} per fine run)\n`);
if (out) writeFileSync(out, JSON.stringify(results));
