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
  const importName = ['import.specimens', 'specimens.import'].find((n) => ws.has(n));
  const exportName = ['export.specimens', 'specimens.export'].find((n) => ws.has(n));

  async function importText(name: string, text: string, fileName: string): Promise<void> {
    setBusy(true);
    setError(null);
    try {
      const r = await callByName<{ imported?: number; count?: number }>(ws.client, importName!, { catalogue: ws.catalogue, csv: text, fileName: name || fileName });
      ws.say(`Imported ${r?.imported ?? r?.count ?? ''} specimens from ${fileName}.`);
      onImported();
    } catch (err) {
      setError(err);
      ws.say(`Nothing imported from ${fileName}: see the problems listed.`, 'error');
    } finally {
      setBusy(false);
    }
  }

  async function exportCsv(): Promise<void> {
    try {
      const r = await callByName<{ csv: string }>(ws.client, exportName!, { catalogue: ws.catalogue });
      download('specimens.csv', r.csv, 'text/csv');
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
      {exportName && (
        <button type="button" onClick={() => void exportCsv()}>
          Export CSV
        </button>
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
