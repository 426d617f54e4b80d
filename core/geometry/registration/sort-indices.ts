/**
 * Sort the first n entries of `order` (indices) by key[index], ascending, stably: equal keys keep
 * their order. The same permutation as `Array.prototype.sort((a, b) => key[a] - key[b])` (which
 * ECMAScript 2019 requires to be stable) on finite keys, without a call per comparison. Returns the
 * array that holds the result (`order` or `scratch`, at least n long).
 *
 * ICP sorts its pairs by distance every round, so this is a bucket sort (a distribution by key
 * into n equal slices of the keys' range, then insertion sort): slicing is monotone (a smaller
 * key never goes to a later slice), so only keys within one slice can be out of order, and ties
 * share a slice in their first order; insertion sort with a strict comparison then leaves every
 * key after the smaller ones and ties as they were, the stable order. Keys that are all equal or
 * not all finite go to insertion sort of runs of 8 and bottom-up merges instead.
 */
export function sortIndicesByKey(order: Int32Array, n: number, key: ArrayLike<number>, scratch: Int32Array): Int32Array {
  if (n < 2) return order;
  let lo = Infinity, hi = -Infinity;
  let nan = false;
  for (let i = 0; i < n; i++) {
    const v = key[order[i]];
    if (v < lo) lo = v;
    if (v > hi) hi = v;
    if (v !== v) nan = true;
  }
  const span = hi - lo;
  if (nan || !(span > 0 && span < Infinity)) return mergeSortIndices(order, n, key, scratch);
  if (slices.length < n + 1) slices = new Int32Array(2 * n + 1);
  const start = slices;
  start.fill(0, 0, n + 1);
  const scale = n / span, last = n - 1;
  for (let i = 0; i < n; i++) {
    const s = Math.floor((key[order[i]] - lo) * scale);
    start[(s < last ? s : last) + 1]++;
  }
  for (let s = 1; s <= n; s++) start[s] += start[s - 1];
  for (let i = 0; i < n; i++) {
    const v = order[i];
    const s = Math.floor((key[v] - lo) * scale);
    scratch[start[s < last ? s : last]++] = v;
  }
  for (let i = 1; i < n; i++) {
    const v = scratch[i], kv = key[v];
    let j = i - 1;
    while (j >= 0 && key[scratch[j]] > kv) {
      scratch[j + 1] = scratch[j];
      j--;
    }
    scratch[j + 1] = v;
  }
  return scratch;
}

/** Where each slice of sortIndicesByKey starts (kept between calls, grown when needed). */
let slices = new Int32Array(0);

/** sortIndicesByKey by insertion sort of runs of 8, then bottom-up merges through `scratch`. */
function mergeSortIndices(order: Int32Array, n: number, key: ArrayLike<number>, scratch: Int32Array): Int32Array {
  const RUN = 8;
  for (let lo = 0; lo < n; lo += RUN) {
    const hi = Math.min(n, lo + RUN);
    for (let i = lo + 1; i < hi; i++) {
      const v = order[i], kv = key[v];
      let j = i - 1;
      while (j >= lo && key[order[j]] > kv) {
        order[j + 1] = order[j];
        j--;
      }
      order[j + 1] = v;
    }
  }
  let src = order, dst = scratch;
  for (let w = RUN; w < n; w *= 2) {
    for (let lo = 0; lo < n; lo += 2 * w) {
      const mid = Math.min(n, lo + w), hi = Math.min(n, lo + 2 * w);
      let i = lo, j = mid, k = lo;
      // take from the right run only when strictly smaller: ties keep the left (earlier) entry first
      while (i < mid && j < hi) dst[k++] = key[src[j]] < key[src[i]] ? src[j++] : src[i++];
      while (i < mid) dst[k++] = src[i++];
      while (j < hi) dst[k++] = src[j++];
    }
    const t = src;
    src = dst;
    dst = t;
  }
  return src;
}
