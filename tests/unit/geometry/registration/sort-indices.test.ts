/**
 * sortIndicesByKey (sort-indices.ts), which orders ICP's pairs by distance, checked against the
 * engine's own Array.prototype.sort, which ECMAScript 2019 (ECMA-262 10th edition, 22.1.3.27)
 * requires to be stable: the same permutation on keys with many ties, on every length from 0 to
 * a few hundred (several merge passes), and on sorted and reversed input.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { sortIndicesByKey } from '../../../../core/geometry/registration/sort-indices';

function reference(n: number, key: ArrayLike<number>): number[] {
  return Array.from({ length: n }, (_, i) => i).sort((a, b) => key[a] - key[b]);
}

function ours(n: number, key: ArrayLike<number>): number[] {
  const order = Int32Array.from({ length: n }, (_, i) => i);
  return [...sortIndicesByKey(order, n, key, new Int32Array(n)).subarray(0, n)];
}

describe('sortIndicesByKey', () => {
  it('gives the permutation of the stable built-in sort, ties in index order', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 0, max: 6 }), { maxLength: 300 }), fc.boolean(), (ints, fractional) => {
        const key = Float64Array.from(ints, (v) => (fractional ? v / 7 : v));
        expect(ours(key.length, key)).toEqual(reference(key.length, key));
      }),
      { numRuns: 300 },
    );
  });

  it('handles sorted, reversed and all-equal keys, and sorts only the first n entries', () => {
    for (const n of [0, 1, 7, 8, 9, 16, 17, 150, 257]) {
      const up = Float64Array.from({ length: n }, (_, i) => i * 0.5);
      const down = Float64Array.from({ length: n }, (_, i) => -i);
      const flat = new Float64Array(n).fill(2);
      for (const key of [up, down, flat]) expect(ours(n, key)).toEqual(reference(n, key));
    }
    // a longer order array: entries past n are left alone
    const order = Int32Array.from([2, 0, 1, 9, 9]);
    const out = sortIndicesByKey(order, 3, [3, 1, 2], new Int32Array(5));
    expect([...out.subarray(0, 3)]).toEqual([1, 2, 0]);
  });
});
