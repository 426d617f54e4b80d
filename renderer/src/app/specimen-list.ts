import { callByName } from '../api/loose';
import type { ApiClient } from '../api/client';
import type { SpecimenRecord } from '../screens/catalogue/specimen-view';

/** The specimens of the open catalogue, read once per change of the catalogue and shared by every screen. */
export interface SpecimenSource {
  client: ApiClient;
  catalogue: string;
  revision: number;
  has(name: string): boolean;
}

let last: { client: ApiClient; key: string; list: Promise<SpecimenRecord[]> } | null = null;

/**
 * All specimens, in catalogue order. Screens that open together (or one after another without
 * a change in between) share one read; a new revision reads again. Uses the compact
 * `specimens.table` rows where the host has them.
 */
export function loadSpecimens(src: SpecimenSource): Promise<SpecimenRecord[]> {
  const key = `${src.catalogue}\u0000${src.revision}`;
  if (last && last.client === src.client && last.key === key) return last.list;
  const list = src.has('specimens.table')
    ? callByName<{ fields: string[]; rows: unknown[][] }>(src.client, 'specimens.table', { catalogue: src.catalogue }).then(recordsFromTable)
    : callByName<SpecimenRecord[]>(src.client, 'specimens.list', { catalogue: src.catalogue });
  const entry = { client: src.client, key, list };
  last = entry;
  // A failed read is not kept: the next screen asks again.
  list.catch(() => {
    if (last === entry) last = null;
  });
  return list;
}

export function recordsFromTable(t: { fields: string[]; rows: unknown[][] }): SpecimenRecord[] {
  const n = t.fields.length;
  return t.rows.map((row) => {
    const r: Record<string, unknown> = {};
    for (let i = 0; i < n; i++) r[t.fields[i]] = row[i];
    return r as unknown as SpecimenRecord;
  });
}
