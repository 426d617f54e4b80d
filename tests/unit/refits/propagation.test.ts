import { describe, expect, it } from 'vitest';
import type { Observation } from '../../../core/refits/observation';
import { RefitState, type RefitJoin } from '../../../core/refits/refit-state';
import { fixtureVocabulary as vocab } from './vocabulary';

const obs = (specimen: string, o: Partial<Observation> = {}): Observation => ({
  specimen,
  taxon: null,
  element: null,
  side: null,
  zones: [],
  fusion: null,
  sizeClass: null,
  ...o,
});
let nextId = 1;
const join = (a: string, b: string, type: RefitJoin['type'] = 'conjoin-green'): RefitJoin => ({ id: nextId++, a, b, type });

// Rule: a conjoin asserts the pieces are one specimen, so same taxon, element and side
// (Lyman 1994, 2008 refit typology); the set's identification is the most specific one
// consistent with every member through the taxon and element hierarchies (design.md s. 6).
describe('propagation through conjoins', () => {
  it('raises a shaft fragment to the diagnostic piece it joins (the example of the issue)', () => {
    const state = RefitState.build(
      [
        obs('K-1', { taxon: 'Mammalia', sizeClass: 3, element: 'long bone', side: 'indeterminate', zones: ['midshaft'] }),
        obs('K-2', { taxon: 'Cervus elaphus', element: 'femur', side: 'left', zones: ['distal-end'] }),
      ],
      [join('K-1', 'K-2')],
      vocab,
    );
    expect(state.effective('K-1')).toEqual({ taxon: 'Cervus elaphus', element: 'femur', side: 'left' });
    expect(state.effective('K-2')).toEqual({ taxon: 'Cervus elaphus', element: 'femur', side: 'left' });
    const d = state.derivedFor('K-1');
    expect(d.taxon?.value).toBe('Cervus elaphus');
    expect(d.element?.value).toBe('femur');
    expect(d.side?.value).toBe('left');
    // The analyst's observation is untouched and the diagnostic piece derives nothing.
    expect(state.observations[0].taxon).toBe('Mammalia');
    expect(state.derivedFor('K-2')).toMatchObject({ taxon: null, element: null, side: null });
  });

  it('reaches every member through a chain of three conjoins', () => {
    const state = RefitState.build(
      [
        obs('A', { taxon: 'Mammalia', element: 'long bone' }),
        obs('B', { taxon: 'Artiodactyla', element: 'long bone' }),
        obs('C', { taxon: 'Cervidae', element: 'upper limb long bone' }),
        obs('D', { taxon: 'Cervus elaphus', element: 'femur', side: 'right' }),
      ],
      [join('A', 'B'), join('B', 'C'), join('C', 'D')],
      vocab,
    );
    for (const s of ['A', 'B', 'C']) {
      expect(state.effective(s)).toEqual({ taxon: 'Cervus elaphus', element: 'femur', side: 'right' });
      expect(state.derivedFor(s).taxon?.joins.sort()).toHaveLength(3);
    }
    expect(state.refitSets()).toEqual([['A', 'B', 'C', 'D']]);
  });

  it('takes taxon from one member and element from another', () => {
    const state = RefitState.build(
      [obs('A', { taxon: 'Bos primigenius', element: 'long bone' }), obs('B', { taxon: 'Bovidae', element: 'tibia' })],
      [join('A', 'B', 'conjoin-dry')],
      vocab,
    );
    expect(state.effective('A')).toMatchObject({ taxon: 'Bos primigenius', element: 'tibia' });
    expect(state.effective('B')).toMatchObject({ taxon: 'Bos primigenius', element: 'tibia' });
  });
});

// Rule: an articulation carries taxon (and side between limb elements), a pair carries
// taxon and element with the opposite side; neither merges specimens (issue 3, Lyman 2008).
describe('articulations and pairs', () => {
  it('a pair flips the side and carries taxon and element', () => {
    const state = RefitState.build(
      [obs('L', { taxon: 'Cervus elaphus', element: 'humerus', side: 'left' }), obs('R', { taxon: 'Cervidae', element: 'upper limb long bone' })],
      [join('L', 'R', 'pair')],
      vocab,
    );
    expect(state.effective('R')).toEqual({ taxon: 'Cervus elaphus', element: 'humerus', side: 'right' });
    expect(state.refitSets()).toEqual([]);
  });

  it('a side flips twice through pair then pair, and stays through a conjoin', () => {
    const state = RefitState.build(
      [obs('A', { element: 'femur', side: 'left' }), obs('B', { element: 'femur' }), obs('C', { element: 'long bone' })],
      [join('A', 'B', 'pair'), join('B', 'C', 'conjoin-green')],
      vocab,
    );
    expect(state.effective('B').side).toBe('right');
    expect(state.effective('C')).toMatchObject({ element: 'femur', side: 'right' });
  });

  it('an articulation between limb elements carries taxon and side but not element', () => {
    const state = RefitState.build(
      [obs('F', { taxon: 'Cervus elaphus', element: 'femur', side: 'left' }), obs('T', { taxon: 'Mammalia', element: 'tibia' })],
      [join('F', 'T', 'articulation')],
      vocab,
    );
    expect(state.effective('T')).toEqual({ taxon: 'Cervus elaphus', element: 'tibia', side: 'left' });
    expect(state.refitSets()).toEqual([]);
  });

  it('an articulation between vertebrae carries taxon but no side', () => {
    const state = RefitState.build(
      [obs('V1', { taxon: 'Bos primigenius', element: 'atlas', side: 'axial' }), obs('V2', { taxon: 'Bovidae', element: 'axis' })],
      [join('V1', 'V2', 'articulation')],
      vocab,
    );
    expect(state.effective('V2')).toEqual({ taxon: 'Bos primigenius', element: 'axis', side: null });
  });
});

describe('conflicts', () => {
  const deerFemur = obs('DF', { taxon: 'Cervus elaphus', element: 'femur', side: 'left', sizeClass: 3, zones: ['distal-end', 'distal-shaft'] });

  it('a deer femur joined to a bovid tibia conflicts in taxon and element (design.md section 6)', () => {
    const state = new RefitState([deerFemur, obs('BT', { taxon: 'Bos primigenius', element: 'tibia' })], vocab);
    const c = state.check(join('DF', 'BT'));
    expect(c.map((x) => x.field).sort()).toEqual(['element', 'taxon']);
    expect(c.find((x) => x.field === 'taxon')?.reason).toMatch(/Cervus elaphus and Bos primigenius/);
  });

  it('left against right, size classes two apart, and a shared zone conflict for a conjoin', () => {
    const state = new RefitState(
      [deerFemur, obs('X', { taxon: 'Cervidae', element: 'femur', side: 'right', sizeClass: 5, zones: ['distal-shaft'] })],
      vocab,
    );
    const fields = state.check(join('DF', 'X')).map((x) => x.field).sort();
    expect(fields).toEqual(['side', 'size', 'zones']);
  });

  it('size classes one apart do not conflict (issue 3: more than one apart)', () => {
    const state = new RefitState([deerFemur, obs('Y', { sizeClass: 4, zones: ['proximal-end'] })], vocab);
    expect(state.check(join('DF', 'Y'))).toEqual([]);
  });

  it('a taxon gives its typical size class where none was recorded (typical sizes of the vocabulary, from memory there)', () => {
    const state = new RefitState(
      [obs('ROE', { taxon: 'Capreolus capreolus', element: 'femur' }), obs('BIG', { taxon: 'Mammalia', sizeClass: 4, element: 'long bone' }), obs('MID', { taxon: 'Mammalia', sizeClass: 2, element: 'long bone' })],
      vocab,
    );
    expect(state.check(join('ROE', 'BIG')).map((x) => x.field)).toEqual(['size']);
    expect(state.check(join('ROE', 'MID'))).toEqual([]);
  });

  it('a conflict is seen at the level of the set, not only of the two pieces joined', () => {
    const state = RefitState.build(
      [deerFemur, obs('S', { element: 'long bone', zones: ['midshaft'] }), obs('BT', { taxon: 'Bovidae', element: 'tibia', zones: ['proximal-end'] })],
      [join('DF', 'S')],
      vocab,
    );
    expect(state.check(join('S', 'BT')).map((x) => x.field).sort()).toEqual(['element', 'taxon']);
  });

  it('a pair of two lefts, of an axial element, and of two conjoined pieces conflict', () => {
    const state = RefitState.build(
      [
        deerFemur,
        obs('L2', { element: 'femur', side: 'left' }),
        obs('AT', { element: 'atlas', side: 'axial' }),
        obs('AT2', { element: 'atlas' }),
        obs('P', { element: 'long bone' }),
      ],
      [join('DF', 'P')],
      vocab,
    );
    expect(state.check(join('DF', 'L2', 'pair')).map((x) => x.field)).toEqual(['side']);
    expect(state.check(join('AT', 'AT2', 'pair')).map((x) => x.field).sort()).toEqual(['element', 'side']);
    expect(state.check(join('DF', 'P', 'pair')).map((x) => x.field)).toContain('side');
  });

  it('a forced conflicting join never propagates through the conflicting field', () => {
    const state = RefitState.build(
      [
        obs('A', { taxon: 'Cervus elaphus', element: 'long bone' }),
        obs('B', { taxon: 'Bos primigenius', element: 'tibia', side: 'left' }),
      ],
      [join('A', 'B')],
      vocab,
    );
    const conflicts = state.conflictingJoins();
    expect(conflicts).toHaveLength(1);
    expect(conflicts[0].conflicts.map((c) => c.field)).toEqual(['taxon']);
    // taxon stays as recorded on both sides; element and side still follow the join
    expect(state.effective('A')).toEqual({ taxon: 'Cervus elaphus', element: 'tibia', side: 'left' });
    expect(state.effective('B').taxon).toBe('Bos primigenius');
    expect(state.refitSets()).toEqual([['A', 'B']]);
  });
});

describe('undo', () => {
  it('rebuilding without the last join restores every derived value exactly', () => {
    const observations = [
      obs('A', { taxon: 'Mammalia', element: 'long bone' }),
      obs('B', { taxon: 'Cervidae', element: 'femur' }),
      obs('C', { taxon: 'Cervus elaphus', element: 'femur', side: 'left' }),
    ];
    const j1 = join('A', 'B');
    const j2 = join('B', 'C');
    const before = RefitState.build(observations, [j1], vocab);
    const after = RefitState.build(observations, [j1, j2], vocab);
    const undone = RefitState.build(observations, [j1], vocab);
    expect(after.derivedIdentifications()).not.toEqual(before.derivedIdentifications());
    expect(undone.derivedIdentifications()).toEqual(before.derivedIdentifications());
    expect(undone.refitSets()).toEqual(before.refitSets());
  });
});
