import { describe, expect, it } from 'vitest';
import { countingVocabulary } from '../../../core/host/counting/vocabulary';
import { builtInVocabulary } from '../../../core/vocab/index';

// Lyman 2008, Quantitative Paleozoology, Table 6.4 "Frequencies of major skeletal elements in a
// single mature skeleton of several common mammalian taxa" (columns Bovid/Cervid, Equid, Suid,
// Canid), verified against the published table text. Our names: innominate = pelvis,
// calcaneum = calcaneus, cervical = cervical vertebra (3-7), thoracic, lumbar = ... vertebra.
// Lumbar "6 (or 7)" accepts either. Carpals and "other tarsals" are categories in our
// vocabulary and are not checked.
const TABLE_6_4: Record<string, [bovidCervid: number, equid: number, suid: number, canid: number]> = {
  cranium: [1, 1, 1, 1],
  mandible: [2, 2, 2, 2],
  atlas: [1, 1, 1, 1],
  axis: [1, 1, 1, 1],
  'cervical vertebra': [5, 5, 5, 5],
  'thoracic vertebra': [13, 18, 14, 13],
  sacrum: [1, 1, 1, 1],
  pelvis: [2, 2, 2, 2],
  rib: [26, 36, 28, 26],
  sternum: [1, 1, 1, 1],
  scapula: [2, 2, 2, 2],
  humerus: [2, 2, 2, 2],
  radius: [2, 2, 2, 2],
  ulna: [2, 2, 2, 2],
  metacarpal: [2, 2, 8, 10],
  femur: [2, 2, 2, 2],
  patella: [2, 2, 2, 2],
  tibia: [2, 2, 2, 2],
  fibula: [2, 2, 2, 2],
  astragalus: [2, 2, 2, 2],
  calcaneus: [2, 2, 2, 2],
  metatarsal: [2, 2, 8, 10],
  'first phalanx': [8, 4, 16, 20],
  'second phalanx': [8, 4, 16, 16],
  'third phalanx': [8, 4, 16, 20],
};
const LUMBAR: Record<string, number[]> = { bovidCervid: [6, 7], equid: [6], suid: [6, 7], canid: [7] };
const TAXA = { bovidCervid: ['Cervus elaphus', 'Bos taurus'], equid: ['Equus caballus'], suid: ['Sus scrofa'], canid: ['Canis familiaris'] };
const COLUMN = { bovidCervid: 0, equid: 1, suid: 2, canid: 3 } as const;

describe('counts per skeleton (MAU divisors) against Lyman 2008, Table 6.4', () => {
  const vocab = countingVocabulary(builtInVocabulary);
  for (const [group, taxa] of Object.entries(TAXA) as Array<[keyof typeof COLUMN, string[]]>) {
    for (const taxon of taxa) {
      it(`${taxon} (${group} column)`, () => {
        const got: Record<string, number | null> = {};
        const want: Record<string, number> = {};
        for (const [element, counts] of Object.entries(TABLE_6_4)) {
          got[element] = vocab.countPerSkeleton(element, taxon);
          want[element] = counts[COLUMN[group]];
        }
        expect(got).toEqual(want);
        expect(LUMBAR[group]).toContain(vocab.countPerSkeleton('lumbar vertebra', taxon));
      });
    }
  }
});
