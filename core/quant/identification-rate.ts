import type { CountingSpecimen } from './counting-specimen';
import { isIdentifiedToElement, isIdentifiedToTaxon, type IdentificationRule } from './identified';
import type { CountingVocabulary } from './vocabulary';

/**
 * Identification rates: the share of all specimens (NSP) identified to a specific element
 * and to taxon at the threshold rank. Raising them is the point of refitting (design.md
 * section 5; Lyman 2008, chapter 6, on fragmentation and identifiability).
 */
export function identificationRates(
  specimens: readonly Pick<CountingSpecimen, 'taxon' | 'element'>[],
  vocab: CountingVocabulary,
  rule: IdentificationRule,
): { identifiedToElement: number; identifiedToTaxon: number } {
  if (specimens.length === 0) return { identifiedToElement: 0, identifiedToTaxon: 0 };
  let toElement = 0;
  let toTaxon = 0;
  for (const s of specimens) {
    if (isIdentifiedToElement(s.element, vocab)) toElement++;
    if (isIdentifiedToTaxon(s.taxon, vocab, rule)) toTaxon++;
  }
  return { identifiedToElement: toElement / specimens.length, identifiedToTaxon: toTaxon / specimens.length };
}
