import type { Catalogue, DerivedField } from '../../catalogue/index';
import type { CatalogueRefits } from './refits-of';

export interface DerivedChanges {
  /** Derived values written (new or changed), as catalogue number, field and value. */
  set: Array<{ specimen: string; field: DerivedField; value: string; joins: number[] }>;
  /** Derived values removed. */
  removed: Array<{ specimen: string; field: DerivedField; value: string }>;
}

const FIELDS: DerivedField[] = ['taxon', 'element', 'side'];

/**
 * Make the catalogue's derived identifications match the refit state: write what changed,
 * remove what no join supports any more, each with a history entry (through the
 * repository). Call inside the transaction of the decision that caused it. With
 * `affected` (catalogue numbers), only those specimens are compared: enough after one
 * decision, whose effects stay within the linked components of its two specimens.
 */
export function syncDerived(cat: Catalogue, refits: CatalogueRefits, who: string, affected?: readonly string[]): DerivedChanges {
  const changes: DerivedChanges = { set: [], removed: [] };
  const stored = new Map<string, { value: string; joins: number[] }>();
  const storedRows = affected
    ? affected.flatMap((no) => cat.derived.list({ specimenId: refits.byNo.get(no)!.id }))
    : cat.derived.list();
  for (const d of storedRows) stored.set(`${d.specimenId}\u0000${d.field}`, { value: d.value, joins: d.sourceJoinIds });
  const wanted = new Map<string, { value: string; joins: number[] }>();
  const derived = affected ? affected.map((no) => refits.state.derivedFor(no)) : refits.state.derivedIdentifications();
  for (const d of derived) {
    const s = refits.byNo.get(d.specimen)!;
    for (const f of FIELDS) {
      const v = d[f];
      if (v) wanted.set(`${s.id}\u0000${f}`, { value: v.value, joins: (v.joins as number[]).slice().sort((a, b) => a - b) });
    }
  }
  for (const [key, w] of wanted) {
    const old = stored.get(key);
    if (old && old.value === w.value && JSON.stringify(old.joins) === JSON.stringify(w.joins)) continue;
    const [id, field] = key.split('\u0000') as [string, DerivedField];
    cat.derived.set(Number(id), field, w.value, w.joins, who);
    changes.set.push({ specimen: refits.byId.get(Number(id))!.catalogueNo, field, value: w.value, joins: w.joins });
  }
  for (const [key, old] of stored) {
    if (wanted.has(key)) continue;
    const [id, field] = key.split('\u0000') as [string, DerivedField];
    cat.derived.remove(Number(id), field, who);
    changes.removed.push({ specimen: refits.byId.get(Number(id))?.catalogueNo ?? id, field, value: old.value });
  }
  return changes;
}
