/**
 * The k-th smallest of the values (k from 0), as `Float64Array.from(values).sort()[k]` reads it:
 * NaN counts as larger than every number. Quickselect (Hoare 1961, "Algorithm 65: Find",
 * Communications of the ACM 4(7)) on a copy, in expected linear time instead of a full sort.
 * -0 and 0 are not told apart (the sort puts -0 first; either may be returned for the other).
 */
export function kthSmallest(values: ArrayLike<number>, k: number): number {
  const n = values.length;
  if (!(k >= 0 && k < n)) return NaN;
  const a = new Float64Array(n);
  let m = 0;
  for (let i = 0; i < n; i++) if (values[i] === values[i]) a[m++] = values[i];
  if (k >= m) return NaN;
  let lo = 0, hi = m - 1;
  while (hi > lo) {
    // Median of three as the pivot value; Hoare's partition around it.
    const mid = (lo + hi) >> 1;
    const x = a[lo], y = a[mid], z = a[hi];
    const pivot = x < y ? (y < z ? y : x < z ? z : x) : (x < z ? x : y < z ? z : y);
    let i = lo, j = hi;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) {
        const t = a[i]; a[i] = a[j]; a[j] = t;
        i++; j--;
      }
    }
    // Now a[lo..j] <= pivot <= a[i..hi], and anything between j and i equals the pivot.
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else return a[k];
  }
  return a[k];
}
