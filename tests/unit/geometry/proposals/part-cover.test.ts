/**
 * A face pair with a piece on either side is not screened when the motion already screened on its
 * whole faces lays both pieces in contact: that motion goes on from the whole faces, ranked as the
 * piece pair's own would be (pairwise-match.ts screenFacePairs, `partCoverShare`).
 * The Stanford bunny (open data in the npm package `bunny`) cut in two by a rough surface
 * (tests/support/bunny-cut.ts, tests/support/bunny-cut-pieces.ts), the upper half moved by a known motion (analytic by construction):
 * each half's cut is its one break face, matched whole and as a piece (the cut's triangles with
 * x below the cut's mean x before the motion: the same stretch of the break on both halves, so the
 * true motion lays each piece on the other, and lays a piece on only part of the other half's
 * whole cut).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { bunnyCutPieces } from '../../../support/bunny-cut-pieces';
import type { PreparedFragment } from '../../../../core/geometry/proposals/prepared-fragment';
import { DEFAULT_MATCH_PARAMETERS, matchFragments, screenFacePairs, type MatchParameters } from '../../../../core/geometry/proposals/pairwise-match';
import { rotationErrorDegrees, displacementAt, type RigidTransform } from '../../../../core/geometry/registration/rigid-transform';

const spacing = 1.2;
let A: PreparedFragment, B: PreparedFragment, truth: RigidTransform;

beforeAll(async () => {
  ({ A, B, truth } = await bunnyCutPieces(spacing));
});

const every = (): Array<[number, number]> => {
  const out: Array<[number, number]> = [];
  for (let i = 0; i < A.faces.length; i++) for (let j = 0; j < B.faces.length; j++) out.push([i, j]);
  return out;
};
// the part pairs' reuse of their wholes' searches (partReusesSearches) left out: this rule alone
const on: MatchParameters = { ...DEFAULT_MATCH_PARAMETERS, partCoverShare: 0.8, partReusesSearches: false };
const off: MatchParameters = { ...DEFAULT_MATCH_PARAMETERS, partCoverShare: 0, partReusesSearches: false };
const nearTruth = (T: RigidTransform): boolean => rotationErrorDegrees(T, truth) < 3 && displacementAt(T, truth, B.faces[0].centroid) < 2 * spacing;

describe('face pairs of pieces that the whole faces cover', () => {
  it('the set-up: each half has its whole cut (index 0) and one piece of it (same parent)', () => {
    expect(A.faces.length).toBeGreaterThanOrEqual(2);
    expect(B.faces.length).toBeGreaterThanOrEqual(2);
    expect(A.faces.every((f) => f.parent === 0) && B.faces.every((f) => f.parent === 0)).toBe(true);
  });

  it('are screened without the setting, and with it the whole pair\'s motions go on in their place once they find the truth', () => {
    const all = screenFacePairs(A, B, every(), off);
    expect(all.some((s) => s.i > 0 && s.j > 0)).toBe(true);
    const cut = screenFacePairs(A, B, every(), on);
    // the whole pair's own motions are the same either way, and one of them is the truth
    const whole = all.filter((s) => s.i === 0 && s.j === 0);
    expect(whole.some((s) => nearTruth(s.motion.transform))).toBe(true);
    // the piece pair was not screened: every motion comes from the faces it was screened on, and
    // the piece pair's place is taken by the whole pair's motions, unchanged, ranked at least as high
    // (the screen is deterministic: the same motions, number for number, in both calls)
    const key = (T: RigidTransform): string => Array.from(T).join(',');
    const wholeMotions = new Map(whole.map((s) => [key(s.motion.transform), s.motion.overlap]));
    expect(cut.some((s) => s.i > 0 && s.j > 0)).toBe(false);
    const standing = cut.filter((s) => s.i === 0 && s.j === 0);
    expect(standing.length).toBeGreaterThan(whole.length);
    expect(standing.every((s) => wholeMotions.has(key(s.motion.transform)) && s.motion.overlap >= wholeMotions.get(key(s.motion.transform))!)).toBe(true);
    expect(standing.filter((s) => nearTruth(s.motion.transform)).length).toBeGreaterThan(whole.filter((s) => nearTruth(s.motion.transform)).length);
    expect(all.filter((s) => s.i > 0 && s.j > 0).some((s) => !wholeMotions.has(key(s.motion.transform)))).toBe(true);
    // the fragment pair's best motion is still the truth (within 1 degree and 1 mm)
    const best = matchFragments(A, B, on, every(), 1)[0];
    expect(rotationErrorDegrees(best.transform, truth)).toBeLessThan(1);
    expect(displacementAt(best.transform, truth, B.faces[0].centroid)).toBeLessThan(1);
  });

  it('are screened when the whole pair\'s motion lays only one of the two faces in contact', () => {
    // A's piece against B's whole cut: the truth lays all of the piece on B's cut but covers only
    // the piece's stretch of B's cut, so the whole pair's motion does not stand for this pair
    const pairs: Array<[number, number]> = [[0, 0], [1, 0]];
    const cut = screenFacePairs(A, B, pairs, on);
    expect(cut.filter((s) => s.i === 1 && s.j === 0)).toEqual(screenFacePairs(A, B, [[1, 0]], off));
    expect(cut.some((s) => s.i === 1 && s.j === 0)).toBe(true);
  });

  it('are screened when no pair of their whole faces was (no motion to cover them)', () => {
    const parts: Array<[number, number]> = [[1, 1]];
    const cut = screenFacePairs(A, B, parts, on);
    expect(cut.length).toBeGreaterThan(0);
    expect(cut).toEqual(screenFacePairs(A, B, parts, off));
  });
});
