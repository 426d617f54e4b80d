/**
 * What the matcher's speed studies (match-speed.ts, axis-direction-speed.ts,
 * screen-abandon-study.ts) read from an imported catalogue's match cache folder: its cached
 * fragments, the run's sampling, and the candidate face pairs a propose run would align
 * (k = DEFAULT_K, no size classes), grouped by fragment pair, at most `maxPairs` fragment pairs
 * evenly strided over all; `assemble(i)` builds fragment i from the cache (kept once built).
 */
import { readdirSync } from 'node:fs';
import { byFragmentPair, candidateFacePairs, DEFAULT_K, type FacePairCandidate, type IndexedFace } from '../../core/geometry/proposals/candidate-index';
import { assemblePrepared, type PreparedFragment } from '../../core/geometry/proposals/prepared-fragment';
import { readFragment, readPrepared, readTraits } from '../../core/jobs/fragment-cache';
import { runSampling } from '../../core/host/proposals/describe-faces';

export interface CachePairs {
  cached: Array<{ key: string; f: NonNullable<ReturnType<typeof readFragment>> }>;
  sampling: ReturnType<typeof runSampling>;
  grouped: FacePairCandidate[][];
  assemble: (i: number) => PreparedFragment;
}

export function matchCachePairs(dir: string, maxPairs: number): CachePairs {
  const keys = readdirSync(dir).filter((f) => /^[0-9a-f]{32}\.json$/.test(f)).map((f) => f.slice(0, 32)).sort();
  const cached = keys.map((k) => ({ key: k, f: readFragment(dir, k) })).filter((x): x is { key: string; f: NonNullable<ReturnType<typeof readFragment>> } => !!x.f);
  const sampling = runSampling(cached.map((x) => x.f.summary));
  const faces: IndexedFace[] = [];
  cached.forEach((x, fi) => readTraits(dir, x.key, sampling)!.traits.forEach((traits, face) => faces.push({ fragment: fi, face, traits })));
  const all = [...byFragmentPair(candidateFacePairs(faces, { k: DEFAULT_K })).values()];
  const stride = Math.max(1, Math.floor(all.length / Math.min(maxPairs, all.length)));
  const grouped = all.filter((_, i) => i % stride === 0).slice(0, maxPairs);
  const built = new Map<number, PreparedFragment>();
  const assemble = (i: number): PreparedFragment => {
    let p = built.get(i);
    if (!p) { p = assemblePrepared(cached[i].f.input, readPrepared(dir, cached[i].key, sampling)!); built.set(i, p); }
    return p;
  };
  return { cached, sampling, grouped, assemble };
}
