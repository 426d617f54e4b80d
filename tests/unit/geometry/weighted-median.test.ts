/**
 * Weighted median (core/geometry/weighted-median.ts), checked against its definition: the
 * lower weighted median of values x_i with positive weights w_i summing to W is the x_k with
 * sum(w_i : x_i < x_k) < W/2 and sum(w_i : x_i <= x_k) >= W/2 (Cormen, Leiserson, Rivest &
 * Stein, "Introduction to Algorithms", 3rd ed., problem 9-2, where the weights sum to 1 and
 * the inequalities are stated as < 1/2 and <= 1/2 of the sums either side; recalled from
 * memory). With equal weights it is the ordinary lower median.
 */
import { describe, expect, it } from 'vitest';
import { weightedMedian, weightedMedianOf } from '../../../core/geometry/weighted-median';
import { mulberry32 } from '../../../core/geometry/seeded-random';

/** Checks the defining inequalities for m (sums over all entries, not in any sorted order). */
function satisfiesDefinition(values: number[], weights: number[], m: number): boolean {
  const total = weights.reduce((s, w) => s + w, 0);
  let below = 0, upTo = 0;
  values.forEach((v, i) => { if (v < m) below += weights[i]; if (v <= m) upTo += weights[i]; });
  const eps = 1e-9 * total;
  return values.includes(m) && below < total / 2 + eps && upTo >= total / 2 - eps;
}

describe('weightedMedianOf', () => {
  it('with equal weights is the lower median (common practice: the lower of the two middle values for an even count)', () => {
    const order = new Uint32Array(16);
    expect(weightedMedianOf([5, 1, 4, 2, 3], [1, 1, 1, 1, 1], 5, order)).toBe(3);
    expect(weightedMedianOf([6, 1, 4, 2, 3, 5], [1, 1, 1, 1, 1, 1], 6, order)).toBe(3);
  });

  it('follows the weight, not the count: one heavy value outweighs the rest', () => {
    // Weights 0.6 on 10 and 0.1 on each of four smaller values: the values below 10 weigh
    // 0.4 < 0.5, and up to 10 weigh 1 >= 0.5 (definition above).
    expect(weightedMedianOf([1, 2, 10, 3, 4], [0.1, 0.1, 0.6, 0.1, 0.1], 5, new Uint32Array(10))).toBe(10);
  });

  it('meets the definition on random values with ties, and equals the pair version bit for bit', () => {
    const rand = mulberry32(20261203);
    const order = new Uint32Array(800);
    for (let trial = 0; trial < 300; trial++) {
      const n = 1 + Math.floor(rand() * 300);
      // Rounded values make ties; weights span three orders of magnitude.
      const values = Array.from({ length: n }, () => Math.round(rand() * 40) / 4 - 3);
      const weights = Array.from({ length: n }, () => 10 ** (3 * rand() - 2));
      const m = weightedMedianOf(Float64Array.from(values), Float64Array.from(weights), n, order);
      expect(satisfiesDefinition(values, weights, m)).toBe(true);
      expect(Object.is(m, weightedMedian(values.map((v, i) => [v, weights[i]] as [number, number])))).toBe(true);
    }
  });

  it('reads only the first n entries', () => {
    expect(weightedMedianOf([3, 1, 2, 100, 100, 100], [1, 1, 1, 50, 50, 50], 3, new Uint32Array(12))).toBe(2);
  });

  it('is 0 for no values, as the pair version', () => {
    expect(weightedMedianOf([], [], 0, new Uint32Array(0))).toBe(0);
    expect(weightedMedian([])).toBe(0);
  });
});
