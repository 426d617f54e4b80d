import type { Hierarchy } from './vocabulary';

/**
 * The most specific term consistent with both observations: in a hierarchy two terms agree
 * when one lies on the path above the other, and then the lower one is the identification
 * both support ("long bone" and "femur" -> "femur"; "Cervidae" and "Cervus elaphus" ->
 * "Cervus elaphus"). Terms on different branches ("femur" and "tibia") do not agree:
 * the result is undefined. A missing observation (null) agrees with anything.
 */
export function mostSpecific(hierarchy: Hierarchy, a: string | null, b: string | null): string | null | undefined {
  if (a === null) return b;
  if (b === null) return a;
  if (a === b) return a;
  if (hierarchy.isAncestorOrSelf(a, b)) return b;
  if (hierarchy.isAncestorOrSelf(b, a)) return a;
  return undefined;
}
