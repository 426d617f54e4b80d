import type { CountingVocabulary } from '../../quant/vocabulary';
import type { RefitVocabulary } from '../../refits/vocabulary';
import {
  countPerSkeleton,
  isLongBone,
  isPairedElement,
  isSpecificElement,
  PORTION_ZONES,
  type Vocabulary,
} from '../../vocab/index';

/**
 * Element categories whose members belong to a limb (long bones, girdles, carpals, tarsals,
 * patella, phalanges, sesamoids): an articulation between two of them is a joint within
 * one limb, so it carries side (common practice).
 */
const LIMB_CATEGORIES = ['long bone', 'girdle', 'carpal', 'tarsal', 'patella', 'phalanx', 'sesamoid'];

/** The catalogue's controlled vocabulary seen through what refits and counting read. */
export function countingVocabulary(vocab: Vocabulary): RefitVocabulary & CountingVocabulary {
  const limbCategories = LIMB_CATEGORIES.filter((c) => vocab.elements.has(c));
  return {
    taxa: vocab.taxa,
    elements: vocab.elements,
    isSpecificElement: (e) => isSpecificElement(e, vocab),
    isPairedElement: (e) => isSpecificElement(e, vocab) && isPairedElement(e, vocab),
    isLimbElement: (e) => limbCategories.some((c) => vocab.elements.isAncestorOrSelf(c, e)),
    rankOf: (t) => vocab.taxa.get(t)?.rank ?? null,
    zonesOf: (e) => (isLongBone(e, vocab) ? PORTION_ZONES : null),
    countPerSkeleton: (e, t) => countPerSkeleton(e, t, vocab) ?? null,
  };
}
