/**
 * The Stanford bunny (open data shipped in the npm package `bunny`) cut in two by a rough
 * surface (manifold-3d), one piece moved by a known rigid motion: the matcher must find the
 * motion back. Tolerance from the issue: 1 degree and 1% of the bunny's bounding-box diagonal.
 * The break faces are found from the known cut surface (the test's truth, bunny-cut.ts).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { cutBunny, type CutPiece } from '../../../support/bunny-cut';
import { breakFaceFromLabels } from '../../../support/break-face-from-labels';
import { DEFAULT_FPFH_RADIUS_SPACINGS, defaultSpacing, prepareFragment, type PreparedFragment } from '../../../../core/geometry/proposals/prepared-fragment';
import { matchFragments } from '../../../../core/geometry/proposals/pairwise-match';
import { icpPointToPlane } from '../../../../core/geometry/registration/icp-point-to-plane';
import {
  applyToPoints,
  compose,
  displacementAt,
  invert,
  rotationAboutAxis,
  rotationErrorDegrees,
  transformFrom,
} from '../../../../core/geometry/registration/rigid-transform';

let lower: CutPiece, upper: CutPiece, otherUpper: CutPiece, diagonal: number, spacing: number;

function prepare(piece: CutPiece, motion: number[]): PreparedFragment {
  const positions = applyToPoints(motion, piece.positions) as Float32Array;
  const face = breakFaceFromLabels(positions, piece.triangles, piece.onCut, spacing);
  return prepareFragment({ positions, triangles: piece.triangles, faces: [face] }, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS });
}

const identity = transformFrom([1, 0, 0, 0, 1, 0, 0, 0, 1], [0, 0, 0]);

beforeAll(async () => {
  ({ lower, upper, diagonal } = await cutBunny());
  // a second cut at another height: its upper piece does not join `lower`
  ({ upper: otherUpper } = await cutBunny({ cutY: 55, amplitude: 4, seed: 9 }));
  spacing = defaultSpacing([diagonal]);
});

describe('joining the two halves of a cut Stanford bunny', () => {
  const motions: Array<[string, number[]]> = [
    ['a 130 degree turn and a 110 mm shift', transformFrom(rotationAboutAxis([1, 2, -1], (130 * Math.PI) / 180), [60, -30, 90])],
    ['a turn that puts the piece upside down', transformFrom(rotationAboutAxis([1, 0, 0.3], (170 * Math.PI) / 180), [5, 150, -20])],
  ];
  for (const [name, M] of motions) {
    it(`recovers ${name} within 1 degree and 1% of the bounding-box diagonal`, () => {
      const A = prepare(lower, identity);
      const B = prepare(upper, M);
      const [best] = matchFragments(A, B);
      const truth = invert(M); // B's file frame -> A's file frame
      expect(rotationErrorDegrees(best.transform, truth)).toBeLessThan(1);
      expect(displacementAt(best.transform, truth, B.centroid)).toBeLessThan(0.01 * diagonal);
      expect(best.score).toBeGreaterThan(0.8);
      expect(best.contactFraction).toBeGreaterThan(0.8);
    });
  }

  it('trimmed point-to-plane ICP (Chen & Medioni 1991) converges from a pose 6 degrees and 4 mm off', () => {
    const A = prepare(lower, identity);
    const B = prepare(upper, identity);
    const off = transformFrom(rotationAboutAxis([0.3, 1, 0.2], (6 * Math.PI) / 180), [2, -3, 1.5]);
    const start = compose(off, identity);
    const face = B.faces[0];
    const r = icpPointToPlane(face.points, face.normals, A.surface, start, { maxDistance: 4 * spacing, trim: 0.7, maxIterations: 60 });
    expect(rotationErrorDegrees(start, identity)).toBeGreaterThan(5.9);
    expect(rotationErrorDegrees(r.transform, identity)).toBeLessThan(0.5);
    expect(displacementAt(r.transform, identity, B.centroid)).toBeLessThan(0.005 * diagonal);
  });

  it('gives a low score to two pieces that do not join', () => {
    const A = prepare(lower, identity);
    const B = prepare(otherUpper, transformFrom(rotationAboutAxis([1, 2, -1], 1), [60, -30, 90]));
    const [best] = matchFragments(A, B);
    expect(best === undefined || best.score < 0.5).toBe(true);
  });
});
