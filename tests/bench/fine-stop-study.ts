/**
 * Where a propose worker's fine step spends its CPU and which shortlisted motions it pays off on:
 * every candidate fragment pair of the true joins and an even stride of all others (as
 * match-truth-ab.ts) goes through `matchFragments(a, b, params, facePairs, 3, 0.05)`'s path with
 * each step timed (screen, the fine step's k-d rounds, its BVH rounds, the deferred score, the
 * rest: completing and polishing), and one row per shortlisted motion is written: its place in
 * the shortlist (and whether it holds a face-pair place), the screen's overlap, after the k-d rounds
 * the share of B's face samples within 1.5 spacings of A's face samples, the trimmed RMS and kept
 * pairs, after the BVH rounds the deferred score's upper bound and its completed score (completed
 * here for every motion, outside the timings), the trimmed RMS after the first KNITBONE_STUDY_KD_ROUNDS
 * (5,10) k-d rounds as well (outside the timings), whether it is correct (5 degrees, 5 mm) on a true
 * pair and where it ends in the pair's answer (-1: not in it).
 *   npx tsx tests/bench/fine-stop-study.ts <catalogue>.match-cache out.jsonl
 * KNITBONE_PROFILE_PAIRS: the stride over all candidate pairs (as match-truth-ab.ts, 200);
 * KNITBONE_PROFILE_PARAMS='{json}': match parameters over the defaults.
 */
import { writeFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import { DEFAULT_MATCH_PARAMETERS, bestDistinct, fineBvhRounds, fineKdRounds, fineShortlist, polishRanked, screenFacePairs, scoredSide, type DeferredMatch, type FaceMatch, type MatchParameters } from '../../core/geometry/proposals/pairwise-match';
import { deferredScore } from '../../core/geometry/registration/score';
import type { RigidTransform } from '../../core/geometry/registration/rigid-transform';
import type { PreparedFragment } from '../../core/geometry/proposals/prepared-fragment';
import { matchCacheTruth } from './match-cache-truth';
import { isCorrectMotion } from './correct-motion';

const dir = process.argv[2];
const outFile = process.argv[3] ?? 'fine-stop-study.jsonl';
const maxPairs = Number(process.env.KNITBONE_PROFILE_PAIRS ?? 200);
const params: MatchParameters = { ...DEFAULT_MATCH_PARAMETERS, ...(JSON.parse(process.env.KNITBONE_PROFILE_PARAMS ?? '{}') as Partial<MatchParameters>) };
const { nos, joins, grouped, assemble } = matchCacheTruth(dir, Infinity);
const stride = Math.max(1, Math.floor(grouped.length / Math.min(maxPairs, grouped.length)));
// the trimmed RMS after these k-d rounds as well (the same first rounds as the whole run's: an ICP's rounds depend only on the start)
const KD_ROUNDS_AT = (process.env.KNITBONE_STUDY_KD_ROUNDS ?? '5,10').split(',').map(Number);
const ms = (): number => { const u = process.cpuUsage(); return (u.user + u.system) / 1e3; };

/** Share of B's face samples that T puts within `within` of A's face samples. */
function nearShare(a: PreparedFragment, fa: number, b: PreparedFragment, fb: number, T: RigidTransform, within: number): number {
  const FA = a.faces[fa], FB = b.faces[fb];
  const n = FB.points.length / 3, q = [0, 0, 0];
  let k = 0, hint = -1;
  for (let i = 0; i < n; i++) {
    const x = FB.points[3 * i], y = FB.points[3 * i + 1], z = FB.points[3 * i + 2];
    q[0] = T[0] * x + T[1] * y + T[2] * z + T[3];
    q[1] = T[4] * x + T[5] * y + T[6] * z + T[7];
    q[2] = T[8] * x + T[9] * y + T[10] * z + T[11];
    const j = FA.tree.someWithin(q, within * within, hint);
    if (j >= 0) { k++; hint = j; }
  }
  return k / Math.max(1, n);
}

const rows: string[] = [];
const sum = { screen: 0, kd: 0, bvh: 0, deferred: 0, rest: 0 };
const sumOthers = { screen: 0, kd: 0, bvh: 0, deferred: 0, rest: 0 };
let studied = 0;
grouped.forEach((list, idx) => {
  const key = `${nos[list[0].a]}|${nos[list[0].b]}`;
  const want = joins.get(key);
  const strided = idx % stride === 0;
  if (!strided && !want) return;
  studied++;
  const a = assemble(list[0].a), b = assemble(list[0].b);
  const spacing = Math.max(a.spacing, b.spacing);
  const pairs = list.map((c): [number, number] => [c.faceA, c.faceB]);
  const t: Record<keyof typeof sum, number> = { screen: 0, kd: 0, bvh: 0, deferred: 0, rest: 0 };
  let t0 = ms();
  const screened = screenFacePairs(a, b, pairs, params);
  const shortlist = fineShortlist(a, b, screened, params);
  t.screen += ms() - t0;
  const plain = fineShortlist(a, b, screened, { ...params, fineFacePairPlaces: 0 }).length;
  const origin = new Map<FaceMatch, [number, number]>();
  const info: Array<Record<string, unknown>> = [];
  const fine = shortlist.map((s, k): DeferredMatch => {
    const FA = a.faces[s.i], FB = b.faces[s.j];
    t0 = ms();
    const mid = fineKdRounds(a, s.i, b, s.j, s.motion.transform, params);
    const t1 = ms();
    const transform = fineBvhRounds(a, s.i, b, s.j, mid.transform, params);
    const t2 = ms();
    const score = deferredScore(scoredSide(a, FA), scoredSide(b, FB), transform, { contactTolerance: params.contactToleranceSpacings * spacing, spacing });
    const t3 = ms();
    t.kd += t1 - t0; t.bvh += t2 - t1; t.deferred += t3 - t2;
    const full = score.complete();
    info.push({
      pair: key, true: !!want, strided, k, n: shortlist.length, place: k >= plain, i: s.i, j: s.j, nA: FA.points.length / 3, nB: FB.points.length / 3,
      overlap: s.motion.overlap, nearStart: nearShare(a, s.i, b, s.j, s.motion.transform, 1.5 * spacing), nearKd: nearShare(a, s.i, b, s.j, mid.transform, 1.5 * spacing),
      kdRms: mid.rms / spacing, kdRmsAt: KD_ROUNDS_AT.map((r) => fineKdRounds(a, s.i, b, s.j, s.motion.transform, { ...params, fineIterations: r }).rms / spacing), kdInliers: mid.inliers, kdIts: mid.iterations, nearEnd: nearShare(a, s.i, b, s.j, transform, 1.5 * spacing),
      upper: score.upper, contact: score.contactFraction, score: full.score, correct: !!want && isCorrectMotion(transform, want, b.centroid),
      msKd: t1 - t0, msBvh: t2 - t1, msDef: t3 - t2,
    });
    return { transform, faceA: FA.parent, faceB: FB.parent, score, i: s.i, j: s.j };
  });
  t0 = ms();
  const completed: Array<FaceMatch | undefined> = new Array(fine.length);
  const polished = new Map<FaceMatch, FaceMatch>();
  let out: FaceMatch[] = [];
  for (let draw = Math.max(3, params.polishBest); ; ) {
    const best = bestDistinct(fine, draw, 2 * spacing, 0.05, origin, completed);
    out = polishRanked(a, b, best, origin, params, spacing, polished);
    if (out.length >= 3 || best.length < draw) { out = out.slice(0, 3); break; }
    draw += 3 - out.length;
  }
  t.rest += ms() - t0;
  info.forEach((r, k) => {
    const d = completed[k];
    const at = d ? out.findIndex((o) => o === d || polished.get(d) === o) : -1;
    rows.push(JSON.stringify({ ...r, out: at, outCorrect: at >= 0 && !!want && isCorrectMotion(out[at].transform, want, b.centroid) }));
  });
  if (!shortlist.length) rows.push(JSON.stringify({ pair: key, true: !!want, strided, k: -1, n: 0 }));
  for (const s of Object.keys(sum) as Array<keyof typeof sum>) { sum[s] += t[s]; if (strided && !want) sumOthers[s] += t[s]; }
  if (studied % 50 === 0) process.stderr.write(`${studied} pairs, load ${loadavg()[0].toFixed(2)}\n`);
});
writeFileSync(outFile, rows.join('\n') + '\n');
const fmt = (x: typeof sum): string => Object.entries(x).map(([k, v]) => `${k} ${(v / 1000).toFixed(2)}`).join(', ');
process.stdout.write(`fragment pairs ${studied}, load ${loadavg()[0].toFixed(2)}\nCPU s all: ${fmt(sum)}\nCPU s strided pairs that are not joins: ${fmt(sumOthers)}\n`);
