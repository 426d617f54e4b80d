import type { SkeletonGroup } from './taxa';

/**
 * How many of each specific element one complete adult skeleton has, per group of
 * animals: the divisor of MAU (Binford 1984) and of MNI for axial elements.
 *
 * Source: standard veterinary anatomy (Getty 1975, Sisson and Grossman's The Anatomy of
 * the Domestic Animals, 5th ed.; Barone 1986, Anatomie comparée des mammifères
 * domestiques), FROM MEMORY, for the reference species named per group. Teeth follow
 * the permanent dental formula of that species (from memory). An element left out of
 * a group has no fixed count there (caudal vertebrae, carpals) or is absent.
 * Counts are for the whole skeleton, both sides together (a femur is 2).
 *
 * For the bovid, cervid, equid, suid and carnivore (canid) groups, every element that
 * Lyman 2008 (Quantitative Paleozoology, Table 6.4) lists takes the count of that table,
 * checked against the published figures in tests/unit/quant/skeleton-counts.test.ts: this
 * counts the sternum as one element, and gives canids 10 metatarsals and 20 first and 20
 * third phalanges (hind dewclaws included), where the dog's usual hind foot has 8 and 18.
 */
export interface SkeletonCounts {
  group: SkeletonGroup;
  /** The species whose skeleton the counts describe. */
  reference: string;
  counts: Readonly<Record<string, number>>;
  /** Where the group's members differ or a count needs a word of care. */
  notes: string[];
}

const limbs = { humerus: 2, femur: 2, radius: 2, ulna: 2, tibia: 2, scapula: 2, pelvis: 2, patella: 2, astragalus: 2, calcaneus: 2 };
const head = { cranium: 1, mandible: 2 };
const neck = { atlas: 1, axis: 1, 'cervical vertebra': 5, sacrum: 1 };
/** Lyman 2008, Table 6.4: the sternum counted as one element. */
const sternum = { sternum: 1 };

/** Ruminant skeleton (Cervus elaphus / Bos taurus): 13 thoracic, 6 lumbar; two main digits per foot. */
const ruminant = {
  ...limbs, ...head, ...neck, ...sternum,
  fibula: 2, // reduced to the lateral malleolus
  metacarpal: 2, metatarsal: 2, // fused III+IV cannon bones
  'thoracic vertebra': 13, 'lumbar vertebra': 6, rib: 26,
  'first phalanx': 8, 'second phalanx': 8, 'third phalanx': 8,
  // I 0/3, C 0/1, P 3/3, M 3/3 (both jaws, both sides)
  incisor: 6, premolar: 12, molar: 12,
};

export const SKELETON_COUNTS: Readonly<Record<SkeletonGroup, SkeletonCounts>> = {
  cervid: {
    group: 'cervid',
    reference: 'Cervus elaphus',
    counts: { ...ruminant, antler: 2 },
    notes: [
      'antlers in males (both sexes in Rangifer); canines: lower canine incisiform, upper canine present in Cervus, so canines have no fixed count here',
      'lumbar vertebrae vary 6-7 in some deer',
    ],
  },
  bovid: {
    group: 'bovid',
    reference: 'Bos taurus',
    counts: { ...ruminant, canine: 2, 'horn core': 2 },
    notes: ['horn cores absent in polled animals', 'Ovis/Capra: 13 thoracic, 6 (sometimes 7) lumbar vertebrae'],
  },
  suid: {
    group: 'suid',
    reference: 'Sus scrofa',
    counts: {
      ...limbs, ...head, ...neck, ...sternum,
      fibula: 2, metacarpal: 8, metatarsal: 8, // digits II-V
      'thoracic vertebra': 14, 'lumbar vertebra': 6, rib: 28,
      'first phalanx': 16, 'second phalanx': 16, 'third phalanx': 16,
      // I 3/3, C 1/1, P 4/4, M 3/3
      incisor: 12, canine: 4, premolar: 16, molar: 12,
    },
    notes: ['thoracic vertebrae vary 13-16 and lumbar 5-7 in Sus', 'metapodials: main digits III-IV and lateral digits II and V all counted'],
  },
  equid: {
    group: 'equid',
    reference: 'Equus caballus',
    counts: {
      ...limbs, ...head, ...neck, ...sternum,
      fibula: 2, // vestigial, fused to the tibia in adults
      metacarpal: 2, metatarsal: 2, // digit III; splint bones II and IV not counted
      'thoracic vertebra': 18, 'lumbar vertebra': 6, rib: 36,
      'first phalanx': 4, 'second phalanx': 4, 'third phalanx': 4,
      // I 3/3, C 1/1, P 3/3, M 3/3 (canines mostly in males; first premolar "wolf tooth" not counted)
      incisor: 12, canine: 4, premolar: 12, molar: 12,
    },
    notes: ['ulna fused to the radius in adults', 'canines usually absent in mares', 'lumbar vertebrae 5-6'],
  },
  carnivore: {
    group: 'carnivore',
    reference: 'Canis familiaris',
    counts: {
      ...limbs, ...head, ...neck, ...sternum,
      // Lyman 2008, Table 6.4 (canid): metatarsals and first and third phalanges with the
      // hind dewclaw (digit I) counted; digit I has no second phalanx
      fibula: 2, metacarpal: 10, metatarsal: 10,
      'thoracic vertebra': 13, 'lumbar vertebra': 7, rib: 26,
      'first phalanx': 20, 'second phalanx': 16, 'third phalanx': 20,
      // I 3/3, C 1/1, P 4/4, M 2/3
      incisor: 12, canine: 4, premolar: 16, molar: 10,
    },
    notes: ['counts of the dog; felids, ursids and mustelids differ in the feet and the teeth', 'feet as in Lyman 2008, Table 6.4: hind dewclaws counted (a dog without them has 8 metatarsals and 18 first and third phalanges)'],
  },
  lagomorph: {
    group: 'lagomorph',
    reference: 'Oryctolagus cuniculus',
    counts: {
      ...limbs, ...head, ...neck,
      // tibia and fibula fused: the fibula is not counted apart
      metacarpal: 10, metatarsal: 8,
      'thoracic vertebra': 12, 'lumbar vertebra': 7, rib: 24,
      'first phalanx': 18, 'second phalanx': 16, 'third phalanx': 18,
      // I 2/1, C 0/0, P 3/2, M 3/3
      incisor: 6, canine: 0, premolar: 10, molar: 12,
    },
    notes: ['thoracic vertebrae 12-13 in Oryctolagus', 'the fibula is fused to the tibia'],
  },
};
