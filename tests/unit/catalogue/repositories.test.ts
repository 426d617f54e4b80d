import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { openCatalogue, type Catalogue } from '../../../core/catalogue/catalogue';
import { emptySpecimenFields } from '../../../core/catalogue/records';
import { tempDir } from './helpers';

function fresh(): Catalogue {
  return openCatalogue(join(tempDir(), 'site.sqlite'), { create: true, who: 'tester' });
}

describe('specimen repository and history', () => {
  it('records an insert and each update in history with who, before and after', () => {
    const cat = fresh();
    const s = cat.specimens.insert({ ...emptySpecimenFields('KB-1'), taxon: 'Cervidae', portion: ['midshaft'] });
    const u = cat.specimens.update(s.id, { taxon: 'Cervus elaphus', unit: 'N3E7', portion: ['midshaft'] }, 'second analyst');
    expect(u.changed).toEqual(['unit', 'taxon']);
    expect(cat.specimens.get(s.id)).toMatchObject({ taxon: 'Cervus elaphus', unit: 'N3E7', portion: ['midshaft'] });
    const h = cat.history.list({ entity: 'specimen', entityId: s.id });
    expect(h.map((e) => [e.action, e.who])).toEqual([['insert', 'tester'], ['update', 'second analyst']]);
    expect(h[1].before).toEqual({ unit: null, taxon: 'Cervidae' });
    expect(h[1].after).toEqual({ unit: 'N3E7', taxon: 'Cervus elaphus' });
    // A patch that changes nothing writes nothing.
    expect(cat.specimens.update(s.id, { taxon: 'Cervus elaphus' }).changed).toEqual([]);
    expect(cat.history.count()).toBe(2);
    cat.close();
  });

  it('refuses a duplicate catalogue number and keeps the batch all-or-nothing', () => {
    const cat = fresh();
    cat.specimens.insert(emptySpecimenFields('KB-1'));
    expect(() => cat.specimens.insertMany([emptySpecimenFields('KB-2'), emptySpecimenFields('KB-1')])).toThrow(/already in this catalogue/);
    expect(cat.specimens.count()).toBe(1);
    expect(cat.history.count()).toBe(1);
    cat.close();
  });

  it('keeps history append-only: UPDATE and DELETE are refused by the schema', () => {
    const cat = fresh();
    cat.specimens.insert(emptySpecimenFields('KB-1'));
    expect(() => cat.db.prepare(`UPDATE history SET who = 'someone else'`).run()).toThrow(/append-only/);
    expect(() => cat.db.prepare('DELETE FROM history').run()).toThrow(/append-only/);
    expect(cat.history.list()[0].who).toBe('tester');
    cat.close();
  });

  it('enforces foreign keys and the join transform shape', () => {
    const cat = fresh();
    expect(() => cat.scans.insert({ specimenId: 999, path: 'a.ply', contentHash: 'x' })).toThrow(/FOREIGN KEY/);
    const [a, b] = cat.specimens.insertMany([emptySpecimenFields('KB-1'), emptySpecimenFields('KB-2')]);
    const identity = [1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1];
    const j = cat.joins.insert({ specimenA: a.id, specimenB: b.id, transform: identity, score: 0.8, scoreComponents: { contact: 0.9 } });
    expect(j).toMatchObject({ status: 'proposed', transform: identity, forced: false });
    expect(() => cat.joins.insert({ specimenA: a.id, specimenB: b.id, transform: [1, 2, 3] })).toThrow(/16 finite numbers/);
    expect(() => cat.joins.insert({ specimenA: a.id, specimenB: a.id })).toThrow(/CHECK/);
    const accepted = cat.joins.update(j.id, { status: 'accepted', type: 'conjoin', decidedBy: 'tester', decidedAt: '2026-01-01T00:00:00Z' });
    expect(accepted.status).toBe('accepted');
    expect(cat.joins.list({ status: 'accepted', specimenId: b.id }).map((x) => x.id)).toEqual([j.id]);
    const h = cat.history.list({ entity: 'join' });
    expect(h.at(-1)).toMatchObject({ action: 'update', before: { status: 'proposed', type: null } });
    cat.close();
  });

  it('keeps derived identifications apart from the observed record', () => {
    const cat = fresh();
    const s = cat.specimens.insert({ ...emptySpecimenFields('KB-1'), element: 'long bone' });
    cat.derived.set(s.id, 'element', 'femur', [7]);
    expect(cat.specimens.get(s.id)!.element).toBe('long bone');
    expect(cat.derived.list({ specimenId: s.id })).toMatchObject([{ field: 'element', value: 'femur', sourceJoinIds: [7] }]);
    expect(cat.derived.remove(s.id, 'element')).toBe(true);
    expect(cat.derived.list()).toEqual([]);
    expect(cat.history.list({ entity: 'derived_identification' }).map((e) => e.action)).toEqual(['insert', 'delete']);
    cat.close();
  });

  it('removes a mistaken specimen with its record kept in history, but not one that joins refer to', () => {
    const cat = fresh();
    const [a, b, c] = cat.specimens.insertMany([emptySpecimenFields('KB-1'), emptySpecimenFields('KB-2'), { ...emptySpecimenFields('KB-3'), unit: 'N1E1' }]);
    cat.joins.insert({ specimenA: a.id, specimenB: b.id });
    expect(() => cat.specimens.remove(a.id)).toThrow(/still has 1 join/);
    cat.specimens.remove(c.id);
    expect(cat.specimens.get(c.id)).toBeUndefined();
    expect(cat.history.list({ entity: 'specimen', entityId: c.id }).at(-1)).toMatchObject({ action: 'delete', before: { catalogueNo: 'KB-3', unit: 'N1E1' } });
    cat.close();
  });

  it('rolls back every write of a failed transaction', () => {
    const cat = fresh();
    expect(() =>
      cat.transaction(() => {
        cat.specimens.insert(emptySpecimenFields('KB-1'));
        cat.settings.set('site', 'Hollow Fen');
        throw new Error('stop');
      }),
    ).toThrow('stop');
    expect(cat.specimens.count()).toBe(0);
    expect(cat.settings.get('site')).toBeUndefined();
    expect(cat.history.count()).toBe(0);
    cat.close();
  });
});
