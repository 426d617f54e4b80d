/**
 * The screen ranks the motions of two shaft pieces by overlap share times their agreement with
 * the two fitted shaft axes (screen-measures.ts screenAxisConsistency). Analytic checks of the
 * measure on axis lines with known tilt and side, then a case with truth from construction: a
 * tube (outer radius 12 mm, inner 7 mm, built by manifold-3d) split lengthwise by a smooth rough
 * surface (tests/support/bunny-cut.ts, amplitude 0.4 mm), a 6 mm patch of the break kept on
 * each side, one piece moved by a known rigid motion. The patch is nearly flat, so the half turn
 * about its normal fits it about as well as the truth; that turn puts the piece inside out (its
 * axis across the wall), which no join of one shaft does: the screen must keep the truth first.
 * Checked to fail before the axes took part in the screen's ranking (the half turn was first).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { cutTube, type CutPiece } from '../../../support/bunny-cut';
import { breakFaceFromLabels } from '../../../support/break-face-from-labels';
import { DEFAULT_FPFH_RADIUS_SPACINGS, prepareFragment, type PreparedFragment } from '../../../../core/geometry/proposals/prepared-fragment';
import { DEFAULT_MATCH_PARAMETERS, screenFacePair } from '../../../../core/geometry/proposals/pairwise-match';
import { screenAxisConsistency } from '../../../../core/geometry/proposals/screen-measures';
import { applyToPoints, displacementAt, invert, rotationAboutAxis, rotationErrorDegrees, transformFrom } from '../../../../core/geometry/registration/rigid-transform';
import type { ShaftFrame } from '../../../../core/geometry/registration/shaft-axis-search';

const identity = transformFrom([1, 0, 0, 0, 1, 0, 0, 0, 1], [0, 0, 0]);
const tilts: [number, number] = [20, 45];

describe('agreement of a motion with two fitted shaft axes', () => {
  // A's axis: the z axis; B's the same line in its own frame; the join at (10, 0, 0), on the wall
  const axis: ShaftFrame = { direction: [0, 0, 1], point: [0, 0, 0], radius: 10 };
  const join = [10, 0, 0];
  /** A turn of B by `deg` about the line through the join along y (tilts B's axis by `deg`). */
  const tilted = (deg: number): number[] => {
    const R = rotationAboutAxis([0, 1, 0], (deg * Math.PI) / 180);
    const t = [join[0] - (R[0] * join[0] + R[1] * join[1] + R[2] * join[2]), join[1] - (R[3] * join[0] + R[4] * join[1] + R[5] * join[2]), join[2] - (R[6] * join[0] + R[7] * join[1] + R[8] * join[2])];
    return transformFrom(R, t);
  };

  it('is 1 when the axes are one line, and falls linearly from 20 to 45 degrees of tilt', () => {
    expect(screenAxisConsistency(axis, axis, identity, join, tilts)).toBeCloseTo(1, 9);
    expect(screenAxisConsistency(axis, axis, tilted(15), join, tilts)).toBeCloseTo(1, 9);
    // (45 - 30) / (45 - 20) = 0.6; the tilted axis still passes the join on the same side
    expect(screenAxisConsistency(axis, axis, tilted(30), join, tilts)).toBeCloseTo(0.6, 6);
    expect(screenAxisConsistency(axis, axis, tilted(60), join, tilts)).toBe(0);
  });

  it('is 0 for a piece turned inside out (its axis across the wall from the join), 1 when either fit is not trusted', () => {
    // half turn about the line through the join parallel to the axis: B's axis line goes to x = 20, across the wall
    const R = rotationAboutAxis([0, 0, 1], Math.PI);
    const flip = transformFrom(R, [2 * join[0], 0, 0]);
    expect(screenAxisConsistency(axis, axis, flip, join, tilts)).toBe(0);
    expect(screenAxisConsistency(axis, { ...axis, radius: 20 }, flip, join, tilts)).toBe(1);
    expect(screenAxisConsistency(null, axis, flip, join, tilts)).toBe(1);
  });
});

describe('screening a small patch of a lengthwise break', () => {
  const spacing = 1;
  let a: PreparedFragment, b: PreparedFragment, truth: number[];

  beforeAll(async () => {
    const cut = await cutTube({ amplitude: 0.4, seed: 3, lengthwise: true });
    const M = transformFrom(rotationAboutAxis([-1, 2, 1], 2.4), [-35, 15, 20]);
    truth = invert(M);
    const patch = (piece: CutPiece, motion: number[], centre: number[]): PreparedFragment => {
      const positions = applyToPoints(motion, piece.positions) as Float32Array;
      const face = breakFaceFromLabels(positions, piece.triangles, piece.onCut, spacing);
      const keep: number[] = [];
      for (let i = 0; i < face.points.length / 3; i++) if (Math.hypot(face.points[3 * i] - centre[0], face.points[3 * i + 1] - centre[1], face.points[3 * i + 2] - centre[2]) < 6) keep.push(i);
      const pick = (v: Float32Array): Float32Array => Float32Array.from(keep.flatMap((i) => [v[3 * i], v[3 * i + 1], v[3 * i + 2]]));
      return prepareFragment({ positions, triangles: piece.triangles, faces: [{ points: pick(face.points), normals: pick(face.normals) }] }, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS, patches: false });
    };
    // on the break strip at z = 9.5 (the tube lies along x, split at y = 0; wall from 7 to 12 mm)
    const c = [-20, 0, 9.5];
    const moved = [0, 1, 2].map((r) => M[4 * r] * c[0] + M[4 * r + 1] * c[1] + M[4 * r + 2] * c[2] + M[4 * r + 3]);
    a = patch(cut.lower, identity, c);
    b = patch(cut.upper, M, moved);
  });

  it('keeps the truth first, not the half turn that fits the flat patch as well but turns the piece inside out', () => {
    expect(a.axis).not.toBeNull();
    expect(b.axis).not.toBeNull();
    // the general path only (RANSAC and pair voting), as for pieces whose axis searches find nothing
    const params = { ...DEFAULT_MATCH_PARAMETERS, directionPeaks: 0, maxRadiusRatio: 0.5 };
    const trace = { coarse: [], refined: [], kept: [] } as { coarse: number[][]; refined: Array<{ transform: number[]; overlap: number }>; kept: number[][] };
    const kept = screenFacePair(a, 0, b, 0, params, trace);
    // the set-up holds: some refined motion is the half turn (within 10 degrees of 180 from the truth) with an overlap at least the truth's
    const near = (T: number[]): boolean => rotationErrorDegrees(T, truth) < 5 && displacementAt(T, truth, b.faces[0].centroid) < 3 * spacing;
    const bestTrue = Math.max(...trace.refined.filter((r) => near(r.transform)).map((r) => r.overlap));
    expect(trace.refined.some((r) => rotationErrorDegrees(r.transform, truth) > 170 && r.overlap >= bestTrue)).toBe(true);
    expect(kept.length).toBeGreaterThan(0);
    expect(near(kept[0].transform)).toBe(true);
  });
});
