/**
 * Would a fragment pair's refined motions store the true join if each were also refined and scored
 * on the face pair it puts most in contact (contact-face-pairs.ts)? On a folder studied by
 * candidate-restudy.ts (as stored-gap-study.ts reads it), each reached true join's fragment pair
 * is aligned as a propose worker aligns it; for those that store nothing (or a wrong motion),
 * every motion of the fine shortlist is refined on its own face pair, then the face pairs it puts
 * in contact are listed (each side's share) and each is refined from it and scored. One JSON
 * record per studied join: per shortlist rank, the motion's own score and whether it lies near
 * the truth, and per contact pair the shares, the score and whether the refined motion lies near.
 *   npx tsx tests/bench/contact-pair-study.ts <studied-dir> [params-json]
 * KNITBONE_STUDY_K (30), KNITBONE_STUDY_MIN (0.05), KNITBONE_STUDY_JOINS=a|b,..., KNITBONE_STUDY_OUT=file.jsonl,
 * KNITBONE_STUDY_SAMPLES (60: strided samples per face for the contact shares).
 */
import { appendFileSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { WHOLE_FACE_PARTNERS } from '../../core/geometry/proposals/candidate-index';
import { contactFacePairs } from '../../core/geometry/proposals/contact-face-pairs';
import { DEFAULT_MATCH_PARAMETERS, fineShortlist, fineTransform, matchFragments, scoredSide, screenFacePairs, type MatchParameters } from '../../core/geometry/proposals/pairwise-match';
import { deferredScore, scoreJoin } from '../../core/geometry/registration/score';
import { isCorrectMotion } from './correct-motion';
import { orderedJoin, readStudiedFolder } from './studied-folder';

interface Join { a: string; b: string; type: string; breakId: number; pattern: string; survivingFraction: number; contactAreaMm2?: number; transformBToA: number[] }
const [dir, extra] = process.argv.slice(2);
const params: MatchParameters = { ...DEFAULT_MATCH_PARAMETERS, ...(extra ? (JSON.parse(extra) as Partial<MatchParameters>) : {}) };
const K = Number(process.env.KNITBONE_STUDY_K ?? 30), MIN = Number(process.env.KNITBONE_STUDY_MIN ?? 0.05);
const SAMPLES = Number(process.env.KNITBONE_STUDY_SAMPLES ?? 60);
const only = process.env.KNITBONE_STUDY_JOINS?.split(',');
const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { joins: Join[] };
const { study, fragOf, pairsOf, prep } = readStudiedFolder(dir, { k: K, wholeFacePartners: WHOLE_FACE_PARTNERS });
const tally = new Map<string, number>();
let studied = 0;
for (const j of truth.joins.filter((x) => x.type === 'conjoin' && x.survivingFraction >= 0.3 && fragOf.has(x.a) && fragOf.has(x.b))) {
  if (only && !only.includes(`${j.a}|${j.b}`)) continue;
  const { ia, ib, want, on } = orderedJoin({ study, fragOf }, j);
  const list = pairsOf.get(`${ia}:${ib}`) ?? [];
  if (!list.some(([x, y]) => on(ia, x) && on(ib, y))) continue;
  studied++;
  const A = prep(ia), B = prep(ib);
  const near = (T: number[]): boolean => isCorrectMotion(T, want, B.centroid);
  const got = matchFragments(A, B, params, list, 3, MIN);
  const best = got[0];
  const cause = best && best.score >= MIN ? (near(best.transform) ? 'stored right' : 'stored wrong') : 'nothing';
  tally.set(cause, (tally.get(cause) ?? 0) + 1);
  if (cause === 'stored right') continue;
  const spacing = Math.max(A.spacing, B.spacing);
  const opts = { contactTolerance: params.contactToleranceSpacings * spacing, spacing };
  const shortlist = fineShortlist(A, B, screenFacePairs(A, B, list, params), params);
  const ranks = shortlist.map((s, rank) => {
    const T = fineTransform(A, s.i, B, s.j, s.motion.transform, params);
    const own = scoreJoin(scoredSide(A, A.faces[s.i]), scoredSide(B, B.faces[s.j]), T, opts);
    const contacts = contactFacePairs(A, B, T, SAMPLES, spacing).map((c) => {
      const T2 = fineTransform(A, c.i, B, c.j, T, params);
      const s2 = scoreJoin(scoredSide(A, A.faces[c.i]), scoredSide(B, B.faces[c.j]), T2, opts);
      return { i: c.i, j: c.j, whole: [A.faces.findIndex((f) => f.parent === A.faces[c.i].parent) === c.i, B.faces.findIndex((f) => f.parent === B.faces[c.j].parent) === c.j], shareA: +c.shareA.toFixed(2), shareB: +c.shareB.toFixed(2), own: c.i === s.i && c.j === s.j, candidate: list.some(([x, y]) => x === c.i && y === c.j), score: +s2.score.toFixed(3), near: near(T2) };
    });
    const upper = deferredScore(scoredSide(A, A.faces[s.i]), scoredSide(B, B.faces[s.j]), T, opts).upper;
    return { rank, i: s.i, j: s.j, upper: +upper.toFixed(3), overlap: +s.motion.overlap.toFixed(2), screenedNear: near(s.motion.transform), near: near(T), score: +own.score.toFixed(3), contacts };
  });
  const rec = { join: `${j.a}|${j.b}`, pattern: j.pattern, area: j.contactAreaMm2, cause, score: best ? +best.score.toFixed(3) : null, faces: [A.faces.length, B.faces.length], ranks };
  const gain = ranks.flatMap((r) => r.contacts.filter((c) => c.near && c.score >= MIN && !c.own).map((c) => ({ rank: r.rank, ...c })));
  console.log(`${rec.join} ${cause} shortlist ${ranks.length} near ${ranks.filter((r) => r.near).map((r) => `${r.rank}:${r.score}`).join(',')} gains ${gain.map((g) => `${g.rank}:(${g.i},${g.j}) ${g.shareA}/${g.shareB} ${g.score}`).join('; ')}`);
  if (process.env.KNITBONE_STUDY_OUT) appendFileSync(process.env.KNITBONE_STUDY_OUT, JSON.stringify(rec) + '\n');
}
console.log(`${studied} joins studied: ${[...tally].map(([k, v]) => `${k} ${v}`).join(', ')}`);
