import { describe, expect, it } from 'vitest';
import {
  BUILT_IN_ELEMENTS, SKELETON_COUNTS, SKELETON_GROUPS, builtInVocabulary as v, countPerSkeleton, elementsCompatible,
  isElementAncestorOrSelf, isLimbElement, isLongBone, isPairedElement, isSpecificElement, mostSpecificElement, zonesOf,
} from '../../../core/vocab';

describe('element hierarchy', () => {
  it('runs from long bone through limb segment to the element (Bunn 1982; Marean & Spencer 1991, from memory)', () => {
    expect(v.elements.lineage('femur')).toEqual(['femur', 'upper limb long bone', 'long bone', 'bone']);
    expect(v.elements.lineage('tibia')).toEqual(['tibia', 'intermediate limb long bone', 'long bone', 'bone']);
    expect(v.elements.lineage('metatarsal')).toEqual(['metatarsal', 'metapodial', 'lower limb long bone', 'long bone', 'bone']);
    expect(isElementAncestorOrSelf('long bone', 'femur')).toBe(true);
    expect(elementsCompatible('femur', 'tibia')).toBe(false);
    expect(elementsCompatible('upper limb long bone', 'femur')).toBe(true);
    expect(elementsCompatible('upper limb long bone', 'tibia')).toBe(false);
    expect(mostSpecificElement(['long bone', null, 'upper limb long bone', 'femur'])).toBe('femur');
    expect(v.elements.lowestCommonAncestor('femur', 'tibia')).toBe('long bone');
  });

  it('tells specific elements from categories, paired from axial, long bones and limb bones', () => {
    expect(isSpecificElement('femur')).toBe(true);
    expect(isSpecificElement('long bone')).toBe(false);
    expect(isSpecificElement('phalanx')).toBe(false);
    expect(isPairedElement('femur')).toBe(true);
    expect(isPairedElement('atlas')).toBe(false);
    expect(isPairedElement('cranium')).toBe(false);
    expect(isLongBone('metacarpal')).toBe(true);
    expect(isLongBone('scapula')).toBe(false);
    expect(zonesOf('femur')).toEqual(['proximal-end', 'proximal-shaft', 'midshaft', 'distal-shaft', 'distal-end']);
    expect(zonesOf('rib')).toBeNull();
    expect(isLimbElement('first phalanx')).toBe(true);
    expect(isLimbElement('thoracic vertebra')).toBe(false);
    // Categories are never leaves that a count could be asked of by mistake: every specific
    // element lies under "bone", and no category is paired.
    for (const e of BUILT_IN_ELEMENTS) {
      expect(v.elements.isAncestorOrSelf('bone', e.name)).toBe(true);
      if (!e.specific) expect(e.paired, e.name).toBe(false);
    }
  });

  it('reads abbreviations and spellings as the canonical element', () => {
    expect(v.elements.resolve('Fem')).toBe('femur');
    expect(v.elements.resolve('MT')).toBe('metatarsal');
    expect(v.elements.resolve('os coxae')).toBe('pelvis');
    expect(v.elements.resolve('Phalanx 1')).toBe('first phalanx');
    expect(v.elements.resolve('talus')).toBe('astragalus');
    expect(v.elements.suggest('humerous')[0]).toBe('humerus');
  });
});

// Counts per skeleton. Source: Getty 1975 (Sisson and Grossman's The Anatomy of the Domestic
// Animals, 5th ed.), from memory: vertebral formulae and dental formulae of the reference species.
describe('element counts per skeleton', () => {
  const formula = (g: (typeof SKELETON_GROUPS)[number]) => {
    const c = SKELETON_COUNTS[g].counts;
    return [c.atlas + c.axis + c['cervical vertebra'], c['thoracic vertebra'], c['lumbar vertebra']];
  };

  it('matches the vertebral formulae C-T-L of the reference species (Getty 1975, from memory)', () => {
    expect(formula('bovid')).toEqual([7, 13, 6]); // Bos taurus
    expect(formula('cervid')).toEqual([7, 13, 6]); // Cervus elaphus
    expect(formula('suid')).toEqual([7, 14, 6]); // Sus scrofa
    expect(formula('equid')).toEqual([7, 18, 6]); // Equus caballus
    expect(formula('carnivore')).toEqual([7, 13, 7]); // Canis familiaris
    expect(formula('lagomorph')).toEqual([7, 12, 7]); // Oryctolagus cuniculus
  });

  it('has a pair of ribs for each thoracic vertebra (anatomical definition of a thoracic vertebra)', () => {
    for (const g of SKELETON_GROUPS) {
      const c = SKELETON_COUNTS[g].counts;
      expect(c.rib, g).toBe(2 * c['thoracic vertebra']);
    }
  });

  it('has as many teeth as the permanent dental formula (Getty 1975, from memory)', () => {
    const teeth = (g: (typeof SKELETON_GROUPS)[number]) => {
      const c = SKELETON_COUNTS[g].counts;
      return (c.incisor ?? 0) + (c.canine ?? 0) + (c.premolar ?? 0) + (c.molar ?? 0);
    };
    expect(teeth('bovid')).toBe(32); // cattle: I0/3 C0/1 P3/3 M3/3
    expect(teeth('suid')).toBe(44); // pig: I3/3 C1/1 P4/4 M3/3
    expect(teeth('equid')).toBe(40); // stallion: I3/3 C1/1 P3/3 M3/3 (without wolf teeth)
    expect(teeth('carnivore')).toBe(42); // dog: I3/3 C1/1 P4/4 M2/3
    expect(teeth('lagomorph')).toBe(28); // rabbit: I2/1 C0/0 P3/2 M3/3
  });

  it('counts feet by digits: two main digits in ruminants, four in pigs, one in horses (from memory)', () => {
    expect(countPerSkeleton('first phalanx', 'Cervus elaphus')).toBe(8);
    expect(countPerSkeleton('first phalanx', 'Sus scrofa')).toBe(16);
    expect(countPerSkeleton('third phalanx', 'Equus caballus')).toBe(4);
    expect(countPerSkeleton('metacarpal', 'Canis lupus')).toBe(10);
    expect(countPerSkeleton('femur', 'Bos taurus')).toBe(2);
    expect(countPerSkeleton('cranium', 'Ovis aries')).toBe(1);
    expect(countPerSkeleton('antler', 'Bos taurus')).toBeUndefined();
    expect(countPerSkeleton('femur', 'Mammalia')).toBeUndefined();
    // A category counts its specific elements: metacarpals and metatarsals of a pig.
    expect(countPerSkeleton('metapodial', 'Sus scrofa')).toBe(16);
    expect(countPerSkeleton('phalanx', 'bovid')).toBe(24);
  });

  it('gives every paired specific element an even count', () => {
    for (const g of SKELETON_GROUPS) {
      for (const [el, n] of Object.entries(SKELETON_COUNTS[g].counts)) {
        expect(v.elements.has(el), `${g}: ${el} is a known element`).toBe(true);
        if (isPairedElement(el)) expect(n % 2, `${g}: ${el}`).toBe(0);
      }
    }
  });
});
