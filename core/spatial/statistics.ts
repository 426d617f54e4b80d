/** Plain descriptive statistics over numbers (null when there is nothing to describe). */

export function mean(values: readonly number[]): number | null {
  if (values.length === 0) return null;
  let sum = 0;
  for (const v of values) sum += v;
  return sum / values.length;
}

/** The middle value; with an even count, the mean of the two middle values. */
export function median(values: readonly number[]): number | null {
  if (values.length === 0) return null;
  const sorted = [...values].sort((p, q) => p - q);
  const mid = sorted.length >> 1;
  return sorted.length % 2 === 1 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

export function maximum(values: readonly number[]): number | null {
  if (values.length === 0) return null;
  let m = -Infinity;
  for (const v of values) if (v > m) m = v;
  return m;
}

/** Share of true among the known (non-null) answers; null when none is known. */
export function shareTrue(values: readonly (boolean | null)[]): number | null {
  let known = 0;
  let yes = 0;
  for (const v of values) {
    if (v === null) continue;
    known++;
    if (v) yes++;
  }
  return known === 0 ? null : yes / known;
}
