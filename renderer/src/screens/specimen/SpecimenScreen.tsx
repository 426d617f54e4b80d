import { useEffect, useMemo, useState } from 'react';
import { callByName } from '../../api/loose';
import { Problems } from '../../app/Problems';
import { themeColour } from '../../app/theme-colours';
import { useWorkspace } from '../../app/workspace';
import { SURFACE } from '../../viewer/colours';
import { ScanViewer, type ViewerPart } from '../../viewer/ScanViewer';
import { useScanMesh } from '../../viewer/use-scan-mesh';
import { cellText, type SpecimenRecord } from '../catalogue/specimen-view';
import { useSpecimenIndex } from '../catalogue/use-specimen-index';

interface Derived {
  field: 'taxon' | 'element' | 'side';
  value: string;
  sourceJoinIds: number[];
}

interface JoinRecord {
  id: number;
  specimenA: number;
  specimenB: number;
  status: string;
  type: string | null;
  breakAge?: string | null;
  score: number | null;
  decidedBy: string | null;
  decidedAt: string | null;
}

interface ScanRecord {
  id: number;
  path: string;
  units: string;
  stats: Record<string, unknown>;
}

interface SpecimenDetail {
  specimen: SpecimenRecord;
  derived: Derived[];
  scans: ScanRecord[];
  joins: JoinRecord[];
}

interface HistoryEntry {
  id: number;
  at: string;
  who: string;
  action: string;
  before?: unknown;
  after?: unknown;
}

const IDENTIFICATION: Array<{ field: 'taxon' | 'element' | 'side'; label: string }> = [
  { field: 'taxon', label: 'Taxon' },
  { field: 'element', label: 'Element' },
  { field: 'side', label: 'Side' },
];

/**
 * One specimen: its record, what the analyst observed beside what the program derived from
 * accepted joins (marked, with the join), its scan with fracture faces, its joins and history.
 */
export function SpecimenScreen({ specimenId }: { specimenId: number | null }) {
  const ws = useWorkspace();
  const [detail, setDetail] = useState<SpecimenDetail | null>(null);
  const [history, setHistory] = useState<HistoryEntry[] | null>(null);
  const [error, setError] = useState<unknown>(null);
  const [selectedFace, setSelectedFace] = useState<{ part: string; face: number } | null>(null);
  const { mesh, error: meshError, available: meshAvailable, loading } = useScanMesh(detail && detail.scans.length ? specimenId : null);
  const historyRequest = ['history.list', 'specimens.history'].find((n) => ws.has(n));
  const index = useSpecimenIndex();
  const numberOf = (id: number): string => [...(index?.values() ?? [])].find((x) => x.id === id)?.catalogueNo ?? `#${id}`;

  useEffect(() => {
    if (specimenId === null) return;
    callByName<SpecimenDetail>(ws.client, 'specimens.get', { catalogue: ws.catalogue, id: specimenId })
      .then((d) => {
        setDetail(d);
        setError(null);
      })
      .catch(setError);
    if (historyRequest) {
      callByName<HistoryEntry[]>(ws.client, historyRequest, { catalogue: ws.catalogue, entity: 'specimen', entityId: specimenId })
        .then(setHistory)
        .catch(() => setHistory(null));
    }
  }, [ws.client, ws.catalogue, specimenId, ws.revision, historyRequest]);

  const parts = useMemo<ViewerPart[]>(() => (mesh ? [{ key: 'scan', label: 'scan', mesh, base: SURFACE.bone, fractures: true }] : []), [mesh]);

  if (specimenId === null) return <p className="empty">Choose a specimen in the catalogue (Enter on a row opens it).</p>;
  if (error) return <Problems error={error} />;
  if (!detail) return <p className="empty" aria-busy="true">Reading the record...</p>;
  const s = detail.specimen;
  const derivedOf = (f: string): Derived | undefined => detail.derived.find((d) => d.field === f);
  const fractureFaces = mesh?.faces.filter((f) => f.kind === 'fracture') ?? [];
  const chosen = selectedFace ? mesh?.faces.find((f) => f.id === selectedFace.face) : undefined;

  return (
    <section className="specimen-screen" aria-labelledby="specimen-title">
      <div className="screen-head">
        <h1 id="specimen-title">Specimen {s.catalogueNo}</h1>
        <button type="button" onClick={() => ws.open('catalogue')}>
          Back to the catalogue
        </button>
      </div>
      <div className="specimen-grid">
        <div className="specimen-left">
          <div className="panel">
            <h2>Identification</h2>
            <table className="ident-table">
              <thead>
                <tr>
                  <th scope="col"></th>
                  <th scope="col">Observed</th>
                  <th scope="col">Derived through joins</th>
                </tr>
              </thead>
              <tbody>
                {IDENTIFICATION.map(({ field, label }) => {
                  const d = derivedOf(field);
                  return (
                    <tr key={field} data-field={field}>
                      <th scope="row">{label}</th>
                      <td className="observed">{s[field] ?? <span className="hint">not recorded</span>}</td>
                      <td className="derived-cell">
                        {d ? (
                          <>
                            <span className="derived">{d.value}</span>
                            <span className="derived-tag">derived</span>
                            <span className="hint"> from join {d.sourceJoinIds.map((j) => `#${j}`).join(', ')}</span>
                          </>
                        ) : (
                          <span className="hint">—</span>
                        )}
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </div>
          <div className="panel">
            <h2>Record</h2>
            <dl className="record">
              {(
                [
                  ['Unit', 'unit'],
                  ['Level', 'level'],
                  ['Layer', 'layer'],
                  ['x, y, z (m)', null],
                  ['Portion zones', 'portion'],
                  ['Fusion', 'fusion'],
                  ['Size class', 'sizeClass'],
                  ['Break age', 'breakAge'],
                  ['Modifications', 'modifications'],
                  ['Weight (g)', 'weightG'],
                  ['Notes', 'notes'],
                ] as const
              ).map(([label, field]) => (
                <div key={label}>
                  <dt>{label}</dt>
                  <dd>{field ? cellText(s, field) || '—' : [s.x, s.y, s.z].some((v) => v !== null) ? `${cellText(s, 'x')}, ${cellText(s, 'y')}, ${cellText(s, 'z')}` : '—'}</dd>
                </div>
              ))}
            </dl>
          </div>
          <div className="panel">
            <h2>Joins</h2>
            {detail.joins.length === 0 ? (
              <p className="hint">No joins recorded or proposed.</p>
            ) : (
              <ul className="join-list">
                {detail.joins.map((j) => (
                  <li key={j.id}>
                    <span className={`status-chip ${j.status}`}>{j.status}</span> #{j.id} {j.type ?? ''}
                    {j.breakAge ? ` (${j.breakAge} break)` : ''} with specimen{' '}
                    <button type="button" className="link" onClick={() => ws.open('specimen', j.specimenA === s.id ? j.specimenB : j.specimenA)}>
                      {numberOf(j.specimenA === s.id ? j.specimenB : j.specimenA)}
                    </button>
                    {j.score !== null && <span className="hint"> · score {j.score.toFixed(2)}</span>}
                    {j.decidedBy && <span className="hint"> · {j.decidedBy}, {j.decidedAt?.slice(0, 10)}</span>}
                  </li>
                ))}
              </ul>
            )}
          </div>
        </div>
        <div className="specimen-right">
          <div className="panel">
            <h2>Scan</h2>
            {detail.scans.length === 0 && <p className="hint">No scan linked to this specimen.</p>}
            {detail.scans.length > 0 && !meshAvailable && <p className="hint">Scan {detail.scans[0].path} is linked; this knitbone cannot draw scans yet.</p>}
            <Problems error={meshError} />
            {loading && <p className="hint" aria-busy="true">Reading the scan...</p>}
            {mesh && (
              <>
                <ScanViewer
                  parts={parts}
                  label={`Scan of ${s.catalogueNo}${fractureFaces.length ? `, ${fractureFaces.length} fracture faces coloured` : ''}`}
                  selectedFace={selectedFace}
                  onSelectFace={setSelectedFace}
                  background={themeColour('panel-2')}
                  height={380}
                />
                <p className="legend">
                  <span className="swatch bone" /> original surface <span className="swatch fracture" /> fracture face{' '}
                  <span className="swatch selected" /> selected · {(mesh.triangles.length / 3).toLocaleString()} triangles
                </p>
                {fractureFaces.length > 0 && (
                  <div className="faces" role="group" aria-label="Fracture faces">
                    {fractureFaces.map((f) => (
                      <button
                        key={f.id}
                        type="button"
                        aria-pressed={selectedFace?.face === f.id}
                        onClick={() => setSelectedFace(selectedFace?.face === f.id ? null : { part: 'scan', face: f.id })}
                      >
                        Face {f.id}
                        {f.angleClass ? ` · ${f.angleClass}` : ''}
                      </button>
                    ))}
                  </div>
                )}
                {chosen && (
                  <dl className="record face-detail" aria-live="polite">
                    <div><dt>Face</dt><dd>{chosen.id} ({chosen.kind})</dd></div>
                    {chosen.area !== undefined && <div><dt>Area</dt><dd>{chosen.area.toFixed(1)} mm²</dd></div>}
                    {chosen.meanAngleDeg != null && <div><dt>Fracture angle</dt><dd>{chosen.meanAngleDeg.toFixed(0)}° ({chosen.angleClass ?? '—'})</dd></div>}
                    {chosen.outlineClass && <div><dt>Outline</dt><dd>{chosen.outlineClass}</dd></div>}
                  </dl>
                )}
              </>
            )}
          </div>
          {historyRequest && (
            <div className="panel">
              <h2>History</h2>
              {!history || history.length === 0 ? (
                <p className="hint">Nothing recorded.</p>
              ) : (
                <ol className="history">
                  {history.map((h) => (
                    <li key={h.id}>
                      <time dateTime={h.at}>{h.at.replace('T', ' ').slice(0, 16)}</time> {h.who}: {h.action}
                      {h.after && typeof h.after === 'object' ? <span className="hint"> {summarise(h.after as Record<string, unknown>)}</span> : null}
                    </li>
                  ))}
                </ol>
              )}
            </div>
          )}
        </div>
      </div>
    </section>
  );
}

function summarise(o: Record<string, unknown>): string {
  return Object.entries(o)
    .filter(([, v]) => v !== null && !(Array.isArray(v) && v.length === 0))
    .slice(0, 5)
    .map(([k, v]) => `${k} ${Array.isArray(v) ? v.join(';') : String(v)}`)
    .join(', ');
}
