import { mkdirSync, renameSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { stringify } from 'csv-stringify/sync';
import type { Catalogue } from './catalogue';
import type { Specimen } from './records';
import { SPECIMEN_CSV_COLUMNS } from './specimen-csv-columns';

/**
 * Export of a catalogue as CSV files an analyst can open anywhere:
 *  - specimens.csv: the import columns, so export -> import round-trips exactly;
 *  - joins.csv: every join with both catalogue numbers, decision and score;
 *  - history.csv: the whole append-only history.
 * tally.csv (counts) belongs to the counting area; an exporter for it is passed in
 * through `extraFiles` so this module stays free of counting rules.
 */

export interface ExportFile {
  name: string;
  rows: number;
  path: string;
}

export interface ExtraExport {
  /** File name, e.g. tally.csv. */
  name: string;
  header: string[];
  rows: (cat: Catalogue) => unknown[][];
}

/** One CSV cell for a specimen field: lists ';'-joined, numbers in shortest round-trip form. */
function cell(value: unknown): string {
  if (value === null || value === undefined) return '';
  if (Array.isArray(value)) return value.join(';');
  return String(value);
}

export function specimenCsvRows(specimens: readonly Specimen[]): string[][] {
  return specimens.map((s) => SPECIMEN_CSV_COLUMNS.map(([, f]) => cell(s[f])));
}

/** The specimens.csv text (UTF-8, comma-separated, header row) of all or some specimens. */
export function specimensCsv(cat: Catalogue, specimens: readonly Specimen[] = cat.specimens.list()): string {
  return stringify([SPECIMEN_CSV_COLUMNS.map(([c]) => c), ...specimenCsvRows(specimens)]);
}

export const JOIN_CSV_COLUMNS = [
  'join_id', 'catalogue_no_a', 'catalogue_no_b', 'status', 'type', 'break_age', 'score', 'score_components',
  'transform', 'method_version', 'parameters', 'forced', 'decided_by', 'decided_at', 'note', 'created_at',
] as const;

export function joinsCsv(cat: Catalogue): string {
  const noOf = new Map(cat.specimens.list().map((s) => [s.id, s.catalogueNo]));
  const rows = cat.joins.list().map((j) => [
    j.id, noOf.get(j.specimenA), noOf.get(j.specimenB), j.status, j.type ?? '', j.breakAge ?? '', j.score ?? '',
    JSON.stringify(j.scoreComponents), j.transform ? j.transform.join(';') : '', j.methodVersion ?? '',
    JSON.stringify(j.parameters), j.forced ? 'yes' : 'no', j.decidedBy ?? '', j.decidedAt ?? '', j.note ?? '', j.createdAt,
  ]);
  return stringify([[...JOIN_CSV_COLUMNS], ...rows]);
}

export const HISTORY_CSV_COLUMNS = ['history_id', 'at', 'who', 'entity', 'entity_id', 'action', 'before', 'after'] as const;

export function historyCsv(cat: Catalogue): string {
  const rows = cat.history.list().map((h) => [
    h.id, h.at, h.who, h.entity, h.entityId ?? '', h.action,
    h.before === null ? '' : JSON.stringify(h.before), h.after === null ? '' : JSON.stringify(h.after),
  ]);
  return stringify([[...HISTORY_CSV_COLUMNS], ...rows]);
}

/** Write a file by writing a temporary one beside it and renaming, so no half-written file is left. */
function writeWhole(path: string, text: string): void {
  const tmp = `${path}.partial-${process.pid}`;
  writeFileSync(tmp, text, 'utf8');
  renameSync(tmp, path);
}

/** Write specimens.csv, joins.csv, history.csv (and any extra files) into `dir`, creating it. */
export function exportCatalogue(cat: Catalogue, dir: string, extraFiles: readonly ExtraExport[] = []): ExportFile[] {
  mkdirSync(dir, { recursive: true });
  // Read everything inside one transaction so the files agree with each other.
  const texts = cat.transaction(() => [
    { name: 'specimens.csv', text: specimensCsv(cat), rows: cat.specimens.count() },
    { name: 'joins.csv', text: joinsCsv(cat), rows: cat.joins.list().length },
    { name: 'history.csv', text: historyCsv(cat), rows: cat.history.count() },
    ...extraFiles.map((x) => {
      const rows = x.rows(cat);
      return { name: x.name, text: stringify([x.header, ...rows]), rows: rows.length };
    }),
  ]);
  return texts.map((t) => {
    const path = join(dir, t.name);
    writeWhole(path, t.text);
    return { name: t.name, rows: t.rows, path };
  });
}
