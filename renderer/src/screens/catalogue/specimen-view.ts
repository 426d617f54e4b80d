/**
 * The specimen table's model: the record as the host sends it, the columns the analyst
 * sees, and pure helpers for filtering, sorting and formatting.
 */
export interface SpecimenRecord {
  id: number;
  catalogueNo: string;
  unit: string | null;
  level: string | null;
  layer: string | null;
  x: number | null;
  y: number | null;
  z: number | null;
  taxon: string | null;
  element: string | null;
  side: string | null;
  portion: string[];
  fusion: string | null;
  sizeClass: number | null;
  breakAge: string | null;
  modifications: string[];
  weightG: number | null;
  notes: string | null;
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

/** Natural order: "B-2" before "B-10"; blanks last. */
const collator = new Intl.Collator(undefined, { numeric: true, sensitivity: 'base' });

function compare(a: SpecimenRecord, b: SpecimenRecord, field: FieldName): number {
  const va = a[field];
  const vb = b[field];
  const blankA = va === null || (Array.isArray(va) && va.length === 0);
  const blankB = vb === null || (Array.isArray(vb) && vb.length === 0);
  if (blankA || blankB) return blankA === blankB ? 0 : blankA ? 1 : -1;
  if (typeof va === 'number' && typeof vb === 'number') return va - vb;
  return collator.compare(cellText(a, field), cellText(b, field));
}

/**
 * Rows that match the query, in its order. The text matches any field (all words must
 * appear somewhere in the record); unit, level and layer match exactly.
 */
export function queryRows(rows: readonly SpecimenRecord[], q: TableQuery): SpecimenRecord[] {
  const words = q.text.toLowerCase().split(/\s+/).filter(Boolean);
  const out = rows.filter((r) => {
    if (q.unit && r.unit !== q.unit) return false;
    if (q.level && r.level !== q.level) return false;
    if (q.layer && r.layer !== q.layer) return false;
    if (words.length === 0) return true;
    const hay = COLUMNS.map((c) => cellText(r, c.field)).join(' ').toLowerCase();
    return words.every((w) => hay.includes(w));
  });
  const { field, descending } = q.sort;
  out.sort((a, b) => {
    const c = compare(a, b, field) || collator.compare(a.catalogueNo, b.catalogueNo);
    return descending && c !== 0 ? -c : c;
  });
  return out;
}

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
