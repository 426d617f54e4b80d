/**
 * What a part-cover rule (screenFacePairs, `partCoverShare`) would save and risk, from one pass of
 * every face pair's own screen over an imported catalogue's match cache (the candidate pairs of
 * every true join and KNITBONE_PROFILE_PAIRS others, match-cache-truth.ts): for each part pair
 * above pair voting's size that a motion screened on its wholes covers (at least 0.5 of the
 * smaller face), the covering motion's share of each face, the part's own screen CPU, and on true
 * fragment pairs whether the part's own screen holds a motion within 5 degrees and 5 mm of the
 * truth that no covering motion comes within 5 degrees and 5 mm of (a "risk": the cover would
 * hide it). Prints, for thresholds on the larger and smaller of the two shares, the share of
 * screen CPU saved and the risks.
 *   npx tsx tests/bench/part-cover-shares.ts <catalogue>.match-cache
 */
import { loadavg } from 'node:os';
import { DEFAULT_MATCH_PARAMETERS, screenFacePair, type CoarseMotion } from '../../core/geometry/proposals/pairwise-match';
import type { PreparedFragment } from '../../core/geometry/proposals/prepared-fragment';
import { invert } from '../../core/geometry/registration/rigid-transform';
import { inOpposedContact } from '../../core/geometry/registration/opposed-contact';
import { stridedSamples } from '../../core/geometry/registration/strided-samples';
import { matchCacheTruth } from './match-cache-truth';
import { isCorrectMotion } from './correct-motion';

const params = DEFAULT_MATCH_PARAMETERS;
const { nos, joins, studied, assemble } = matchCacheTruth(process.argv[2], Number(process.env.KNITBONE_PROFILE_PAIRS ?? 200));
const cpu = (): number => { const u = process.cpuUsage(); return (u.user + u.system) / 1e3; };
interface Cover { shares: Array<{ hi: number; lo: number; ok: boolean; gap: number }>; ms: number; ownOk: boolean; key: string }
const covers: Cover[] = [];
let total = 0;
const whole = (p: PreparedFragment): number[] => { const m = new Map<number, number>(); return p.faces.map((x, k) => { if (!m.has(x.parent)) m.set(x.parent, k); return m.get(x.parent)!; }); };
const share = (pts: Float32Array, nrm: Float32Array, T: number[], tree: PreparedFragment['faces'][number]['tree'], N: Float32Array, spacing: number): number => {
  const q = [0, 0, 0]; let k = 0; const n = pts.length / 3;
  for (let i = 0; i < n; i++) if (inOpposedContact(T, pts, nrm, i, tree, N, spacing, q)) k++;
  return k / Math.max(1, n);
};
/** RMS point-to-plane gap (in spacings) of B's samples that T puts within one spacing of A's face samples. */
const gap = (pts: Float32Array, T: number[], FA: PreparedFragment['faces'][number], spacing: number): number => {
  let s2 = 0, n = 0;
  for (let i = 0; i < pts.length / 3; i++) {
    const x = pts[3 * i], y = pts[3 * i + 1], z = pts[3 * i + 2];
    const q = [T[0] * x + T[1] * y + T[2] * z + T[3], T[4] * x + T[5] * y + T[6] * z + T[7], T[8] * x + T[9] * y + T[10] * z + T[11]];
    const h = FA.tree.nearestOne(q, spacing * spacing);
    if (h.index < 0) continue;
    const j = h.index;
    const d = (q[0] - FA.points[3 * j]) * FA.normals[3 * j] + (q[1] - FA.points[3 * j + 1]) * FA.normals[3 * j + 1] + (q[2] - FA.points[3 * j + 2]) * FA.normals[3 * j + 2];
    s2 += d * d; n++;
  }
  return n ? Math.sqrt(s2 / n) / spacing : Infinity;
};
for (const list of studied) {
  const a = assemble(list[0].a), b = assemble(list[0].b);
  const key = `${nos[list[0].a]}|${nos[list[0].b]}`;
  const truth = joins.get(key);
  const spacing = Math.max(a.spacing, b.spacing);
  const wA = whole(a), wB = whole(b);
  const own = new Map<string, { motions: CoarseMotion[]; ms: number }>();
  for (const c of list) {
    const t0 = cpu();
    const motions = screenFacePair(a, c.faceA, b, c.faceB, params);
    const ms = cpu() - t0;
    total += ms;
    own.set(`${c.faceA},${c.faceB}`, { motions, ms });
  }
  for (const c of list) {
    const i = c.faceA, j = c.faceB;
    const FA = a.faces[i], FB = b.faces[j];
    if (wA[i] === i && wB[j] === j) continue;
    if (Math.min(FA.points.length, FB.points.length) / 3 <= params.pairVoteMaxFaceSamples) continue;
    const prior = [...new Set([`${wA[i]},${wB[j]}`, `${wA[i]},${j}`, `${i},${wB[j]}`])].filter((k) => k !== `${i},${j}`).flatMap((k) => own.get(k)?.motions ?? []);
    const sb = stridedSamples(FB.points, FB.normals, params.icpSamples), sa = stridedSamples(FA.points, FA.normals, params.icpSamples);
    const shares = prior.map((m) => {
      const kb = share(sb.points, sb.normals, m.transform, FA.tree, FA.normals, spacing);
      const ka = share(sa.points, sa.normals, invert(m.transform), FB.tree, FB.normals, spacing);
      return { m, hi: Math.max(ka, kb), lo: Math.min(ka, kb), gap: gap(sb.points, m.transform, FA, spacing) };
    }).filter((s) => s.hi >= 0.5);
    if (!shares.length) continue;
    const self = own.get(`${i},${j}`)!;
    const ok = (T: number[]): boolean => !!truth && isCorrectMotion(T, truth, b.centroid);
    covers.push({ shares: shares.map((x) => ({ hi: x.hi, lo: x.lo, gap: x.gap, ok: ok(x.m.transform) })), ms: self.ms, ownOk: self.motions.some((m) => ok(m.transform)), key: `${key} ${i},${j}` });
  }
}
process.stdout.write(`fragment pairs ${studied.length}, screen CPU ${(total / 1000).toFixed(2)} s, part pairs covered at 0.5 ${covers.length}, load ${loadavg()[0].toFixed(2)}\n`);
for (const g of [Infinity, 0.3, 0.25, 0.2, 0.15]) for (const lo of [0, 0.5, 0.7]) for (const hi of [0.5, 0.8]) {
  const c = covers.map((x) => ({ x, pass: x.shares.filter((y) => y.lo >= lo && y.hi >= hi && y.gap <= g) })).filter((y) => y.pass.length);
  const saved = c.reduce((s, y) => s + y.x.ms, 0);
  // a risk: the part's own screen holds a correct motion and no covering motion that passes is correct
  const risks = c.filter((y) => y.x.ownOk && !y.pass.some((z) => z.ok));
  process.stdout.write(`gap <= ${g} sp, smaller share >= ${lo.toFixed(2)}, larger >= ${hi.toFixed(2)}: ${c.length} pairs, screen CPU saved ${((100 * saved) / total).toFixed(1)}%, risks ${risks.length} ${risks.map((y) => y.x.key).join(', ')}\n`);
}
const fmt = (y: { hi: number; lo: number; gap: number; ok: boolean }): string => `${y.ok ? 'ok' : 'wrong'} ${y.hi.toFixed(2)}/${y.lo.toFixed(2)} gap ${y.gap.toFixed(3)}`;
for (const x of covers.filter((c) => c.ownOk)) process.stdout.write(`  own correct ${x.key}: ${x.shares.map(fmt).join('; ')}\n`);
const gaps = (ok: boolean): number[] => covers.flatMap((c) => c.shares.filter((y) => y.ok === ok).map((y) => y.gap)).sort((p, q) => p - q);
const q = (v: number[], f: number): string => (v.length ? v[Math.min(v.length - 1, Math.floor(f * v.length))].toFixed(3) : '-');
for (const ok of [true, false]) { const v = gaps(ok); process.stdout.write(`covering motions ${ok ? 'correct' : 'not correct (or no truth)'}: ${v.length}, gap p10/p50/p90 ${q(v, 0.1)}/${q(v, 0.5)}/${q(v, 0.9)} sp\n`); }
