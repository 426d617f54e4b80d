import Database from 'better-sqlite3';
import { afterEach, describe, expect, it } from 'vitest';
import { Host } from '../../../core/host/host';
import { KnitboneError } from '../../../core/host/errors';
import { catalogueWith, propose, readBack } from './helpers';

const host = new Host();
const cleanups: Array<() => void> = [];
afterEach(() => {
  while (cleanups.length) cleanups.pop()!();
});
function fresh(specimens: Parameters<typeof catalogueWith>[0]): string {
  const c = catalogueWith(specimens);
  cleanups.push(c.cleanup);
  return c.path;
}

// The example of issue 3 (rule: a conjoin asserts same taxon, element and side; Lyman 1994, 2008).
const shaft = { catalogueNo: 'K-1', taxon: 'Mammalia', sizeClass: 3, element: 'long bone', side: 'indeterminate' as const, portion: ['midshaft'] };
const deerFemur = { catalogueNo: 'K-2', taxon: 'Cervus elaphus', element: 'femur', side: 'left' as const, portion: ['distal-shaft', 'distal-end'] };

describe('joins through the host API', () => {
  it('link propagates the identification, stores it apart with its join, and counts follow', async () => {
    const path = fresh([shaft, deerFemur, { catalogueNo: 'K-3', taxon: 'Cervus elaphus', element: 'femur', side: 'left', portion: ['midshaft'] }]);
    const before = await host.call('tally.counts', { catalogue: path });
    const r = await host.call('joins.link', { catalogue: path, a: 'K-1', b: 'K-2', type: 'conjoin-green', by: 'A. Analyst' });
    expect(r.conflicts).toEqual([]);
    expect(r.join).toMatchObject({ a: 'K-1', b: 'K-2', status: 'accepted', type: 'conjoin-green', decidedBy: 'A. Analyst', score: null });
    const back = readBack(path);
    const k1 = back.specimens.find((s) => s.catalogueNo === 'K-1')!;
    expect(k1).toMatchObject({ taxon: 'Mammalia', element: 'long bone', side: 'indeterminate' }); // observation untouched
    expect(back.derived.filter((d) => d.specimenId === k1.id)).toEqual([
      { specimenId: k1.id, field: 'element', value: 'femur', joins: [r.join.id] },
      { specimenId: k1.id, field: 'side', value: 'left', joins: [r.join.id] },
      { specimenId: k1.id, field: 'taxon', value: 'Cervus elaphus', joins: [r.join.id] },
    ]);
    const after = await host.call('tally.counts', { catalogue: path });
    expect(after.recorded).toEqual(before.recorded);
    expect(before.refitted.identifiedToElement).toBeCloseTo(2 / 3, 12);
    expect(after.refitted.identifiedToElement).toBe(1);
    // K-1 (midshaft, via the set) and K-3 (midshaft) overlap: MNE of left femora rises to 2
    // (overlap approach, Marean et al. 2001).
    expect(before.refitted.byElement).toMatchObject([{ taxon: 'Cervus elaphus', element: 'femur', nisp: 2, mneLeft: 1, mne: 1 }]);
    expect(after.refitted.byElement).toMatchObject([{ taxon: 'Cervus elaphus', element: 'femur', nisp: 2, mneLeft: 2, mne: 2, mau: 1, percentMau: 100 }]);
    expect(after.refitted.byTaxon).toEqual([{ taxon: 'Cervus elaphus', nisp: 2, mni: 2 }]);
    // history has the link and each derived value
    const actions = back.history.map((h) => `${h.entity}:${h.action}`);
    expect(actions).toContain('join:link');
    expect(actions.filter((a) => a === 'derived_identification:insert')).toHaveLength(3);
  });

  it('propagates through a chain of three conjoins', async () => {
    const path = fresh([
      { catalogueNo: 'A', taxon: 'Mammalia', element: 'long bone' },
      { catalogueNo: 'B', taxon: 'Artiodactyla', element: 'long bone' },
      { catalogueNo: 'C', taxon: 'Cervidae', element: 'upper limb long bone' },
      { catalogueNo: 'D', taxon: 'Cervus elaphus', element: 'humerus', side: 'right' },
    ]);
    for (const [a, b] of [['A', 'B'], ['B', 'C'], ['C', 'D']]) await host.call('joins.link', { catalogue: path, a, b, type: 'conjoin-dry' });
    const t = await host.call('tally.counts', { catalogue: path });
    expect(t.refitted).toMatchObject({ nisp: 1, nispFragments: 4, identifiedToElement: 1, identifiedToTaxon: 1 });
    expect(t.recorded).toMatchObject({ nisp: 1, nispFragments: 1, identifiedToElement: 0.25, identifiedToTaxon: 0.5 });
    expect(readBack(path).derived.filter((d) => d.value === 'Cervus elaphus')).toHaveLength(3);
  });

  it('refuses a conflicting link with the reason and writes nothing; --force records it without carrying the field', async () => {
    const path = fresh([deerFemur, { catalogueNo: 'B-1', taxon: 'Bos taurus', element: 'tibia', portion: ['proximal-end'] }]);
    const before = readBack(path);
    const err = await host.call('joins.link', { catalogue: path, a: 'K-2', b: 'B-1', type: 'conjoin-green' }).catch((e) => e);
    expect(err).toBeInstanceOf(KnitboneError);
    expect((err as KnitboneError).kind).toBe('conflict');
    expect((err as KnitboneError).problems.map((p) => p.field).sort()).toEqual(['element', 'taxon']);
    expect(readBack(path)).toEqual(before);

    const forced = await host.call('joins.link', { catalogue: path, a: 'K-2', b: 'B-1', type: 'conjoin-green', force: true });
    expect(forced.join.forced).toBe(true);
    expect(forced.derived.set.map((d) => d.field)).toEqual(['side']); // only side carries
    const conflicts = await host.call('joins.conflicts', { catalogue: path });
    expect(conflicts).toHaveLength(1);
    expect(conflicts[0]).toMatchObject({ id: forced.join.id, a: 'K-2', b: 'B-1', status: 'accepted' });
    expect(conflicts[0].conflicts.map((c) => c.field).sort()).toEqual(['element', 'taxon']);
  });

  it('accepting a proposal then undoing it restores the join, derived values and counts exactly', async () => {
    const path = fresh([shaft, deerFemur, { catalogueNo: 'K-3', taxon: 'Cervus elaphus', element: 'femur', side: 'right', portion: ['midshaft'] }]);
    const id = propose(path, 'K-1', 'K-2', { score: 0.82, breakAge: 'fresh' });
    const joinsBefore = await host.call('joins.list', { catalogue: path });
    const countsBefore = await host.call('tally.counts', { catalogue: path });
    const derivedBefore = readBack(path).derived;
    expect(joinsBefore).toEqual([
      { id, a: 'K-1', b: 'K-2', status: 'proposed', type: 'conjoin-green', score: 0.82, transform: [1, 0, 0, 5, 0, 1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1], decidedBy: null, decidedAt: null },
    ]);
    const accepted = await host.call('joins.accept', { catalogue: path, id, by: 'A. Analyst' });
    expect(accepted.derived.set).toHaveLength(3);
    expect(await host.call('tally.counts', { catalogue: path })).not.toEqual(countsBefore);
    const undone = await host.call('joins.unlink', { catalogue: path, id, by: 'A. Analyst' });
    expect(undone.removed).toBe(false);
    expect(undone.derived.removed).toHaveLength(3);
    expect(await host.call('joins.list', { catalogue: path })).toEqual(joinsBefore);
    expect(await host.call('tally.counts', { catalogue: path })).toEqual(countsBefore);
    expect(readBack(path).derived).toEqual(derivedBefore);
    const actions = readBack(path).history.filter((h) => h.entity === 'join').map((h) => h.action);
    expect(actions).toEqual(['insert', 'accept', 'unlink']);
  });

  it('undoing a link made by hand removes it, and history keeps both steps', async () => {
    const path = fresh([shaft, deerFemur]);
    const countsBefore = await host.call('tally.counts', { catalogue: path });
    const r = await host.call('joins.link', { catalogue: path, a: 'K-1', b: 'K-2', type: 'conjoin-modern' });
    const u = await host.call('joins.unlink', { catalogue: path, id: r.join.id });
    expect(u.removed).toBe(true);
    expect(await host.call('joins.list', { catalogue: path })).toEqual([]);
    expect(await host.call('tally.counts', { catalogue: path })).toEqual(countsBefore);
    expect(readBack(path).derived).toEqual([]);
    expect(readBack(path).history.filter((h) => h.entity === 'join').map((h) => h.action)).toEqual(['link', 'unlink']);
  });

  it('reject decides a proposal without propagating; proposed conflicts are reported before a decision', async () => {
    const path = fresh([shaft, deerFemur, { catalogueNo: 'K-4', taxon: 'Cervus elaphus', element: 'femur', side: 'right', portion: ['distal-end'] }]);
    const good = propose(path, 'K-1', 'K-2');
    const bad = propose(path, 'K-2', 'K-4');
    const conflicts = await host.call('joins.conflicts', { catalogue: path });
    expect(conflicts.map((c) => c.id)).toEqual([bad]);
    expect(conflicts[0].conflicts.map((c) => c.field).sort()).toEqual(['side', 'zones']);
    // the review screen asks before deciding
    expect((await host.call('joins.check', { catalogue: path, id: good })).conflicts).toEqual([]);
    expect((await host.call('joins.check', { catalogue: path, id: bad })).conflicts.map((c) => c.field).sort()).toEqual(['side', 'zones']);
    expect((await host.call('joins.check', { catalogue: path, a: 'K-2', b: 'K-4', type: 'pair' })).conflicts).toEqual([]);
    // a proposal between the same two specimens is accepted, not linked a second time
    await expect(host.call('joins.link', { catalogue: path, a: 'K-2', b: 'K-1', type: 'conjoin-green' })).rejects.toMatchObject({ kind: 'conflict' });
    const r = await host.call('joins.reject', { catalogue: path, id: good, by: 'A. Analyst' });
    expect(r.join.status).toBe('rejected');
    expect(readBack(path).derived).toEqual([]);
    await expect(host.call('joins.accept', { catalogue: path, id: bad })).rejects.toMatchObject({ kind: 'conflict' });
    await expect(host.call('joins.accept', { catalogue: path, id: 999 })).rejects.toMatchObject({ kind: 'not-found' });
  });

  it('a pair flips side and gives L + R - P (Lyman 2008)', async () => {
    const h = (n: string, side: 'left' | 'right' | null, taxon = 'Cervus elaphus') => ({ catalogueNo: n, taxon, element: 'humerus', side, portion: ['distal-end'] });
    const path = fresh([h('L1', 'left'), h('L2', 'left'), h('R1', 'right'), h('X', null, 'Cervidae')]);
    await host.call('joins.link', { catalogue: path, a: 'L1', b: 'R1', type: 'pair' });
    const r = await host.call('joins.link', { catalogue: path, a: 'L2', b: 'X', type: 'pair' });
    expect(r.derived.set.map((d) => [d.specimen, d.field, d.value]).sort()).toEqual([
      ['X', 'side', 'right'],
      ['X', 'taxon', 'Cervus elaphus'],
    ]);
    const t = await host.call('tally.counts', { catalogue: path });
    expect(t.refitted.byTaxon).toEqual([{ taxon: 'Cervus elaphus', nisp: 4, mni: 2, lrp: 2 + 2 - 2 }]);
  });

  it('the identification threshold is a catalogue setting (default family; Grayson 1984 counts at a chosen rank)', async () => {
    const path = fresh([
      { catalogueNo: 'G-1', taxon: 'Cervidae', element: 'femur' },
      { catalogueNo: 'G-2', taxon: 'Cervus elaphus', element: 'femur' },
    ]);
    expect(await host.call('tally.identificationRank', { catalogue: path })).toEqual({ rank: 'family' });
    expect((await host.call('tally.counts', { catalogue: path })).recorded.nisp).toBe(2);
    expect(await host.call('tally.identificationRank', { catalogue: path, rank: 'genus' })).toEqual({ rank: 'genus' });
    const t = await host.call('tally.counts', { catalogue: path });
    expect(t.recorded.nisp).toBe(1);
    expect(t.recorded.identifiedToTaxon).toBe(0.5);
    await expect(host.call('tally.identificationRank', { catalogue: path, rank: 'kingdom' as never })).rejects.toMatchObject({ kind: 'bad-input' });
  });

  it('an edit made with another SQLite tool is counted at once (change counter, migration 0010)', async () => {
    const path = fresh([{ catalogueNo: 'E-1', taxon: 'Mammalia', element: 'femur' }]);
    expect((await host.call('tally.counts', { catalogue: path })).recorded.nisp).toBe(0);
    const outside = new Database(path);
    outside.prepare(`UPDATE specimen SET taxon = 'Cervus elaphus' WHERE catalogue_no = 'E-1'`).run();
    outside.close();
    expect((await host.call('tally.counts', { catalogue: path })).recorded.nisp).toBe(1);
  });

  it('preview (the review screen\'s request) says what accepting would change, and accepting does exactly that; reopen undoes a rejection', async () => {
    const path = fresh([shaft, deerFemur, { catalogueNo: 'K-3', taxon: 'Cervus elaphus', element: 'femur', side: 'left', portion: ['midshaft'] }]);
    const id = propose(path, 'K-1', 'K-2', { breakAge: 'dry' });
    const joinsBefore = await host.call('joins.list', { catalogue: path });
    const p = await host.call('joins.preview', { catalogue: path, id });
    expect(p.conflicts).toEqual([]);
    expect(p.derived.sort((x, y) => x.field.localeCompare(y.field))).toEqual([
      { specimen: 'K-1', field: 'element', before: null, after: 'femur' },
      { specimen: 'K-1', field: 'side', before: null, after: 'left' },
      { specimen: 'K-1', field: 'taxon', before: null, after: 'Cervus elaphus' },
    ]);
    expect(p.elements).toEqual([
      { taxon: 'Cervus elaphus', element: 'femur', before: { nisp: 2, mneLeft: 1, mneRight: 0, mne: 1 }, after: { nisp: 2, mneLeft: 2, mneRight: 0, mne: 2 } },
    ]);
    expect(readBack(path).derived).toEqual([]); // nothing written
    await host.call('joins.accept', { catalogue: path, id });
    const t = await host.call('tally.counts', { catalogue: path });
    expect(t.refitted.nisp).toBe(p.nisp.after);
    expect(t.refitted.identifiedToElement).toBe(p.identifiedToElement.after);
    expect(t.refitted.byElement[0]).toMatchObject(p.elements[0].after!);
    await host.call('joins.unlink', { catalogue: path, id });
    await host.call('joins.reject', { catalogue: path, id });
    await host.call('joins.reopen', { catalogue: path, id });
    expect(await host.call('joins.list', { catalogue: path })).toEqual(joinsBefore);
  });
});
