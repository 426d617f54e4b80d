/**
 * The aligning step of a propose run in one thread, for speed work that must not change results:
 * `npx tsx tests/bench/match-speed.ts <catalogue>.match-cache [OUT.json]`
 * (KNITBONE_STAGES=1: the screen and the fine step once more, with each step's CPU seconds;
 * there every shortlisted motion is completed, which a run does only for a few). Fragments, spacing and
 * face traits come from a catalogue's match cache folder (filled by `knitbone import scans`),
 * candidate pairs as a propose run makes them (KNITBONE_PROFILE_PAIRS: at most this many, evenly
 * strided over all; no size classes), and each fragment pair goes through
 * `matchFragments(a, b, params, facePairs, 3, 0.05)` as a propose worker runs it. Prints the CPU
 * seconds of the matching; OUT.json gets every pair's motions (scores and transforms to the last
 * bit), so two versions of the code can be compared with `cmp`. KNITBONE_PROFILE_PARAMS='{json}':
 * match parameters over the defaults; KNITBONE_COMPARE_PARAMS='{json}': every pair also matched
 * with these (the two runs of a pair back to back, so load hits both alike) and the paired CPU
 * seconds printed.
 */
import { writeFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import { DEFAULT_MATCH_PARAMETERS, type MatchParameters, fineShortlist, fineTransform, matchFragments, screenFacePair, scoredSide, type CoarseMotion, type MatchTrace } from '../../core/geometry/proposals/pairwise-match';
import { matchCachePairs } from './match-cache-pairs';
import { deferredScore } from '../../core/geometry/registration/score';
import { rotationErrorDegrees } from '../../core/geometry/registration/rigid-transform';

const dir = process.argv[2];
const out = process.argv[3];
const maxPairs = Number(process.env.KNITBONE_PROFILE_PAIRS ?? Infinity);
// KNITBONE_PROFILE_PARAMS: match parameters over the defaults (JSON)
const params: MatchParameters = { ...DEFAULT_MATCH_PARAMETERS, ...(JSON.parse(process.env.KNITBONE_PROFILE_PARAMS ?? '{}') as Partial<MatchParameters>) };
const cpu = (): number => { const u = process.cpuUsage(); return (u.user + u.system) / 1e6; };
const { cached, sampling, grouped, assemble } = matchCachePairs(dir, maxPairs);
let t = cpu();
const prepared = cached.map((_, i) => assemble(i));
const prepCpu = cpu() - t;
const results: Array<{ pair: string; matches: unknown[] }> = [];
let facePairs = 0;
t = cpu();
for (const list of grouped) {
  const a = prepared[list[0].a], b = prepared[list[0].b];
  const pairs = list.map((c): [number, number] => [c.faceA, c.faceB]);
  facePairs += pairs.length;
  const matches = matchFragments(a, b, params, pairs, 3, 0.05);
  results.push({ pair: `${cached[list[0].a].key}|${cached[list[0].b].key}`, matches });
}
const matchCpu = cpu() - t;
// KNITBONE_COMPARE_PARAMS: every pair matched once more with these parameters over the others,
// the two runs of a pair one after the other (which goes first alternates), so both see the same
// load; prints both CPU sums and how many pairs' best motions moved
if (process.env.KNITBONE_COMPARE_PARAMS) {
  const other = { ...params, ...(JSON.parse(process.env.KNITBONE_COMPARE_PARAMS) as Partial<MatchParameters>) };
  let mine = 0, theirs = 0, moved = 0, lost = 0, won = 0;
  grouped.forEach((list, k) => {
    const a = prepared[list[0].a], b = prepared[list[0].b];
    const pairs = list.map((c): [number, number] => [c.faceA, c.faceB]);
    const run = (p: MatchParameters): { cpu: number; best: ReturnType<typeof matchFragments>[number] | undefined } => { const t0 = cpu(); const m = matchFragments(a, b, p, pairs, 3, 0.05); return { cpu: cpu() - t0, best: m[0] }; };
    const [x, y] = k % 2 ? [run(params), run(other)] : (([q, r]) => [r, q])([run(other), run(params)]);
    mine += x.cpu; theirs += y.cpu;
    if (!!x.best !== !!y.best) { if (x.best) lost++; else won++; } else if (x.best && y.best && (rotationErrorDegrees(x.best.transform, y.best.transform) > 1 || Math.abs(x.best.score - y.best.score) > 0.01)) moved++;
  });
  process.stdout.write(`paired CPU s: parameters ${mine.toFixed(2)}, compared ${theirs.toFixed(2)} (${((100 * (theirs - mine)) / mine).toFixed(1)}%); best motion above the minimum only with the first ${lost}, only with the second ${won}, moved over 1 degree or 0.01 in score ${moved}\n`);
}
// KNITBONE_STAGES=1: every face pair screened once more with the CPU ms of each screen step (with
// KNITBONE_PROFILE_PARAMS's parameters)
const stages: Record<string, number> = {};
if (process.env.KNITBONE_STAGES === '1') {
  for (const list of grouped) {
    const a = prepared[list[0].a], b = prepared[list[0].b];
    const screened: Array<{ i: number; j: number; motion: CoarseMotion }> = [];
    for (const c of list) for (const motion of screenFacePair(a, c.faceA, b, c.faceB, params, { coarse: [], refined: [], kept: [], times: stages } satisfies MatchTrace)) screened.push({ i: c.faceA, j: c.faceB, motion });
    // the fine step and the score of every shortlisted motion (completed too), as matchFragments runs them
    const ms = (): number => { const u = process.cpuUsage(); return (u.user + u.system) / 1000; };
    const add = (k: string, t0: number): void => { stages[k] = (stages[k] ?? 0) + ms() - t0; };
    for (const s of fineShortlist(a, b, screened, params)) {
      let t0 = ms();
      const T = fineTransform(a, s.i, b, s.j, s.motion.transform, params);
      add('fine icp', t0);
      const FA = a.faces[s.i], FB = b.faces[s.j];
      t0 = ms();
      const d = deferredScore(scoredSide(a, FA), scoredSide(b, FB), T, { contactTolerance: params.contactToleranceSpacings * spacing(), spacing: spacing() });
      add('deferred score', t0);
      t0 = ms();
      d.complete();
      add('completing (every motion)', t0);
    }
  }
}
if (out) writeFileSync(out, JSON.stringify(results));
process.stdout.write(`fragment pairs ${grouped.length}, face pairs ${facePairs}, spacing ${spacing()}; CPU s: assembling ${prepCpu.toFixed(2)}, matching ${matchCpu.toFixed(2)}; load ${loadavg()[0].toFixed(2)}\n`);
if (Object.keys(stages).length) process.stdout.write(`steps, CPU s: ${Object.entries(stages).map(([k, v]) => `${k} ${(v / 1000).toFixed(2)}`).join(', ')}\n`);
function spacing(): number { return sampling.spacing; }
