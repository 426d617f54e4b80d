/**
 * Why a part face pair's covering motion (screenFacePairs, `partCoverShare`) loses a true join:
 * for the given fragment pairs, every part pair (piece or patch on either side, above pair
 * voting's size) is screened on its own and also looked at under the motions screened on its
 * wholes; each motion is printed with the share of each of the two faces it puts in contact, the
 * distance of that contact's centroid from the part's centroid, and its distance from the
 * generator's truth (degrees; mm at B's face centroid), and the pair's best motion with and
 * without the setting.
 *   npx tsx tests/bench/part-cover-study.ts <catalogue>.match-cache 'QS-1|QS-2' ...
 *   npx tsx tests/bench/part-cover-study.ts sample 'QS-10074|QS-10880' ...   (demo-data/sample)
 * KNITBONE_PROFILE_PARAMS='{json}' sets the "on" parameters (the defaults with partCoverShare 0.8 unless given; "off" is them with partCoverShare 0); only part
 * pairs the truth puts at least KNITBONE_TRUE_SHARE (0.1) of one face in contact are printed.
 */
import { DEFAULT_MATCH_PARAMETERS, fineShortlist, matchFragments, polishBothWays, refineFacePair, screenFacePairs, type CoarseMotion, type MatchParameters } from '../../core/geometry/proposals/pairwise-match';
import type { PreparedFace, PreparedFragment } from '../../core/geometry/proposals/prepared-fragment';
import { displacementAt, invert, rotationErrorDegrees, type RigidTransform } from '../../core/geometry/registration/rigid-transform';
import { inOpposedContact } from '../../core/geometry/registration/opposed-contact';
import { stridedSamples } from '../../core/geometry/registration/strided-samples';
import { sampleJoin } from '../integration/proposals/sample-join';
import { matchCacheTruth } from './match-cache-truth';

const [source, ...wanted] = process.argv.slice(2);
const on: MatchParameters = { ...DEFAULT_MATCH_PARAMETERS, partCoverShare: 0.8, ...(JSON.parse(process.env.KNITBONE_PROFILE_PARAMS ?? '{}') as Partial<MatchParameters>) };
const off: MatchParameters = { ...on, partCoverShare: 0 };

interface Case { key: string; a: PreparedFragment; b: PreparedFragment; truth: RigidTransform; pairs?: Array<[number, number]> }

function cases(): Case[] {
  if (source === 'sample') return wanted.map((key) => { const [x, y] = key.split('|'); const j = sampleJoin(x, y); return { key, a: j.A, b: j.B, truth: j.transformBToA }; });
  const { nos, joins, studied, assemble } = matchCacheTruth(source, 1);
  return wanted.map((key) => {
    const [x, y] = key.split('|');
    const list = studied.find((l) => (nos[l[0].a] === x && nos[l[0].b] === y) || (nos[l[0].a] === y && nos[l[0].b] === x));
    if (!list) throw new Error(`${key}: not a true candidate fragment pair of ${source}`);
    const k = `${nos[list[0].a]}|${nos[list[0].b]}`;
    return { key: k, a: assemble(list[0].a), b: assemble(list[0].b), truth: joins.get(k)!, pairs: list.map((c): [number, number] => [c.faceA, c.faceB]) };
  });
}

/** Contact of the two faces' strided samples under T: the share of each, and the mean position of B's samples in contact (B's frame). */
function contact(FA: PreparedFace, FB: PreparedFace, T: RigidTransform, spacing: number, n: number): { sa: number; sb: number; at: number[] | null } {
  const q = [0, 0, 0];
  const b = stridedSamples(FB.points, FB.normals, n), a = stridedSamples(FA.points, FA.normals, n);
  let kb = 0; const c = [0, 0, 0];
  for (let i = 0; i < b.points.length / 3; i++) if (inOpposedContact(T, b.points, b.normals, i, FA.tree, FA.normals, spacing, q)) { kb++; for (let d = 0; d < 3; d++) c[d] += b.points[3 * i + d]; }
  let ka = 0; const U = invert(T);
  for (let i = 0; i < a.points.length / 3; i++) if (inOpposedContact(U, a.points, a.normals, i, FB.tree, FB.normals, spacing, q)) ka++;
  return { sa: ka / (a.points.length / 3), sb: kb / (b.points.length / 3), at: kb ? c.map((v) => v / kb) : null };
}

const f = (x: number, d = 2): string => x.toFixed(d);
for (const { key, a, b, truth, pairs: given } of cases()) {
  const pairs: Array<[number, number]> = given ?? [];
  if (!given) for (let i = 0; i < a.faces.length; i++) for (let j = 0; j < b.faces.length; j++) pairs.push([i, j]);
  const spacing = Math.max(a.spacing, b.spacing);
  const whole = (p: PreparedFragment): number[] => { const m = new Map<number, number>(); return p.faces.map((x, k) => { if (!m.has(x.parent)) m.set(x.parent, k); return m.get(x.parent)!; }); };
  const wA = whole(a), wB = whole(b);
  const screened = screenFacePairs(a, b, pairs, off);
  const own = new Map<string, CoarseMotion[]>();
  for (const s of screened) { const k = `${s.i},${s.j}`; own.set(k, [...(own.get(k) ?? []), s.motion]); }
  const err = (T: RigidTransform, c: ArrayLike<number>): string => `${f(rotationErrorDegrees(T, truth), 1)} deg ${f(displacementAt(T, truth, c), 1)} mm`;
  process.stdout.write(`\n== ${key}: faces ${a.faces.length} x ${b.faces.length}, ${pairs.length} face pairs, spacing ${f(spacing)}\n`);
  for (const [i, j] of pairs) {
    const FA = a.faces[i], FB = b.faces[j];
    const n = (wA[i] === i ? 0 : 1) + (wB[j] === j ? 0 : 1);
    const small = !on.partCoverSmall && Math.min(FA.points.length, FB.points.length) / 3 <= on.pairVoteMaxFaceSamples;
    const t = contact(FA, FB, truth, spacing, on.icpSamples);
    if (n === 0 || small || Math.max(t.sa, t.sb) < (Number(process.env.KNITBONE_TRUE_SHARE ?? 0.1))) continue;
    const prior = [...new Set([`${wA[i]},${wB[j]}`, `${wA[i]},${j}`, `${i},${wB[j]}`])].filter((k) => k !== `${i},${j}`).map((k) => k.split(',').map(Number)).flatMap(([x, y]) => (own.get(`${x},${y}`) ?? []).map((m) => ({ m, from: `${x},${y}` })));
    const tAway = t.at ? Math.hypot(t.at[0] - FB.centroid[0], t.at[1] - FB.centroid[1], t.at[2] - FB.centroid[2]) : NaN;
    process.stdout.write(`part pair ${i},${j} (parents ${FA.parent},${FB.parent}; samples ${FA.points.length / 3} x ${FB.points.length / 3}); truth covers A ${f(t.sa)} B ${f(t.sb)}, contact ${f(tAway, 1)} mm from B's centroid\n`);
    for (const m of own.get(`${i},${j}`) ?? []) process.stdout.write(`   own       overlap ${f(m.overlap)}  ${err(m.transform, FB.centroid)}\n`);
    for (const { m, from } of prior) {
      const c = contact(FA, FB, m.transform, spacing, on.icpSamples);
      const away = c.at ? Math.hypot(c.at[0] - FB.centroid[0], c.at[1] - FB.centroid[1], c.at[2] - FB.centroid[2]) : NaN;
      process.stdout.write(`   from ${from.padEnd(5)} share A ${f(c.sa)} B ${f(c.sb)} (max ${f(Math.max(c.sa, c.sb))}), contact ${f(away, 1)} mm from B's centroid (${f(away / spacing, 1)} sp)  ${err(m.transform, FB.centroid)}\n`);
    }
  }
  for (const [name, p] of [['off', off], ['on', on]] as const) {
    // the fine shortlist, each start's distance from the truth and where its fine step (and polish) lands
    if (process.env.KNITBONE_SHORTLIST) for (const s of fineShortlist(a, b, screenFacePairs(a, b, pairs, p), p)) {
      const [m] = refineFacePair(a, s.i, b, s.j, [s.motion], p);
      const q = polishBothWays(a, s.i, b, s.j, m, p);
      process.stdout.write(`   ${name} shortlist ${s.i},${s.j} overlap ${f(s.motion.overlap)} start ${err(s.motion.transform, b.centroid)} -> fine ${f(m.score, 3)} ${err(m.transform, b.centroid)} -> polished ${f(q.score, 3)} ${err(q.transform, b.centroid)}\n`);
    }
    const best = matchFragments(a, b, p, pairs, 3, 0.05);
    process.stdout.write(`best ${name}: ${best.map((m) => `faces ${m.faceA},${m.faceB} score ${f(m.score, 3)} ${err(m.transform, b.centroid)}`).join(' | ') || '-'}\n`);
  }
}
