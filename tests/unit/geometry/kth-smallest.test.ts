/**
 * kthSmallest (core/geometry/kth-smallest.ts) against a general-purpose reference: the k-th
 * entry of Float64Array.prototype.sort's ascending order (ECMAScript's TypedArray sort, which
 * puts NaN last), on random data with many ties and on sorted, reversed and constant input
 * (quickselect's classic bad cases).
 */
import { describe, expect, it } from 'vitest';
import { kthSmallest } from '../../../core/geometry/kth-smallest';
import { mulberry32 } from '../../../core/geometry/seeded-random';

const reference = (values: number[], k: number): number => Float64Array.from(values).sort()[k];

describe('kthSmallest', () => {
  it('agrees with the sorted order for every k on random inputs with ties', () => {
    const rand = mulberry32(3);
    for (let trial = 0; trial < 60; trial++) {
      const n = 1 + Math.floor(rand() * 120);
      const values = Array.from({ length: n }, () => (rand() < 0.5 ? Math.round(rand() * 10) : rand() * 1000 - 500));
      for (let k = 0; k < n; k++) expect(kthSmallest(values, k)).toBe(reference(values, k));
    }
  });

  it('handles sorted, reversed and constant input', () => {
    const up = Array.from({ length: 1001 }, (_, i) => i * 0.5);
    const down = [...up].reverse();
    const flat = new Array(1001).fill(2.5);
    for (const values of [up, down, flat]) for (const k of [0, 1, 500, 999, 1000]) expect(kthSmallest(values, k)).toBe(reference(values, k));
  });

  it('counts NaN as larger than every number, and is NaN outside 0..n-1', () => {
    const values = [3, NaN, 1, NaN, 2];
    expect(kthSmallest(values, 0)).toBe(1);
    expect(kthSmallest(values, 2)).toBe(3);
    expect(kthSmallest(values, 3)).toBeNaN();
    expect(kthSmallest(values, 5)).toBeNaN();
    expect(kthSmallest([], 0)).toBeNaN();
  });

  it('reads typed arrays (the median of a Float32Array as its sort reads it)', () => {
    const rand = mulberry32(5);
    const values = Float32Array.from({ length: 20001 }, () => rand() * 3);
    const k = Math.floor(values.length / 2);
    expect(kthSmallest(values, k)).toBe(Float32Array.from(values).sort()[k]);
  });
});
