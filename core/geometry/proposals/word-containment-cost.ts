/**
 * How unlike two break faces are as partners by their FPFH words (fpfh-word-counts.ts), allowing
 * for a face that meets only part of its partner: the share of the smaller face's samples whose
 * words the other face also holds, -log of it. Counts are compared one word at a time, the
 * smaller count kept (histogram intersection, Swain & Ballard 1991), and divided by the smaller
 * face's sample count instead of normalising each histogram (which histogram intersection does
 * for whole images): a piece that keeps half of a break holds about half of its partner's words
 * and scores as well as the whole, while a face whose words the other lacks does not. One face's
 * mirrored words (its samples as the partner shows them) meet the other's words. A share below
 * `floor` costs as much as the floor, so one odd face cannot outweigh the trait cost.
 */

/** -log of the share of the smaller face's words held by the other; 0 when one face holds all of the other's. */
export function wordContainmentCost(mirroredA: ArrayLike<number>, wordsB: ArrayLike<number>, floor = 0.02): number {
  let common = 0, massA = 0, massB = 0;
  const n = Math.min(mirroredA.length, wordsB.length);
  for (let w = 0; w < n; w++) {
    const a = mirroredA[w], b = wordsB[w];
    common += a < b ? a : b;
    massA += a;
    massB += b;
  }
  const smaller = Math.min(massA, massB);
  if (smaller <= 0) return -Math.log(floor);
  return -Math.log(Math.max(floor, common / smaller));
}
