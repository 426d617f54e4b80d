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
 * least 2n) is work space. The same value as weightedMedian on the pairs, bit for bit: ties are
 * ordered by index, as the stable sort of the pairs leaves them.
 */
export function weightedMedianOf(values: ArrayLike<number>, weights: ArrayLike<number>, n: number, order: Uint32Array): number {
  const idx = sortIndicesByValue(values, n, order);
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

/**
 * Indices 0..n-1 ordered by value, ties by index: a bottom-up merge sort (stable, so ties keep
 * index order) in the two halves of `work` (length at least 2n); returns the half holding the result.
 */
function sortIndicesByValue(values: ArrayLike<number>, n: number, work: Uint32Array): Uint32Array {
  let src = work.subarray(0, n), dst = work.subarray(n, 2 * n);
  for (let i = 0; i < n; i++) src[i] = i;
  for (let width = 1; width < n; width *= 2) {
    for (let lo = 0; lo < n; lo += 2 * width) {
      const mid = Math.min(lo + width, n), hi = Math.min(lo + 2 * width, n);
      let i = lo, j = mid, k = lo;
      while (i < mid && j < hi) {
        // Take the right run's entry only when strictly smaller: equal values keep their order.
        if (values[src[j]] < values[src[i]]) dst[k++] = src[j++];
        else dst[k++] = src[i++];
      }
      while (i < mid) dst[k++] = src[i++];
      while (j < hi) dst[k++] = src[j++];
    }
    const t = src; src = dst; dst = t;
  }
  return src;
}
