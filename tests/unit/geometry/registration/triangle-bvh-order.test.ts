/**
 * A triangle BVH built again from a stored triangle order (triangle-bvh.ts, constructor's
 * `order`; fragment-cache.ts writeTriangleOrder / readTriangleOrder, used by the propose workers
 * when they assemble a fragment from the match cache): on the Stanford bunny (npm package
 * `bunny`, Stanford 3D Scanning Repository) the tree built from the order is the tree the
 * sorting build makes, array for array (boxes, children, ranges, order, corners), and answers
 * every closest-point query with the same point, triangle and distance to the last bit (the
 * search itself is checked against three-mesh-bvh in triangle-bvh.test.ts); an order that does
 * not fit the mesh (another length, a repeated triangle) is ignored and the tree sorted as usual;
 * the order survives the match cache byte for byte.
 */
import { createRequire } from 'node:module';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { TriangleBvh, type TriangleHit } from '../../../../core/geometry/registration/triangle-bvh';
import { readTriangleOrder, TRIANGLE_ORDER_VERSION, writeTriangleOrder } from '../../../../core/jobs/fragment-cache';
import { mulberry32 } from '../../../../core/geometry/seeded-random';

const bunny = createRequire(import.meta.url)('bunny') as { positions: number[][]; cells: number[][] };
const positions = Float32Array.from(bunny.positions.flat().map((v) => v * 10));
const triangles = Uint32Array.from(bunny.cells.flat());
const nt = triangles.length / 3;

/** The tree's arrays (private fields), for comparing two trees. */
function arrays(t: TriangleBvh): Record<string, ArrayLike<number>> {
  const r = t as unknown as Record<string, ArrayLike<number>>;
  return { box: r.box, child: r.child, start: r.start, end: r.end, order: r.order, corners: r.corners };
}

function sameTree(a: TriangleBvh, b: TriangleBvh): boolean {
  const x = arrays(a), y = arrays(b);
  return Object.keys(x).every((k) => x[k].length === y[k].length && Array.prototype.every.call(x[k], (v: number, i: number) => Object.is(v, y[k][i])));
}

describe('a triangle BVH built from a stored order', () => {
  const built = new TriangleBvh(positions, triangles);

  it('is the tree the sorting build makes, and answers every query the same to the last bit', () => {
    const again = new TriangleBvh(positions, triangles, built.triangleOrder.slice());
    expect(sameTree(built, again)).toBe(true);
    const rnd = mulberry32(5);
    const a = {} as TriangleHit, b = {} as TriangleHit;
    for (let k = 0; k < 2000; k++) {
      const v = Math.floor(rnd() * (positions.length / 3));
      const p = [positions[3 * v] + (rnd() - 0.5) * 20, positions[3 * v + 1] + (rnd() - 0.5) * 20, positions[3 * v + 2] + (rnd() - 0.5) * 20];
      const limit = k % 2 ? 3 : Infinity;
      const ga = built.closest(p[0], p[1], p[2], limit, a), gb = again.closest(p[0], p[1], p[2], limit, b);
      expect(gb).toBe(ga);
      if (ga) expect([b.x, b.y, b.z, b.triangle, b.distance]).toEqual([a.x, a.y, a.z, a.triangle, a.distance]);
    }
  });

  it('sorts as usual when the order does not fit the mesh', () => {
    // the identity order is a permutation, but not the build's: it gives another (valid) tree
    const identity = Uint32Array.from({ length: nt }, (_, i) => i);
    expect(sameTree(built, new TriangleBvh(positions, triangles, identity))).toBe(false);
    const short = built.triangleOrder.slice(0, nt - 1);
    const repeated = built.triangleOrder.slice();
    repeated[1] = repeated[0];
    const outOfRange = built.triangleOrder.slice();
    outOfRange[3] = nt;
    for (const bad of [short, repeated, outOfRange]) expect(sameTree(built, new TriangleBvh(positions, triangles, bad))).toBe(true);
  });

  it('survives the match cache byte for byte; a missing or torn file is no order', () => {
    const dir = mkdtempSync(join(tmpdir(), 'knitbone-bvh-order-'));
    expect(readTriangleOrder(dir, 'abc')).toBeUndefined();
    writeTriangleOrder(dir, 'abc', built.triangleOrder);
    const read = readTriangleOrder(dir, 'abc')!;
    expect(Array.from(read)).toEqual(Array.from(built.triangleOrder));
    expect(sameTree(built, new TriangleBvh(positions, triangles, read))).toBe(true);
    writeFileSync(join(dir, `abc.bvh-order${TRIANGLE_ORDER_VERSION}.bin`), Buffer.from([1, 2, 3]));
    expect(readTriangleOrder(dir, 'abc')).toBeUndefined();
  });
});
