/**
 * What refit propagation needs to know about taxa and skeletal elements. The controlled
 * vocabularies live in core/vocab; this is the small surface refits reads, so the two stay
 * apart and tests can check propagation against any hierarchy.
 */
export interface Hierarchy {
  /** The broader term directly above, or null at the top (or for an unknown term). */
  parentOf(term: string): string | null;
  /** True when `ancestor` is `term` itself or lies above it. */
  isAncestorOrSelf(ancestor: string, term: string): boolean;
}

export interface RefitVocabulary {
  /** Taxa: class -> order -> family -> genus -> species ("Cervidae" -> "Cervus elaphus"). */
  taxa: Hierarchy;
  /** Skeletal elements: categories above specific elements ("long bone" -> "femur"). */
  elements: Hierarchy;
  /** A specific element (femur), not a category (long bone). */
  isSpecificElement(element: string): boolean;
  /** A specific element that occurs as a left and a right one (femur, not atlas). */
  isPairedElement(element: string): boolean;
  /** An element (or category) of the fore- or hindlimb, whose side a joint carries. */
  isLimbElement(element: string): boolean;
  /** Typical body-size class of an adult of the taxon, when known (a hint, not an observation). */
  typicalSizeClass?(taxon: string): number | null;
}
