import { describe, expect, it } from 'vitest';
import { defaultIdentificationRule } from '../../../core/quant/identified';
import { tally } from '../../../core/quant/tally';
import { recordedView, refittedView } from '../../../core/refits/counting-view';
import type { Observation } from '../../../core/refits/observation';
import { RefitState, type RefitJoin } from '../../../core/refits/refit-state';
import { fixtureVocabulary as vocab } from '../refits/vocabulary';

const obs = (specimen: string, o: Partial<Observation> = {}): Observation => ({
  specimen, taxon: null, element: null, side: null, zones: [], fusion: null, sizeClass: null, ...o,
});
let nextId = 1;
const join = (a: string, b: string, type: RefitJoin['type'] = 'conjoin-green'): RefitJoin => ({ id: nextId++, a, b, type });

function counts(observations: Observation[], joins: RefitJoin[]) {
  const state = RefitState.build(observations, joins, vocab);
  const refitted = refittedView(state);
  return {
    recorded: tally(recordedView(state), vocab, defaultIdentificationRule),
    refitted: tally(refitted.specimens, vocab, defaultIdentificationRule, refitted.pairs),
  };
}
const row = (t: ReturnType<typeof tally>, taxon: string, element: string) => t.byElement.find((r) => r.taxon === taxon && r.element === element);

describe('tally as recorded and refitted', () => {
  it('a shaft fragment raised to "femur, left" by a refit raises MNE when its zone overlaps another left femur (issue 3)', () => {
    // Overlap rule (Marean et al. 2001): the refit set's zones are the union of its members'.
    const observations = [
      obs('F1', { taxon: 'Cervus elaphus', element: 'femur', side: 'left', zones: ['midshaft', 'distal-shaft', 'distal-end'] }),
      obs('F2', { taxon: 'Cervus elaphus', element: 'femur', side: 'left', zones: ['proximal-end'] }),
      obs('S', { taxon: 'Mammalia', sizeClass: 3, element: 'long bone', side: 'indeterminate', zones: ['proximal-shaft', 'midshaft'] }),
    ];
    const { recorded, refitted } = counts(observations, [join('F2', 'S')]);
    expect(row(recorded, 'Cervus elaphus', 'femur')).toMatchObject({ nisp: 2, mneLeft: 1, mne: 1 });
    expect(row(refitted, 'Cervus elaphus', 'femur')).toMatchObject({ nisp: 2, mneLeft: 2, mne: 2 });
    expect(refitted.byTaxon).toEqual([{ taxon: 'Cervus elaphus', nisp: 2, mni: 2 }]);
    // identification rates rise from 2/3 to 3/3 (design.md section 5)
    expect(recorded.identifiedToElement).toBeCloseTo(2 / 3, 12);
    expect(refitted.identifiedToElement).toBe(1);
    expect(refitted.identifiedToTaxon).toBe(1);
  });

  it('a refit set counts once in NISP; nispFragments counts green and dry pieces apart, modern ones once', () => {
    // Morin, Boileau & Ready 2021 compare counting a refitted set once with counting its
    // fragments; fragments joined across modern breaks are one specimen (common practice).
    const t = (n: string, zones: string[]) => obs(n, { taxon: 'Bos primigenius', element: 'tibia', side: 'right', zones });
    const observations = [t('A', ['proximal-end']), t('B', ['proximal-shaft']), t('C', ['midshaft']), t('D', ['distal-end'])];
    const { recorded, refitted } = counts(observations, [join('A', 'B', 'conjoin-green'), join('B', 'C', 'conjoin-modern'), join('C', 'D', 'conjoin-dry')]);
    expect(recorded).toMatchObject({ nisp: 4, nispFragments: 4 });
    expect(refitted).toMatchObject({ nisp: 1, nispFragments: 3 });
    expect(row(refitted, 'Bos primigenius', 'tibia')).toMatchObject({ nisp: 1, mneRight: 1, mne: 1, mau: 0.5, percentMau: 100 });
  });

  it('"recorded" does not change when joins are accepted', () => {
    const observations = [
      obs('A', { taxon: 'Cervidae', element: 'long bone' }),
      obs('B', { taxon: 'Cervus elaphus', element: 'humerus', side: 'left' }),
      obs('C', { taxon: 'Cervus elaphus', element: 'humerus' }),
    ];
    const none = counts(observations, []);
    const some = counts(observations, [join('A', 'B'), join('B', 'C', 'pair')]);
    expect(some.recorded).toEqual(none.recorded);
    expect(some.refitted).not.toEqual(none.refitted);
  });

  it('NISP needs family rank or finer and a specific element (Grayson 1984; Lyman 2008)', () => {
    const observations = [
      obs('A', { taxon: 'Artiodactyla', element: 'femur' }),
      obs('B', { taxon: 'Cervidae', element: 'femur' }),
      obs('C', { taxon: 'Cervus elaphus', element: 'long bone' }),
      obs('D', { taxon: 'Cervus elaphus', element: 'femur' }),
    ];
    const { recorded } = counts(observations, []);
    expect(recorded.nisp).toBe(2);
    // grouped by the taxon as identified, at its own rank
    expect(recorded.byTaxon.map((t) => [t.taxon, t.nisp])).toEqual([['Cervidae', 1], ['Cervus elaphus', 1]]);
    expect(recorded.identifiedToTaxon).toBe(0.75);
    expect(recorded.identifiedToElement).toBe(0.75);
  });

  it('reports L + R - P where pair joins exist (Lyman 2008)', () => {
    const h = (n: string, side: 'left' | 'right') => obs(n, { taxon: 'Cervus elaphus', element: 'humerus', side, zones: ['distal-end'] });
    const observations = [h('L1', 'left'), h('L2', 'left'), h('L3', 'left'), h('R1', 'right'), h('R2', 'right')];
    const { recorded, refitted } = counts(observations, [join('L1', 'R1', 'pair'), join('L2', 'R2', 'pair')]);
    expect(recorded.byTaxon[0]).toEqual({ taxon: 'Cervus elaphus', nisp: 5, mni: 3 });
    expect(refitted.byTaxon[0]).toEqual({ taxon: 'Cervus elaphus', nisp: 5, mni: 3, lrp: 3 + 2 - 2 });
    expect(row(refitted, 'Cervus elaphus', 'humerus')?.pairs).toBe(2);
  });
});
