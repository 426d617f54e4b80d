/**
 * Sort the first n entries of `order` (indices) by key[index], ascending, stably: equal keys keep
 * their order. The same permutation as `Array.prototype.sort((a, b) => key[a] - key[b])` (which
 * ECMAScript 2019 requires to be stable) on finite keys, without a call per comparison: insertion
 * sort of runs of 8, then bottom-up merges through `scratch` (at least n long). Returns the array
 * that holds the result (`order` or `scratch`).
 */
export function sortIndicesByKey(order: Int32Array, n: number, key: ArrayLike<number>, scratch: Int32Array): Int32Array {
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
