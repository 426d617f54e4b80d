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
 * bit), so two versions of the code can be compared with `cmp`.
 */
import { readdirSync, writeFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import { byFragmentPair, candidateFacePairs, DEFAULT_K, type IndexedFace } from '../../core/geometry/proposals/candidate-index';
import { DEFAULT_MATCH_PARAMETERS, fineShortlist, fineTransform, matchFragments, screenFacePair, scoredSide, type CoarseMotion, type MatchTrace } from '../../core/geometry/proposals/pairwise-match';
import { assemblePrepared } from '../../core/geometry/proposals/prepared-fragment';
import { readFragment, readPrepared, readTraits } from '../../core/jobs/fragment-cache';
import { runSampling } from '../../core/host/proposals/describe-faces';
import { deferredScore } from '../../core/geometry/registration/score';

const dir = process.argv[2];
const out = process.argv[3];
const maxPairs = Number(process.env.KNITBONE_PROFILE_PAIRS ?? Infinity);
const cpu = (): number => { const u = process.cpuUsage(); return (u.user + u.system) / 1e6; };
const keys = readdirSync(dir).filter((f) => /^[0-9a-f]{32}\.json$/.test(f)).map((f) => f.slice(0, 32)).sort();
const cached = keys.map((k) => ({ key: k, f: readFragment(dir, k) })).filter((x): x is { key: string; f: NonNullable<ReturnType<typeof readFragment>> } => !!x.f);
const sampling = runSampling(cached.map((x) => x.f.summary));
const faces: IndexedFace[] = [];
cached.forEach((x, fi) => readTraits(dir, x.key, sampling)!.traits.forEach((traits, face) => faces.push({ fragment: fi, face, traits })));
const all = [...byFragmentPair(candidateFacePairs(faces, { k: DEFAULT_K })).values()];
const stride = Math.max(1, Math.floor(all.length / Math.min(maxPairs, all.length)));
const grouped = all.filter((_, i) => i % stride === 0).slice(0, maxPairs);
let t = cpu();
const prepared = cached.map((x) => assemblePrepared(x.f.input, readPrepared(dir, x.key, sampling)!));
const prepCpu = cpu() - t;
const results: Array<{ pair: string; matches: unknown[] }> = [];
let facePairs = 0;
t = cpu();
for (const list of grouped) {
  const a = prepared[list[0].a], b = prepared[list[0].b];
  const pairs = list.map((c): [number, number] => [c.faceA, c.faceB]);
  facePairs += pairs.length;
  const matches = matchFragments(a, b, DEFAULT_MATCH_PARAMETERS, pairs, 3, 0.05);
  results.push({ pair: `${cached[list[0].a].key}|${cached[list[0].b].key}`, matches });
}
const matchCpu = cpu() - t;
// KNITBONE_STAGES=1: every face pair screened once more with the CPU ms of each screen step
const stages: Record<string, number> = {};
if (process.env.KNITBONE_STAGES === '1') {
  for (const list of grouped) {
    const a = prepared[list[0].a], b = prepared[list[0].b];
    const screened: Array<{ i: number; j: number; motion: CoarseMotion }> = [];
    for (const c of list) for (const motion of screenFacePair(a, c.faceA, b, c.faceB, DEFAULT_MATCH_PARAMETERS, { coarse: [], refined: [], kept: [], times: stages } satisfies MatchTrace)) screened.push({ i: c.faceA, j: c.faceB, motion });
    // the fine step and the score of every shortlisted motion (completed too), as matchFragments runs them
    const ms = (): number => { const u = process.cpuUsage(); return (u.user + u.system) / 1000; };
    const add = (k: string, t0: number): void => { stages[k] = (stages[k] ?? 0) + ms() - t0; };
    for (const s of fineShortlist(a, b, screened, DEFAULT_MATCH_PARAMETERS)) {
      let t0 = ms();
      const T = fineTransform(a, s.i, b, s.j, s.motion.transform, DEFAULT_MATCH_PARAMETERS);
      add('fine icp', t0);
      const FA = a.faces[s.i], FB = b.faces[s.j];
      t0 = ms();
      const d = deferredScore(scoredSide(a, FA), scoredSide(b, FB), T, { contactTolerance: DEFAULT_MATCH_PARAMETERS.contactToleranceSpacings * spacing(), spacing: spacing() });
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
