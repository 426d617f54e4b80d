/**
 * A shaft piece with analytic truth: a tube (outer radius 12 mm, inner 7 mm, built by
 * manifold-3d) cut in two by a rough surface (tests/support/bunny-cut.ts), one piece turned into
 * each of the eight octants by a known rigid motion. The matcher must find the motion back
 * within 1 degree and 1% of the bounding-box diagonal (issue 6, item 7), through the search
 * about the shared shaft axis. The break faces come from the known cut surface (the test's
 * truth); each piece's axis is fitted by the matcher from its own surface.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { cutTube, type CutPiece } from '../../../support/bunny-cut';
import { breakFaceFromLabels } from '../../../support/break-face-from-labels';
import { DEFAULT_FPFH_RADIUS_SPACINGS, prepareFragment, type PreparedFragment } from '../../../../core/geometry/proposals/prepared-fragment';
import { matchFragments } from '../../../../core/geometry/proposals/pairwise-match';
import { axisMotion, searchAboutSharedAxis } from '../../../../core/geometry/registration/shaft-axis-search';
import { applyToPoint, applyToPoints, displacementAt, invert, rotationAboutAxis, rotationErrorDegrees, transformFrom } from '../../../../core/geometry/registration/rigid-transform';

let lower: CutPiece, upper: CutPiece, diagonal: number, A: PreparedFragment;
const spacing = 1;

function prepare(piece: CutPiece, motion: number[]): PreparedFragment {
  const positions = applyToPoints(motion, piece.positions) as Float32Array;
  const face = breakFaceFromLabels(positions, piece.triangles, piece.onCut, spacing);
  return prepareFragment({ positions, triangles: piece.triangles, faces: [face] }, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS, patches: false });
}

const identity = transformFrom([1, 0, 0, 0, 1, 0, 0, 0, 1], [0, 0, 0]);

beforeAll(async () => {
  // an oblique rough break (amplitude 2 mm) through a 90 mm tube
  ({ lower, upper, diagonal } = await cutTube({ amplitude: 2, seed: 3 }));
  A = prepare(lower, identity);
});

describe('the search about a shared shaft axis', () => {
  it('builds the motion that lays one axis on the other (analytic: axis points and directions map exactly)', () => {
    const A = { direction: [0, 0, 1] as [number, number, number], point: [1, 2, 3] as [number, number, number], radius: 10 };
    const d = Math.SQRT1_2;
    const B = { direction: [d, d, 0] as [number, number, number], point: [-5, 4, 0] as [number, number, number], radius: 10 };
    for (const flip of [false, true]) {
      const M = axisMotion(A, B, flip, 0.7, 5);
      // B's axis point goes to A's axis point shifted 5 mm along A's axis
      const p = applyToPoint(M, ...B.point);
      expect(Math.hypot(p[0] - 1, p[1] - 2, p[2] - 8)).toBeLessThan(1e-9);
      // B's axis direction goes to A's (or its reverse when flipped)
      const q = applyToPoint(M, B.point[0] + d, B.point[1] + d, B.point[2]);
      expect(q[2] - p[2]).toBeCloseTo(flip ? -1 : 1, 9);
    }
  });

  it('ranks the true turn and shift first for the cut tube', () => {
    const M = transformFrom(rotationAboutAxis([1, -2, 0.5], 2.1), [40, 10, -25]);
    const B = prepare(upper, M);
    expect(A.axis).not.toBeNull();
    expect(B.axis).not.toBeNull();
    const [h] = searchAboutSharedAxis(A.axis!, A.faces[0].points, A.faces[0].normals, B.axis!, B.faces[0].points, B.faces[0].normals, { spacing });
    const truth = invert(M);
    // a coarse hypothesis: within a few bins of the truth (ICP does the rest)
    expect(rotationErrorDegrees(h.transform, truth)).toBeLessThan(8);
    expect(displacementAt(h.transform, truth, B.faces[0].centroid)).toBeLessThan(4 * spacing);
  });
});

describe('joining the two pieces of a cut tube from every octant', () => {
  for (const sx of [1, -1]) for (const sy of [1, -1]) for (const sz of [1, -1]) {
    const name = `${sx > 0 ? '+' : '-'}${sy > 0 ? '+' : '-'}${sz > 0 ? '+' : '-'}`;
    it(`recovers a 135 degree turn about (${name}) within 1 degree and 1% of the diagonal`, () => {
      const M = transformFrom(rotationAboutAxis([sx, sy, sz], (135 * Math.PI) / 180), [30 * sx, -20 * sy, 10 * sz]);
      const B = prepare(upper, M);
      const [best] = matchFragments(A, B);
      const truth = invert(M);
      expect(rotationErrorDegrees(best.transform, truth)).toBeLessThan(1);
      expect(displacementAt(best.transform, truth, B.centroid)).toBeLessThan(0.01 * diagonal);
    });
  }
});
