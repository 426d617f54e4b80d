/**
 * Weighted median: the smallest value at which the weights of the values up to it, in
 * ascending order, reach half of all the weight (the lower weighted median; with equal weights
 * and an even count, the lower of the two middle values). Ties keep their input order, so the
 * sums run in one fixed order and the result does not depend on how the sort is made.
 */

/** Of (value, weight) pairs (sorts the array in place). */
export function weightedMedian(values: Array<[number, number]>): number {
  values.sort((p, q) => p[0] - q[0]);
  const half = values.reduce((s, x) => s + x[1], 0) / 2;
  let acc = 0;
  for (const [v, w] of values) {
    acc += w;
    if (acc >= half) return v;
  }
  return values.length ? values[values.length - 1][0] : 0;
}

/**
 * Of the first n entries of values and weights, without pairing them up: `order` (length at
 * least n) is work space. The same value as weightedMedian on the pairs, bit for bit: ties are
 * ordered by index, as the stable sort of the pairs leaves them.
 */
export function weightedMedianOf(values: ArrayLike<number>, weights: ArrayLike<number>, n: number, order: Uint32Array): number {
  const idx = order.subarray(0, n);
  for (let i = 0; i < n; i++) idx[i] = i;
  idx.sort((a, b) => values[a] - values[b] || a - b);
  let total = 0;
  for (let i = 0; i < n; i++) total += weights[idx[i]];
  const half = total / 2;
  let acc = 0;
  for (let i = 0; i < n; i++) {
    acc += weights[idx[i]];
    if (acc >= half) return values[idx[i]];
  }
  return n ? values[idx[n - 1]] : 0;
}
