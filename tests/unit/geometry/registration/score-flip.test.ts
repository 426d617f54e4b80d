/**
 * The join score on a pose that contact alone cannot tell from the truth (issue 6, items 3 and
 * 5): a splinter split off a tube along its length (tests/support/tube-splinter.ts, manifold-3d,
 * analytic truth), its rough longitudinal break built so that the splinter turned end over end
 * about the break's normal through the middle of the wall lays the break exactly onto itself.
 * In that pose the splinter's outer surface continues the shaft's medullary surface and its
 * axis lies on the far side of the wall. The true pose must score high, the flipped one low.
 * The splinter is moved by a known rigid motion first; the truth is that motion's inverse and
 * the flip is the half turn about the y axis through (MID_WALL, 0, 0) after it (analytic
 * geometry). Each piece's shaft axis is fitted by the matcher from its own surface.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { splitTube, MID_WALL, type SplitPiece } from '../../../support/tube-splinter';
import { breakFaceFromLabels } from '../../../support/break-face-from-labels';
import { DEFAULT_FPFH_RADIUS_SPACINGS, prepareFragment, type PreparedFragment } from '../../../../core/geometry/proposals/prepared-fragment';
import { refineFacePair, type FaceMatch } from '../../../../core/geometry/proposals/pairwise-match';
import { applyToPoints, compose, invert, rotationAboutAxis, rotationErrorDegrees, transformFrom } from '../../../../core/geometry/registration/rigid-transform';

const spacing = 1;
const identity = transformFrom([1, 0, 0, 0, 1, 0, 0, 0, 1], [0, 0, 0]);

function prepare(piece: SplitPiece, motion: number[]): PreparedFragment {
  const positions = applyToPoints(motion, piece.positions) as Float32Array;
  // both breaks, each from the set-up's labels (1 rough, 2 plane)
  const faces = [1, 2].map((k) => breakFaceFromLabels(positions, piece.triangles, Uint8Array.from(piece.breakOf, (b) => (b === k ? 1 : 0)), spacing));
  return prepareFragment({ positions, triangles: piece.triangles, faces }, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS, patches: false });
}

let truth: number[], flipped: number[], onTruth: FaceMatch, onFlip: FaceMatch;

beforeAll(async () => {
  const { shaft, splinter } = await splitTube();
  const M = transformFrom(rotationAboutAxis([1, -2, 0.5], 2.1), [40, 10, -25]);
  const A = prepare(shaft, identity), B = prepare(splinter, M);
  truth = invert(M);
  // half turn about the rough break's normal (y) through the middle of the wall at z = 0
  const halfTurn = compose(transformFrom(rotationAboutAxis([0, 1, 0], Math.PI), [MID_WALL, 0, 0]), transformFrom([1, 0, 0, 0, 1, 0, 0, 0, 1], [-MID_WALL, 0, 0]));
  flipped = compose(halfTurn, truth);
  // both poses refined and scored as the matcher's fine step does (rough break against rough break)
  [onTruth] = refineFacePair(A, 0, B, 0, [{ transform: truth, overlap: 1 }]);
  [onFlip] = refineFacePair(A, 0, B, 0, [{ transform: flipped, overlap: 1 }]);
});

describe('the join score against a splinter turned end over end', () => {
  it('keeps both poses where they were put (the flip is a real local fit, 180 degrees from the truth)', () => {
    expect(rotationErrorDegrees(onTruth.transform, truth)).toBeLessThan(1);
    expect(rotationErrorDegrees(onFlip.transform, truth)).toBeGreaterThan(175);
  });

  it('cannot tell the poses apart by contact, gaps or outlines (the fixture does what it claims)', () => {
    expect(Math.abs(onTruth.contactFraction - onFlip.contactFraction)).toBeLessThan(0.05);
    expect(Math.abs(onTruth.outlineAgreement - onFlip.outlineAgreement)).toBeLessThan(0.05);
    expect(Math.abs(onTruth.gapRmsMm - onFlip.gapRmsMm)).toBeLessThan(0.05);
  });

  it('scores the true pose high and the flipped pose low', () => {
    expect(onTruth.score).toBeGreaterThan(0.8);
    expect(onFlip.score).toBeLessThan(0.2);
    // the flipped splinter's axis lies across the wall: about 2 x 9.5 mm over a 9-12 mm radius
    expect(onFlip.axisOffset).toBeGreaterThan(1);
    expect(onTruth.axisOffset).toBeLessThan(0.4);
  });
});
