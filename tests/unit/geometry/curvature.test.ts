import { describe, expect, it } from 'vitest';
import { vertexRings } from '../../../core/geometry/adjacency';
import { principalCurvatures } from '../../../core/geometry/curvature';
import { vertexNormals } from '../../../core/geometry/mesh';
import { buildTopology } from '../../../core/geometry/topology';
import { openCylinder, sphere } from './shapes';

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

describe('principal curvatures by local quadric fit', () => {
  // Analytic geometry (do Carmo 1976, section 3-3): both principal curvatures of a sphere
  // of radius r are 1/r; a circular cylinder of radius r has 1/r across and 0 along its axis.
  it('a sphere of radius 5 has both curvatures 1/5', () => {
    const m = sphere(5, 30);
    const c = principalCurvatures(m, vertexNormals(m), vertexRings(m));
    expect(median(Array.from(c.k1))).toBeCloseTo(0.2, 2);
    expect(median(Array.from(c.k2))).toBeCloseTo(0.2, 2);
    // every vertex, not only the median, within 3 %
    for (let v = 0; v < c.k1.length; v++) {
      expect(Math.abs(c.k1[v] - 0.2)).toBeLessThan(0.006);
      expect(Math.abs(c.k2[v] - 0.2)).toBeLessThan(0.006);
    }
  });

  it('a sphere of radius 20 has both curvatures 1/20', () => {
    const m = sphere(20, 30);
    const c = principalCurvatures(m, vertexNormals(m), vertexRings(m));
    expect(median(Array.from(c.k1))).toBeCloseTo(0.05, 3);
    expect(median(Array.from(c.k2))).toBeCloseTo(0.05, 3);
  });

  it('a cylinder of radius 4 has curvatures 1/4 and 0, the flat direction along the axis', () => {
    const m = openCylinder(4, 30, 96, 48);
    const c = principalCurvatures(m, vertexNormals(m), vertexRings(m));
    // Leave out the two rims (their neighbourhoods are one-sided).
    const interior: number[] = [];
    for (let v = 0; v < c.k1.length; v++) if (Math.abs(m.positions[3 * v + 1]) < 13) interior.push(v);
    for (const v of interior) {
      expect(Math.abs(c.k1[v] - 0.25)).toBeLessThan(0.01);
      expect(Math.abs(c.k2[v])).toBeLessThan(0.01);
      // three.js builds the cylinder along y
      expect(Math.abs(c.minDirection[3 * v + 1])).toBeGreaterThan(0.99);
    }
    expect(buildTopology(m).boundaryEdges).toBe(2 * 96);
  });

  it('roughness is near zero on a smooth sphere and grows with added bumps', () => {
    const m = sphere(10, 24);
    const smooth = principalCurvatures(m, vertexNormals(m), vertexRings(m)).roughness;
    const bumpy = { positions: Float32Array.from(m.positions), triangles: m.triangles };
    for (let v = 0; v < bumpy.positions.length / 3; v++) {
      const s = 1 + 0.01 * Math.sin(37 * v); // deterministic radial jitter of 1 %
      for (let k = 0; k < 3; k++) bumpy.positions[3 * v + k] *= s;
    }
    const rough = principalCurvatures(bumpy, vertexNormals(bumpy), vertexRings(bumpy)).roughness;
    expect(median(Array.from(smooth))).toBeLessThan(0.002);
    expect(median(Array.from(rough))).toBeGreaterThan(10 * median(Array.from(smooth)));
  });
});
