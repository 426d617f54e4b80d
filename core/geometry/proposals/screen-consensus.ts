/**
 * How many of a face pair's screened motions ended in the same place: each coarse motion goes
 * through the screen's short ICP on its own, and several starts that end within a few degrees and
 * millimetres of one another mark a wide basin of the contact, which a wrong motion rarely has
 * (the rank by overlap share alone lets a small face covered by a wrong turn outrank it).
 */
import { displacementAt, rotationErrorDegrees, type RigidTransform } from '../registration/rigid-transform';

/**
 * The motion of `motions` with the most others (itself included) within `maxRotationDeg` degrees
 * and `maxDisplacement` (the displacement of `at` between the two motions) of it; ties go to the
 * earlier motion. Only the indices in `eligible` may be chosen, while every motion counts as
 * support. Returns its index and support, or index -1 (support 0) when `eligible` is empty.
 */
export function mostSupportedMotion(
  motions: readonly RigidTransform[],
  eligible: readonly number[],
  at: ArrayLike<number>,
  maxRotationDeg: number,
  maxDisplacement: number,
): { index: number; support: number } {
  let index = -1, support = 0;
  for (const i of eligible) {
    let n = 0;
    for (let k = 0; k < motions.length; k++) {
      if (k === i || (rotationErrorDegrees(motions[i], motions[k]) < maxRotationDeg && displacementAt(motions[i], motions[k], at) < maxDisplacement)) n++;
    }
    if (n > support) { support = n; index = i; }
  }
  return { index, support };
}

/**
 * The screen's consensus motion of one face pair: of the screened motions (each with its rank,
 * best first; every one counts as support, only those of rank above 0 may be chosen), the most
 * supported one (mostSupportedMotion) when at least `minSupport` motions ended at it and it is
 * not within the same distance of one already kept; else null.
 */
export function consensusMotion<M extends { transform: RigidTransform }>(
  ranked: ReadonlyArray<{ r: M; rank: number }>,
  kept: readonly M[],
  at: ArrayLike<number>,
  maxRotationDeg: number,
  maxDisplacement: number,
  minSupport: number,
): M | null {
  if (minSupport <= 0 || ranked.length < minSupport) return null;
  const eligible: number[] = [];
  ranked.forEach((q, i) => { if (q.rank > 0) eligible.push(i); });
  const c = mostSupportedMotion(ranked.map((q) => q.r.transform), eligible, at, maxRotationDeg, maxDisplacement);
  if (c.support < minSupport) return null;
  const m = ranked[c.index].r;
  const near = (k: M): boolean => rotationErrorDegrees(k.transform, m.transform) < maxRotationDeg && displacementAt(k.transform, m.transform, at) < maxDisplacement;
  return kept.some(near) ? null : m;
}
