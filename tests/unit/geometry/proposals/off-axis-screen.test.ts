/**
 * Two shaft pieces whose fitted axes do not lie on one line: a tube (outer radius 12 mm, inner
 * 7 mm, built by manifold-3d) cut in two by a rough surface (tests/support/bunny-cut.ts), one
 * piece moved by a known rigid motion (the truth, analytic by construction), and that piece's
 * fitted axis point moved 6 mm across the axis, as a fit on a partial arc of a lobed or flattened
 * shaft can be (core/geometry/registration/axis-direction-search.ts). The search about the shared
 * axis then lays the break faces off each other and can find a wrong turn that still puts much
 * of the face in contact; the screen must not stop there: the search along the axis directions
 * (which trusts only the directions) runs as well, and a motion within 5 degrees and 3 mm of the
 * truth is screened first, whichever way across the axis the point is off, and whichever face
 * the screen moves onto the other (screenWays: the axis-direction search is symmetric in the two
 * faces, so moving A's face onto B's finds the same motion turned round).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { cutTube, type CutPiece } from '../../../support/bunny-cut';
import { breakFaceFromLabels } from '../../../support/break-face-from-labels';
import { DEFAULT_FPFH_RADIUS_SPACINGS, prepareFragment, type PreparedFragment } from '../../../../core/geometry/proposals/prepared-fragment';
import { DEFAULT_MATCH_PARAMETERS, screenFacePair } from '../../../../core/geometry/proposals/pairwise-match';
import { applyToPoints, displacementAt, invert, rotationAboutAxis, rotationErrorDegrees, transformFrom } from '../../../../core/geometry/registration/rigid-transform';

const spacing = 1;
function prepare(piece: CutPiece, motion: number[]): PreparedFragment {
  const positions = applyToPoints(motion, piece.positions) as Float32Array;
  const face = breakFaceFromLabels(positions, piece.triangles, piece.onCut, spacing);
  return prepareFragment({ positions, triangles: piece.triangles, faces: [face] }, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS, patches: false });
}

let A: PreparedFragment, B: PreparedFragment, truth: number[];

beforeAll(async () => {
  const cut = await cutTube({ amplitude: 2, seed: 3 });
  A = prepare(cut.lower, transformFrom([1, 0, 0, 0, 1, 0, 0, 0, 1], [0, 0, 0]));
  const M = transformFrom(rotationAboutAxis([-1, 2, 1], 2.4), [-35, 15, 20]);
  B = prepare(cut.upper, M);
  truth = invert(M);
});

describe('screening shaft pieces whose fitted axis points disagree', () => {
  it.each([0, 1, 2, 3])('B\'s axis point 6 mm off across the axis (quarter turn %i): a motion near the truth is screened first', (quarter) => {
    expect(A.axis).not.toBeNull();
    expect(B.axis).not.toBeNull();
    const d = B.axis!.direction;
    // two unit vectors across B's axis, and the offset between them
    const l = Math.hypot(d[1], d[0]);
    const u = [d[1] / l, -d[0] / l, 0];
    const v = [d[1] * u[2] - d[2] * u[1], d[2] * u[0] - d[0] * u[2], d[0] * u[1] - d[1] * u[0]];
    const a = (quarter * Math.PI) / 2;
    const off = u.map((x, k) => 6 * (Math.cos(a) * x + Math.sin(a) * v[k]));
    const moved: PreparedFragment = { ...B, axis: { ...B.axis!, point: [B.axis!.point[0] + off[0], B.axis!.point[1] + off[1], B.axis!.point[2] + off[2]] } };
    for (const screenWays of ['given', 'smaller', 'both'] as const) {
      const screened = screenFacePair(A, 0, moved, 0, { ...DEFAULT_MATCH_PARAMETERS, screenWays });
      expect(screened.length, screenWays).toBeGreaterThan(0);
      expect(rotationErrorDegrees(screened[0].transform, truth), screenWays).toBeLessThan(5);
      expect(displacementAt(screened[0].transform, truth, B.faces[0].centroid), screenWays).toBeLessThan(3 * spacing);
    }
  });
});
