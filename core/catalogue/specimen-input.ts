import { KnitboneError, type Problem } from '../host/errors';
import { meansComplete, PORTION_ZONES, resolveZone, sortZones, type PortionZone } from '../vocab/portion-zones';
import { parseSizeClass } from '../vocab/size-classes';
import { isLongBone, type Vocabulary } from '../vocab/vocabulary';
import type { Catalogue } from './catalogue';
import { vocabularyOf } from './catalogue-vocabulary';
import { SPECIMEN_FIELDS, type BreakAge, type Side, type Specimen, type SpecimenField, type SpecimenFields } from './records';

/**
 * Turning what a person typed (a CSV cell, a form field) into a specimen's canonical
 * values: terms resolved through the vocabulary (any case, spacing, synonym or
 * abbreviation), numbers parsed, lists split on ';'. Each problem names the field and,
 * for unknown terms, the closest known ones.
 */

export type RawValue = string | number | readonly string[] | null | undefined;
export type RawSpecimen = Partial<Record<SpecimenField, RawValue>>;

export interface FieldProblem {
  field: SpecimenField;
  message: string;
}

export interface Normalised {
  fields: Partial<SpecimenFields>;
  problems: FieldProblem[];
}

const TEXT_FIELDS = ['unit', 'level', 'layer', 'notes'] as const;
const COORD_FIELDS = ['x', 'y', 'z'] as const;

function isBlank(v: RawValue): boolean {
  return v === null || v === undefined || (typeof v === 'string' && v.trim() === '') || (Array.isArray(v) && v.length === 0);
}

function asText(v: RawValue): string {
  return Array.isArray(v) ? v.join(';') : String(v);
}

/** A number from a cell: "12.5", "-0.25", "1e3"; a decimal comma ("12,5") is accepted too. */
export function parseNumber(v: RawValue): number | undefined {
  if (typeof v === 'number') return Number.isFinite(v) ? v : undefined;
  const t = asText(v).trim();
  const s = /^[+-]?\d+,\d+$/.test(t) ? t.replace(',', '.') : t;
  if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(s)) return undefined;
  const n = Number(s);
  return Number.isFinite(n) ? n : undefined;
}

function listItems(v: RawValue): string[] {
  const items = Array.isArray(v) ? [...v] : asText(v).split(';');
  return items.map((s) => s.trim()).filter((s) => s.length > 0);
}

function didYouMean(suggestions: string[]): string {
  return suggestions.length ? `; closest known: ${suggestions.map((s) => `"${s}"`).join(', ')}` : '';
}

/**
 * How many "closest known" suggestions may still be computed. Suggestions cost an edit
 * distance against every spelling; a 10,000-row file with a shifted column would
 * otherwise spend seconds on them. Past the budget, problems are still reported, without
 * suggestions.
 */
export interface SuggestionBudget {
  remaining: number;
}

/** Normalise the fields present in `raw` (absent fields are left out of the result). */
export function normaliseSpecimenValues(raw: RawSpecimen, vocab: Vocabulary, budget: SuggestionBudget = { remaining: Infinity }): Normalised {
  const suggest = (list: { suggest(typed: string): string[] }, typed: string): string[] => {
    if (budget.remaining <= 0) return [];
    budget.remaining--;
    return list.suggest(typed);
  };
  const fields: Partial<SpecimenFields> = {};
  const problems: FieldProblem[] = [];
  const has = (f: SpecimenField) => Object.prototype.hasOwnProperty.call(raw, f) && raw[f] !== undefined;

  if (has('catalogueNo')) {
    const no = isBlank(raw.catalogueNo) ? '' : asText(raw.catalogueNo).trim().replace(/\s+/g, ' ');
    if (!no) problems.push({ field: 'catalogueNo', message: 'the catalogue number is required' });
    else fields.catalogueNo = no;
  }
  for (const f of TEXT_FIELDS) {
    if (has(f)) fields[f] = isBlank(raw[f]) ? null : asText(raw[f]).trim();
  }
  for (const f of COORD_FIELDS) {
    if (!has(f)) continue;
    if (isBlank(raw[f])) { fields[f] = null; continue; }
    const n = parseNumber(raw[f]);
    if (n === undefined) problems.push({ field: f, message: `"${asText(raw[f])}" is not a number (${f} is in metres, e.g. 12.345)` });
    else fields[f] = n;
  }
  if (has('weightG')) {
    if (isBlank(raw.weightG)) fields.weightG = null;
    else {
      const n = parseNumber(raw.weightG);
      if (n === undefined) problems.push({ field: 'weightG', message: `"${asText(raw.weightG)}" is not a number (weight in grams)` });
      else if (n < 0) problems.push({ field: 'weightG', message: `weight cannot be negative (${n})` });
      else fields.weightG = n;
    }
  }
  if (has('sizeClass')) {
    if (isBlank(raw.sizeClass)) fields.sizeClass = null;
    else {
      const n = typeof raw.sizeClass === 'number' ? (Number.isInteger(raw.sizeClass) && raw.sizeClass >= 1 && raw.sizeClass <= 6 ? raw.sizeClass : undefined) : parseSizeClass(asText(raw.sizeClass));
      if (n === undefined) problems.push({ field: 'sizeClass', message: `"${asText(raw.sizeClass)}" is not a size class (1 to 6)` });
      else fields.sizeClass = n;
    }
  }
  if (has('taxon')) {
    if (isBlank(raw.taxon)) fields.taxon = null;
    else {
      const t = vocab.taxa.resolve(asText(raw.taxon));
      if (t) fields.taxon = t;
      else problems.push({ field: 'taxon', message: `unknown taxon "${asText(raw.taxon).trim()}"${didYouMean(suggest(vocab.taxa, asText(raw.taxon)))} (add new taxa to the catalogue's vocabulary)` });
    }
  }
  if (has('element')) {
    if (isBlank(raw.element)) fields.element = null;
    else {
      const e = vocab.elements.resolve(asText(raw.element));
      if (e) fields.element = e;
      else problems.push({ field: 'element', message: `unknown element "${asText(raw.element).trim()}"${didYouMean(suggest(vocab.elements, asText(raw.element)))} (add new elements to the catalogue's vocabulary)` });
    }
  }
  if (has('side')) {
    if (isBlank(raw.side)) fields.side = null;
    else {
      const s = vocab.sides.resolve(asText(raw.side));
      if (s) fields.side = s as Side;
      else problems.push({ field: 'side', message: `"${asText(raw.side).trim()}" is not a side; use ${vocab.sides.terms.join(', ')} (or L, R, A, I)` });
    }
  }
  if (has('breakAge')) {
    if (isBlank(raw.breakAge)) fields.breakAge = null;
    else {
      const b = vocab.breakAges.resolve(asText(raw.breakAge));
      if (b) fields.breakAge = b as BreakAge;
      else problems.push({ field: 'breakAge', message: `"${asText(raw.breakAge).trim()}" is not a break age; use ${vocab.breakAges.terms.join(', ')}` });
    }
  }
  if (has('fusion')) {
    if (isBlank(raw.fusion)) fields.fusion = null;
    else {
      const f = vocab.fusion.resolve(asText(raw.fusion));
      if (f) fields.fusion = f;
      else problems.push({ field: 'fusion', message: `"${asText(raw.fusion).trim()}" is not a fusion state; use ${vocab.fusion.terms.join(', ')}` });
    }
  }
  if (has('modifications')) {
    const out: string[] = [];
    for (const item of listItems(raw.modifications)) {
      const m = vocab.modifications.resolve(item);
      if (m) { if (!out.includes(m)) out.push(m); }
      else problems.push({ field: 'modifications', message: `unknown modification "${item}"${didYouMean(suggest(vocab.modifications, item))}` });
    }
    fields.modifications = out;
  }
  if (has('portion')) {
    const zones: PortionZone[] = [];
    for (const item of listItems(raw.portion)) {
      if (meansComplete(item)) { zones.push(...PORTION_ZONES); continue; }
      const z = resolveZone(item);
      if (z) zones.push(z);
      else problems.push({ field: 'portion', message: `unknown portion zone "${item}"; use ${PORTION_ZONES.join(', ')} (separate several with ;)` });
    }
    fields.portion = sortZones(zones);
  }
  return { fields, problems };
}

/** Checks across fields of a whole record: portion zones need a long bone. */
export function checkSpecimenConsistency(s: SpecimenFields, vocab: Vocabulary): FieldProblem[] {
  const problems: FieldProblem[] = [];
  if (s.portion.length > 0) {
    if (s.element === null) {
      problems.push({ field: 'portion', message: 'portion zones need an element (at least "long bone")' });
    } else if (!isLongBone(s.element, vocab)) {
      problems.push({ field: 'portion', message: `portion zones apply to long bones, not to "${s.element}"` });
    }
  }
  return problems;
}

function toProblems(list: FieldProblem[]): Problem[] {
  return list.map((p) => ({ field: p.field, message: `${p.field}: ${p.message}` }));
}

/** A whole new specimen from request values; throws 'bad-input' listing every problem. */
export function checkSpecimenFields(raw: RawSpecimen, cat: Catalogue, vocab: Vocabulary = vocabularyOf(cat)): SpecimenFields {
  const full: RawSpecimen = { ...raw };
  for (const f of SPECIMEN_FIELDS) if (!(f in full)) full[f] = null;
  const { fields, problems } = normaliseSpecimenValues(full, vocab);
  const record = fields as SpecimenFields;
  if (problems.length === 0) problems.push(...checkSpecimenConsistency(record, vocab));
  if (problems.length) throw new KnitboneError('bad-input', toProblems(problems));
  return record;
}

/** The canonical changes to an existing specimen; throws 'bad-input' listing every problem. */
export function checkSpecimenPatch(raw: RawSpecimen, current: Specimen, cat: Catalogue, vocab: Vocabulary = vocabularyOf(cat)): Partial<SpecimenFields> {
  const { fields, problems } = normaliseSpecimenValues(raw, vocab);
  if (problems.length === 0) {
    const merged: SpecimenFields = { ...current, ...fields };
    problems.push(...checkSpecimenConsistency(merged, vocab));
  }
  if (problems.length) throw new KnitboneError('bad-input', toProblems(problems));
  return fields;
}
