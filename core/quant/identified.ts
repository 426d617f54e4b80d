import type { CountingVocabulary } from './vocabulary';

/**
 * Linnaean ranks from broad to narrow. "Identified" in NISP means identified to a taxon
 * at or below a threshold rank and to a specific element (Grayson 1984; Lyman 2008,
 * chapter 2: a specimen is identified when assigned to a taxon and a skeletal element).
 */
export const TAXONOMIC_RANKS = [
  'kingdom',
  'phylum',
  'subphylum',
  'class',
  'subclass',
  'infraclass',
  'superorder',
  'order',
  'suborder',
  'infraorder',
  'superfamily',
  'family',
  'subfamily',
  'tribe',
  'genus',
  'subgenus',
  'species',
  'subspecies',
] as const;

/** The default threshold: family or finer (a catalogue setting may change it). */
export const DEFAULT_IDENTIFICATION_RANK = 'family';

export interface IdentificationRule {
  /** The broadest rank that still counts as identified to taxon. */
  rank: string;
}

export const defaultIdentificationRule: IdentificationRule = { rank: DEFAULT_IDENTIFICATION_RANK };

/** True when the taxon's rank is the threshold rank or narrower. */
export function isIdentifiedToTaxon(taxon: string | null, vocab: CountingVocabulary, rule: IdentificationRule): boolean {
  if (!taxon) return false;
  const rank = vocab.rankOf(taxon);
  if (!rank) return false;
  const at = TAXONOMIC_RANKS.indexOf(rank as (typeof TAXONOMIC_RANKS)[number]);
  const threshold = TAXONOMIC_RANKS.indexOf(rule.rank as (typeof TAXONOMIC_RANKS)[number]);
  if (at < 0 || threshold < 0) return false;
  return at >= threshold;
}

/** True when the element is a specific element, not a category such as "long bone". */
export function isIdentifiedToElement(element: string | null, vocab: CountingVocabulary): boolean {
  return !!element && vocab.isSpecificElement(element);
}

/** Counts in NISP: identified to taxon (at the threshold or finer) and to a specific element. */
export function isIdentified(
  s: { taxon: string | null; element: string | null },
  vocab: CountingVocabulary,
  rule: IdentificationRule,
): boolean {
  return isIdentifiedToTaxon(s.taxon, vocab, rule) && isIdentifiedToElement(s.element, vocab);
}
