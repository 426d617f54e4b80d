/**
 * Join types, after Lyman's refit typology (Lyman 1994, 2008) in our own words:
 * - conjoin: pieces of one specimen broken apart, by break age: green (broken fresh,
 *   around the time of death), dry (after the bone dried, before excavation) or modern
 *   (in or after excavation);
 * - articulation: different elements of one individual that meet at a joint;
 * - pair: left and right of one element of one individual.
 */
export const JOIN_TYPES = ['conjoin-green', 'conjoin-dry', 'conjoin-modern', 'articulation', 'pair'] as const;
export type JoinType = (typeof JOIN_TYPES)[number];

/** A conjoin whose break age was not recorded (a proposal not yet typed, for instance). */
export type RefitJoinType = JoinType | 'conjoin';

export function isJoinType(value: string): value is JoinType {
  return (JOIN_TYPES as readonly string[]).includes(value);
}

export function isConjoin(type: RefitJoinType): boolean {
  return type === 'conjoin' || type === 'conjoin-green' || type === 'conjoin-dry' || type === 'conjoin-modern';
}

/** Which identification fields a join carries from one member to the other. */
export interface Carried {
  taxon: boolean;
  element: boolean;
  /** 'same' for a conjoin (and an articulation between limb elements), 'opposite' for a pair. */
  side: 'same' | 'opposite' | 'none';
  /** The two pieces share one size class (one individual). */
  size: boolean;
  /** The two pieces are parts of one bone: zones must not both be covered. */
  zones: boolean;
}

/**
 * A conjoin asserts same taxon, element and side; a pair carries taxon and element with
 * the opposite side; an articulation carries taxon, and side only where both elements are
 * limb elements (a joint within one limb). Neither of the last two merges specimens.
 */
export function carriedBy(type: RefitJoinType, bothLimbElements: boolean): Carried {
  if (isConjoin(type)) return { taxon: true, element: true, side: 'same', size: true, zones: true };
  if (type === 'pair') return { taxon: true, element: true, side: 'opposite', size: true, zones: false };
  return { taxon: true, element: false, side: bothLimbElements ? 'same' : 'none', size: true, zones: false };
}
