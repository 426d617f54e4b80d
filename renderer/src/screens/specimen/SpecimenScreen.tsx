import { useEffect, useMemo, useState } from 'react';
import { callByName } from '../../api/loose';
import { Problems } from '../../app/Problems';
import { themeColour } from '../../app/theme-colours';
import { useWorkspace } from '../../app/workspace';
import { SURFACE } from '../../viewer/colours';
import type { SurfaceClassName } from '../../viewer/mesh-payload';
import { ScanViewer, type RegionSelection, type ViewerPart } from '../../viewer/ScanViewer';
import { useScanMesh } from '../../viewer/use-scan-mesh';
import { cellText, type SpecimenRecord } from '../catalogue/specimen-view';
import { useSpecimenIndex } from '../catalogue/use-specimen-index';
import { RegionClassEditor, surfaceClassLabel } from './RegionClassEditor';

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
  entity?: string;
  entityId?: string | number | null;
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
 * accepted joins (marked, with the join), its scan with its surface regions coloured by class
 * (select one in the view or the list and correct its class), its joins and history.
 */
export function SpecimenScreen({ specimenId }: { specimenId: number | null }) {
  const ws = useWorkspace();
  const [detail, setDetail] = useState<SpecimenDetail | null>(null);
  const [history, setHistory] = useState<HistoryEntry[] | null>(null);
  const [error, setError] = useState<unknown>(null);
  const [selected, setSelected] = useState<RegionSelection | null>(null);
  const [meshRefresh, setMeshRefresh] = useState(0);
  const [correcting, setCorrecting] = useState(false);
  const [correctionError, setCorrectionError] = useState<unknown>(null);
  const { mesh, error: meshError, available: meshAvailable, loading } = useScanMesh(detail && detail.scans.length ? specimenId : null, meshRefresh);
  const historyRequest = ['history.list', 'specimens.history'].find((n) => ws.has(n));
  const index = useSpecimenIndex();
  const numberOf = (id: number): string => [...(index?.values() ?? [])].find((x) => x.id === id)?.catalogueNo ?? `#${id}`;
  const canCorrect = ws.has('scans.correctRegion');

  useEffect(() => {
    setSelected(null);
  }, [specimenId]);

  useEffect(() => {
    if (specimenId === null) return;
    let live = true;
    callByName<SpecimenDetail>(ws.client, 'specimens.get', { catalogue: ws.catalogue, id: specimenId })
      .then(async (d) => {
        if (!live) return;
        setDetail(d);
        setError(null);
        if (!historyRequest) return;
        // The specimen's own history and that of its scans (region class corrections).
        const lists = await Promise.all([
          callByName<HistoryEntry[]>(ws.client, historyRequest, { catalogue: ws.catalogue, entity: 'specimen', entityId: specimenId }),
          ...d.scans.map((sc) => callByName<HistoryEntry[]>(ws.client, historyRequest, { catalogue: ws.catalogue, entity: 'scan', entityId: sc.id })),
        ]);
        if (live) setHistory(lists.flat().sort((a, b) => a.id - b.id));
      })
      .catch((e) => live && setError(e));
    return () => {
      live = false;
    };
  }, [ws.client, ws.catalogue, specimenId, ws.revision, historyRequest]);

  async function correct(regionId: number, surfaceClass: SurfaceClassName | null): Promise<void> {
    if (!mesh?.scanId) return;
    setCorrecting(true);
    setCorrectionError(null);
    try {
      await callByName(ws.client, 'scans.correctRegion', { catalogue: ws.catalogue, scanId: mesh.scanId, regionId, surfaceClass });
      ws.say(surfaceClass ? `Region ${regionId} recorded as ${surfaceClassLabel(surfaceClass)}.` : `Correction of region ${regionId} withdrawn.`);
      setMeshRefresh((r) => r + 1);
      ws.changed();
    } catch (err) {
      setCorrectionError(err);
    } finally {
      setCorrecting(false);
    }
  }

  const parts = useMemo<ViewerPart[]>(() => (mesh ? [{ key: 'scan', label: 'scan', mesh, base: SURFACE.bone, fractures: true, byClass: true }] : []), [mesh]);

  if (specimenId === null) return <p className="empty">Choose a specimen in the catalogue (Enter on a row opens it).</p>;
  if (error) return <Problems error={error} />;
  if (!detail) return <p className="empty" aria-busy="true">Reading the record...</p>;
  const s = detail.specimen;
  const derivedOf = (f: string): Derived | undefined => detail.derived.find((d) => d.field === f);
  const fractureFaces = mesh?.faces.filter((f) => f.kind === 'fracture') ?? [];
  const region = selected && mesh ? mesh.regions.find((r) => r.id === selected.region) : undefined;
  // The fracture face the selected region belongs to (its first triangle tells).
  const chosen = (() => {
    if (!region || !mesh?.triangleRegions || !mesh.triangleFaces) return undefined;
    const t = mesh.triangleRegions.indexOf(region.id);
    const face = t >= 0 ? mesh.triangleFaces[t] : -1;
    return face >= 0 ? mesh.faces.find((f) => f.id === face) : undefined;
  })();
  const regionsByArea = mesh ? [...mesh.regions].filter((r) => r.triangles > 0).sort((x, y) => y.area - x.area) : [];

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
            {loading && !mesh && <p className="hint" aria-busy="true">Reading the scan...</p>}
            {mesh && (
              <>
                <ScanViewer
                  parts={parts}
                  label={`Scan of ${s.catalogueNo}, ${mesh.regions.length} surface regions coloured by class${fractureFaces.length ? `, ${fractureFaces.length} fracture faces` : ''}; click a region to select it`}
                  selectedRegion={selected}
                  onSelectRegion={setSelected}
                  background={themeColour('panel-2')}
                  height={380}
                />
                <p className="legend">
                  <span className="swatch bone" /> outer cortical <span className="swatch medullary" /> medullary <span className="swatch articular" /> articular{' '}
                  <span className="swatch fracture" /> fracture face <span className="swatch selected" /> selected · {(mesh.triangles.length / 3).toLocaleString()} triangles
                  {loading && <span aria-busy="true"> · redrawing...</span>}
                </p>
                {regionsByArea.length > 0 && <p className="legend">Surface regions, largest first; click one to see or correct its class.</p>}
                {regionsByArea.length > 0 && (
                  <div className="regions" role="group" aria-label="Surface regions, largest first">
                    {regionsByArea.map((r) => (
                      <button
                        key={r.id}
                        type="button"
                        data-region={r.id}
                        data-class={r.surfaceClass}
                        aria-pressed={selected?.region === r.id}
                        onClick={() => setSelected(selected?.region === r.id ? null : { part: 'scan', region: r.id })}
                      >
                        <span className={`swatch ${swatchOf(r.surfaceClass)}`} aria-hidden="true" /> Region {r.id} · {surfaceClassLabel(r.surfaceClass)} · {r.area.toFixed(0)} mm²
                        {r.corrected ? ' · corrected' : ''}
                      </button>
                    ))}
                  </div>
                )}
                {region && (
                  <div className="region-detail">
                    {canCorrect && <RegionClassEditor region={region} correctable={mesh.correctable} busy={correcting} onCorrect={(c) => void correct(region.id, c)} />}
                    <Problems error={correctionError} />
                    {chosen && (
                      <dl className="record face-detail" aria-live="polite">
                        <div><dt>Fracture face</dt><dd>{chosen.id}</dd></div>
                        {chosen.area !== undefined && <div><dt>Face area</dt><dd>{chosen.area.toFixed(1)} mm²</dd></div>}
                        {chosen.meanAngleDeg != null && <div><dt>Fracture angle</dt><dd>{chosen.meanAngleDeg.toFixed(0)}° ({chosen.angleClass ?? '—'})</dd></div>}
                        {chosen.outlineClass && <div><dt>Outline</dt><dd>{chosen.outlineClass}</dd></div>}
                      </dl>
                    )}
                  </div>
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
                      <time dateTime={h.at}>{h.at.replace('T', ' ').slice(0, 16)}</time> {h.who}: {actionWords(h)}
                      {h.action === 'correct-region-class' ? (
                        <span className="hint"> {regionCorrectionText(h)}</span>
                      ) : h.after && typeof h.after === 'object' ? (
                        <span className="hint"> {summarise(h.after as Record<string, unknown>)}</span>
                      ) : null}
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

/** A history entry's action in words: what happened to what. */
function actionWords(h: HistoryEntry): string {
  const what = h.entity === 'scan' ? `scan ${h.entityId ?? ''}`.trim() : 'record';
  switch (h.action) {
    case 'insert':
      return h.entity === 'scan' ? `${what} linked` : 'record added';
    case 'import':
      return 'record imported';
    case 'import-update':
      return 'record changed by import';
    case 'update':
      return h.entity === 'scan' ? `${what} figures recomputed` : 'record changed';
    case 'delete':
      return `${what} removed`;
    case 'correct-region-class':
      return 'surface class corrected';
    default:
      return h.action;
  }
}

/** The first few fields of a history entry; nested figures (a scan's stats) are named, not printed. */
function summarise(o: Record<string, unknown>): string {
  return Object.entries(o)
    .filter(([k, v]) => v !== null && !(Array.isArray(v) && v.length === 0) && !['id', 'specimenId', 'contentHash'].includes(k))
    .filter(([, v]) => typeof v !== 'object' || Array.isArray(v))
    .slice(0, 5)
    .map(([k, v]) => `${k} ${Array.isArray(v) ? v.join(';') : String(v)}`)
    .join(', ');
}

function swatchOf(surfaceClass: string): string {
  return surfaceClass === 'outer-cortical' ? 'bone' : surfaceClass;
}

/** "region 3 of scan 2: fracture face -> medullary surface" from a correction's history entry. */
function regionCorrectionText(h: HistoryEntry): string {
  type Side = { regionId?: number; surfaceClass?: string | null; shownClass?: string };
  const before = (h.before ?? {}) as Side;
  const after = (h.after ?? {}) as Side;
  const withdrawn = after.surfaceClass === null ? ' (correction withdrawn)' : '';
  return `region ${after.regionId ?? before.regionId} of scan ${h.entityId ?? '?'}: ${surfaceClassLabel(before.shownClass ?? before.surfaceClass)} → ${surfaceClassLabel(after.shownClass ?? after.surfaceClass)}${withdrawn}`;
}
