/**
 * A face pair with a piece on either side is not screened when the motion already screened on its
 * whole faces lays the piece in contact: that motion stands for the pair's own (pairwise-match.ts
 * screenFacePairs, `partCoverShare`).
 * The Stanford bunny (open data in the npm package `bunny`) cut in two by a rough surface
 * (tests/support/bunny-cut.ts), the upper half moved by a known motion (analytic by construction):
 * each half's cut is its one break face, matched whole and as a piece (the cut's triangles with
 * x below the cut's mean x before the motion: the same stretch of the break on both halves).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { cutBunny, type CutPiece } from '../../../support/bunny-cut';
import { breakFaceFromLabels } from '../../../support/break-face-from-labels';
import { DEFAULT_FPFH_RADIUS_SPACINGS, prepareFragment, type PreparedFragment } from '../../../../core/geometry/proposals/prepared-fragment';
import { DEFAULT_MATCH_PARAMETERS, matchFragments, screenFacePairs, type MatchParameters } from '../../../../core/geometry/proposals/pairwise-match';
import { applyToPoints, invert, rotationAboutAxis, rotationErrorDegrees, transformFrom, displacementAt, type RigidTransform } from '../../../../core/geometry/registration/rigid-transform';

const spacing = 1.2;
let A: PreparedFragment, B: PreparedFragment, truth: RigidTransform;

/** One half with its cut as a break face and the cut's triangles below mean x as a piece of it. */
function prepare(piece: CutPiece, motion: RigidTransform, meanX: number): PreparedFragment {
  const positions = applyToPoints(motion, piece.positions) as Float32Array;
  const cut: number[] = [], low: number[] = [];
  const nt = piece.triangles.length / 3;
  for (let t = 0; t < nt; t++) {
    if (!piece.onCut[t]) continue;
    cut.push(t);
    const x = [0, 1, 2].reduce((s, k) => s + piece.positions[3 * piece.triangles[3 * t + k]], 0) / 3;
    if (x < meanX) low.push(t);
  }
  const face = { ...breakFaceFromLabels(positions, piece.triangles, piece.onCut, spacing), triangleIds: Uint32Array.from(cut), pieces: [Uint32Array.from(low)] };
  return { ...prepareFragment({ positions, triangles: piece.triangles, faces: [face] }, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS, patches: true }), axis: null };
}

/** Mean x of the cut triangles' corners (before any motion). */
function cutMeanX(piece: CutPiece): number {
  let s = 0, n = 0;
  for (let t = 0; t < piece.triangles.length / 3; t++) {
    if (!piece.onCut[t]) continue;
    for (let k = 0; k < 3; k++) { s += piece.positions[3 * piece.triangles[3 * t + k]]; n++; }
  }
  return s / n;
}

beforeAll(async () => {
  const cut = await cutBunny({ amplitude: 2, seed: 5 });
  const meanX = cutMeanX(cut.lower);
  A = prepare(cut.lower, transformFrom([1, 0, 0, 0, 1, 0, 0, 0, 1], [0, 0, 0]), meanX);
  const M = transformFrom(rotationAboutAxis([2, -1, 1], 1.9), [25, -40, 10]);
  B = prepare(cut.upper, M, meanX);
  truth = invert(M);
});

const every = (): Array<[number, number]> => {
  const out: Array<[number, number]> = [];
  for (let i = 0; i < A.faces.length; i++) for (let j = 0; j < B.faces.length; j++) out.push([i, j]);
  return out;
};
const on: MatchParameters = { ...DEFAULT_MATCH_PARAMETERS, partCoverShare: 0.5 };
const off: MatchParameters = { ...DEFAULT_MATCH_PARAMETERS, partCoverShare: 0 };

describe('face pairs of pieces that the whole faces cover', () => {
  it('the set-up: each half has its whole cut (index 0) and one piece of it (same parent)', () => {
    expect(A.faces.length).toBeGreaterThanOrEqual(2);
    expect(B.faces.length).toBeGreaterThanOrEqual(2);
    expect(A.faces.every((f) => f.parent === 0) && B.faces.every((f) => f.parent === 0)).toBe(true);
  });

  it('are screened without the setting, and with it take the whole pair\'s motion once it finds the truth', () => {
    const all = screenFacePairs(A, B, every(), off);
    expect(all.some((s) => s.i > 0 || s.j > 0)).toBe(true);
    const cut = screenFacePairs(A, B, every(), on);
    // the whole pair's motions are the same either way, and one of them is the truth
    const whole = cut.filter((s) => s.i === 0 && s.j === 0);
    expect(whole.length).toBeGreaterThan(0);
    expect(whole.some((s) => rotationErrorDegrees(s.motion.transform, truth) < 3 && displacementAt(s.motion.transform, truth, B.faces[0].centroid) < 2 * spacing)).toBe(true);
    // the piece pairs were not screened: what stands for them is the whole pair's motions, unchanged
    const wholeMotions = new Set(whole.map((s) => s.motion.transform));
    expect(cut.filter((s) => s.i > 0 || s.j > 0).every((s) => wholeMotions.has(s.motion.transform))).toBe(true);
    expect(all.filter((s) => s.i > 0 || s.j > 0).some((s) => !wholeMotions.has(s.motion.transform))).toBe(true);
    // the fragment pair's best motion is still the truth (within 1 degree and 1 mm)
    const best = matchFragments(A, B, on, every(), 1)[0];
    expect(rotationErrorDegrees(best.transform, truth)).toBeLessThan(1);
    expect(displacementAt(best.transform, truth, B.faces[0].centroid)).toBeLessThan(1);
  });

  it('are screened when no pair of their whole faces was (no motion to cover them)', () => {
    const parts: Array<[number, number]> = [[1, 1]];
    const cut = screenFacePairs(A, B, parts, on);
    expect(cut.length).toBeGreaterThan(0);
    expect(cut).toEqual(screenFacePairs(A, B, parts, off));
  });
});
