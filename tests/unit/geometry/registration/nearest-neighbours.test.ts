import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { KdTree } from '../../../../core/geometry/registration/nearest-neighbours';

// Reference: brute-force search over every point (the definition of the k nearest neighbours).
function bruteForce(data: number[], dim: number, q: number[], k: number): number[] {
  const n = data.length / dim;
  const d = Array.from({ length: n }, (_, i) => {
    let s = 0;
    for (let j = 0; j < dim; j++) s += (data[i * dim + j] - q[j]) ** 2;
    return s;
  });
  return d.sort((a, b) => a - b).slice(0, k);
}

describe('k-d tree (Friedman, Bentley & Finkel 1977)', () => {
  it('finds the same k nearest distances as brute force, in 3 and 8 dimensions', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(3, 8),
        fc.integer({ min: 1, max: 300 }),
        fc.integer({ min: 1, max: 6 }),
        fc.integer({ min: 0, max: 1e6 }),
        (dim, n, k, seed) => {
          let s = seed;
          const r = (): number => ((s = (s * 1103515245 + 12345) % 2147483648) / 2147483648) * 10;
          const data = Array.from({ length: n * dim }, () => Math.round(r() * 4) / 4);
          const q = Array.from({ length: dim }, () => r());
          const tree = new KdTree(Float64Array.from(data), dim);
          const got = tree.nearest(q, k).dist2;
          const want = bruteForce(data, dim, q, k);
          expect(got.length).toBe(want.length);
          got.forEach((v, i) => expect(v).toBeCloseTo(want[i], 9));
          const radius = Math.sqrt(want[want.length - 1]) + 1e-9;
          const inside = tree.within(q, radius, []);
          expect(inside.length).toBe(bruteForce(data, dim, q, n).filter((d) => d <= radius * radius).length);
        },
      ),
      { numRuns: 150 },
    );
  });
});
