import { useState } from 'react';
import { callByName } from '../../api/loose';
import { Problems } from '../../app/Problems';
import { useWorkspace } from '../../app/workspace';

interface ScanImportOutcome {
  imported: Array<{ file: string; catalogueNo: string; fractureFaces: number }>;
  alreadyImported: Array<{ file: string; catalogueNo: string }>;
  unmatched: string[];
  bad: Array<{ file?: string; message: string }>;
  cancelled: boolean;
}

/**
 * Read a folder of scans (PLY, STL, OBJ named by catalogue number) into the catalogue through
 * the host's scans.import: all or nothing unless the analyst asks to skip bad files; files
 * already read are recognised by their content and not read again.
 */
export function ScanFolderLink({ onLinked }: { onLinked: () => void }) {
  const ws = useWorkspace();
  const [open, setOpen] = useState(false);
  const [folder, setFolder] = useState(() => ws.catalogue.replace(/[^\\/]*$/, '') + 'scans');
  const [skipBad, setSkipBad] = useState(false);
  const [progress, setProgress] = useState<string | null>(null);
  const [error, setError] = useState<unknown>(null);
  const [outcome, setOutcome] = useState<ScanImportOutcome | null>(null);
  if (!ws.has('scans.import')) return null;

  async function pick(): Promise<void> {
    const chosen = await ws.client.pickFile?.('import-scans');
    if (chosen) setFolder(chosen);
  }

  async function link(): Promise<void> {
    setProgress('starting...');
    setError(null);
    setOutcome(null);
    try {
      const r = await callByName<ScanImportOutcome>(ws.client, 'scans.import', { catalogue: ws.catalogue, folder, skipBad }, {
        onProgress: (e) => setProgress(`${e.stage}: ${e.done} of ${e.total}`),
      });
      setOutcome(r);
      ws.say(`Linked ${r.imported.length} scans from ${folder}${r.alreadyImported.length ? ` (${r.alreadyImported.length} already linked)` : ''}.`);
      if (r.imported.length) onLinked();
    } catch (err) {
      setError(err);
      ws.say(`No scans linked from ${folder}: see the problems listed.`, 'error');
    } finally {
      setProgress(null);
    }
  }

  return (
    <>
      <button type="button" aria-expanded={open} onClick={() => setOpen((o) => !o)}>
        Link scans...
      </button>
      {open && (
        <form
          className="export-form panel scan-link-form"
          onSubmit={(e) => {
            e.preventDefault();
            void link();
          }}
        >
          <label htmlFor="scan-folder">Folder of scans (PLY, STL or OBJ, each named by its catalogue number)</label>
          <input id="scan-folder" value={folder} onChange={(e) => setFolder(e.target.value)} autoFocus />
          {ws.session.canPickFiles && (
            <button type="button" onClick={() => void pick()}>
              Choose folder...
            </button>
          )}
          <label>
            <input type="checkbox" checked={skipBad} onChange={(e) => setSkipBad(e.target.checked)} /> Skip unreadable files and link the rest
          </label>
          <button type="submit" className="primary" disabled={!folder.trim() || progress !== null}>
            Read and link scans
          </button>
          {progress && (
            <span className="hint" role="status">
              {progress}
            </span>
          )}
          {outcome && (
            <div role="status" className="scan-link-outcome">
              <p>
                {outcome.imported.length} scans linked
                {outcome.alreadyImported.length ? `, ${outcome.alreadyImported.length} already in the catalogue` : ''}
                {outcome.cancelled ? ' (stopped before the end: run again to read the rest)' : ''}.
              </p>
              {outcome.unmatched.length > 0 && <p>No specimen with these catalogue numbers: {outcome.unmatched.join(', ')}</p>}
              {outcome.bad.length > 0 && <p>Skipped: {outcome.bad.map((b) => `${b.file ?? ''} (${b.message})`).join('; ')}</p>}
            </div>
          )}
          {error ? <Problems error={error} /> : null}
        </form>
      )}
    </>
  );
}
