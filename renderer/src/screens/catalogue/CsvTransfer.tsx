import { useRef, useState } from 'react';
import { callByName } from '../../api/loose';
import { Problems } from '../../app/Problems';
import { useWorkspace } from '../../app/workspace';

/** Import a specimen CSV (all or nothing, every bad row reported) and export the catalogue. */
export function CsvTransfer({ onImported }: { onImported: () => void }) {
  const ws = useWorkspace();
  const fileInput = useRef<HTMLInputElement>(null);
  const [error, setError] = useState<unknown>(null);
  const [busy, setBusy] = useState(false);
  const [progress, setProgress] = useState<string | null>(null);
  const [exportOpen, setExportOpen] = useState(false);
  const [exportDir, setExportDir] = useState(() => ws.catalogue.replace(/[^\\/]*$/, '') + 'export');
  const importName = ['import.specimens', 'specimens.import'].find((n) => ws.has(n));
  const exportName = ['catalogue.export', 'export.specimens'].find((n) => ws.has(n));

  async function importText(name: string, text: string, fileName: string): Promise<void> {
    setBusy(true);
    setError(null);
    try {
      const r = await callByName<{ inserted: number; updated: number; rows: number }>(
        ws.client,
        importName!,
        { catalogue: ws.catalogue, csv: text, fileName: name || fileName },
        { onProgress: (e) => setProgress(`${e.stage} ${e.done}/${e.total}`) },
      );
      ws.say(`Imported ${r.inserted} specimens from ${fileName} (${r.rows} rows read).`);
      onImported();
    } catch (err) {
      setError(err);
      ws.say(`Nothing imported from ${fileName}: see the problems listed.`, 'error');
    } finally {
      setBusy(false);
      setProgress(null);
    }
  }

  async function exportTo(folder: string): Promise<void> {
    try {
      const r = await callByName<{ files: string[] | Record<string, string> }>(ws.client, exportName!, { catalogue: ws.catalogue, out: folder });
      const files = Array.isArray(r.files) ? r.files : Object.values(r.files ?? {});
      ws.say(`Exported ${files.length} files to ${folder}.`);
      setExportOpen(false);
    } catch (err) {
      setError(err);
    }
  }

  return (
    <div className="csv-transfer">
      {importName && (
        <>
          <button type="button" disabled={busy} onClick={() => fileInput.current?.click()}>
            Import CSV...
          </button>
          <input
            ref={fileInput}
            type="file"
            accept=".csv,text/csv,text/plain"
            className="visually-hidden"
            aria-label="Specimen CSV file to import"
            tabIndex={-1}
            onChange={(e) => {
              const f = e.target.files?.[0];
              if (f) void f.text().then((t) => importText(f.name, t, f.name));
              e.target.value = '';
            }}
          />
        </>
      )}
      {progress && <span className="hint" role="status">{progress}</span>}
      {exportName && (
        <button type="button" aria-expanded={exportOpen} onClick={() => setExportOpen((o) => !o)}>
          Export...
        </button>
      )}
      {exportOpen && (
        <form
          className="export-form panel"
          onSubmit={(e) => {
            e.preventDefault();
            void exportTo(exportDir.trim());
          }}
        >
          <label htmlFor="export-folder">Folder for specimens.csv, joins.csv and history.csv</label>
          <input id="export-folder" value={exportDir} onChange={(e) => setExportDir(e.target.value)} autoFocus />
          <button type="submit" className="primary" disabled={!exportDir.trim()}>
            Export
          </button>
        </form>
      )}
      {error ? (
        <div className="import-problems panel">
          <h2>The file was not imported</h2>
          <Problems error={error} />
          <button type="button" onClick={() => setError(null)}>
            Dismiss
          </button>
        </div>
      ) : null}
    </div>
  );
}

export function download(name: string, content: string | Blob, type: string): void {
  const blob = typeof content === 'string' ? new Blob([content], { type }) : content;
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}
