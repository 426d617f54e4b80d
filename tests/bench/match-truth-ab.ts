/**
 * Two sets of match parameters side by side on an imported catalogue's match cache, with the
 * generator's truth: every candidate fragment pair of the true joins (and KNITBONE_PROFILE_PAIRS
 * others, evenly strided) goes through `matchFragments(a, b, params, facePairs, 3, 0.05)` as a
 * propose worker runs it, once with each set, back to back (which goes first alternates), so the
 * load hits both alike.
 *   KNITBONE_PROFILE_PARAMS='{json}' KNITBONE_COMPARE_PARAMS='{json}' \
 *   npx tsx tests/bench/match-truth-ab.ts <catalogue>.match-cache
 * Prints the paired CPU seconds, the true pairs whose best motion is correct (5 degrees, 5 mm)
 * and at least 0.05 with each set (the joins gained and lost listed), and how many pairs' best
 * motion or score moved.
 */
import { loadavg } from 'node:os';
import { DEFAULT_MATCH_PARAMETERS, matchFragments, type MatchParameters } from '../../core/geometry/proposals/pairwise-match';
import { rotationErrorDegrees } from '../../core/geometry/registration/rigid-transform';
import { matchCacheTruth } from './match-cache-truth';
import { isCorrectMotion } from './correct-motion';

const dir = process.argv[2];
const maxPairs = Number(process.env.KNITBONE_PROFILE_PAIRS ?? 200);
const first: MatchParameters = { ...DEFAULT_MATCH_PARAMETERS, ...(JSON.parse(process.env.KNITBONE_PROFILE_PARAMS ?? '{}') as Partial<MatchParameters>) };
const second: MatchParameters = { ...first, ...(JSON.parse(process.env.KNITBONE_COMPARE_PARAMS ?? '{}') as Partial<MatchParameters>) };
const { nos, joins, studied: grouped, assemble } = matchCacheTruth(dir, maxPairs);
const cpu = (): number => { const u = process.cpuUsage(); return (u.user + u.system) / 1e6; };
const cpuOf = [0, 0], right = [0, 0], stored = [0, 0];
const lost: string[] = [], won: string[] = [];
let truePairs = 0, moved = 0;
grouped.forEach((list, k) => {
  const a = assemble(list[0].a), b = assemble(list[0].b);
  const pairs = list.map((c): [number, number] => [c.faceA, c.faceB]);
  const run = (p: MatchParameters, w: number): ReturnType<typeof matchFragments>[number] | undefined => { const t0 = cpu(); const m = matchFragments(a, b, p, pairs, 3, 0.05); cpuOf[w] += cpu() - t0; return m[0]; };
  const [x, y] = k % 2 ? [run(first, 0), run(second, 1)] : (([q, r]) => [r, q])([run(second, 1), run(first, 0)]);
  const key = `${nos[list[0].a]}|${nos[list[0].b]}`;
  const want = joins.get(key);
  [x, y].forEach((m, w) => { if (m) stored[w]++; });
  if ((!!x !== !!y) || (x && y && (rotationErrorDegrees(x.transform, y.transform) > 1 || Math.abs(x.score - y.score) > 0.01))) moved++;
  if (!want) return;
  truePairs++;
  const ok = [x, y].map((m) => !!m && isCorrectMotion(m.transform, want, b.centroid));
  ok.forEach((o, w) => { if (o) right[w]++; });
  if (ok[0] && !ok[1]) lost.push(key);
  if (!ok[0] && ok[1]) won.push(key);
});
process.stdout.write(`fragment pairs ${grouped.length} (true ${truePairs}), load ${loadavg()[0].toFixed(2)}\n`);
process.stdout.write(`paired CPU s: first ${cpuOf[0].toFixed(2)}, second ${cpuOf[1].toFixed(2)} (${((100 * (cpuOf[1] - cpuOf[0])) / cpuOf[0]).toFixed(1)}%)\n`);
process.stdout.write(`true pairs with a correct best motion >= 0.05: ${right[0]} -> ${right[1]} (lost ${lost.join(' ') || '-'}; gained ${won.join(' ') || '-'}); pairs with a motion >= 0.05 ${stored[0]} -> ${stored[1]}; best moved (1 degree or 0.01) ${moved}\n`);
