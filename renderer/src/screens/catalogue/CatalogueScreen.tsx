import { useCallback, useDeferredValue, useEffect, useMemo, useRef, useState } from 'react';
import { callByName } from '../../api/loose';
import { loadSpecimens } from '../../app/specimen-list';
import { Problems } from '../../app/Problems';
import { useWorkspace } from '../../app/workspace';
import { BenchEntry, type BenchEntryHandle } from './BenchEntry';
import { CsvTransfer } from './CsvTransfer';
import { ScanFolderLink } from './ScanFolderLink';
import { SpecimenTable } from './SpecimenTable';
import { COLUMNS, distinctValues, EMPTY_QUERY, nextCatalogueNo, PreparedRows, queryPrepared, type FieldName, type SpecimenRecord, type TableQuery } from './specimen-view';
import { useVocabulary } from './use-vocabulary';

type UndoStep =
  | { kind: 'create'; record: SpecimenRecord }
  | { kind: 'update'; id: number; catalogueNo: string; before: Record<string, unknown> };

/** The catalogue: find and sort specimens, log new ones at the bench, undo a slip. */
export function CatalogueScreen() {
  const ws = useWorkspace();
  const [rows, setRows] = useState<SpecimenRecord[] | null>(null);
  const [error, setError] = useState<unknown>(null);
  const [query, setQuery] = useState<TableQuery>(EMPTY_QUERY);
  const [selected, setSelected] = useState<number | null>(null);
  const [undo, setUndo] = useState<UndoStep[]>([]);
  const [loadMs, setLoadMs] = useState<number | null>(null);
  const bench = useRef<BenchEntryHandle>(null);
  const vocabulary = useVocabulary();

  const load = useCallback(async () => {
    const t0 = performance.now();
    try {
      const list = await loadSpecimens(ws);
      setRows(list);
      setError(null);
      setLoadMs(performance.now() - t0);
    } catch (err) {
      setError(err);
    }
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [ws.client, ws.catalogue, ws.revision]);

  useEffect(() => {
    void load();
  }, [load]);

  const prepared = useMemo(() => (rows ? new PreparedRows(rows) : null), [rows]);
  // The field shows every keystroke at once; the table follows in a render React may
  // interrupt for the next keystroke, so typing never waits for 10,000 rows.
  const shownQuery = useDeferredValue(query);
  const shown = useMemo(() => (prepared ? queryPrepared(prepared, shownQuery) : []), [prepared, shownQuery]);
  const units = useMemo(() => (rows ? distinctValues(rows, 'unit') : []), [rows]);
  const levels = useMemo(() => (rows ? distinctValues(rows, 'level') : []), [rows]);
  const layers = useMemo(() => (rows ? distinctValues(rows, 'layer') : []), [rows]);
  const suggestions = useMemo(() => {
    const s: Partial<Record<FieldName, string[]>> = { unit: units, level: levels, layer: layers, ...vocabulary };
    if (!vocabulary.taxon && rows) s.taxon = distinctValues(rows, 'taxon');
    if (!vocabulary.element && rows) s.element = distinctValues(rows, 'element');
    return s;
  }, [units, levels, layers, vocabulary, rows]);
  const nextNumber = useMemo(() => {
    if (!rows || rows.length === 0) return '';
    const last = rows.reduce((a, b) => (b.id > a.id ? b : a));
    return nextCatalogueNo(last.catalogueNo);
  }, [rows]);

  const openSpecimen = useCallback((id: number) => ws.open('specimen', id), [ws.open]);
  // The entry strip keeps one onSave for its life (it is memoised); it calls the newest save.
  const saveRef = useRef<typeof save>(null as never);
  const onSave = useCallback((values: Record<string, unknown>, editing: SpecimenRecord | null) => saveRef.current(values, editing), []);
  saveRef.current = save;

  async function save(values: Record<string, unknown>, editing: SpecimenRecord | null): Promise<void> {
    if (editing) {
      const before: Record<string, unknown> = {};
      const changes: Record<string, unknown> = {};
      for (const [k, v] of Object.entries(values)) {
        const old = editing[k as FieldName];
        if (JSON.stringify(old ?? null) !== JSON.stringify(v ?? null) && !(Array.isArray(old) && old.length === 0 && Array.isArray(v) && v.length === 0)) {
          changes[k] = v;
          before[k] = old;
        }
      }
      if (Object.keys(changes).length === 0) {
        ws.say(`No change to ${editing.catalogueNo}.`);
        return;
      }
      await callByName(ws.client, 'specimens.update', { catalogue: ws.catalogue, id: editing.id, changes });
      setUndo((u) => [...u, { kind: 'update', id: editing.id, catalogueNo: editing.catalogueNo, before }]);
      ws.say(`Saved changes to ${editing.catalogueNo}.`);
    } else {
      const created = await callByName<SpecimenRecord>(ws.client, 'specimens.create', { catalogue: ws.catalogue, specimen: values });
      setUndo((u) => [...u, { kind: 'create', record: created }]);
      setSelected(created.id);
      ws.say(`Logged ${created.catalogueNo}.`);
    }
    ws.changed();
  }

  const undoName = deleteRequest(ws.has);
  const canUndo = undo.length > 0 && (undo[undo.length - 1].kind === 'update' || undoName !== null);

  async function undoLast(): Promise<void> {
    const step = undo[undo.length - 1];
    if (!step) return;
    try {
      if (step.kind === 'update') {
        await callByName(ws.client, 'specimens.update', { catalogue: ws.catalogue, id: step.id, changes: step.before });
        ws.say(`Undone: the changes to ${step.catalogueNo}.`);
      } else if (undoName) {
        await callByName(ws.client, undoName, { catalogue: ws.catalogue, id: step.record.id });
        ws.say(`Undone: logging ${step.record.catalogueNo}.`);
      }
      setUndo((u) => u.slice(0, -1));
      ws.changed();
    } catch (err) {
      setError(err);
    }
  }

  useEffect(() => {
    const onKey = (e: KeyboardEvent): void => {
      const typing = e.target instanceof HTMLInputElement || e.target instanceof HTMLTextAreaElement;
      if ((e.ctrlKey || e.metaKey) && !e.shiftKey && e.key.toLowerCase() === 'z' && !typing && canUndo) {
        e.preventDefault();
        void undoLast();
      }
      if (e.key === '/' && !typing) {
        e.preventDefault();
        document.getElementById('find-specimens')?.focus();
      }
      if (e.key === 'n' && !typing && !e.ctrlKey && !e.metaKey && !e.altKey) {
        e.preventDefault();
        bench.current?.focus();
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  });

  const last = undo[undo.length - 1];
  const undoLabel = last && canUndo ? (last.kind === 'create' ? `Undo logging ${last.record.catalogueNo}` : `Undo changes to ${last.catalogueNo}`) : 'Undo';

  return (
    <section className="catalogue-screen" aria-labelledby="catalogue-title">
      <div className="screen-head">
        <h1 id="catalogue-title">Catalogue</h1>
        <span className="count" aria-live="polite">
          {rows ? `${shown.length.toLocaleString()} of ${rows.length.toLocaleString()} specimens` : 'loading...'}
          {loadMs !== null && <span className="timing"> · read in {Math.round(loadMs)} ms</span>}
        </span>
        <button type="button" onClick={() => void undoLast()} disabled={!canUndo} title="Ctrl+Z outside a field">
          {undoLabel}
        </button>
        <CsvTransfer onImported={() => ws.changed()} />
        <ScanFolderLink onLinked={() => ws.changed()} />
      </div>
      <BenchEntry ref={bench} suggestions={suggestions} nextNumber={nextNumber} onSave={onSave} />
      <div className="filters" role="search" aria-label="Find specimens">
        <label htmlFor="find-specimens">Find</label>
        <input
          id="find-specimens"
          type="search"
          placeholder="any field: femur, B4, cut..."
          value={query.text}
          onChange={(e) => setQuery((q) => ({ ...q, text: e.target.value }))}
        />
        <ProvenienceFilter id="filter-unit" label="Unit" values={units} value={query.unit} onChange={(unit) => setQuery((q) => ({ ...q, unit }))} />
        <ProvenienceFilter id="filter-level" label="Level" values={levels} value={query.level} onChange={(level) => setQuery((q) => ({ ...q, level }))} />
        <ProvenienceFilter id="filter-layer" label="Layer" values={layers} value={query.layer} onChange={(layer) => setQuery((q) => ({ ...q, layer }))} />
        <label htmlFor="sort-by">Sort by</label>
        <select id="sort-by" value={query.sort.field} onChange={(e) => setQuery((q) => ({ ...q, sort: { field: e.target.value as FieldName, descending: q.sort.descending } }))}>
          {COLUMNS.map((c) => (
            <option key={c.field} value={c.field}>
              {c.label}
            </option>
          ))}
        </select>
        <label className="check">
          <input type="checkbox" checked={query.sort.descending} onChange={(e) => setQuery((q) => ({ ...q, sort: { ...q.sort, descending: e.target.checked } }))} />
          reversed
        </label>
        {(query.text || query.unit || query.level || query.layer) && (
          <button type="button" className="quiet" onClick={() => setQuery((q) => ({ ...EMPTY_QUERY, sort: q.sort }))}>
            Clear
          </button>
        )}
        <span className="hint">/ finds · n logs · Enter opens · e edits</span>
      </div>
      <Problems error={error} />
      {rows && (
        <SpecimenTable
          rows={shown}
          total={rows.length}
          query={shownQuery}
          onSort={(field) =>
            setQuery((q) => ({ ...q, sort: { field, descending: q.sort.field === field ? !q.sort.descending : false } }))
          }
          selected={selected}
          onSelect={setSelected}
          onOpen={openSpecimen}
          onEdit={(id) => {
            const r = rows.find((x) => x.id === id);
            if (r) bench.current?.edit(r);
          }}
        />
      )}
    </section>
  );
}

function ProvenienceFilter(props: { id: string; label: string; values: string[]; value: string; onChange: (v: string) => void }) {
  return (
    <>
      <label htmlFor={props.id}>{props.label}</label>
      <select id={props.id} value={props.value} onChange={(e) => props.onChange(e.target.value)}>
        <option value="">all</option>
        {props.values.map((v) => (
          <option key={v} value={v}>
            {v}
          </option>
        ))}
      </select>
    </>
  );
}

/** The request that takes back a specimen just logged, when the host has one. */
function deleteRequest(has: (name: string) => boolean): string | null {
  for (const name of ['specimens.remove', 'specimens.delete', 'specimens.withdraw']) if (has(name)) return name;
  return null;
}
