import { createHash } from 'node:crypto';
import { basename } from 'node:path';
import { parse } from 'csv-parse/sync';
import { KnitboneError, type Problem } from '../host/errors';
import type { ProgressEvent } from '../host/request';
import { closestTerms } from '../vocab/normalise';
import type { Vocabulary } from '../vocab/vocabulary';
import type { Catalogue } from './catalogue';
import { vocabularyOf } from './catalogue-vocabulary';
import { emptySpecimenFields, type Specimen, type SpecimenField, type SpecimenFields } from './records';
import { CSV_COLUMN_NAMES, columnOfField, fieldOfColumn, normaliseHeader } from './specimen-csv-columns';
import { checkSpecimenConsistency, normaliseSpecimenValues, type RawSpecimen } from './specimen-input';

/**
 * Import of a lab's specimen list from CSV, all or nothing: every row is checked first and
 * if any is bad nothing is written and every problem is reported as
 * `line N, column C: reason`. With `update`, rows whose catalogue number is already in the
 * catalogue change that specimen (only the columns present in the file; each change goes
 * to history); without it they are refused as duplicates.
 */

export interface ImportSpecimensOptions {
  /** Change existing specimens instead of refusing their catalogue numbers. */
  update?: boolean;
  /** Name of the file, for messages and history. */
  fileName?: string;
  onProgress?: (e: ProgressEvent) => void;
}

export interface ImportSpecimensResult {
  file: string;
  delimiter: ',' | ';';
  rows: number;
  inserted: number;
  updated: number;
  unchanged: number;
  /** Catalogue numbers of the specimens that were updated, with the fields that changed. */
  changes: { catalogueNo: string; fields: SpecimenField[] }[];
}

interface Row {
  line: number;
  /** The row's values in canonical form (only the columns the file has). */
  values: RawSpecimen;
  /** False when a cell of this row had a problem. */
  ok: boolean;
}

/** Unknown terms in one file that get "closest known" suggestions; later ones are reported without. */
export const SUGGESTION_BUDGET = 500;

const utf8 = new TextDecoder('utf-8', { fatal: true });

/** Decode bytes as UTF-8 (with or without a byte-order mark); refuse anything else. */
export function decodeCsv(bytes: Uint8Array | string, file: string): string {
  let text: string;
  if (typeof bytes === 'string') text = bytes;
  else {
    try {
      text = utf8.decode(bytes);
    } catch {
      throw new KnitboneError('bad-input', [{ file, message: 'the file is not UTF-8 text; save the spreadsheet as "CSV UTF-8"' }]);
    }
  }
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}

/** Comma or semicolon, whichever separates more cells of the header line (quotes respected). */
export function detectDelimiter(text: string): ',' | ';' {
  let commas = 0;
  let semicolons = 0;
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const ch = text[i];
    if (ch === '"') quoted = !quoted;
    else if (!quoted && (ch === '\n' || ch === '\r')) break;
    else if (!quoted && ch === ',') commas++;
    else if (!quoted && ch === ';') semicolons++;
  }
  return semicolons > commas ? ';' : ',';
}

/**
 * Parse and check a specimen CSV without writing anything. A bad header or unreadable CSV
 * throws 'bad-input'; problems of single rows are returned (rows with `ok` false had some).
 */
export function readSpecimenCsv(
  text: string,
  file: string,
  vocab: Vocabulary,
): { rows: Row[]; columns: SpecimenField[]; delimiter: ',' | ';'; problems: Problem[] } {
  // One kind of line ending, so that a file mixing them (pasted rows) still parses and
  // line numbers stay simple.
  const unified = text.replace(/\r\n?/g, '\n');
  const delimiter = detectDelimiter(unified);
  let parsed: string[][];
  try {
    // Every physical line yields a record (blank ones too), so line numbers can be counted.
    parsed = parse(unified, { delimiter, relax_column_count: true }) as string[][];
  } catch (err) {
    const e = err as { lines?: number; message: string };
    throw new KnitboneError('bad-input', [{ file, line: e.lines, message: `the file is not valid CSV: ${e.message.replace(/ at line \d+/, '')}` }]);
  }
  const records: { record: string[]; line: number }[] = [];
  let nextLine = 1;
  for (const record of parsed) {
    const line = nextLine;
    for (const cell of record) for (let i = cell.indexOf('\n'); i !== -1; i = cell.indexOf('\n', i + 1)) nextLine++;
    nextLine++;
    if (record.some((cell) => cell.trim() !== '')) records.push({ record, line });
  }
  if (records.length === 0) throw new KnitboneError('bad-input', [{ file, message: 'the file is empty; it needs a header row with at least catalogue_no' }]);

  const problems: Problem[] = [];
  const startLine = (r: { line: number }) => r.line;

  // Header
  const header = records[0];
  const headerLine = startLine(header);
  const columns: (SpecimenField | undefined)[] = [];
  const seen = new Map<string, number>();
  header.record.forEach((cell, i) => {
    const name = normaliseHeader(cell);
    const field = fieldOfColumn(name);
    if (!field) {
      const hint = closestTerms(name, CSV_COLUMN_NAMES.map((c) => [c, c] as [string, string]), 2);
      problems.push({
        file, line: headerLine, column: cell.trim() || `${i + 1}`,
        message: `unknown column "${cell.trim()}"${hint.length ? `; closest known: ${hint.map((h) => `"${h}"`).join(', ')}` : ''} (columns: ${CSV_COLUMN_NAMES.join(', ')})`,
      });
    } else if (seen.has(name)) {
      problems.push({ file, line: headerLine, column: name, message: `column "${name}" appears twice (columns ${seen.get(name)! + 1} and ${i + 1})` });
    } else seen.set(name, i);
    columns.push(field);
  });
  if (!seen.has('catalogue_no')) problems.push({ file, line: headerLine, column: 'catalogue_no', message: 'the header has no catalogue_no column; it is required' });
  if (problems.length) throw new KnitboneError('bad-input', problems);

  // Rows
  const rows: Row[] = [];
  const budget = { remaining: SUGGESTION_BUDGET };
  const firstLineOf = new Map<string, number>();
  for (const r of records.slice(1)) {
    const line = startLine(r);
    if (r.record.length > header.record.length) {
      problems.push({ file, line, message: `this row has ${r.record.length} cells but the header has ${header.record.length}; check for an unquoted ${delimiter === ',' ? 'comma' : 'semicolon'}` });
      continue;
    }
    const values: RawSpecimen = {};
    columns.forEach((field, i) => {
      if (field) values[field] = r.record[i] ?? '';
    });
    const { fields, problems: fieldProblems } = normaliseSpecimenValues(values, vocab, budget);
    for (const p of fieldProblems) problems.push({ file, line, column: columnOfField(p.field), message: p.message });
    if (!fieldProblems.some((p) => p.field === 'element' || p.field === 'portion')) {
      for (const p of checkSpecimenConsistency({ ...emptySpecimenFields(''), ...fields }, vocab)) {
        problems.push({ file, line, column: columnOfField(p.field), message: p.message });
      }
    }
    if (fields.catalogueNo) {
      const first = firstLineOf.get(fields.catalogueNo);
      if (first !== undefined) problems.push({ file, line, column: 'catalogue_no', message: `catalogue number "${fields.catalogueNo}" is also on line ${first}` });
      else firstLineOf.set(fields.catalogueNo, line);
    }
    rows.push({ line, values: fields as RawSpecimen, ok: fieldProblems.length === 0 });
  }
  return { rows, columns: columns.filter((c): c is SpecimenField => c !== undefined), delimiter, problems };
}

/** Import a specimen CSV into a catalogue: every row or none. */
export function importSpecimens(cat: Catalogue, bytes: Uint8Array | string, options: ImportSpecimensOptions = {}): ImportSpecimensResult {
  const file = options.fileName ?? 'specimens.csv';
  const progress = options.onProgress ?? (() => {});
  const text = decodeCsv(bytes, file);
  const vocab = vocabularyOf(cat);
  const { rows, columns, delimiter, problems } = readSpecimenCsv(text, file, vocab);
  progress({ stage: 'checking specimens', done: rows.length, total: rows.length });

  // Against the catalogue
  const inserts: SpecimenFields[] = [];
  const updates: { current: Specimen; patch: Partial<SpecimenFields> }[] = [];
  const existingIds = cat.specimens.catalogueNumbers();
  for (const row of rows) {
    const fields = row.values as Partial<SpecimenFields>;
    if (fields.catalogueNo === undefined) continue;
    const currentId = existingIds.get(fields.catalogueNo);
    if (currentId === undefined) {
      inserts.push({ ...emptySpecimenFields(fields.catalogueNo!), ...fields });
    } else if (!options.update) {
      problems.push({ file, line: row.line, column: 'catalogue_no', message: `catalogue number "${fields.catalogueNo}" is already in the catalogue (import with --update to change existing specimens)` });
    } else {
      const current = cat.specimens.get(currentId)!;
      const patch: Partial<SpecimenFields> = {};
      for (const f of columns) (patch as Record<string, unknown>)[f] = fields[f];
      const checkable = row.ok ? checkSpecimenConsistency({ ...current, ...patch }, vocab) : [];
      for (const p of checkable) {
        problems.push({ file, line: row.line, column: columnOfField(p.field), message: p.message });
      }
      updates.push({ current, patch });
    }
  }
  if (problems.length) {
    problems.sort((a, b) => (a.line ?? 0) - (b.line ?? 0));
    throw new KnitboneError('bad-input', problems);
  }

  const result: ImportSpecimensResult = { file, delimiter, rows: rows.length, inserted: 0, updated: 0, unchanged: 0, changes: [] };
  const sha256 = createHash('sha256').update(text).digest('hex');
  cat.transaction(() => {
    const chunk = 1000;
    for (let i = 0; i < inserts.length; i += chunk) {
      cat.specimens.insertMany(inserts.slice(i, i + chunk), cat.who, 'import');
      progress({ stage: 'importing specimens', done: Math.min(i + chunk, inserts.length), total: inserts.length });
    }
    result.inserted = inserts.length;
    for (const u of updates) {
      const r = cat.specimens.update(u.current.id, u.patch, cat.who, 'import-update');
      if (r.changed.length) {
        result.updated++;
        result.changes.push({ catalogueNo: r.specimen.catalogueNo, fields: r.changed });
      } else result.unchanged++;
    }
    cat.history.record({
      who: cat.who, entity: 'import', entityId: basename(file), action: options.update ? 'import-update' : 'import',
      after: { file: basename(file), sha256, rows: rows.length, inserted: result.inserted, updated: result.updated, unchanged: result.unchanged },
    });
  });
  return result;
}
