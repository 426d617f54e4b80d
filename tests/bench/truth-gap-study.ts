/**
 * Why a true join scores low at (or refined from) its true motion: for the true joins of a folder
 * studied by candidate-restudy.ts (see stored-gap-study.ts), every face pair of the two fragments
 * with both faces on the break is scored at the exact true motion and after the fine step from it,
 * with the score's components and the distances of the facing face samples split by where they
 * lie (within one tolerance: in contact; beyond it up to the three tolerances the gap reads), and
 * the same figures for the motions a propose worker returns on a stride of other candidate
 * fragment pairs (wrong by construction) and on the true pairs (right or wrong against the truth).
 * One JSON line per motion on stdout:
 *   npx tsx tests/bench/truth-gap-study.ts <studied-dir> <records.jsonl> [others]
 * records.jsonl: stored-gap-study.ts records (their `join` and `cause` are read); others: how many
 * non-true candidate fragment pairs to match (default 150).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { WHOLE_FACE_PARTNERS } from '../../core/geometry/proposals/candidate-index';
import { DEFAULT_MATCH_PARAMETERS, fineTransform, matchFragments, scoredSide, type FaceMatch } from '../../core/geometry/proposals/pairwise-match';
import type { PreparedFragment } from '../../core/geometry/proposals/prepared-fragment';
import { applyToDirections, applyToPoints, invert, type RigidTransform } from '../../core/geometry/registration/rigid-transform';
import { scoreJoin, type ScoredSide } from '../../core/geometry/registration/score';
import { FEATURE_NAMES, SCORE_MODEL, scoreFeatures } from '../../core/geometry/registration/score-model';
import type { ClosestPoint } from '../../core/geometry/registration/target-surface';
import { readStudiedFolder } from './studied-folder';
import { isCorrectMotion } from './correct-motion';

interface Join { a: string; b: string; type: string; breakId: number; pattern: string; survivingFraction: number; contactAreaMm2?: number; transformBToA: number[]; damaged?: boolean; breakAge?: string }
const [dir, recordsFile, othersArg] = process.argv.slice(2);
const params = DEFAULT_MATCH_PARAMETERS;
const OTHERS = Number(othersArg ?? 150);
const records = new Map(readFileSync(recordsFile, 'utf8').split('\n').filter((l) => l.startsWith('{')).map((l) => JSON.parse(l) as { join: string; cause: string }).map((r) => [r.join, r.cause]));
const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { joins: Join[] };
const { study, spacing, fragOf, pairsOf, prep } = readStudiedFolder(dir, { k: 30, wholeFacePartners: WHOLE_FACE_PARTNERS, keepFragments: 60 });
const tol = params.contactToleranceSpacings * spacing;

/** Distances of one side's facing samples (opposed normals, within 3 tol) and how far each lies from its face's outline. */
function facing(side: ScoredSide, other: ScoredSide, T: RigidTransform): { d: number[]; rim: number[]; n: number } {
  const p = applyToPoints(T, side.facePoints), nn = applyToDirections(T, side.faceNormals);
  const o = applyToPoints(T, side.outline);
  const d: number[] = [], rim: number[] = [];
  const cp = {} as ClosestPoint;
  const n = p.length / 3;
  for (let i = 0; i < n; i++) {
    const hit = other.surface.closest(p[3 * i], p[3 * i + 1], p[3 * i + 2], 3 * tol, cp);
    if (!hit) continue;
    if (nn[3 * i] * hit.nx + nn[3 * i + 1] * hit.ny + nn[3 * i + 2] * hit.nz > -0.5) continue;
    d.push(hit.distance);
    let best = Infinity;
    for (let k = 0; k < o.length; k += 3) best = Math.min(best, (o[k] - p[3 * i]) ** 2 + (o[k + 1] - p[3 * i + 1]) ** 2 + (o[k + 2] - p[3 * i + 2]) ** 2);
    rim.push(Math.sqrt(best));
  }
  return { d, rim, n };
}

function extra(A: PreparedFragment, fa: number, B: PreparedFragment, fb: number, T: RigidTransform): Record<string, number> {
  const sa = scoredSide(A, A.faces[fa]), sb = scoredSide(B, B.faces[fb]);
  // B's samples moved into A, A's into B
  const fB = facing(sb, sa, T), fA = facing(sa, sb, invert(T));
  const d = [...fA.d, ...fB.d].sort((x, y) => x - y), rim = [...fA.rim, ...fB.rim];
  const rms = (xs: number[]): number => (xs.length ? Math.sqrt(xs.reduce((s, x) => s + x * x, 0) / xs.length) : 3 * tol);
  const inC = d.filter((x) => x <= tol);
  const q = (f: number): number => (d.length ? d[Math.min(d.length - 1, Math.floor(f * d.length))] : 3 * tol);
  const all = [...fA.d, ...fB.d];
  const nearRim = all.filter((_, i) => rim[i] <= spacing), inner = all.filter((_, i) => rim[i] > spacing);
  return {
    nFacing: d.length,
    gapAll: +rms(d).toFixed(3),
    gapContact: +rms(inC).toFixed(3),
    gapHalf: +rms(d.slice(0, Math.ceil(d.length / 2))).toFixed(3),
    q25: +q(0.25).toFixed(3), q50: +q(0.5).toFixed(3), q75: +q(0.75).toFixed(3),
    shareFar: +(d.filter((x) => x > tol).length / Math.max(1, d.length)).toFixed(3),
    gapRim: +rms(nearRim).toFixed(3), nRim: nearRim.length, gapInner: +rms(inner).toFixed(3), nInner: inner.length,
  };
}

function row(kind: string, jn: string, cause: string, A: PreparedFragment, fa: number, B: PreparedFragment, fb: number, T: RigidTransform, more: Record<string, unknown>): void {
  const s = scoreJoin(scoredSide(A, A.faces[fa]), scoredSide(B, B.faces[fb]), T, { contactTolerance: tol, spacing });
  // each input's share of the logit (slope x input), to see which one pulls a motion down
  const xs = scoreFeatures(s);
  const logit = Object.fromEntries(FEATURE_NAMES.map((n, k) => [n, +(SCORE_MODEL.slopes[n] * xs[k]).toFixed(2)]));
  console.log(JSON.stringify({ kind, join: jn, cause, faces: [fa, fb], samples: [A.faces[fa].points.length / 3, B.faces[fb].points.length / 3], ...more, score: +s.score.toFixed(4), logit, c: { contactFraction: s.contactFraction, contactFractionOther: s.contactFractionOther, contactAreaMm2: s.contactAreaMm2, gapRmsMm: s.gapRmsMm, contactGapRmsMm: s.contactGapRmsMm, penetrationMm: s.penetrationMm, outlineAgreement: s.outlineAgreement, interlock: s.interlock, axesCompared: s.axesCompared, axisOffset: s.axisOffset, axisAngleDeg: s.axisAngleDeg, axisSide: s.axisSide, radiusRatio: s.radiusRatio }, x: extra(A, fa, B, fb, T) }));
}

/** The candidate face pair (piece or patch) whose score is the motion's own. */
function facesOf(A: PreparedFragment, B: PreparedFragment, list: Array<[number, number]>, m: FaceMatch): [number, number] {
  let best: [number, number] = [0, 0], err = Infinity;
  for (const [x, y] of list) {
    if (A.faces[x].parent !== m.faceA || B.faces[y].parent !== m.faceB) continue;
    const e = Math.abs(scoreJoin(scoredSide(A, A.faces[x]), scoredSide(B, B.faces[y]), m.transform, { contactTolerance: tol, spacing }).score - m.score);
    if (e < err) { err = e; best = [x, y]; }
  }
  return best;
}

const trueKeys = new Set<string>();
for (const j of truth.joins) {
  if (j.type !== 'conjoin' || !fragOf.has(j.a) || !fragOf.has(j.b)) continue;
  let ia = fragOf.get(j.a)!, ib = fragOf.get(j.b)!;
  if (ia > ib) [ia, ib] = [ib, ia];
  trueKeys.add(`${ia}:${ib}`);
  const jn = `${j.a}|${j.b}`;
  const cause = records.get(jn);
  if (!cause || j.survivingFraction < 0.3) continue;
  let want = j.transformBToA;
  if (fragOf.get(j.a)! > fragOf.get(j.b)!) want = invert(want);
  const A = prep(ia), B = prep(ib);
  const on = (fr: number, face: number): boolean => (study[fr].faces[face].breaks[String(j.breakId)] ?? 0) >= 0.3;
  const meta = { pattern: j.pattern, damaged: j.damaged, age: j.breakAge, area: j.contactAreaMm2, surviving: j.survivingFraction };
  for (let x = 0; x < A.faces.length; x++) for (let y = 0; y < B.faces.length; y++) {
    // KNITBONE_STUDY_ALL_FACES=1: every face pair at the exact truth (a face the labels put on another break may be the one that meets)
    if (process.env.KNITBONE_STUDY_ALL_FACES && !(on(ia, x) && on(ib, y))) {
      row('truth', jn, cause, A, x, B, y, want, { ...meta, shares: [0, 0], labelled: false });
      continue;
    }
    if (!on(ia, x) || !on(ib, y)) continue;
    const shares = [study[ia].faces[x].breaks[String(j.breakId)], study[ib].faces[y].breaks[String(j.breakId)]];
    row('truth', jn, cause, A, x, B, y, want, { ...meta, shares });
    const R = fineTransform(A, x, B, y, want, params);
    row('fromTruth', jn, cause, A, x, B, y, R, { ...meta, shares, near: isCorrectMotion(R, want, B.centroid) });
  }
  // what a worker returns on this pair (KNITBONE_STUDY_TRUTH_ONLY=1: only the truth and the fine step from it)
  const list = pairsOf.get(`${ia}:${ib}`) ?? [];
  if (!list.length || process.env.KNITBONE_STUDY_TRUTH_ONLY) continue;
  const got: FaceMatch[] = matchFragments(A, B, params, list, 3, 0);
  for (const m of got) {
    const [fa, fb] = facesOf(A, B, list, m);
    row('matched', jn, cause, A, fa, B, fb, m.transform, { ...meta, correct: isCorrectMotion(m.transform, want, B.centroid), pairScore: m.score });
  }
}
// wrong motions of other candidate fragment pairs
const others = [...pairsOf.keys()].filter((k) => !trueKeys.has(k));
const stride = Math.max(1, Math.floor(others.length / OTHERS));
for (let k = 0; k < others.length; k += stride) {
  const [ia, ib] = others[k].split(':').map(Number);
  const A = prep(ia), B = prep(ib);
  for (const m of matchFragments(A, B, params, pairsOf.get(others[k])!, 3, 0)) {
    const [fa, fb] = facesOf(A, B, pairsOf.get(others[k])!, m);
    row('other', `${study[ia].no}|${study[ib].no}`, 'false pair', A, fa, B, fb, m.transform, { correct: false, pairScore: m.score });
  }
}
