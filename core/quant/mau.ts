/**
 * MAU, minimum animal units: MNE divided by the number of that element in one skeleton
 * (Binford 1984; Lyman 2008, chapter 6, with counts per skeleton from its Table 6.4).
 */
export function minimumAnimalUnits(mne: number, countPerSkeleton: number): number {
  if (!(countPerSkeleton > 0)) throw new RangeError(`count per skeleton must be positive, got ${countPerSkeleton}`);
  return mne / countPerSkeleton;
}

/**
 * %MAU: each MAU divided by the largest MAU of the same taxon, times 100, rounded to one
 * decimal (Binford 1984; Lyman 2008, chapter 6, norming MAU to compare samples).
 * All-zero input gives zeros.
 */
export function percentMau(maus: readonly number[]): number[] {
  const max = Math.max(0, ...maus);
  return maus.map((m) => (max > 0 ? Math.round((m / max) * 1000) / 10 : 0));
}
