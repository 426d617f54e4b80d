import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { defaultIdentificationRule, isIdentified } from '../../../core/quant/identified';
import { tally, TallyBook } from '../../../core/quant/tally';
import { recordedView, refittedView } from '../../../core/refits/counting-view';
import { JOIN_TYPES } from '../../../core/refits/join-type';
import type { Observation } from '../../../core/refits/observation';
import { RefitState, type RefitJoin } from '../../../core/refits/refit-state';
import { fixtureVocabulary as vocab } from './vocabulary';

// Property of issue 3: for random catalogues and random accept/undo sequences, accepting
// then undoing returns every count and derived value to what it was, and refitted NISP
// never exceeds recorded NISP plus the specimens newly identified through joins.
const TAXA = [null, 'Mammalia', 'Artiodactyla', 'Cervidae', 'Cervus elaphus', 'Bovidae', 'Bos primigenius'];
const ELEMENTS = [null, 'bone', 'long bone', 'upper limb long bone', 'femur', 'humerus', 'tibia', 'atlas', 'first phalanx'];
const SIDES = [null, 'left', 'right', 'indeterminate', 'axial'] as const;
const ZONES = ['proximal-end', 'proximal-shaft', 'midshaft', 'distal-shaft', 'distal-end'];

const observation = (i: number) =>
  fc.record({
    taxon: fc.constantFrom(...TAXA),
    element: fc.constantFrom(...ELEMENTS),
    side: fc.constantFrom(...SIDES),
    zones: fc.subarray(ZONES, { maxLength: 3 }),
    fusion: fc.constantFrom(null, 'fused', 'unfused'),
    sizeClass: fc.constantFrom(null, 2, 3, 4, 5),
  }).map((o): Observation => ({ specimen: `S-${i}`, ...o }));

const catalogue = fc.integer({ min: 2, max: 12 }).chain((n) =>
  fc.tuple(
    fc.tuple(...Array.from({ length: n }, (_, i) => observation(i))),
    fc.array(
      fc.record({ a: fc.nat(n - 1), b: fc.nat(n - 1), type: fc.constantFrom(...JOIN_TYPES), undo: fc.boolean() }),
      { maxLength: 20 },
    ),
  ),
);

function snapshot(state: RefitState) {
  const refitted = refittedView(state);
  return {
    state,
    derived: state.derivedIdentifications(),
    sets: state.refitSets(),
    conflicts: state.conflictingJoins(),
    recorded: tally(recordedView(state), vocab, defaultIdentificationRule),
    refitted: tally(refitted.specimens, vocab, defaultIdentificationRule, refitted.pairs),
    refittedSpecimens: refitted.specimens,
  };
}
const comparable = (s: ReturnType<typeof snapshot>) => ({ derived: s.derived, sets: s.sets, conflicts: s.conflicts, recorded: s.recorded, refitted: s.refitted });

describe('accept and undo (property)', () => {
  it('undo restores every count and derived value; refitted NISP is bounded', () => {
    fc.assert(
      fc.property(catalogue, ([observations, steps]) => {
        // A live state that joins are applied to one by one, as the host does on accept;
        // undo rebuilds from the remaining accepted joins.
        let live = new RefitState(observations, vocab);
        // A tally book brought along after every step must agree with a fresh tally.
        const start = refittedView(live);
        const book = new TallyBook(start.specimens, vocab, defaultIdentificationRule, start.pairs);
        const checkBook = () => {
          const view = refittedView(live);
          book.update(view.specimens, view.pairs);
          expect(book.result()).toEqual(tally(view.specimens, vocab, defaultIdentificationRule, view.pairs));
        };
        let accepted: RefitJoin[] = [];
        let id = 1;
        for (const step of steps) {
          if (step.a === step.b) continue;
          const before = snapshot(live);
          const j: RefitJoin = { id: id++, a: observations[step.a].specimen, b: observations[step.b].specimen, type: step.type };
          live.accept(j);
          checkBook();
          const after = snapshot(live);
          // recorded never moves with joins
          expect(after.recorded).toEqual(before.recorded);
          // refitted NISP <= recorded NISP + specimens newly identified through joins
          const newly = after.refittedSpecimens.filter(
            (s, i) => isIdentified(s, vocab, defaultIdentificationRule) && !isIdentified(observations[i], vocab, defaultIdentificationRule),
          ).length;
          expect(after.refitted.nisp).toBeLessThanOrEqual(after.recorded.nisp + newly);
          if (step.undo) {
            live = RefitState.build(observations, accepted, vocab);
            checkBook();
            expect(comparable(snapshot(live))).toEqual(comparable(before));
          } else {
            accepted = [...accepted, j];
            // applying one join to the live state agrees with building from every accepted join
            expect(comparable(snapshot(RefitState.build(observations, accepted, vocab)))).toEqual(comparable(after));
          }
        }
      }),
      { numRuns: 150 },
    );
  });
});
