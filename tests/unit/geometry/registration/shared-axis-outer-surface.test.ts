/**
 * Two splinters of one shaft of elliptic section whose own fitted radii differ (analytic truth).
 * The section's outer ellipse has semi-axes 14 x 10 mm, the medullary one 10 x 6 mm, the shaft
 * runs along z. A longitudinal break at the ellipse parameter 60 degrees parts a splinter from the
 * flat side (parameter 60..130 degrees) from one round the tight end (0..60 degrees). Each piece's
 * axis is the circle through three points of its own outer arc (its two ends and its middle: the
 * circumscribed circle of a triangle, analytic geometry), as a fit on a partial arc reads the
 * local curvature: radii 18.6 and 10.0 mm (ratio 1.87, over the screen's maxRadiusRatio 1.35),
 * centres 8.7 mm apart, so the two axes laid on one line put the outer surfaces apart at the join.
 * The break face is the wall's band at 60 degrees with a relief (0.6 mm along its normal), the
 * same samples for both pieces with opposed normals; the second piece is then moved by a known
 * rigid motion, whose inverse is the truth. With A's axis moved so that the outer surfaces meet at
 * the join (outerQuantile), the search's best hypothesis is a coarse start near the truth (within
 * 10 degrees and 5 mm, the studies' coarse-start tolerance, tests/bench/coarse-miss-study.ts: the
 * short ICP takes up the rest; the two fitted circles cross the join at 7 degrees to each other,
 * which the turn about one axis cannot undo) with the face in place (under 1 mm at its
 * centroid); with the axes on one line it finds none (no samples pair at one radius).
 */
import { describe, expect, it } from 'vitest';
import { searchAboutSharedAxis, type ShaftFrame } from '../../../../core/geometry/registration/shaft-axis-search';
import { axisMeetingOuterSurface } from '../../../../core/geometry/registration/axis-meeting-outer-surface';
import { applyToDirections, applyToPoint, applyToPoints, displacementAt, invert, rotationAboutAxis, rotationErrorDegrees, transformFrom } from '../../../../core/geometry/registration/rigid-transform';

const deg = Math.PI / 180;
const A_OUT = 14, B_OUT = 10, A_IN = 10, B_IN = 6;
const JOIN = 60 * deg;
const ellipse = (a: number, b: number, t: number): [number, number] => [a * Math.cos(t), b * Math.sin(t)];

/** The circle through three points of the plane (circumscribed circle): centre and radius. */
function circleThrough(p: [number, number], q: [number, number], r: [number, number]): { centre: [number, number]; radius: number } {
  const d = 2 * (p[0] * (q[1] - r[1]) + q[0] * (r[1] - p[1]) + r[0] * (p[1] - q[1]));
  const s = (v: [number, number]): number => v[0] * v[0] + v[1] * v[1];
  const x = (s(p) * (q[1] - r[1]) + s(q) * (r[1] - p[1]) + s(r) * (p[1] - q[1])) / d;
  const y = (s(p) * (r[0] - q[0]) + s(q) * (p[0] - r[0]) + s(r) * (q[0] - p[0])) / d;
  return { centre: [x, y], radius: Math.hypot(p[0] - x, p[1] - y) };
}

/** A piece's own axis: the circle through its outer arc's ends and middle (parameters in degrees). */
function pieceAxis(fromDeg: number, toDeg: number): ShaftFrame {
  const c = circleThrough(ellipse(A_OUT, B_OUT, fromDeg * deg), ellipse(A_OUT, B_OUT, ((fromDeg + toDeg) / 2) * deg), ellipse(A_OUT, B_OUT, toDeg * deg));
  return { direction: [0, 0, 1], point: [c.centre[0], c.centre[1], 0], radius: c.radius };
}

/**
 * The break face at the join: the band from the medullary to the outer ellipse, z in [-20, 20],
 * pushed along the band's normal by a relief; normals (finite differences of the surface) facing
 * towards decreasing ellipse parameter (out of the flat-side piece, into the other).
 */
function breakFace(): { points: Float64Array; normals: Float64Array } {
  const inner = ellipse(A_IN, B_IN, JOIN), outer = ellipse(A_OUT, B_OUT, JOIN);
  const e = [outer[0] - inner[0], outer[1] - inner[1]];
  const width = Math.hypot(e[0], e[1]);
  e[0] /= width; e[1] /= width;
  // the band's normal in the section plane, facing the tight-end piece (decreasing parameter)
  let n = [-e[1], e[0]];
  const towards = [A_OUT * Math.sin(JOIN), -B_OUT * Math.cos(JOIN)];
  if (n[0] * towards[0] + n[1] * towards[1] < 0) n = [-n[0], -n[1]];
  const relief = (s: number, z: number): number => 0.6 * (Math.cos((2 * Math.PI * z) / 9 + s) + 0.5 * Math.sin((2 * Math.PI * z) / 7) * Math.cos((2 * Math.PI * s) / 3));
  const at = (s: number, z: number): number[] => { const h = relief(s, z); return [inner[0] + s * e[0] + h * n[0], inner[1] + s * e[1] + h * n[1], z]; };
  const P: number[] = [], N: number[] = [];
  for (let s = 0; s <= width + 1e-9; s += width / 5) {
    for (let z = -20; z <= 20; z += 1) {
      const p = at(s, z), ps = at(s + 1e-4, z), pz = at(s, z + 1e-4);
      const u = [ps[0] - p[0], ps[1] - p[1], ps[2] - p[2]], v = [pz[0] - p[0], pz[1] - p[1], pz[2] - p[2]];
      let m = [u[1] * v[2] - u[2] * v[1], u[2] * v[0] - u[0] * v[2], u[0] * v[1] - u[1] * v[0]];
      const l = Math.hypot(m[0], m[1], m[2]);
      m = m.map((x) => x / l);
      if (m[0] * n[0] + m[1] * n[1] < 0) m = m.map((x) => -x);
      P.push(...p); N.push(...m);
    }
  }
  return { points: Float64Array.from(P), normals: Float64Array.from(N) };
}

describe('the shared-axis search for pieces whose fitted radii differ (elliptic section)', () => {
  const axisA = pieceAxis(60, 130), axisB0 = pieceAxis(0, 60);
  const face = breakFace();
  const faceA = face, faceB0 = { points: face.points, normals: face.normals.map((x) => -x) };
  const M = transformFrom(rotationAboutAxis([1, -2, 0.5], 2.1), [40, 10, -25]);
  const axisB: ShaftFrame = { direction: Array.from(applyToDirections(M, axisB0.direction)) as [number, number, number], point: applyToPoint(M, ...axisB0.point), radius: axisB0.radius };
  const faceB = { points: applyToPoints(M, faceB0.points), normals: applyToDirections(M, Float32Array.from(faceB0.normals)) };
  const truth = invert(M);
  const centroidB = [0, 0, 0];
  for (let i = 0; i < faceB.points.length / 3; i++) for (let k = 0; k < 3; k++) centroidB[k] += faceB.points[3 * i + k] / (faceB.points.length / 3);
  const near = (T: number[]): boolean => rotationErrorDegrees(T, truth) < 10 && displacementAt(T, truth, centroidB) < 5;

  it('fits radii more than 1.35 apart whose centres lie far apart', () => {
    expect(axisA.radius / axisB0.radius).toBeGreaterThan(1.35);
    expect(Math.hypot(axisA.point[0] - axisB0.point[0], axisA.point[1] - axisB0.point[1])).toBeGreaterThan(8);
  });

  it('moves A\'s axis so that B\'s outer circle passes through the join\'s outer edge', () => {
    const moved = axisMeetingOuterSurface(axisA, faceA.points, axisB0, faceB0.points, 0.9).frame;
    const o = ellipse(A_OUT, B_OUT, JOIN);
    // B's outer radius at its own face about the moved axis: within a millimetre of the join's outer edge
    expect(Math.abs(Math.hypot(o[0] - moved.point[0], o[1] - moved.point[1]) - moved.radius)).toBeLessThan(1);
    // unmoved along the axis
    expect(moved.point[2]).toBeCloseTo(axisA.point[2], 9);
  });

  it('screens a coarse start near the truth first with the outer surfaces meeting, none with the axes on one line', () => {
    const run = (outerQuantile?: number) => searchAboutSharedAxis(axisA, faceA.points, faceA.normals, axisB, faceB.points, faceB.normals, { spacing: 1, peaks: 2, ...(outerQuantile !== undefined ? { outerQuantile } : {}) });
    const meeting = run(0.9), oneLine = run();
    expect(meeting.length).toBeGreaterThan(0);
    expect(near(meeting[0].transform)).toBe(true);
    expect(displacementAt(meeting[0].transform, truth, centroidB)).toBeLessThan(1);
    expect(oneLine.some((h) => near(h.transform))).toBe(false);
  });
});
