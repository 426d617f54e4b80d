/**
 * The score's side rule (score-model.ts SIDE_NONE, SIDE_FULL, SIDE_MIN_OFF_AXIS) judges whether
 * a motion puts the two fitted shaft axes on opposite sides of the wall, seen from the join. On
 * a break across the shaft the join's centroid lies on the axis (analytic geometry: the centroid
 * of an annulus is its centre), so the direction from the join to either axis is not defined and
 * a fitted axis a millimetre off turns it any way at all. Checks: analytic axis lines (the side
 * is still measured, and a piece turned inside out still zeroed, for a join off the axis; not
 * measured for a join on it), then a case with truth from construction: a tube (outer radius
 * 12 mm, inner 7 mm, built by manifold-3d) cut across by a rough surface
 * (tests/support/bunny-cut.ts), B's piece moved by a known rigid motion, each piece's axis
 * fitted from its own surface; B's fit then moved 1.5 mm across the shaft (a fitting error of
 * an eighth of the radius) beyond the join, so that the join lies between the two axis lines. The truth must score about as it does
 * with B's own fit. Checked to fail before the side rule left joins on the axis alone (the
 * truth scored 0 with B's fit moved).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { cutTube, type CutPiece } from '../../../support/bunny-cut';
import { breakFaceFromLabels } from '../../../support/break-face-from-labels';
import { DEFAULT_FPFH_RADIUS_SPACINGS, prepareFragment, type PreparedFragment } from '../../../../core/geometry/proposals/prepared-fragment';
import { DEFAULT_MATCH_PARAMETERS, scoredSide } from '../../../../core/geometry/proposals/pairwise-match';
import { axisAgreement, scoreJoin } from '../../../../core/geometry/registration/score';
import { SIDE_MIN_OFF_AXIS } from '../../../../core/geometry/registration/score-model';
import { applyToPoint, applyToPoints, invert, rotationAboutAxis, transformFrom } from '../../../../core/geometry/registration/rigid-transform';
import type { ShaftFrame } from '../../../../core/geometry/registration/shaft-axis-search';

const identity = transformFrom([1, 0, 0, 0, 1, 0, 0, 0, 1], [0, 0, 0]);

/** Points of an arc of radius r about the z axis at height z, from angle a0 to a1 (radians). */
function arc(r: number, a0: number, a1: number, z = 0, n = 64): Float64Array {
  const out = new Float64Array(3 * n);
  for (let i = 0; i < n; i++) {
    const t = a0 + ((a1 - a0) * (i + 0.5)) / n;
    out.set([r * Math.cos(t), r * Math.sin(t), z], 3 * i);
  }
  return out;
}

describe('the side of the wall seen from the join (analytic axis lines)', () => {
  const axis: ShaftFrame = { direction: [0, 0, 1], point: [0, 0, 0], radius: 10 };

  it('is measured for a join off the axis: a half ring (centroid at 2/pi of the radius) turned inside out gives -1', () => {
    const half = arc(9.5, -Math.PI / 2, Math.PI / 2);
    // half turn about the line through the half ring's centroid (x = 2r/pi) along the axis: B's axis line goes to x = 4r/pi
    const cx = (2 * 9.5) / Math.PI;
    expect(cx).toBeGreaterThan(SIDE_MIN_OFF_AXIS * axis.radius);
    const flip = transformFrom(rotationAboutAxis([0, 0, 1], Math.PI), [2 * cx, 0, 0]);
    expect(axisAgreement(axis, axis, flip, applyToPoints(flip, half) as Float64Array).axisSide).toBeCloseTo(-1, 9);
    expect(axisAgreement(axis, axis, identity, half).axisSide).toBeCloseTo(1, 9);
  });

  it('is not measured (1) for a join on the axis, however the fitted axes lie about it', () => {
    // a ring with a short stretch of its rim missing: its centroid 0.2 mm off the axis at angle 0
    const ring = arc(9.5, 0.25, 2 * Math.PI - 0.25);
    let cx = 0;
    for (let i = 0; i < ring.length / 3; i++) cx += ring[3 * i] / (ring.length / 3);
    expect(Math.abs(cx)).toBeGreaterThan(0.1);
    // B's fitted axis 1.5 mm off A's, beyond the centroid (the join between the two axis lines): the two directions from the join are opposed
    const B: ShaftFrame = { direction: [0, 0, 1], point: [Math.sign(cx) * 1.5, 0, 0], radius: 10 };
    const r = axisAgreement(axis, B, identity, ring);
    expect(r.axesCompared).toBe(1);
    expect(r.axisSide).toBe(1);
    // the same offset seen from a join off the axis is still measured (both axes on one side: about 1)
    const half = arc(9.5, -Math.PI / 2, Math.PI / 2);
    expect(axisAgreement(axis, { ...B, point: [1.5, 0, 0] }, identity, half).axisSide).toBeGreaterThan(0.99);
  });
});

describe('the truth of a break across a tube', () => {
  const spacing = 1;
  let lower: CutPiece, upper: CutPiece, A: PreparedFragment, B: PreparedFragment, truth: number[];

  const prepare = (piece: CutPiece, motion: number[]): PreparedFragment => {
    const positions = applyToPoints(motion, piece.positions) as Float32Array;
    const face = breakFaceFromLabels(positions, piece.triangles, piece.onCut, spacing);
    return prepareFragment({ positions, triangles: piece.triangles, faces: [face] }, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS, patches: false });
  };

  beforeAll(async () => {
    // a rough break across a 90 mm tube along y (amplitude 1.5 mm)
    ({ lower, upper } = await cutTube({ amplitude: 1.5, seed: 5 }));
    const M = transformFrom(rotationAboutAxis([1, -2, 0.5], 1.9), [30, -12, 25]);
    truth = invert(M);
    A = prepare(lower, identity);
    B = prepare(upper, M);
  });

  it('scores the truth about as well when B\'s fitted axis lies 1.5 mm off, beyond the join', () => {
    expect(A.axis).not.toBeNull();
    expect(B.axis).not.toBeNull();
    const opts = { contactTolerance: DEFAULT_MATCH_PARAMETERS.contactToleranceSpacings * spacing, spacing };
    const own = scoreJoin(scoredSide(A, A.faces[0]), scoredSide(B, B.faces[0]), truth, opts);
    // the set-up holds: the truth scores well with the pieces' own fits, and the join lies on A's axis
    expect(own.score).toBeGreaterThan(0.5);
    const c = applyToPoint(truth, ...B.faces[0].centroid);
    const a = A.axis!;
    const v = [c[0] - a.point[0], c[1] - a.point[1], c[2] - a.point[2]];
    const t = v[0] * a.direction[0] + v[1] * a.direction[1] + v[2] * a.direction[2];
    const off = [v[0] - t * a.direction[0], v[1] - t * a.direction[1], v[2] - t * a.direction[2]];
    const fromAxis = Math.hypot(off[0], off[1], off[2]);
    expect(fromAxis).toBeLessThan(SIDE_MIN_OFF_AXIS * a.radius);
    // B's fit moved 1.5 mm (in A's frame) across the shaft, beyond the join's centroid (the join between the two axis lines)
    const away = fromAxis > 1e-6 ? off.map((x) => x / fromAxis) : [1, 0, 0];
    const awayInB = applyToPoint(invert(truth), away[0], away[1], away[2]);
    const originInB = applyToPoint(invert(truth), 0, 0, 0);
    const shift = [0, 1, 2].map((k) => 1.5 * (awayInB[k] - originInB[k]));
    const bOff: PreparedFragment = { ...B, axis: { ...B.axis!, point: [B.axis!.point[0] + shift[0], B.axis!.point[1] + shift[1], B.axis!.point[2] + shift[2]] } };
    const moved = scoreJoin(scoredSide(A, A.faces[0]), scoredSide(bOff, bOff.faces[0]), truth, opts);
    expect(moved.axesCompared).toBe(1);
    expect(moved.score).toBeGreaterThan(0.9 * own.score);
  });
});
