/**
 * RANSAC run the other way round in the screen (pairwise-match.ts `ransacReverseHypotheses`):
 * A's face moved onto B's, each motion turned round into B onto A. The Stanford bunny (open data
 * in the npm package `bunny`) cut in two by a rough surface (tests/support/bunny-cut.ts), one half
 * moved by a known rigid motion (the truth, analytic by construction). With the other coarse
 * stages off (no shaft axes, no point pair voting, no principal frames, no hypotheses of B onto A), the screen's motions
 * come from the reversed RANSAC alone: the best must lie within 5 degrees and 3 mm of the
 * truth, which fails if the reversed motions are not turned round (or turned round wrongly).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { preparedBunnyHalves } from '../../../support/bunny-halves';
import type { PreparedFragment } from '../../../../core/geometry/proposals/prepared-fragment';
import { DEFAULT_MATCH_PARAMETERS, screenFacePair, type MatchParameters, type MatchTrace } from '../../../../core/geometry/proposals/pairwise-match';
import { displacementAt, rotationErrorDegrees } from '../../../../core/geometry/registration/rigid-transform';

// no shaft axis (bunny-halves.ts): the axis searches stay out, so only RANSAC gives coarse motions
let A: PreparedFragment, B: PreparedFragment, truth: number[];
const only: MatchParameters = { ...DEFAULT_MATCH_PARAMETERS, pairVoteHypotheses: 0, directionPeaks: 0, ransacReverseHypotheses: 0, principalFrameMotions: 0 };

beforeAll(async () => {
  ({ A, B, truth } = await preparedBunnyHalves());
});

describe('the screen with RANSAC run both ways round', () => {
  it('turns the motions of A onto B round: the best screened motion is the truth', () => {
    const trace: MatchTrace = { coarse: [], refined: [], kept: [] };
    const screened = screenFacePair(A, 0, B, 0, { ...only, hypothesesPerPair: 0, ransacReverseHypotheses: 2 }, trace);
    expect(trace.coarse.length).toBeGreaterThan(0);
    expect(screened.length).toBeGreaterThan(0);
    expect(rotationErrorDegrees(screened[0].transform, truth)).toBeLessThan(5);
    expect(displacementAt(screened[0].transform, truth, B.faces[0].centroid)).toBeLessThan(3);
  });

  it('adds its hypotheses to those of B onto A, which alone find the truth as well', () => {
    const given: MatchTrace = { coarse: [], refined: [], kept: [] };
    const both: MatchTrace = { coarse: [], refined: [], kept: [] };
    const a = screenFacePair(A, 0, B, 0, only, given);
    const b = screenFacePair(A, 0, B, 0, { ...only, ransacReverseHypotheses: 2 }, both);
    expect(both.coarse.length).toBeGreaterThan(given.coarse.length);
    // B onto A's hypotheses come first and are the same motions
    expect(both.coarse.slice(0, given.coarse.length)).toEqual(given.coarse);
    for (const s of [a, b]) {
      expect(rotationErrorDegrees(s[0].transform, truth)).toBeLessThan(5);
      expect(displacementAt(s[0].transform, truth, B.faces[0].centroid)).toBeLessThan(3);
    }
  });

  it('without either run there is no motion to screen', () => {
    const trace: MatchTrace = { coarse: [], refined: [], kept: [] };
    expect(screenFacePair(A, 0, B, 0, { ...only, hypothesesPerPair: 0 }, trace)).toEqual([]);
    expect(trace.coarse).toEqual([]);
  });
});
