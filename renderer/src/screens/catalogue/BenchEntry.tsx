import { forwardRef, memo, useEffect, useImperativeHandle, useRef, useState } from 'react';
import { ApiError } from '../../api/client';
import type { FieldName, SpecimenRecord } from './specimen-view';
import { nextCatalogueNo } from './specimen-view';

/** The fields of the entry strip, in the order an analyst reads a bag label and a bone. */
const FIELDS: Array<{ field: FieldName; label: string; width: string; kind: 'text' | 'number' | 'list'; carry?: boolean; hint?: string }> = [
  { field: 'catalogueNo', label: 'Cat. no.', width: '7.5rem', kind: 'text' },
  { field: 'unit', label: 'Unit', width: '4.5rem', kind: 'text', carry: true },
  { field: 'level', label: 'Level', width: '4rem', kind: 'text', carry: true },
  { field: 'layer', label: 'Layer', width: '4rem', kind: 'text', carry: true },
  { field: 'x', label: 'x (m)', width: '5rem', kind: 'number', hint: 'metres on the site grid' },
  { field: 'y', label: 'y (m)', width: '5rem', kind: 'number', hint: 'metres on the site grid' },
  { field: 'z', label: 'z (m)', width: '5rem', kind: 'number', hint: 'elevation in metres, up is positive' },
  { field: 'taxon', label: 'Taxon', width: '10rem', kind: 'text' },
  { field: 'element', label: 'Element', width: '8rem', kind: 'text' },
  { field: 'side', label: 'Side', width: '5.5rem', kind: 'text' },
  { field: 'portion', label: 'Portion zones', width: '10rem', kind: 'list', hint: 'separate zones with ;' },
  { field: 'sizeClass', label: 'Size', width: '3.5rem', kind: 'number', hint: 'body-size class 1 to 6' },
  { field: 'breakAge', label: 'Break', width: '5.5rem', kind: 'text' },
  { field: 'notes', label: 'Notes', width: '10rem', kind: 'text' },
];

export type Draft = Partial<Record<FieldName, string>>;

export interface BenchEntryHandle {
  edit(record: SpecimenRecord): void;
  focus(): void;
}

/** What the entry strip sends: values typed by the analyst, blanks as null. */
export function valuesFromDraft(draft: Draft): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const f of FIELDS) {
    const raw = (draft[f.field] ?? '').trim();
    if (f.kind === 'number') out[f.field] = raw === '' ? null : Number(raw.replace(',', '.'));
    else if (f.kind === 'list') out[f.field] = raw === '' ? [] : raw.split(';').map((s) => s.trim()).filter(Boolean);
    else out[f.field] = raw === '' ? null : raw;
  }
  out.catalogueNo = (draft.catalogueNo ?? '').trim();
  return out;
}

/** Checks made as the analyst types; the host repeats them (and the vocabulary ones) on save. */
export function localProblems(draft: Draft): Partial<Record<FieldName, string>> {
  const problems: Partial<Record<FieldName, string>> = {};
  for (const f of FIELDS) {
    const raw = (draft[f.field] ?? '').trim();
    if (f.kind === 'number' && raw !== '' && !/^[+-]?(\d+([.,]\d*)?|[.,]\d+)$/.test(raw)) problems[f.field] = `"${raw}" is not a number`;
  }
  const size = (draft.sizeClass ?? '').trim();
  if (size && !problems.sizeClass && !/^[1-6]$/.test(size)) problems.sizeClass = 'size class is a whole number from 1 to 6';
  return problems;
}

function draftFrom(r: SpecimenRecord): Draft {
  const d: Draft = {};
  for (const f of FIELDS) {
    const v = r[f.field];
    d[f.field] = v === null || v === undefined ? '' : Array.isArray(v) ? v.join('; ') : String(v);
  }
  return d;
}

/**
 * The entry strip for logging specimens at the bench: one line of fields, Enter saves, the
 * provenience (unit, level, layer) is carried over to the next record and the catalogue
 * number steps on by one. Type-ahead lists come from the vocabularies.
 */
export const BenchEntry = memo(forwardRef<BenchEntryHandle, {
  suggestions: Partial<Record<FieldName, string[]>>;
  nextNumber: string;
  onSave: (values: Record<string, unknown>, editing: SpecimenRecord | null) => Promise<void>;
}>(function BenchEntry(props, ref) {
  const [draft, setDraft] = useState<Draft>({ catalogueNo: props.nextNumber });
  const [editing, setEditing] = useState<SpecimenRecord | null>(null);
  const [serverProblems, setServerProblems] = useState<Partial<Record<string, string>>>({});
  const [generalProblem, setGeneralProblem] = useState<string | null>(null);
  const [saving, setSaving] = useState(false);
  const first = useRef<HTMLInputElement>(null);
  const proposed = useRef(props.nextNumber);

  // The catalogue's next number, until the analyst types their own.
  useEffect(() => {
    setDraft((d) => (!editing && (!d.catalogueNo || d.catalogueNo === proposed.current) ? { ...d, catalogueNo: props.nextNumber } : d));
    proposed.current = props.nextNumber;
  }, [props.nextNumber, editing]);

  useImperativeHandle(ref, () => ({
    edit(record) {
      setEditing(record);
      setDraft(draftFrom(record));
      setServerProblems({});
      setGeneralProblem(null);
      setTimeout(() => first.current?.select(), 0);
    },
    focus() {
      first.current?.focus();
      first.current?.select();
    },
  }));

  const local = localProblems(draft);
  const problemOf = (f: FieldName): string | undefined => local[f] ?? serverProblems[f];

  async function save(): Promise<void> {
    if (Object.keys(local).length > 0 || saving) return;
    setSaving(true);
    try {
      await props.onSave(valuesFromDraft(draft), editing);
      setServerProblems({});
      setGeneralProblem(null);
      const carried: Draft = { catalogueNo: editing ? props.nextNumber : nextCatalogueNo(draft.catalogueNo ?? '') };
      for (const f of FIELDS) if (f.carry) carried[f.field] = draft[f.field] ?? '';
      setDraft(editing ? { catalogueNo: props.nextNumber, unit: draft.unit, level: draft.level, layer: draft.layer } : carried);
      setEditing(null);
      setTimeout(() => {
        first.current?.focus();
        first.current?.select();
      }, 0);
    } catch (err) {
      const byField: Partial<Record<string, string>> = {};
      let general: string | null = null;
      if (err instanceof ApiError) {
        for (const p of err.problems) {
          const field = p.field?.replace(/^(specimen|changes)\./, '');
          if (field && FIELDS.some((f) => f.field === field)) byField[field] = p.message.replace(/^[\w.]+: /, '');
          else general = general ? `${general} ${p.message}` : p.message;
        }
      } else general = err instanceof Error ? err.message : String(err);
      setServerProblems(byField);
      setGeneralProblem(general);
    } finally {
      setSaving(false);
    }
  }

  return (
    <form
      className="bench-entry panel"
      aria-label={editing ? `Edit specimen ${editing.catalogueNo}` : 'Log a specimen'}
      onSubmit={(e) => {
        e.preventDefault();
        void save();
      }}
      onKeyDown={(e) => {
        if (e.key === 'Escape' && editing) {
          setEditing(null);
          setDraft({ catalogueNo: props.nextNumber, unit: draft.unit, level: draft.level, layer: draft.layer });
        }
      }}
    >
      <div className="bench-title">
        <h2>{editing ? `Editing ${editing.catalogueNo}` : 'Log a specimen'}</h2>
        <span className="hint">
          Enter saves · provenience carries over · Tab moves on{editing ? ' · Esc stops editing' : ''}
        </span>
      </div>
      <div className="bench-fields">
        {FIELDS.map((f, i) => {
          const problem = problemOf(f.field);
          const id = `bench-${f.field}`;
          const list = props.suggestions[f.field];
          return (
            <div className={`bench-field${f.carry ? ' carried' : ''}`} key={f.field} style={{ width: f.width }}>
              <label htmlFor={id}>{f.label}</label>
              <input
                id={id}
                ref={i === 0 ? first : undefined}
                value={draft[f.field] ?? ''}
                inputMode={f.kind === 'number' ? 'decimal' : undefined}
                list={list && list.length ? `${id}-terms` : undefined}
                autoComplete="off"
                spellCheck={false}
                aria-invalid={problem ? true : undefined}
                aria-describedby={problem ? `${id}-problem` : undefined}
                title={f.hint}
                onChange={(e) => {
                  setDraft((d) => ({ ...d, [f.field]: e.target.value }));
                  if (serverProblems[f.field]) setServerProblems((p) => ({ ...p, [f.field]: undefined }));
                }}
              />
              {list && list.length > 0 && (
                <datalist id={`${id}-terms`}>
                  {list.map((t) => (
                    <option key={t} value={t} />
                  ))}
                </datalist>
              )}
            </div>
          );
        })}
        <div className="bench-actions">
          <button type="submit" className="primary" disabled={saving || Object.keys(local).length > 0}>
            {editing ? 'Save changes' : 'Log specimen'}
          </button>
        </div>
      </div>
      {FIELDS.some((f) => problemOf(f.field)) && (
        <ul className="field-problems" role="alert">
          {FIELDS.filter((f) => problemOf(f.field)).map((f) => (
            <li key={f.field} id={`bench-${f.field}-problem`}>
              <label htmlFor={`bench-${f.field}`}>{f.label}</label>: {problemOf(f.field)}
            </li>
          ))}
        </ul>
      )}
      {generalProblem && (
        <p className="problems" role="alert">
          {generalProblem}
        </p>
      )}
    </form>
  );
}));
