import { useCallback, useEffect, useMemo, useState } from 'react';
import { callByName } from '../../api/loose';
import { Problems } from '../../app/Problems';
import { themeColour } from '../../app/theme-colours';
import { useWorkspace } from '../../app/workspace';
import { contactGaps, matrixFromRowMajor } from '../../viewer/build-geometry';
import { SURFACE } from '../../viewer/colours';
import { ScanViewer, type ViewerPart } from '../../viewer/ScanViewer';
import { useScanMesh } from '../../viewer/use-scan-mesh';
import { useSpecimenIndex } from '../catalogue/use-specimen-index';
import type { SpecimenRecord } from '../catalogue/specimen-view';
import { CountsPanel } from './CountsPanel';
import { JOIN_TYPE_CHOICES, previewSentences, queueOrder, type Conflict, type JoinPreview, type JoinTypeChoice, type JoinView } from './review-model';


/**
 * Join review: proposals best first; the two fragments in the proposed alignment with a
 * contact-gap map and a pull-apart control; the score and its parts, conflicts, and what
 * accepting would change; accept (with a join type), reject or skip from the keyboard.
 */
export function ReviewScreen() {
  const ws = useWorkspace();
  const index = useSpecimenIndex();
  const [queue, setQueue] = useState<JoinView[] | null>(null);
  const [conflicts, setConflicts] = useState<Map<number, Conflict[]>>(new Map());
  const [position, setPosition] = useState(0);
  const [type, setType] = useState<JoinTypeChoice>('conjoin-green');
  const [error, setError] = useState<unknown>(null);
  const { decisions, setDecisions } = ws;
  const [busy, setBusy] = useState(false);
  const [pull, setPull] = useState(0);
  const [showGaps, setShowGaps] = useState(true);
  const [preview, setPreview] = useState<JoinPreview | null>(null);
  const [details, setDetails] = useState<{ scoreComponents: Record<string, number>; breakAge?: string | null } | null>(null);
  const canPreview = ws.has('joins.preview');
  const canUndoReject = ws.has('joins.reopen');
  const canPropose = ws.has('proposals.run');
  const [proposing, setProposing] = useState<string | null>(null);

  async function propose(): Promise<void> {
    setProposing('starting...');
    setError(null);
    try {
      const found = await callByName<unknown[]>(ws.client, 'proposals.run', { catalogue: ws.catalogue }, {
        onProgress: (e) => setProposing(`${e.stage}: ${e.done} of ${e.total}`),
      });
      ws.say(`Proposal run finished${Array.isArray(found) ? `: ${found.length} proposals in the catalogue` : ''}.`);
      ws.changed();
      await load();
    } catch (err) {
      setError(err);
    } finally {
      setProposing(null);
    }
  }

  const load = useCallback(async () => {
    try {
      const [list, conflicted] = await Promise.all([
        callByName<JoinView[]>(ws.client, 'joins.list', { catalogue: ws.catalogue, status: 'proposed' }),
        ws.has('joins.conflicts')
          ? callByName<Array<JoinView & { conflicts: Conflict[] }>>(ws.client, 'joins.conflicts', { catalogue: ws.catalogue })
          : Promise.resolve([]),
      ]);
      setQueue(queueOrder(list));
      setConflicts(new Map(conflicted.map((c) => [c.id, c.conflicts])));
    } catch (err) {
      setError(err);
    }
  }, [ws]);

  useEffect(() => {
    void load();
  }, [load]);

  const current = queue && queue.length ? queue[Math.min(position, queue.length - 1)] : null;
  const a = current && index ? (index.get(current.a) ?? null) : null;
  const b = current && index ? (index.get(current.b) ?? null) : null;
  const meshA = useScanMesh(a?.id ?? null);
  const meshB = useScanMesh(b?.id ?? null);

  useEffect(() => {
    setPull(0);
    setPreview(null);
    setDetails(null);
    if (!current || !a) return;
    if (current.type && JOIN_TYPE_CHOICES.some((c) => c.type === current.type)) setType(current.type as JoinTypeChoice);
    callByName<{ joins: Array<{ id: number; scoreComponents: Record<string, number>; breakAge?: string | null }> }>(ws.client, 'specimens.get', {
      catalogue: ws.catalogue,
      id: a.id,
    })
      .then((d) => setDetails(d.joins.find((j) => j.id === current.id) ?? null))
      .catch(() => setDetails(null));
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [current?.id, a?.id]);

  useEffect(() => {
    if (!current || !canPreview) return;
    let live = true;
    callByName<JoinPreview>(ws.client, 'joins.preview', { catalogue: ws.catalogue, id: current.id, type })
      .then((p) => live && setPreview(p))
      .catch(() => live && setPreview(null));
    return () => {
      live = false;
    };
  }, [ws.client, ws.catalogue, current?.id, type, canPreview, ws.revision]);

  const parts = useMemo<ViewerPart[]>(() => {
    if (!current || !meshA.mesh || !meshB.mesh) return [];
    let gapsA: Float32Array | null = null;
    let gapsB: Float32Array | null = null;
    if (showGaps && current.transform) {
      const identity = matrixFromRowMajor(null);
      const toA = matrixFromRowMajor(current.transform);
      gapsB = contactGaps(meshA.mesh, identity, meshB.mesh, toA);
      gapsA = contactGaps(meshB.mesh, toA, meshA.mesh, identity);
    }
    return [
      { key: 'a', label: current.a, mesh: meshA.mesh, base: SURFACE.bone, gaps: gapsA, fractures: !showGaps },
      { key: 'b', label: current.b, mesh: meshB.mesh, base: SURFACE.boneAlt, transform: current.transform, gaps: gapsB, pulls: true, fractures: !showGaps },
    ];
  }, [current, meshA.mesh, meshB.mesh, showGaps]);

  async function decide(kind: 'accept' | 'reject'): Promise<void> {
    if (!current || busy) return;
    setBusy(true);
    try {
      if (kind === 'accept') await callByName(ws.client, 'joins.accept', { catalogue: ws.catalogue, id: current.id, type });
      else await callByName(ws.client, 'joins.reject', { catalogue: ws.catalogue, id: current.id });
      setDecisions((d) => [...d, { kind, join: current }]);
      ws.say(`${kind === 'accept' ? 'Accepted' : 'Rejected'} join #${current.id} (${current.a} and ${current.b}${kind === 'accept' ? `, ${type}` : ''}).`);
      setError(null);
      ws.changed();
      await load();
    } catch (err) {
      setError(err);
    } finally {
      setBusy(false);
    }
  }

  const last = decisions[decisions.length - 1];
  const canUndo = !!last && (last.kind === 'accept' || canUndoReject);

  async function undo(): Promise<void> {
    if (!last || busy || !canUndo) return;
    setBusy(true);
    try {
      if (last.kind === 'accept') await callByName(ws.client, 'joins.unlink', { catalogue: ws.catalogue, id: last.join.id });
      else await callByName(ws.client, 'joins.reopen', { catalogue: ws.catalogue, id: last.join.id });
      setDecisions((d) => d.slice(0, -1));
      ws.say(`Undone: ${last.kind} of join #${last.join.id}.`);
      ws.changed();
      await load();
      setPosition(0);
    } catch (err) {
      setError(err);
    } finally {
      setBusy(false);
    }
  }

  function skip(): void {
    if (!queue || queue.length === 0) return;
    setPosition((p) => (p + 1) % queue.length);
  }

  useEffect(() => {
    const onKey = (e: KeyboardEvent): void => {
      const t = e.target as HTMLElement | null;
      if (t && (t.tagName === 'INPUT' && (t as HTMLInputElement).type !== 'range' && (t as HTMLInputElement).type !== 'radio')) return;
      if (t && (t.tagName === 'TEXTAREA' || t.tagName === 'SELECT')) return;
      if (e.ctrlKey || e.metaKey || e.altKey) return;
      const choice = JOIN_TYPE_CHOICES.find((c) => c.key === e.key);
      if (choice) {
        setType(choice.type);
        e.preventDefault();
      } else if (e.key === 'a') void decide('accept');
      else if (e.key === 'r') void decide('reject');
      else if (e.key === 's') skip();
      else if (e.key === 'u') void undo();
      else if (e.key === 'g') setShowGaps((g) => !g);
      else return;
      e.preventDefault();
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  });

  if (!ws.has('joins.list')) return <p className="empty">Join review is not available in this knitbone yet.</p>;
  if (!queue) return error ? <Problems error={error} /> : <p className="empty" aria-busy="true">Reading proposals...</p>;

  const currentConflicts = preview?.conflicts ?? (current ? (conflicts.get(current.id) ?? []) : []);
  const sentences = preview ? previewSentences(preview) : [];

  return (
    <section className="review-screen" aria-labelledby="review-title">
      <div className="screen-head">
        <h1 id="review-title">Proposed joins</h1>
        <span className="count">{queue.length} waiting</span>
        {canPropose && (
          <button type="button" onClick={() => void propose()} disabled={proposing !== null}>
            {proposing === null ? 'Find joins in the scans' : 'Finding joins...'}
          </button>
        )}
        {proposing && (
          <span className="hint" role="status">
            {proposing}
          </span>
        )}
        <button type="button" onClick={() => void undo()} disabled={!canUndo || busy}>
          {last ? `Undo ${last.kind} of #${last.join.id}` : 'Undo'} <kbd>U</kbd>
        </button>
      </div>
      <Problems error={error} />
      {queue.length === 0 ? (
        <div className="review-empty">
          <p className="empty panel">No proposals wait for a decision. Run proposals on scanned specimens to fill this queue.</p>
          <CountsPanel />
        </div>
      ) : (
        <div className="review-layout">
          <nav className="queue panel" aria-label="Proposals, best score first">
            <ol>
              {queue.map((j, i) => (
                <li key={j.id}>
                  <button type="button" aria-current={current?.id === j.id ? 'true' : undefined} onClick={() => setPosition(i)}>
                    <span className="pair">
                      {j.a} · {j.b}
                    </span>
                    <span className="score">{j.score !== null ? j.score.toFixed(2) : 'by hand'}</span>
                    {conflicts.has(j.id) && <span className="conflict-mark" title="identification conflict">conflict</span>}
                  </button>
                </li>
              ))}
            </ol>
          </nav>
          {current && (
            <div className="review-main">
              <div className="panel">
                <h2>
                  Join #{current.id}: {current.a} and {current.b}
                </h2>
                <div className="pair-records">
                  <FragmentCard label="Fixed" record={a} tone="a" />
                  <FragmentCard label="Moved into place" record={b} tone="b" />
                </div>
                {(meshA.loading || meshB.loading) && <p className="hint" aria-busy="true">Reading scans...</p>}
                {parts.length === 2 ? (
                  <>
                    <ScanViewer parts={parts} pullApart={pull} label={`${current.a} and ${current.b} in the proposed alignment`} background={themeColour('panel-2')} height={360} />
                    <div className="viewer-controls">
                      <label htmlFor="pull-apart">Pull apart</label>
                      <input id="pull-apart" type="range" min={0} max={60} step={1} value={pull} onChange={(e) => setPull(Number(e.target.value))} aria-valuetext={`${pull} millimetres`} />
                      <span className="num">{pull} mm</span>
                      <label className="check">
                        <input type="checkbox" checked={showGaps} onChange={(e) => setShowGaps(e.target.checked)} /> contact gaps <kbd>G</kbd>
                      </label>
                      {showGaps && (
                        <span className="legend">
                          <span className="swatch touch" /> touching <span className="swatch near" /> about 1 mm <span className="swatch bone" /> apart (2.5 mm or more)
                        </span>
                      )}
                    </div>
                  </>
                ) : (
                  !meshA.loading && !meshB.loading && <p className="hint">No scans to draw for this pair.</p>
                )}
              </div>
              <div className="panel score-panel">
                <h2>Score {current.score !== null ? current.score.toFixed(2) : '—'}</h2>
                {details && Object.keys(details.scoreComponents).length > 0 ? (
                  <dl className="score-parts">
                    {Object.entries(details.scoreComponents).map(([k, v]) => (
                      <div key={k}>
                        <dt>{words(k)}</dt>
                        <dd>
                          <meter min={0} max={1} value={Math.max(0, Math.min(1, v))} aria-label={words(k)} /> {formatPart(k, v)}
                        </dd>
                      </div>
                    ))}
                  </dl>
                ) : (
                  <p className="hint">No score parts recorded.</p>
                )}
              </div>
            </div>
          )}
          <aside className="decision">
            <div className="panel">
              <h2>Decision</h2>
              <fieldset className="join-types">
                <legend>Join type</legend>
                {JOIN_TYPE_CHOICES.map((c) => (
                  <label key={c.type}>
                    <input type="radio" name="join-type" value={c.type} checked={type === c.type} onChange={() => setType(c.type)} />
                    {c.label} <kbd>{c.key}</kbd>
                  </label>
                ))}
              </fieldset>
              {currentConflicts.length > 0 && (
                <div className="conflicts" role="alert">
                  <strong>Identification conflict</strong>
                  <ul>
                    {currentConflicts.map((c, i) => (
                      <li key={i}>
                        {c.field}: {c.reason}
                      </li>
                    ))}
                  </ul>
                  <span className="hint">Accepting is refused until the records agree.</span>
                </div>
              )}
              <div className="would-change" aria-live="polite">
                <h3>Accepting would change</h3>
                {!canPreview ? (
                  <p className="hint">(not available in this knitbone)</p>
                ) : sentences.length ? (
                  <ul>
                    {sentences.map((s) => (
                      <li key={s}>{s}</li>
                    ))}
                  </ul>
                ) : (
                  <p className="hint">{preview ? 'No identification or count.' : '...'}</p>
                )}
              </div>
              <div className="decide-buttons">
                <button type="button" className="primary" onClick={() => void decide('accept')} disabled={busy || !current}>
                  Accept <kbd>A</kbd>
                </button>
                <button type="button" className="danger" onClick={() => void decide('reject')} disabled={busy || !current}>
                  Reject <kbd>R</kbd>
                </button>
                <button type="button" onClick={skip} disabled={busy || queue.length < 2}>
                  Skip <kbd>S</kbd>
                </button>
              </div>
              <p className="hint">Check the fit on the physical specimens before accepting. Accepting changes records, never the bones.</p>
            </div>
            <CountsPanel />
          </aside>
        </div>
      )}
    </section>
  );
}

function FragmentCard({ label, record, tone }: { label: string; record: SpecimenRecord | null; tone: 'a' | 'b' }) {
  if (!record) return null;
  const ident = [record.taxon, record.element, record.side].filter(Boolean).join(', ') || (record.sizeClass ? `size class ${record.sizeClass}` : 'unidentified');
  return (
    <div className={`fragment-card ${tone}`}>
      <span className="caption">{label}</span>
      <strong>{record.catalogueNo}</strong> {ident}
      <span className="hint">
        {' '}
        · {[record.unit, record.level, record.layer].filter(Boolean).join(' / ')}
        {record.portion.length ? ` · ${record.portion.join('; ')}` : ''}
      </span>
    </div>
  );
}

function words(key: string): string {
  return key.replace(/([a-z])([A-Z])/g, '$1 $2').toLowerCase();
}

function formatPart(key: string, v: number): string {
  if (/mm$/i.test(key)) return `${v.toFixed(2)} mm`;
  return v.toFixed(2);
}
