import { describe, expect, it } from 'vitest';
import { BoneShape } from '../../../demo-data/bone-shape';
import { axisFrame, type Vec3 } from '../../../demo-data/fracture-bodies';
import { framePoint, outerNormal, outerRadiusOnRay, slopeForRimAngle } from '../../../demo-data/rim-angle';
import type { ElementSpec } from '../../../demo-data/skeleton';

const deg = Math.PI / 180;
const cross = (a: Vec3, b: Vec3): Vec3 => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
const dot = (a: Vec3, b: Vec3): number => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
const unit = (a: Vec3): Vec3 => {
  const n = Math.hypot(...a);
  return [a[0] / n, a[1] / n, a[2] / n];
};

describe('slope through the wall for a fracture angle at the rim (analytic geometry)', () => {
  it('on a circular cylinder, a face along the axis turned by beta from the radial plane has r dphi/dr = tan(beta)', () => {
    // at angle 0: e_r = x, e_phi = y, axis z; the outer normal is e_r
    for (const beta of [0, 20, -35, 44]) {
      expect(slopeForRimAngle([1, 0, 0], [0, 0, 1], beta * deg, [1, 0, 0], [0, 1, 0])).toBeCloseTo(Math.tan(beta * deg), 9);
    }
  });

  it('on a circular cylinder, a transverse face tilted by beta has |dh/dr| = tan(beta)', () => {
    for (const beta of [0, 25, -40]) {
      const k = slopeForRimAngle([1, 0, 0], [0, 1, 0], beta * deg, [1, 0, 0], [0, 0, 1]);
      expect(Math.abs(k)).toBeCloseTo(Math.tan(Math.abs(beta) * deg), 9);
    }
  });

  it('on an elliptic cylinder x = a cos t, y = b sin t, a face along the normal has r dphi/dr = (a^2 - b^2) sin t cos t / (a b)', () => {
    // Outward normal of the ellipse at t is along (b cos t, a sin t); r dphi/dr along it is the
    // tangent of the normal's angle from the radial direction: (n . e_phi) / (n . e_r).
    const a = 14;
    const b = 9;
    for (const t of [0.2, 0.7, 1.3, 2.1, 2.9, 4.0, 5.5]) {
      const p: Vec3 = [a * Math.cos(t), b * Math.sin(t), 0];
      const r = Math.hypot(p[0], p[1]);
      const eR: Vec3 = [p[0] / r, p[1] / r, 0];
      const ePhi: Vec3 = [-eR[1], eR[0], 0];
      const n = unit([b * Math.cos(t), a * Math.sin(t), 0]);
      const k = slopeForRimAngle(n, [0, 0, 1], 0, eR, ePhi, 10);
      expect(k).toBeCloseTo(((a * a - b * b) * Math.sin(t) * Math.cos(t)) / (a * b), 9);
    }
  });

  it('a front running slantwise round a cylinder (a helix) still meets the surface at 90 - beta', () => {
    // The plane holding the rim direction and dp/dr = e_r + k e_t makes the angle beta with the
    // plane perpendicular to the surface along the rim: its normal is at 90 - beta from the
    // outer normal.
    for (const slant of [0.3, 0.8, 1.5]) {
      for (const beta of [15, -30, 45]) {
        const along = unit([0, 1, slant]);
        const k = slopeForRimAngle([1, 0, 0], along, beta * deg, [1, 0, 0], [0, 0, 1], 10);
        const N = unit(cross(along, [1, 0, k]));
        expect(Math.acos(Math.abs(dot(N, [1, 0, 0]))) / deg).toBeCloseTo(90 - Math.abs(beta), 6);
      }
    }
  });
});

describe('the bone surface the generator bevels against', () => {
  const end = { length: 40, radius: 20, lobe2: 0, lobe4: 0, phase: 0, offset: [0, 0] as const, cap: 12 };
  const tube = (oval: number): ElementSpec => ({
    taxon: 'test', family: 'test', sizeClass: 3, element: 'tube', length: 300,
    shaft: [12, 12, 12], cortical: [4, 4, 4], oval, tri: 0, wobble: 0, bow: 0, proximal: end, distal: end,
  });

  it('a straight circular shaft: the ray meets the surface at the radius, and the normal is radial', () => {
    const shape = new BoneShape(tube(0));
    const frame = axisFrame([0, 0, 150], [0, 0, 1]);
    for (const phi of [0, 1, 2.5, 4]) {
      expect(outerRadiusOnRay(shape, frame, phi, 5, 40)).toBeCloseTo(12, 6);
      const n = outerNormal(shape, framePoint(frame, 12, phi, 5));
      expect(dot(n, [Math.cos(phi), Math.sin(phi), 0])).toBeCloseTo(1, 6);
    }
  });

  it('a flattened shaft is the ellipse x²/a² + y²/b² = 1 with a, b = R0 (1 ± e): the ray meets it there and the normal is the gradient (x/a², y/b²)', () => {
    // Analytic geometry of the ellipse: a point at polar angle theta lies at distance
    // ab / sqrt((b cos theta)² + (a sin theta)²), and the outward normal is the gradient of
    // x²/a² + y²/b² (any analytic geometry text).
    const e = 0.26;
    const shape = new BoneShape(tube(e));
    const frame = axisFrame([0, 0, 150], [0, 0, 1]);
    const a = 12 * (1 + e), b = 12 * (1 - e);
    for (const th of [0.3, 0.8, 1.2, 1.5708, 2.5]) {
      const R = (a * b) / Math.hypot(b * Math.cos(th), a * Math.sin(th));
      expect(outerRadiusOnRay(shape, frame, th, 0, 40)).toBeCloseTo(R, 4);
      const p = framePoint(frame, R, th, 0);
      const x = R * Math.cos(th), y = R * Math.sin(th);
      expect((x * x) / (a * a) + (y * y) / (b * b)).toBeCloseTo(1, 6);
      const n = outerNormal(shape, p);
      const g: Vec3 = [x / (a * a), y / (b * b), 0];
      const gl = Math.hypot(g[0], g[1]);
      expect(dot(n, [g[0] / gl, g[1] / gl, 0])).toBeCloseTo(1, 5);
    }
  });

  it('a flattened shaft stays convex and keeps its wall: the cavity is the ellipse of the outer semi-axes less the wall', () => {
    // A convex closed curve has curvature of one sign; for a polar curve r(theta) the sign is
    // that of r² + 2r'² - r r'' (curvature of a polar curve, any calculus text).
    const shape = new BoneShape(tube(0.3));
    const sign = (f: (t: number) => number, t: number) => {
      const h = 1e-3, r = f(t), r1 = (f(t + h) - f(t - h)) / (2 * h), r2 = (f(t + h) - 2 * r + f(t - h)) / (h * h);
      return r * r + 2 * r1 * r1 - r * r2;
    };
    for (let t = 0; t < 2 * Math.PI; t += 0.05) {
      expect(sign((q) => shape.outerRadius(150, q), t)).toBeGreaterThan(0);
      expect(sign((q) => shape.innerRadius(150, q), t)).toBeGreaterThan(0);
    }
    // Along both axes of the ellipse the wall is exactly the cortical thickness.
    for (const t of [0, Math.PI / 2, Math.PI]) expect(shape.outerRadius(150, t) - shape.innerRadius(150, t)).toBeCloseTo(4, 6);
  });
});
