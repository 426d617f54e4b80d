import type { CountingVocabulary } from '../../../core/quant/vocabulary';
import type { Hierarchy, RefitVocabulary } from '../../../core/refits/vocabulary';

/**
 * A few real taxa and elements for checking propagation and counting before (and apart
 * from) the catalogue's controlled vocabulary. Taxonomy: standard Linnaean placement
 * (common practice). Counts per skeleton: Lyman 2008, Table 6.4 (bovid/cervid column).
 * Zones: the long-bone zones of the catalogue (after Dobney & Rielly 1988).
 */
const taxonParent: Record<string, [string | null, string]> = {
  Mammalia: [null, 'class'],
  Artiodactyla: ['Mammalia', 'order'],
  Carnivora: ['Mammalia', 'order'],
  Cervidae: ['Artiodactyla', 'family'],
  Bovidae: ['Artiodactyla', 'family'],
  Cervus: ['Cervidae', 'genus'],
  'Cervus elaphus': ['Cervus', 'species'],
  Capreolus: ['Cervidae', 'genus'],
  'Capreolus capreolus': ['Capreolus', 'species'],
  Bos: ['Bovidae', 'genus'],
  'Bos primigenius': ['Bos', 'species'],
};
const elementParent: Record<string, string | null> = {
  bone: null,
  'long bone': 'bone',
  'limb bone': 'bone',
  'upper limb long bone': 'long bone',
  vertebra: 'bone',
  femur: 'upper limb long bone',
  humerus: 'upper limb long bone',
  tibia: 'long bone',
  metatarsal: 'long bone',
  astragalus: 'limb bone',
  calcaneum: 'limb bone',
  'first phalanx': 'limb bone',
  'second phalanx': 'limb bone',
  'third phalanx': 'limb bone',
  atlas: 'vertebra',
  axis: 'vertebra',
  'thoracic vertebra': 'vertebra',
};
const categories = new Set(['bone', 'long bone', 'limb bone', 'upper limb long bone', 'vertebra']);
const axial = new Set(['vertebra', 'atlas', 'axis', 'thoracic vertebra']);
const bovidCervidCount: Record<string, number> = {
  femur: 2, humerus: 2, tibia: 2, metatarsal: 2, astragalus: 2, calcaneum: 2,
  'first phalanx': 8, 'second phalanx': 8, 'third phalanx': 8, atlas: 1, axis: 1, 'thoracic vertebra': 13,
};
const LONG_BONE_ZONES = ['proximal-end', 'proximal-shaft', 'midshaft', 'distal-shaft', 'distal-end'];

function hierarchy(parentOf: (t: string) => string | null): Hierarchy {
  return {
    parentOf,
    isAncestorOrSelf(ancestor, term) {
      for (let t: string | null = term; t !== null; t = parentOf(t)) if (t === ancestor) return true;
      return false;
    },
  };
}

export const fixtureVocabulary: RefitVocabulary & CountingVocabulary = {
  taxa: hierarchy((t) => taxonParent[t]?.[0] ?? null),
  elements: hierarchy((e) => elementParent[e] ?? null),
  isSpecificElement: (e) => e in elementParent && !categories.has(e),
  isPairedElement: (e) => e in elementParent && !categories.has(e) && !axial.has(e),
  isLimbElement: (e) => e in elementParent && !axial.has(e) && e !== 'bone',
  rankOf: (t) => taxonParent[t]?.[1] ?? null,
  zonesOf: (e) => (fixtureVocabulary.elements.isAncestorOrSelf('long bone', e) && e !== 'long bone' ? LONG_BONE_ZONES : null),
  countPerSkeleton: (e) => bovidCervidCount[e] ?? null,
};
