/**
 * The pairwise step in two stages (screen, then fine): on a tube cut in two by a rough surface
 * (manifold-3d, tests/support/bunny-cut.ts) with one piece moved by a known rigid motion, the
 * screen alone already ranks a motion near the truth first, the fine step brings it within
 * 1 degree and 1% of the diagonal (issue 6, item 7), and the two stages run one after the
 * other give exactly what matchFacePair gives (same input, same motions and scores).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { cutTube, type CutPiece } from '../../../support/bunny-cut';
import { breakFaceFromLabels } from '../../../support/break-face-from-labels';
import { DEFAULT_FPFH_RADIUS_SPACINGS, prepareFragment, type PreparedFragment } from '../../../../core/geometry/proposals/prepared-fragment';
import { DEFAULT_MATCH_PARAMETERS, matchFacePair, refineFacePair, screenFacePair } from '../../../../core/geometry/proposals/pairwise-match';
import { applyToPoints, displacementAt, invert, rotationAboutAxis, rotationErrorDegrees, transformFrom } from '../../../../core/geometry/registration/rigid-transform';

const spacing = 1;
let A: PreparedFragment, B: PreparedFragment, truth: number[], diagonal: number, cut: { lower: CutPiece; upper: CutPiece; diagonal: number };

function prepare(piece: CutPiece, motion: number[]): PreparedFragment {
  const positions = applyToPoints(motion, piece.positions) as Float32Array;
  const face = breakFaceFromLabels(positions, piece.triangles, piece.onCut, spacing);
  return prepareFragment({ positions, triangles: piece.triangles, faces: [face] }, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS, patches: false });
}

beforeAll(async () => {
  cut = await cutTube({ amplitude: 2, seed: 3 });
  diagonal = cut.diagonal;
  A = prepare(cut.lower, transformFrom([1, 0, 0, 0, 1, 0, 0, 0, 1], [0, 0, 0]));
  const M = transformFrom(rotationAboutAxis([-1, 2, 1], 2.4), [-35, 15, 20]);
  B = prepare(cut.upper, M);
  truth = invert(M);
});

describe('screening then refining one face pair', () => {
  it('the screen ranks a motion near the truth first, with most of the face in contact', () => {
    const screened = screenFacePair(A, 0, B, 0);
    expect(screened.length).toBeGreaterThan(0);
    expect(rotationErrorDegrees(screened[0].transform, truth)).toBeLessThan(5);
    expect(displacementAt(screened[0].transform, truth, B.centroid)).toBeLessThan(3 * spacing);
    expect(screened[0].overlap).toBeGreaterThan(0.5);
  });

  it('the fine step recovers the motion within 1 degree and 1% of the diagonal', () => {
    const [best] = refineFacePair(A, 0, B, 0, screenFacePair(A, 0, B, 0));
    expect(rotationErrorDegrees(best.transform, truth)).toBeLessThan(1);
    expect(displacementAt(best.transform, truth, B.centroid)).toBeLessThan(0.01 * diagonal);
  });

  it('the two stages in turn give exactly what matchFacePair gives', () => {
    const whole = matchFacePair(A, 0, B, 0);
    const staged = refineFacePair(A, 0, B, 0, screenFacePair(A, 0, B, 0));
    expect(staged).toEqual(whole);
  });

  it('a small contact (a 6 mm disc of the break on each side, under pairVoteMaxFaceSamples samples: the small-face path) still gets a motion near the truth through the screen and the fine step', () => {
    // the same cut, but each piece's break face is only the samples within 6 mm of one point of the cut
    const M = transformFrom(rotationAboutAxis([-1, 2, 1], 2.4), [-35, 15, 20]);
    const small = (piece: CutPiece, motion: number[], centre: number[], R = 6): PreparedFragment => {
      const positions = applyToPoints(motion, piece.positions) as Float32Array;
      const face = breakFaceFromLabels(positions, piece.triangles, piece.onCut, spacing);
      const keep: number[] = [];
      for (let i = 0; i < face.points.length / 3; i++) if (Math.hypot(face.points[3 * i] - centre[0], face.points[3 * i + 1] - centre[1], face.points[3 * i + 2] - centre[2]) < R) keep.push(i);
      const pick = (v: Float32Array): Float32Array => Float32Array.from(keep.flatMap((i) => [v[3 * i], v[3 * i + 1], v[3 * i + 2]]));
      return prepareFragment({ positions, triangles: piece.triangles, faces: [{ points: pick(face.points), normals: pick(face.normals) }] }, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS, patches: false });
    };
    const c = [11, 0, 1]; // on the break near the tube's outer wall (outer radius 12 mm, inner 7)
    const moved = [0, 1, 2].map((r) => M[4 * r] * c[0] + M[4 * r + 1] * c[1] + M[4 * r + 2] * c[2] + M[4 * r + 3]);
    const a = small(cut.lower, transformFrom([1, 0, 0, 0, 1, 0, 0, 0, 1], [0, 0, 0]), c), b = small(cut.upper, M, moved);
    expect(b.faces[0].points.length / 3).toBeLessThan(DEFAULT_MATCH_PARAMETERS.pairVoteMaxFaceSamples);
    const near = (T: number[]): boolean => rotationErrorDegrees(T, truth) < 5 && displacementAt(T, truth, b.faces[0].centroid) < 3 * spacing;
    const screened = screenFacePair(a, 0, b, 0);
    expect(screened.some((m) => near(m.transform))).toBe(true);
    const [best] = refineFacePair(a, 0, b, 0, screened);
    expect(near(best.transform)).toBe(true);
  });
});
