/**
 * The lighter geometry drawn while a large scan turns: checked on a sphere built by three.js
 * (a reference library; analytic surface: every point at distance r from the centre).
 */
import { SphereGeometry } from 'three';
import { describe, expect, it } from 'vitest';
import { coarseGeometry } from '../../../renderer/src/viewer/coarse-geometry';

describe('coarseGeometry', () => {
  it('keeps about the wanted number of triangles, on the surface within one grid cell', () => {
    // 400 x 200 segments: 159,200 triangles on a sphere of radius 50 mm.
    const fine = new SphereGeometry(50, 400, 200);
    const fineTriangles = fine.getIndex()!.count / 3;
    const coarse = coarseGeometry(fine, 20_000)!;
    const triangles = coarse.getIndex()!.count / 3;
    expect(triangles).toBeLessThan(fineTriangles / 4);
    expect(triangles).toBeGreaterThan(20_000 * 0.5);
    expect(triangles).toBeLessThan(20_000 * 1.5);
    // Cell size about the mean edge: 100 mm box / sqrt(20,000) ≈ 0.7 mm; averaged points lie
    // inside the sphere by at most the cell diagonal.
    const p = coarse.getAttribute('position');
    let worst = 0;
    for (let i = 0; i < p.count; i++) worst = Math.max(worst, Math.abs(Math.hypot(p.getX(i), p.getY(i), p.getZ(i)) - 50));
    expect(worst).toBeLessThan(2);
    // Normals stay unit length and point outwards.
    const n = coarse.getAttribute('normal');
    for (let i = 0; i < n.count; i += 97) {
      expect(Math.hypot(n.getX(i), n.getY(i), n.getZ(i))).toBeCloseTo(1, 5);
      expect(n.getX(i) * p.getX(i) + n.getY(i) * p.getY(i) + n.getZ(i) * p.getZ(i)).toBeGreaterThan(0);
    }
  });

  it('leaves small geometries alone', () => {
    expect(coarseGeometry(new SphereGeometry(1, 32, 16), 20_000)).toBeNull();
  });
});
