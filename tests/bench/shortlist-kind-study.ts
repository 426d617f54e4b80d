/**
 * What the fine shortlist of a propose run is made of, split by the kind of prepared face each
 * motion came from (the whole break face, or a part of it: a piece or patch), on an imported
 * catalogue's match cache with the generator's truth:
 *   npx tsx tests/bench/shortlist-kind-study.ts <catalogue>.match-cache [out.jsonl]
 * (the truth is read from the generated folder two levels above the cache; KNITBONE_PROFILE_PAIRS:
 * at most this many fragment pairs, evenly strided, every true pair kept besides).
 * Per fragment pair: face pairs screened and the screen's CPU by kind (whole-whole, part-whole,
 * part-part), screened motions, the shortlist's length and kinds, and the shortlisted motions that
 * lie within 3 degrees and 2 spacings of a better shortlisted one of a face pair whose two faces
 * have the same parents (a part and its whole). For the true pairs every shortlisted motion is
 * refined and marked correct (5 degrees, 5 mm), with its shortlist rank and kind.
 */
import { appendFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import { DEFAULT_MATCH_PARAMETERS, fineShortlist, fineTransform, screenFacePair, scoredSide, type CoarseMotion, type MatchParameters } from '../../core/geometry/proposals/pairwise-match';
import type { PreparedFragment } from '../../core/geometry/proposals/prepared-fragment';
import { deferredScore } from '../../core/geometry/registration/score';
import { displacementAt, rotationErrorDegrees } from '../../core/geometry/registration/rigid-transform';
import { matchCacheTruth } from './match-cache-truth';
import { screenInterlock } from '../../core/geometry/proposals/screen-measures';
import { isCorrectMotion } from './correct-motion';

const dir = process.argv[2];
const out = process.argv[3];
const maxPairs = Number(process.env.KNITBONE_PROFILE_PAIRS ?? Infinity);
const params: MatchParameters = { ...DEFAULT_MATCH_PARAMETERS, ...(JSON.parse(process.env.KNITBONE_PROFILE_PARAMS ?? '{}') as Partial<MatchParameters>) };
// KNITBONE_STUDY_PLACES: shortlist this many instead (to replay smaller or split shortlists from the ranked list)
const places = Number(process.env.KNITBONE_STUDY_PLACES ?? params.finePerFragmentPair);
const { nos, joins, studied: grouped, assemble } = matchCacheTruth(dir, maxPairs);
const whole = (f: PreparedFragment, i: number): boolean => i === 0 || f.faces[i - 1].parent !== f.faces[i].parent;
const kindOf = (a: PreparedFragment, i: number, b: PreparedFragment, j: number): string => (whole(a, i) ? 'w' : 'p') + (whole(b, j) ? 'w' : 'p');
const cpu = (): number => { const u = process.cpuUsage(); return (u.user + u.system) / 1e6; };
const screenCpu: Record<string, number> = {}, facePairs: Record<string, number> = {}, listed: Record<string, number> = {};
let fragmentPairs = 0, shortlisted = 0, capped = 0, dupes = 0, truePairs = 0, fineCpu = 0;
const lengths: number[] = [];
const correctRanks: Array<{ pair: string; rank: number; kind: string; dupOf: number; len: number }> = [];
for (const list of grouped) {
  const a = assemble(list[0].a), b = assemble(list[0].b);
  fragmentPairs++;
  const screened: Array<{ i: number; j: number; motion: CoarseMotion; kind: string }> = [];
  for (const c of list) {
    const kind = kindOf(a, c.faceA, b, c.faceB).replace('pw', 'wp');
    const t0 = cpu();
    const ms = screenFacePair(a, c.faceA, b, c.faceB, params);
    screenCpu[kind] = (screenCpu[kind] ?? 0) + cpu() - t0;
    facePairs[kind] = (facePairs[kind] ?? 0) + 1;
    for (const motion of ms) screened.push({ i: c.faceA, j: c.faceB, motion, kind });
  }
  const spacing = Math.max(a.spacing, b.spacing);
  const short = fineShortlist(a, b, screened, { ...params, finePerFragmentPair: places });
  lengths.push(short.length);
  shortlisted += short.length;
  if (short.length >= places) capped++;
  const dupOf = short.map((s, k) => short.findIndex((o, m) => m < k && a.faces[o.i].parent === a.faces[s.i].parent && b.faces[o.j].parent === b.faces[s.j].parent && rotationErrorDegrees(o.motion.transform, s.motion.transform) < 3 && displacementAt(o.motion.transform, s.motion.transform, b.faces[s.j].centroid) < 2 * spacing));
  dupes += dupOf.filter((d) => d >= 0).length;
  for (const s of short) listed[s.kind] = (listed[s.kind] ?? 0) + 1;
  const key = `${nos[list[0].a]}|${nos[list[0].b]}`;
  const want = joins.get(key);
  if (want) truePairs++;
  const t0 = cpu();
  const lines: string[] = [];
  short.forEach((s, rank) => {
    const T = fineTransform(a, s.i, b, s.j, s.motion.transform, params);
    const d = deferredScore(scoredSide(a, a.faces[s.i]), scoredSide(b, b.faces[s.j]), T, { contactTolerance: params.contactToleranceSpacings * spacing, spacing });
    const correct = !!want && isCorrectMotion(T, want, b.centroid);
    if (correct) correctRanks.push({ pair: key, rank, kind: s.kind, dupOf: dupOf[rank], len: short.length });
    const score = d.upper >= 0.05 ? d.complete().score : null;
    lines.push(JSON.stringify({ pair: key, true: !!want, correct, rank, kind: s.kind, i: s.i, j: s.j, pa: a.faces[s.i].parent, pb: b.faces[s.j].parent, dupOf: dupOf[rank], len: short.length, upper: d.upper, score, overlap: s.motion.overlap, interlock: screenInterlock(a.faces[s.i], b.faces[s.j], s.motion.transform, spacing), T: [...T], T0: [...s.motion.transform] }));
  });
  if (out && lines.length) appendFileSync(out, lines.join('\n') + '\n');
  fineCpu += cpu() - t0;
}
const sum = (r: Record<string, number>): string => Object.entries(r).map(([k, v]) => `${k} ${typeof v === 'number' && v % 1 ? v.toFixed(2) : v}`).join(', ');
lengths.sort((x, y) => x - y);
const q = (p: number): number => lengths[Math.min(lengths.length - 1, Math.floor(p * lengths.length))];
process.stdout.write(`fragment pairs ${fragmentPairs} (true ${truePairs}), load ${loadavg()[0].toFixed(2)}\n`);
process.stdout.write(`face pairs by kind: ${sum(facePairs)}\nscreen CPU s by kind: ${sum(screenCpu)}\n`);
process.stdout.write(`shortlisted ${shortlisted} (mean ${(shortlisted / fragmentPairs).toFixed(2)}, median ${q(0.5)}, p90 ${q(0.9)}, at the cap ${capped}); by kind ${sum(listed)}; repeating a better one of the same parents ${dupes}\n`);
const byPair = new Map<string, typeof correctRanks>();
for (const c of correctRanks) byPair.set(c.pair, [...(byPair.get(c.pair) ?? []), c]);
const first = [...byPair.values()].map((l) => l[0]);
const hist = (f: (c: (typeof correctRanks)[number]) => boolean): number => first.filter(f).length;
process.stdout.write(`true pairs with a correct shortlisted motion ${byPair.size}; the first correct at rank < 8 ${hist((c) => c.rank < 8)}, < 12 ${hist((c) => c.rank < 12)}, < 16 ${hist((c) => c.rank < 16)}, < 24 ${hist((c) => c.rank < 24)}; first correct by kind ${sum(Object.fromEntries(['ww', 'wp', 'pp'].map((k) => [k, hist((c) => c.kind === k)])))}; only correct ones repeating a better one ${[...byPair.values()].filter((l) => l.every((c) => c.dupOf >= 0)).length}; fine CPU (with the study's completions) ${fineCpu.toFixed(1)} s\n`);
