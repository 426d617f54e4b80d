/**
 * Coarse motions from the two faces' principal frames (principal-frame-motions.ts; moment
 * matching, e.g. Besl & McKay 1992, section IV). Checked against analytic geometry: the partner
 * of a face is the same surface seen from the other side (same points, normals reversed), moved
 * by a known rigid motion; its principal frame is the face's own frame moved, so one of the two
 * motions is the exact inverse of that motion, and the other is it turned half round about the
 * face's mean normal through its centroid. Then the screen (pairwise-match.ts
 * `principalFrameMotions`) on the Stanford bunny (open data, npm package `bunny`) cut in two by a
 * rough surface (tests/support/bunny-cut.ts), one half moved by a known motion: with every other
 * coarse stage off, the principal frames alone screen the truth first.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { principalFrameMotions } from '../../../../core/geometry/registration/principal-frame-motions';
import { applyToDirections, applyToPoints, compose, displacementAt, invert, rotationAboutAxis, rotationErrorDegrees, transformFrom } from '../../../../core/geometry/registration/rigid-transform';
import { preparedBunnyHalves } from '../../../support/bunny-halves';
import type { PreparedFragment } from '../../../../core/geometry/proposals/prepared-fragment';
import { DEFAULT_MATCH_PARAMETERS, screenFacePair, type MatchParameters, type MatchTrace } from '../../../../core/geometry/proposals/pairwise-match';

/** A 40 x 10 mm plate on a 1 mm grid, gently bent (z = 0.002 x^2), with its upward unit normals. */
function bentPlate(): { points: Float32Array; normals: Float32Array } {
  const p: number[] = [], n: number[] = [];
  for (let x = -20; x <= 20; x++) for (let y = -5; y <= 5; y++) {
    p.push(x, y, 0.002 * x * x);
    const gx = 0.004 * x, l = Math.hypot(gx, 0, 1);
    n.push(-gx / l, 0, 1 / l);
  }
  return { points: Float32Array.from(p), normals: Float32Array.from(n) };
}

describe('principal frame motions (analytic)', () => {
  const A = bentPlate();
  const M = transformFrom(rotationAboutAxis([1, 2, -0.5], 2.2), [30, -12, 7]);
  // the partner: the same surface from the other side, moved by M
  const B = { points: applyToPoints(M, A.points) as Float32Array, normals: applyToDirections(M, A.normals.map((v) => -v)) as Float32Array };
  const truth = invert(M);

  it('one motion is the exact inverse of the partner\'s motion, the other a half turn about the mean normal', () => {
    const ms = principalFrameMotions(A.points, A.normals, B.points, B.normals);
    expect(ms).toHaveLength(2);
    const errs = ms.map((m) => rotationErrorDegrees(m, truth));
    const k = errs[0] < errs[1] ? 0 : 1;
    expect(errs[k]).toBeLessThan(1e-3);
    expect(displacementAt(ms[k], truth, [30, -12, 7])).toBeLessThan(1e-3);
    // the other: the truth followed by a half turn about A's mean normal through A's centroid
    let nz = 0, cz = 0;
    for (let i = 0; i < A.normals.length / 3; i++) { nz += A.normals[3 * i + 2]; cz += A.points[3 * i + 2] / (A.points.length / 3); }
    expect(nz).toBeGreaterThan(0); // the mean normal is +z (x terms cancel by symmetry)
    const halfTurn = compose(transformFrom([1, 0, 0, 0, 1, 0, 0, 0, 1], [0, 0, cz]), compose(transformFrom(rotationAboutAxis([0, 0, 1], Math.PI), [0, 0, 0]), transformFrom([1, 0, 0, 0, 1, 0, 0, 0, 1], [0, 0, -cz])));
    const other = compose(halfTurn, truth);
    expect(rotationErrorDegrees(ms[1 - k], other)).toBeLessThan(1e-3);
    expect(displacementAt(ms[1 - k], other, [30, -12, 7])).toBeLessThan(1e-3);
    // every motion is a proper rotation carrying B's normals against A's
    for (const m of ms) {
      const R = [m[0], m[1], m[2], m[4], m[5], m[6], m[8], m[9], m[10]];
      const det = R[0] * (R[4] * R[8] - R[5] * R[7]) - R[1] * (R[3] * R[8] - R[5] * R[6]) + R[2] * (R[3] * R[7] - R[4] * R[6]);
      expect(det).toBeCloseTo(1, 9);
    }
  });

  it('with quarter turns adds the two motions laying the long axis across', () => {
    const ms = principalFrameMotions(A.points, A.normals, B.points, B.normals, { quarterTurns: true });
    expect(ms).toHaveLength(4);
    const errs = ms.map((m) => rotationErrorDegrees(m, truth)).sort((a, b) => a - b);
    expect(errs[0]).toBeLessThan(1e-3);
    expect(errs[1]).toBeCloseTo(90, 3);
    expect(errs[2]).toBeCloseTo(90, 3);
    expect(errs[3]).toBeCloseTo(180, 3);
  });

  it('gives nothing for a face whose normals cancel or with under 3 samples', () => {
    const flat = Float32Array.from([0, 0, 0, 1, 0, 0, 0, 1, 0, 1, 1, 0]);
    const cancel = Float32Array.from([0, 0, 1, 0, 0, -1, 0, 0, 1, 0, 0, -1]);
    expect(principalFrameMotions(flat, cancel, A.points, A.normals)).toEqual([]);
    expect(principalFrameMotions(A.points, A.normals, flat.subarray(0, 6), A.normals.subarray(0, 6))).toEqual([]);
  });
});

describe('the screen with principal frame motions', () => {
  let A: PreparedFragment, B: PreparedFragment, truth: number[];
  // every other coarse stage off
  const only: MatchParameters = { ...DEFAULT_MATCH_PARAMETERS, hypothesesPerPair: 0, pairVoteHypotheses: 0, directionPeaks: 0, ransacReverseHypotheses: 0, principalFrameMinSamples: 0 };
  beforeAll(async () => {
    ({ A, B, truth } = await preparedBunnyHalves());
  });

  it('screens the truth first from the two faces\' principal frames alone', () => {
    const trace: MatchTrace = { coarse: [], refined: [], kept: [] };
    const screened = screenFacePair(A, 0, B, 0, { ...only, principalFrameMotions: 2 }, trace);
    expect(trace.coarse).toHaveLength(2);
    expect(screened.length).toBeGreaterThan(0);
    expect(rotationErrorDegrees(screened[0].transform, truth)).toBeLessThan(5);
    expect(displacementAt(screened[0].transform, truth, B.faces[0].centroid)).toBeLessThan(3);
  });

  it('is left out below principalFrameMinSamples, for faces of unequal size, and when off', () => {
    const n = Math.min(A.faces[0].points.length, B.faces[0].points.length) / 3;
    for (const p of [{ principalFrameMinSamples: n + 1 }, { principalFrameMinSizeRatio: 1.01 }, { principalFrameMotions: 0 }]) {
      const trace: MatchTrace = { coarse: [], refined: [], kept: [] };
      expect(screenFacePair(A, 0, B, 0, { ...only, principalFrameMotions: 2, ...p }, trace)).toEqual([]);
      expect(trace.coarse).toEqual([]);
    }
  });
});
