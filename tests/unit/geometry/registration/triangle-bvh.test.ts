/**
 * The closest-point search (triangle-bvh.ts) against a general-purpose reference library:
 * three-mesh-bvh's closestPointToPoint on the Stanford bunny (npm package `bunny`, Stanford 3D
 * Scanning Repository), at random points near and far from the surface, with and without a
 * distance limit; and against the analytic closest point of a single triangle (each Voronoi
 * region: corner, edge, face).
 */
import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { BufferAttribute, BufferGeometry, Vector3 } from 'three';
import { MeshBVH } from 'three-mesh-bvh';
import { TriangleBvh, type TriangleHit } from '../../../../core/geometry/registration/triangle-bvh';
import { mulberry32 } from '../../../../core/geometry/seeded-random';

const bunny = createRequire(import.meta.url)('bunny') as { positions: number[][]; cells: number[][] };
const positions = Float32Array.from(bunny.positions.flat().map((v) => v * 10));
const triangles = Uint32Array.from(bunny.cells.flat());

describe('closest point on a triangle mesh', () => {
  it('agrees with three-mesh-bvh on the Stanford bunny (distance within 1e-6 mm, point on the same spot)', () => {
    const geometry = new BufferGeometry();
    geometry.setAttribute('position', new BufferAttribute(positions, 3));
    geometry.setIndex(new BufferAttribute(triangles.slice(), 1));
    const reference = new MeshBVH(geometry);
    const mine = new TriangleBvh(positions, triangles);
    const rnd = mulberry32(11);
    const out = {} as TriangleHit;
    let hits = 0, misses = 0;
    for (let k = 0; k < 3000; k++) {
      // a vertex of the bunny pushed off by up to 12 mm (the bunny scaled to about 100 mm), or a point anywhere in a box around it
      const v = Math.floor(rnd() * (positions.length / 3));
      const far = k % 5 === 0;
      const p = far
        ? [(rnd() - 0.5) * 300, (rnd() - 0.5) * 300 + 50, (rnd() - 0.5) * 300]
        : [positions[3 * v] + (rnd() - 0.5) * 24, positions[3 * v + 1] + (rnd() - 0.5) * 24, positions[3 * v + 2] + (rnd() - 0.5) * 24];
      const limit = k % 2 === 0 ? Infinity : 4;
      const want = reference.closestPointToPoint(new Vector3(p[0], p[1], p[2]), {} as never, 0, limit) as { point: Vector3; distance: number } | null;
      const got = mine.closest(p[0], p[1], p[2], limit, out);
      if (!want || !(want.distance <= limit)) {
        expect(got).toBe(false);
        misses++;
        continue;
      }
      expect(got).toBe(true);
      hits++;
      expect(Math.abs(out.distance - want.distance)).toBeLessThan(1e-6 * Math.max(1, want.distance));
      // the closest point itself (unique unless two triangles tie, which random points avoid)
      expect(Math.hypot(out.x - want.point.x, out.y - want.point.y, out.z - want.point.z)).toBeLessThan(1e-3);
      // and it lies on the triangle reported
      const t = out.triangle;
      const a = [0, 1, 2].map((c) => [0, 1, 2].map((d) => positions[3 * triangles[3 * t + c] + d]));
      const n = cross(sub(a[1], a[0]), sub(a[2], a[0]));
      const off = Math.abs(dot(n, sub([out.x, out.y, out.z], a[0]))) / Math.hypot(...n);
      expect(off).toBeLessThan(1e-6 * 100);
    }
    expect(hits).toBeGreaterThan(1000);
    expect(misses).toBeGreaterThan(100);
  });

  it('finds the analytic closest point of one triangle in each Voronoi region', () => {
    // triangle (0,0,0), (4,0,0), (0,4,0): closest points worked out by hand
    const one = new TriangleBvh(Float32Array.of(0, 0, 0, 4, 0, 0, 0, 4, 0), Uint32Array.of(0, 1, 2));
    const out = {} as TriangleHit;
    const cases: Array<[number[], number[]]> = [
      [[-1, -1, 2], [0, 0, 0]], // corner a
      [[6, -1, 0], [4, 0, 0]], // corner b
      [[-1, 7, -3], [0, 4, 0]], // corner c
      [[2, -3, 1], [2, 0, 0]], // edge ab
      [[-2, 1.5, 0], [0, 1.5, 0]], // edge ac
      [[3, 3, 5], [2, 2, 0]], // edge bc
      [[1, 1, -7], [1, 1, 0]], // face
    ];
    for (const [p, want] of cases) {
      expect(one.closest(p[0], p[1], p[2], Infinity, out)).toBe(true);
      expect(Math.hypot(out.x - want[0], out.y - want[1], out.z - want[2])).toBeLessThan(1e-12);
      expect(out.distance).toBeCloseTo(Math.hypot(p[0] - want[0], p[1] - want[1], p[2] - want[2]), 12);
    }
  });
});

const sub = (a: number[], b: number[]): number[] => [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
const dot = (a: number[], b: number[]): number => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
const cross = (a: number[], b: number[]): number[] => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
