/**
 * The L + R - P estimate of the number of individuals from one paired element: lefts plus
 * rights minus the pairs matched between them (Lyman 2008, chapter 3, "More pairs means
 * fewer individuals"). Every unmatched left or right is a further individual.
 */
export function lPlusRMinusP(left: number, right: number, pairs: number): number {
  if (pairs > Math.min(left, right)) {
    throw new RangeError(`cannot match ${pairs} pairs from ${left} lefts and ${right} rights`);
  }
  return left + right - pairs;
}
