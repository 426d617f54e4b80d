import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { axialBearing, bearingDeg, distance3d, horizontalDistance, verticalDisplacement } from '../../../core/spatial/measures';

// Reference: analytic geometry (Pythagoras; bearing = atan2(east, north) measured clockwise
// from north, the surveyor's convention). Worked values are computed by hand beside each check.

describe('distances and bearing of one join', () => {
  it('hand-worked case (issue 8): (0, 0, 1.20) -> (3, 4, 1.05)', () => {
    const a = { x: 0, y: 0, z: 1.2 };
    const b = { x: 3, y: 4, z: 1.05 };
    // 3-4-5 right triangle: sqrt(3^2 + 4^2) = 5.
    expect(horizontalDistance(a, b)).toBeCloseTo(5.0, 10);
    // |1.05 - 1.20| = 0.15.
    expect(verticalDisplacement(a, b)).toBeCloseTo(0.15, 10);
    // sqrt(25 + 0.0225) = sqrt(25.0225) = 5.0022495 -> 5.002 m.
    expect(distance3d(a, b)).toBeCloseTo(5.0022495, 6);
    expect(Number(distance3d(a, b).toFixed(3))).toBe(5.002);
    // atan(3 / 4) = 36.8699 degrees east of north.
    expect(bearingDeg(a, b)).toBeCloseTo(36.8699, 4);
  });

  it('hand-worked bearings in all four quadrants and on the four axes', () => {
    const o = { x: 0, y: 0, z: 0 };
    const to = (x: number, y: number) => bearingDeg(o, { x, y, z: 0 });
    // Diagonals: 45 degrees into each quadrant.
    expect(to(1, 1)).toBeCloseTo(45, 10); // north-east
    expect(to(1, -1)).toBeCloseTo(135, 10); // south-east
    expect(to(-1, -1)).toBeCloseTo(225, 10); // south-west
    expect(to(-1, 1)).toBeCloseTo(315, 10); // north-west
    // 3-4-5 triangles: 36.8699 = atan(3/4) from the nearest north or south axis.
    expect(to(3, -4)).toBeCloseTo(180 - 36.8699, 4); // 143.1301
    expect(to(-3, -4)).toBeCloseTo(180 + 36.8699, 4); // 216.8699
    expect(to(-3, 4)).toBeCloseTo(360 - 36.8699, 4); // 323.1301
    expect(to(4, 3)).toBeCloseTo(90 - 36.8699, 4); // 53.1301
    // Axes: grid north, east, south, west.
    expect(to(0, 2)).toBe(0);
    expect(to(2, 0)).toBeCloseTo(90, 10);
    expect(to(0, -2)).toBeCloseTo(180, 10);
    expect(to(-2, 0)).toBeCloseTo(270, 10);
  });

  it('has no bearing for a join straight up or down (same x and y)', () => {
    expect(bearingDeg({ x: 2, y: 3, z: 1 }, { x: 2, y: 3, z: 0.5 })).toBeNull();
  });

  it('folds bearings onto one axis: 30 and 210 degrees are the same line', () => {
    expect(axialBearing(210)).toBeCloseTo(30, 10);
    expect(axialBearing(30)).toBeCloseTo(30, 10);
    expect(axialBearing(180)).toBe(0);
  });

  // Geometry facts that hold for any two points.
  const coord = fc.double({ min: -500, max: 500, noNaN: true });
  const point = fc.record({ x: coord, y: coord, z: fc.double({ min: -10, max: 10, noNaN: true }) });

  it('3D distance squared is horizontal squared plus vertical squared (Pythagoras)', () => {
    fc.assert(
      fc.property(point, point, (a, b) => {
        const h = horizontalDistance(a, b);
        const v = verticalDisplacement(a, b);
        const d = distance3d(a, b);
        expect(d * d).toBeCloseTo(h * h + v * v, 6);
        expect(h).toBeLessThanOrEqual(d + 1e-9);
      }),
    );
  });

  it('the bearing back from B to A is the bearing from A to B plus 180 degrees', () => {
    fc.assert(
      fc.property(point, point, (a, b) => {
        const ab = bearingDeg(a, b);
        const ba = bearingDeg(b, a);
        if (ab === null || ba === null) return;
        expect(ab).toBeGreaterThanOrEqual(0);
        expect(ab).toBeLessThan(360);
        const diff = (((ba - ab) % 360) + 360) % 360;
        expect(Math.min(Math.abs(diff - 180), 360 - Math.abs(diff - 180))).toBeLessThan(1e-6);
      }),
    );
  });

  it('the bearing points where B is: moving horizontalDistance along it from A reaches B', () => {
    fc.assert(
      fc.property(point, point, (a, b) => {
        const t = bearingDeg(a, b);
        if (t === null) return;
        const h = horizontalDistance(a, b);
        const rad = (t * Math.PI) / 180;
        expect(a.x + h * Math.sin(rad)).toBeCloseTo(b.x, 6);
        expect(a.y + h * Math.cos(rad)).toBeCloseTo(b.y, 6);
      }),
    );
  });
});
