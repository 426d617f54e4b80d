/**
 * The tightness of a join where its faces touch (score.ts contactGapRmsMm) against the RMS gap
 * over the whole band where they face each other (gapRmsMm), on a break with chips taken out of
 * one side (issue 6, item 5: true joins of damaged or partial breaks scoring under the run's
 * minimum at their true motion). Analytic truth: a tube split along its length by a rough surface
 * (tests/support/tube-splinter.ts, manifold-3d), balls centred on the break removed from the
 * splinter only, as post-depositional chipping takes material from one side of a break. Both
 * pieces are cut from one solid, so under the true motion the two break faces coincide wherever
 * neither was chipped (up to the vertex noise of 0.02 mm), and the shaft's face meets a pit
 * where the splinter was chipped (analytic geometry: the pit's floor lies up to the ball's radius
 * away). So at the truth the contact's own gap must not grow with the chips, while the band's RMS
 * gap does; a pose slid along the break (the relief's periods are 5-9 mm, so a 2 mm slide puts
 * crests against flanks) must have a far wider contact gap than the truth's.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { splitTube, OUTER_RADIUS, INNER_RADIUS, type SplitPiece } from '../../../support/tube-splinter';
import { breakFaceFromLabels } from '../../../support/break-face-from-labels';
import { DEFAULT_FPFH_RADIUS_SPACINGS, prepareFragment, type PreparedFragment } from '../../../../core/geometry/proposals/prepared-fragment';
import { DEFAULT_MATCH_PARAMETERS, scoredSide } from '../../../../core/geometry/proposals/pairwise-match';
import { applyToPoints, compose, invert, rotationAboutAxis, transformFrom } from '../../../../core/geometry/registration/rigid-transform';
import { scoreJoin, type JoinScore } from '../../../../core/geometry/registration/score';

const spacing = 1;
const identity = transformFrom([1, 0, 0, 0, 1, 0, 0, 0, 1], [0, 0, 0]);
const options = { contactTolerance: DEFAULT_MATCH_PARAMETERS.contactToleranceSpacings * spacing, spacing };

function prepare(piece: SplitPiece, motion: number[]): PreparedFragment {
  const positions = applyToPoints(motion, piece.positions) as Float32Array;
  const face = breakFaceFromLabels(positions, piece.triangles, Uint8Array.from(piece.breakOf, (b) => (b === 1 ? 1 : 0)), spacing);
  return prepareFragment({ positions, triangles: piece.triangles, faces: [face] }, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS, patches: false });
}

const M = transformFrom(rotationAboutAxis([1, -2, 0.5], 2.1), [40, 10, -25]);
const truth = invert(M);
// the splinter slid 2 mm along the shaft (z) after the truth
const slid = compose(transformFrom([1, 0, 0, 0, 1, 0, 0, 0, 1], [0, 0, 2]), truth);
let whole: { truth: JoinScore; slid: JoinScore }, chipped: { truth: JoinScore; slid: JoinScore };

async function scored(chips: Array<{ x: number; z: number; radius: number }>): Promise<{ truth: JoinScore; slid: JoinScore }> {
  const { shaft, splinter } = await splitTube({ chips });
  const A = prepare(shaft, identity), B = prepare(splinter, M);
  const a = scoredSide(A, A.faces[0]), b = scoredSide(B, B.faces[0]);
  return { truth: scoreJoin(a, b, truth, options), slid: scoreJoin(a, b, slid, options) };
}

beforeAll(async () => {
  whole = await scored([]);
  // chips of 1.6-2.4 mm at the outer and the medullary rim and one inside the break
  chipped = await scored([
    { x: OUTER_RADIUS - 0.3, z: -12, radius: 2.4 },
    { x: OUTER_RADIUS - 0.3, z: 10, radius: 2 },
    { x: INNER_RADIUS + 0.3, z: 3, radius: 2.2 },
    { x: (OUTER_RADIUS + INNER_RADIUS) / 2, z: -22, radius: 1.6 },
  ]);
});

describe('the contact gap of a chipped join', () => {
  it('the chips take contact away from the splinter (the fixture does what it claims)', () => {
    expect(chipped.truth.contactFractionOther).toBeLessThan(whole.truth.contactFractionOther - 0.03);
  });
  it('the band RMS gap grows with the chips at the truth (pit floors within 3 tolerances count)', () => {
    expect(chipped.truth.gapRmsMm).toBeGreaterThan(2 * whole.truth.gapRmsMm);
  });
  it('the contact gap at the truth stays that of the unchipped join, near the vertex noise', () => {
    expect(whole.truth.contactGapRmsMm).toBeLessThan(0.1);
    expect(Math.abs(chipped.truth.contactGapRmsMm - whole.truth.contactGapRmsMm)).toBeLessThan(0.02);
  });
  it('a pose slid along the break has a far wider contact gap', () => {
    expect(chipped.slid.contactGapRmsMm).toBeGreaterThan(3 * chipped.truth.contactGapRmsMm);
    expect(whole.slid.contactGapRmsMm).toBeGreaterThan(3 * whole.truth.contactGapRmsMm);
  });
  it('the score keeps the chipped truth and drops the slid pose', () => {
    expect(chipped.truth.score).toBeGreaterThan(0.8);
    expect(Math.abs(chipped.truth.score - whole.truth.score)).toBeLessThan(0.05);
    expect(chipped.slid.score).toBeLessThan(0.05);
  });
});
