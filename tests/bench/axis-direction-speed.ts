/**
 * The screen's axis-direction vote alone, for speed work that must keep its answers:
 * `npx tsx tests/bench/axis-direction-speed.ts <catalogue>.match-cache [OUT.json]` runs
 * searchAlongAxisDirections, as the screen calls it, on every candidate face pair of two shaft
 * pieces among KNITBONE_PROFILE_PAIRS fragment pairs (evenly strided, as match-speed.ts chooses
 * them), KNITBONE_ROUNDS times (default 3), and prints the least CPU seconds of a round; OUT.json
 * gets every hypothesis (transforms to the last bit, support) so that two versions compare with `cmp`.
 */
import { writeFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import { DEFAULT_MATCH_PARAMETERS } from '../../core/geometry/proposals/pairwise-match';
import { matchCachePairs } from './match-cache-pairs';
import { searchAlongAxisDirections, type DirectionHypothesis } from '../../core/geometry/registration/axis-direction-search';

const dir = process.argv[2];
const out = process.argv[3];
const maxPairs = Number(process.env.KNITBONE_PROFILE_PAIRS ?? 200);
const rounds = Number(process.env.KNITBONE_ROUNDS ?? 3);
const params = DEFAULT_MATCH_PARAMETERS;
const cpu = (): number => { const u = process.cpuUsage(); return (u.user + u.system) / 1e6; };
const { grouped, assemble: get } = matchCachePairs(dir, maxPairs);
const jobs: Array<() => DirectionHypothesis[]> = [];
for (const list of grouped) {
  const a = get(list[0].a), b = get(list[0].b);
  if (!a.axis || !b.axis) continue;
  const spacing = Math.max(a.spacing, b.spacing);
  for (const c of list) {
    const FA = a.faces[c.faceA], FB = b.faces[c.faceB];
    jobs.push(() => searchAlongAxisDirections(a.axis!.direction, FA.points, FA.normals, b.axis!.direction, FB.points, FB.normals, { spacing, peaks: params.directionPeaks, maxSamples: params.icpSamples, tiltsDeg: params.directionTiltsDeg }));
  }
}
let least = Infinity;
let results: DirectionHypothesis[][] = [];
for (let r = 0; r < rounds; r++) {
  const t = cpu();
  results = jobs.map((f) => f());
  least = Math.min(least, cpu() - t);
}
process.stdout.write(`${jobs.length} face pairs of two shaft pieces; least CPU s of ${rounds} rounds ${least.toFixed(3)}; load ${loadavg()[0].toFixed(1)}\n`);
if (out) writeFileSync(out, JSON.stringify(results));
