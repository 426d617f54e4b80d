/**
 * What counting needs to know about taxa and skeletal elements. The controlled
 * vocabularies live in core/vocab; this is the small surface quant reads.
 */
export interface CountingVocabulary {
  /** Rank of a taxon ("family", "genus", "species", ...), or null when unknown. */
  rankOf(taxon: string): string | null;
  /** A specific element (femur), not a category (long bone). */
  isSpecificElement(element: string): boolean;
  /** A specific element with a left and a right one in a skeleton. */
  isPairedElement(element: string): boolean;
  /** The element's portion zones, in order, or null when it has no zone scheme. */
  zonesOf(element: string): readonly string[] | null;
  /** How many of this element one skeleton of the taxon's group has, or null if not known. */
  countPerSkeleton(element: string, taxon: string): number | null;
}
