import type { CountingVocabulary } from '../../quant/vocabulary';
import type { RefitVocabulary } from '../../refits/vocabulary';
import { countPerSkeleton, isLimbElement, isPairedElement, isSpecificElement, typicalSizeClass, zonesOf, type Vocabulary } from '../../vocab/index';

/**
 * The catalogue's controlled vocabulary seen through what refits and counting read. An
 * articulation between two limb elements is a joint within one limb, so it carries side.
 */
export function countingVocabulary(vocab: Vocabulary): RefitVocabulary & CountingVocabulary {
  return {
    taxa: vocab.taxa,
    elements: vocab.elements,
    isSpecificElement: (e) => isSpecificElement(e, vocab),
    isPairedElement: (e) => isSpecificElement(e, vocab) && isPairedElement(e, vocab),
    isLimbElement: (e) => isLimbElement(e, vocab),
    typicalSizeClass: (t) => typicalSizeClass(t, vocab) ?? null,
    rankOf: (t) => vocab.taxa.get(t)?.rank ?? null,
    zonesOf: (e) => zonesOf(e, vocab),
    countPerSkeleton: (e, t) => countPerSkeleton(e, t, vocab) ?? null,
  };
}
