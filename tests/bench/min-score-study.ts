/**
 * How early a propose worker could tell that a fragment pair will not reach the run's minimum
 * score: `npx tsx tests/bench/min-score-study.ts <catalogue>.match-cache OUT.jsonl`. Fragments,
 * spacing and face traits come from a catalogue's match cache folder (filled by `knitbone import
 * scans`), candidate pairs as a propose run makes them (KNITBONE_PROFILE_PAIRS: at most this
 * many, evenly strided over all; KNITBONE_PROFILE_SKIP: from this one). Each fragment pair goes
 * the way matchFragments with `keep` goes; per pair one JSON line: the shortlisted motions in
 * shortlist order with their screen overlap and interlock, the deferred score's upper bound and
 * contact at the screened motion (before the fine step) and after it, and the pair's exact best
 * score (every motion completed).
 */
import { readdirSync, writeFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import { byFragmentPair, candidateFacePairs, DEFAULT_K, type IndexedFace } from '../../core/geometry/proposals/candidate-index';
import { bestDistinct, DEFAULT_MATCH_PARAMETERS, fineShortlist, fineTransform, screenFacePair, type CoarseMotion, type DeferredMatch } from '../../core/geometry/proposals/pairwise-match';
import { assemblePrepared, type PreparedFace, type PreparedFragment } from '../../core/geometry/proposals/prepared-fragment';
import { readFragment, readPrepared, readTraits } from '../../core/jobs/fragment-cache';
import { runSampling } from '../../core/host/proposals/describe-faces';
import { deferredScore, type ScoredSide } from '../../core/geometry/registration/score';
import { screenInterlock } from '../../core/geometry/proposals/screen-measures';

const dir = process.argv[2];
const out = process.argv[3];
const maxPairs = Number(process.env.KNITBONE_PROFILE_PAIRS ?? Infinity);
const skip = Number(process.env.KNITBONE_PROFILE_SKIP ?? 0);
// every fragment of the match cache, built from its stored parts as a propose worker builds it
const keys = readdirSync(dir).filter((f) => /^[0-9a-f]{32}\.json$/.test(f)).map((f) => f.slice(0, 32)).sort();
const cached = keys.map((k) => ({ key: k, f: readFragment(dir, k) })).filter((x): x is { key: string; f: NonNullable<ReturnType<typeof readFragment>> } => !!x.f);
const sampling = runSampling(cached.map((x) => x.f.summary));
const spacing = sampling.spacing;
const prepared = cached.map((x) => assemblePrepared(x.f.input, readPrepared(dir, x.key, sampling)!));
const faces: IndexedFace[] = [];
cached.forEach((x, fi) => readTraits(dir, x.key, sampling)!.traits.forEach((traits, face) => faces.push({ fragment: fi, face, traits })));
const all = [...byFragmentPair(candidateFacePairs(faces, { k: DEFAULT_K })).values()];
// an even stride over every candidate fragment pair (from the `skip`-th), at most maxPairs of them
const stride = Math.max(1, Math.floor(all.length / Math.min(maxPairs, all.length)));
const grouped = all.filter((_, i) => i >= skip && (i - skip) % stride === 0).slice(0, maxPairs);
const params = DEFAULT_MATCH_PARAMETERS;
const side = (f: PreparedFragment, face: PreparedFace): ScoredSide => ({ surface: f.surface, facePoints: face.points, faceNormals: face.normals, surfacePoints: f.surfacePoints, surfaceNormals: f.surfaceNormals, surfaceTree: f.surfaceTree, outline: face.outline, axis: f.axis });
const options = { contactTolerance: params.contactToleranceSpacings * spacing, spacing };
const lines: string[] = [];
for (const list of grouped) {
  const a = prepared[list[0].a], b = prepared[list[0].b];
  const screened: Array<{ i: number; j: number; motion: CoarseMotion }> = [];
  for (const c of list) for (const motion of screenFacePair(a, c.faceA, b, c.faceB, params)) screened.push({ i: c.faceA, j: c.faceB, motion });
  const shortlist = fineShortlist(a, b, screened, params);
  const motions = shortlist.map((s) => {
    const FA = a.faces[s.i], FB = b.faces[s.j];
    const pre = deferredScore(side(a, FA), side(b, FB), s.motion.transform, options);
    const T = fineTransform(a, s.i, b, s.j, s.motion.transform, params);
    const post = deferredScore(side(a, FA), side(b, FB), T, options);
    return { s, pre, T, post, interlock: screenInterlock(FA, FB, s.motion.transform, spacing) };
  });
  const deferred: DeferredMatch[] = motions.map((m) => ({ transform: m.T, faceA: a.faces[m.s.i].parent, faceB: b.faces[m.s.j].parent, score: m.post }));
  const best = bestDistinct(deferred, 3, 2 * spacing);
  const key = [cached[list[0].a].key, cached[list[0].b].key].sort().join('|');
  lines.push(JSON.stringify({
    pair: key, facePairs: list.length, screened: screened.length,
    best: best[0]?.score ?? null,
    motions: motions.map((m) => ({ overlap: m.s.motion.overlap, interlock: m.interlock, preUpper: m.pre.upper, preContact: m.pre.contactFraction, postUpper: m.post.upper, postContact: m.post.contactFraction })),
  }));
}
writeFileSync(out, lines.join('\n') + '\n');
process.stdout.write(`fragment pairs ${grouped.length}, spacing ${spacing}, load ${loadavg()[0].toFixed(2)}\n`);
