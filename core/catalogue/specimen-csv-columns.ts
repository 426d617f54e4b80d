import type { SpecimenField } from './records';

/**
 * The columns of a specimen CSV (import and export alike), in export order, and the
 * specimen field each one fills. Lists (portion, modifications) are ';'-separated in a cell.
 */
export const SPECIMEN_CSV_COLUMNS = [
  ['catalogue_no', 'catalogueNo'],
  ['unit', 'unit'],
  ['level', 'level'],
  ['layer', 'layer'],
  ['x', 'x'],
  ['y', 'y'],
  ['z', 'z'],
  ['taxon', 'taxon'],
  ['element', 'element'],
  ['side', 'side'],
  ['portion', 'portion'],
  ['fusion', 'fusion'],
  ['size_class', 'sizeClass'],
  ['break_age', 'breakAge'],
  ['modifications', 'modifications'],
  ['weight_g', 'weightG'],
  ['notes', 'notes'],
] as const satisfies readonly (readonly [string, SpecimenField])[];

export type SpecimenCsvColumn = (typeof SPECIMEN_CSV_COLUMNS)[number][0];

export const CSV_COLUMN_NAMES: readonly string[] = SPECIMEN_CSV_COLUMNS.map(([c]) => c);

const fieldOf = new Map<string, SpecimenField>(SPECIMEN_CSV_COLUMNS.map(([c, f]) => [c, f]));

/** A header cell as typed ("Catalogue No", "weight-g", " X ") -> its column name, normalised. */
export function normaliseHeader(cell: string): string {
  return cell.normalize('NFKC').trim().toLowerCase().replace(/[\s\-.]+/g, '_').replace(/^_+|_+$/g, '');
}

export function fieldOfColumn(column: string): SpecimenField | undefined {
  return fieldOf.get(column);
}

export function columnOfField(field: SpecimenField): string {
  return SPECIMEN_CSV_COLUMNS.find(([, f]) => f === field)![0];
}
