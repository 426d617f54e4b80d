/**
 * The fine step gives up a shortlisted motion whose k-d rounds end with a trimmed RMS residual above
 * fineKdMaxRmsSpacings (pairwise-match.ts fineTransformOrNone): the BVH rounds and the score are
 * not run for it. The Stanford bunny (open data in the npm package `bunny`) cut in two by a rough
 * surface (tests/support/bunny-halves.ts), the upper half moved by a known motion, so the truth is
 * analytic by construction. Starts near the truth (turned about an axis through B's face centroid
 * by a known angle, or shifted by a known distance) must go on and end at the truth; starts turned a
 * quarter turn or more across the break (the rough faces then do not conform, or no longer face
 * each other) must be given up, and kept with the cut off.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { preparedBunnyHalves } from '../../../support/bunny-halves';
import { turnedAbout } from '../../../support/shortlist-entries';
import type { PreparedFragment } from '../../../../core/geometry/proposals/prepared-fragment';
import { DEFAULT_MATCH_PARAMETERS, fineKdRounds, fineTransform, fineTransformOrNone, matchFragments } from '../../../../core/geometry/proposals/pairwise-match';
import { compose, displacementAt, rotationErrorDegrees, transformFrom, type RigidTransform } from '../../../../core/geometry/registration/rigid-transform';

let A: PreparedFragment, B: PreparedFragment, truth: RigidTransform, c: number[];
const spacing = 1.2;
const off = { ...DEFAULT_MATCH_PARAMETERS, fineKdMaxRmsSpacings: 0 };

beforeAll(async () => {
  ({ A, B, truth } = await preparedBunnyHalves(spacing));
  c = [...B.faces[0].centroid];
});

describe('fine step given up after the k-d rounds on faces that do not conform', () => {
  it('the default cut is 0.15 spacings', () => {
    expect(DEFAULT_MATCH_PARAMETERS.fineKdMaxRmsSpacings).toBe(0.15);
  });

  it('goes on from starts near the truth, to the same motion as the whole fine step, at the truth', () => {
    const starts = [
      ...[2, 8, 15].map((deg) => turnedAbout(truth, c, deg)),
      ...[8, 15].map((deg) => turnedAbout(truth, c, deg, [1, 0, 0])),
      ...[1, 4].map((mm) => compose(truth, transformFrom([1, 0, 0, 0, 1, 0, 0, 0, 1], [0, mm, 0]))),
    ];
    for (const s of starts) {
      const mid = fineKdRounds(A, 0, B, 0, s, DEFAULT_MATCH_PARAMETERS);
      expect(mid.rms / spacing).toBeLessThan(0.15);
      const T = fineTransformOrNone(A, 0, B, 0, s, DEFAULT_MATCH_PARAMETERS);
      expect(T).toBeDefined();
      // the same arithmetic as fineTransform, to the last bit
      expect(Array.from(T!)).toEqual(Array.from(fineTransform(A, 0, B, 0, s, DEFAULT_MATCH_PARAMETERS)));
      expect(rotationErrorDegrees(T!, truth)).toBeLessThan(1);
      expect(displacementAt(T!, truth, c)).toBeLessThan(0.5);
    }
  });

  it('gives up starts a quarter turn or more off, which the fine step does not bring back, and keeps them with the cut off', () => {
    // about x and z the faces stay face to face with their roughness crossed; about the first axis and y they no longer face each other
    const starts = [turnedAbout(truth, c, 90, [1, 0, 0]), turnedAbout(truth, c, 90, [0, 0, 1]), turnedAbout(truth, c, 90, [0.3, -0.5, 0.8]), turnedAbout(truth, c, 180, [0, 1, 0])];
    for (const s of starts) {
      const mid = fineKdRounds(A, 0, B, 0, s, DEFAULT_MATCH_PARAMETERS);
      expect(mid.rms / spacing).toBeGreaterThan(0.3);
      expect(fineTransformOrNone(A, 0, B, 0, s, DEFAULT_MATCH_PARAMETERS)).toBeUndefined();
      const T = fineTransformOrNone(A, 0, B, 0, s, off);
      expect(T).toBeDefined();
      // the whole fine step leaves such a start far from the truth: nothing was lost by giving it up
      expect(rotationErrorDegrees(T!, truth)).toBeGreaterThan(45);
    }
  });

  it('a propose worker finds the same best motion, at the truth, with and without the cut', () => {
    const on = matchFragments(A, B, DEFAULT_MATCH_PARAMETERS, [[0, 0]], 3, 0.05);
    const without = matchFragments(A, B, off, [[0, 0]], 3, 0.05);
    expect(on.length).toBeGreaterThan(0);
    expect(Array.from(on[0].transform)).toEqual(Array.from(without[0].transform));
    expect(on[0].score).toBe(without[0].score);
    expect(rotationErrorDegrees(on[0].transform, truth)).toBeLessThan(1);
    expect(displacementAt(on[0].transform, truth, c)).toBeLessThan(1);
  });
});
