/**
 * The specimen table's model: the record as the host sends it, the columns the analyst
 * sees, and pure helpers for filtering, sorting and formatting.
 */
import type { SpecimenFields } from '../../../../core/catalogue/records';

/** A specimen as the host's specimens.list / specimens.get answer it (the analyst's own fields). */
export interface SpecimenRecord extends SpecimenFields {
  id: number;
}

export type FieldName = Exclude<keyof SpecimenRecord, 'id'>;

export interface Column {
  field: FieldName;
  label: string;
  width: number;
  numeric?: boolean;
}

export const COLUMNS: Column[] = [
  { field: 'catalogueNo', label: 'Cat. no.', width: 110 },
  { field: 'unit', label: 'Unit', width: 70 },
  { field: 'level', label: 'Level', width: 60 },
  { field: 'layer', label: 'Layer', width: 60 },
  { field: 'x', label: 'x (m)', width: 84, numeric: true },
  { field: 'y', label: 'y (m)', width: 84, numeric: true },
  { field: 'z', label: 'z (m)', width: 84, numeric: true },
  { field: 'taxon', label: 'Taxon', width: 150 },
  { field: 'element', label: 'Element', width: 120 },
  { field: 'side', label: 'Side', width: 90 },
  { field: 'portion', label: 'Portion zones', width: 170 },
  { field: 'sizeClass', label: 'Size', width: 48, numeric: true },
  { field: 'breakAge', label: 'Break', width: 80 },
  { field: 'modifications', label: 'Modifications', width: 130 },
  { field: 'weightG', label: 'g', width: 60, numeric: true },
  { field: 'notes', label: 'Notes', width: 200 },
];

export function cellText(r: SpecimenRecord, field: FieldName): string {
  const v = r[field];
  if (v === null || v === undefined) return '';
  if (Array.isArray(v)) return v.join('; ');
  if (typeof v === 'number') return field === 'x' || field === 'y' || field === 'z' ? v.toFixed(3) : String(v);
  return v;
}

export interface TableQuery {
  text: string;
  unit: string;
  level: string;
  layer: string;
  sort: { field: FieldName; descending: boolean };
}

export const EMPTY_QUERY: TableQuery = { text: '', unit: '', level: '', layer: '', sort: { field: 'catalogueNo', descending: false } };

/** A natural-order key: digit runs zero-padded ("B-2" before "B-10"), case folded. */
export function naturalKey(text: string): string {
  return text.toLowerCase().replace(/\d+/g, (d) => d.padStart(12, '0'));
}

/**
 * Rows made ready for fast queries: the text every word is searched in, and sort keys
 * computed once per field (plain comparisons then; no locale-aware compare per pair).
 */
export class PreparedRows {
  private haystack: string[] | null = null;
  private readonly keys = new Map<FieldName, Array<string | number | null>>();
  private readonly orders = new Map<string, number[]>();

  constructor(readonly rows: readonly SpecimenRecord[]) {}

  /** The text of each row that words are found in; made at the first search, not at opening. */
  get hay(): string[] {
    this.haystack ??= this.rows.map((r) => COLUMNS.map((c) => cellText(r, c.field)).join(' ').toLowerCase());
    return this.haystack;
  }

  private keysOf(field: FieldName): Array<string | number | null> {
    let k = this.keys.get(field);
    if (!k) {
      k = this.rows.map((r) => {
        const v = r[field];
        if (v === null || (Array.isArray(v) && v.length === 0)) return null;
        return typeof v === 'number' ? v : naturalKey(cellText(r, field));
      });
      this.keys.set(field, k);
    }
    return k;
  }

  /** Row indices in the order of a field (blanks last), ties by catalogue number. */
  order(field: FieldName, descending: boolean): number[] {
    const id = `${field}:${descending}`;
    const cached = this.orders.get(id);
    if (cached) return cached;
    const k = this.keysOf(field);
    const tie = this.keysOf('catalogueNo');
    const idx = this.rows.map((_, i) => i);
    idx.sort((i, j) => {
      const a = k[i];
      const b = k[j];
      if (a === null || b === null) return a === b ? cmp(tie[i], tie[j]) : a === null ? 1 : -1;
      const c = cmp(a, b) || cmp(tie[i], tie[j]);
      return descending ? -c : c;
    });
    this.orders.set(id, idx);
    return idx;
  }
}

function cmp(a: string | number | null, b: string | number | null): number {
  return a === b ? 0 : (a as string | number) < (b as string | number) ? -1 : 1;
}

/**
 * Rows that match the query, in its order. The text matches any field (all words must
 * appear somewhere in the record); unit, level and layer match exactly.
 */
export function queryPrepared(p: PreparedRows, q: TableQuery): SpecimenRecord[] {
  const words = q.text.toLowerCase().split(/\s+/).filter(Boolean);
  const hay = words.length ? p.hay : [];
  const out: SpecimenRecord[] = [];
  for (const i of p.order(q.sort.field, q.sort.descending)) {
    const r = p.rows[i];
    if (q.unit && r.unit !== q.unit) continue;
    if (q.level && r.level !== q.level) continue;
    if (q.layer && r.layer !== q.layer) continue;
    if (words.length && !words.every((w) => hay[i].includes(w))) continue;
    out.push(r);
  }
  return out;
}

export function queryRows(rows: readonly SpecimenRecord[], q: TableQuery): SpecimenRecord[] {
  return queryPrepared(new PreparedRows(rows), q);
}

const collator = new Intl.Collator(undefined, { numeric: true, sensitivity: 'base' });

/** Distinct non-blank values of a field, naturally sorted (for filters and type-ahead). */
export function distinctValues(rows: readonly SpecimenRecord[], field: FieldName): string[] {
  const set = new Set<string>();
  for (const r of rows) {
    const v = r[field];
    if (Array.isArray(v)) v.forEach((x) => set.add(x));
    else if (v !== null && v !== '') set.add(String(v));
  }
  return [...set].sort(collator.compare);
}

/** The next catalogue number after this one: the last run of digits plus one, width kept. */
export function nextCatalogueNo(no: string): string {
  const m = /^(.*?)(\d+)(\D*)$/.exec(no);
  if (!m) return no;
  const n = String(Number(m[2]) + 1).padStart(m[2].length, '0');
  return `${m[1]}${n}${m[3]}`;
}
