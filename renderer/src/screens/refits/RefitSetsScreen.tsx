import { useEffect, useMemo, useState } from 'react';
import { callByName } from '../../api/loose';
import { Problems } from '../../app/Problems';
import { themeColour } from '../../app/theme-colours';
import { useWorkspace } from '../../app/workspace';
import type { MeshView } from '../../viewer/mesh-payload';
import { decodeMesh, type MeshPayload } from '../../viewer/mesh-payload';
import { MESH_REQUEST } from '../../viewer/use-scan-mesh';
import { ScanViewer, type ViewerPart } from '../../viewer/ScanViewer';
import { cellText } from '../catalogue/specimen-view';
import { useSpecimenIndex } from '../catalogue/use-specimen-index';
import type { JoinView } from '../review/review-model';
import { refitSetsFromJoins } from './refit-sets';

/** A few distinct, calm tints so the members of an assembled set can be told apart. */
const TINTS: ReadonlyArray<readonly number[]> = [
  [0.86, 0.82, 0.72],
  [0.7, 0.78, 0.86],
  [0.78, 0.86, 0.74],
  [0.88, 0.76, 0.72],
  [0.8, 0.74, 0.88],
  [0.9, 0.86, 0.6],
];

/** Refit sets: each assembled in 3D from its members' poses, with members and provenience. */
export function RefitSetsScreen() {
  const ws = useWorkspace();
  const index = useSpecimenIndex();
  const [joins, setJoins] = useState<JoinView[] | null>(null);
  const [error, setError] = useState<unknown>(null);
  const [chosen, setChosen] = useState(0);
  const [meshes, setMeshes] = useState<Map<string, MeshView>>(new Map());
  const [solved, setSolved] = useState<Array<{ members: Array<{ catalogueNo: string; pose: number[] }> }> | null>(null);

  useEffect(() => {
    if (!ws.has('joins.list')) return;
    callByName<JoinView[]>(ws.client, 'joins.list', { catalogue: ws.catalogue, status: 'accepted' })
      .then(setJoins)
      .catch(setError);
  }, [ws.client, ws.catalogue, ws.revision]);

  // Poses refined over the whole pose graph (cycles reconciled), when the host computes them.
  useEffect(() => {
    if (!ws.has('proposals.poses')) return;
    callByName<Array<{ members: Array<{ catalogueNo: string; pose: number[] }> }>>(ws.client, 'proposals.poses', { catalogue: ws.catalogue })
      .then(setSolved)
      .catch(() => setSolved(null));
  }, [ws.client, ws.catalogue, ws.revision]);

  const sets = useMemo(() => {
    const chained = joins ? refitSetsFromJoins(joins) : [];
    for (const set of chained) {
      const found = solved?.find((x) => set.members.every((m) => x.members.some((y) => y.catalogueNo === m)));
      if (found) for (const m of found.members) set.poses.set(m.catalogueNo, m.pose);
    }
    return chained;
  }, [joins, solved]);
  const set = sets[Math.min(chosen, Math.max(0, sets.length - 1))];

  useEffect(() => {
    setMeshes(new Map());
    if (!set || !index || !ws.has(MESH_REQUEST)) return;
    let live = true;
    void Promise.all(
      set.members.map(async (no) => {
        const s = index.get(no);
        if (!s) return null;
        const p = await callByName<MeshPayload | null>(ws.client, MESH_REQUEST, { catalogue: ws.catalogue, specimenId: s.id }).catch(() => null);
        return p ? ([no, decodeMesh(p)] as const) : null;
      }),
    ).then((list) => {
      if (live) setMeshes(new Map(list.filter((x): x is readonly [string, MeshView] => x !== null)));
    });
    return () => {
      live = false;
    };
  }, [set, index, ws.client, ws.catalogue]);

  const parts = useMemo<ViewerPart[]>(() => {
    if (!set) return [];
    return set.members
      .filter((no) => meshes.has(no) && set.poses.get(no))
      .map((no, i) => ({ key: no, label: no, mesh: meshes.get(no)!, transform: set.poses.get(no)!, base: TINTS[i % TINTS.length], fractures: false }));
  }, [set, meshes]);

  if (!ws.has('joins.list')) return <p className="empty">Refit sets are not available in this knitbone yet.</p>;
  if (error) return <Problems error={error} />;
  if (!joins) return <p className="empty" aria-busy="true">Reading joins...</p>;

  return (
    <section className="refits-screen" aria-labelledby="refits-title">
      <div className="screen-head">
        <h1 id="refits-title">Refit sets</h1>
        <span className="count">{sets.length} {sets.length === 1 ? "set" : "sets"} from accepted conjoins</span>
      </div>
      {sets.length === 0 ? (
        <p className="empty">No accepted conjoins yet. Accept proposals in the review, or record joins found by hand.</p>
      ) : (
        <div className="refits-layout">
          <nav className="queue panel" aria-label="Refit sets">
            <ol>
              {sets.map((s, i) => (
                <li key={s.members.join('+')}>
                  <button type="button" aria-current={i === chosen ? 'true' : undefined} onClick={() => setChosen(i)}>
                    <span className="pair">{s.members.slice(0, 3).join(' · ')}{s.members.length > 3 ? ' ...' : ''}</span>
                    <span className="score">{s.members.length} pieces</span>
                  </button>
                </li>
              ))}
            </ol>
          </nav>
          {set && (
            <div className="review-main">
              <div className="panel">
                <h2>Set of {set.members.length}: {set.members.join(', ')}</h2>
                {parts.length > 0 ? (
                  <ScanViewer parts={parts} label={`Refit set of ${set.members.join(', ')}, assembled`} background={themeColour('panel-2')} height={380} />
                ) : (
                  <p className="hint">{ws.has(MESH_REQUEST) ? 'Reading scans...' : 'Scans cannot be drawn in this knitbone yet.'}</p>
                )}
              </div>
              <div className="panel">
                <h2>Members and provenience</h2>
                <table className="counts-table">
                  <thead>
                    <tr>
                      <th>Cat. no.</th>
                      <th>Identification</th>
                      <th>Unit</th>
                      <th>Level</th>
                      <th>Layer</th>
                      <th className="num">x</th>
                      <th className="num">y</th>
                      <th className="num">z</th>
                      <th>Placed</th>
                    </tr>
                  </thead>
                  <tbody>
                    {set.members.map((no, i) => {
                      const s = index?.get(no);
                      return (
                        <tr key={no}>
                          <th scope="row">
                            <span className="swatch" data-tint={i % TINTS.length} /> {' '}
                            <button type="button" className="link" onClick={() => s && ws.open('specimen', s.id)}>
                              {no}
                            </button>
                          </th>
                          <td>{s ? [s.taxon, s.element, s.side].filter(Boolean).join(', ') || '—' : ''}</td>
                          <td>{s?.unit ?? ''}</td>
                          <td>{s?.level ?? ''}</td>
                          <td>{s?.layer ?? ''}</td>
                          <td className="num">{s ? cellText(s, 'x') : ''}</td>
                          <td className="num">{s ? cellText(s, 'y') : ''}</td>
                          <td className="num">{s ? cellText(s, 'z') : ''}</td>
                          <td>{set.poses.get(no) ? 'yes' : 'no transform'}</td>
                        </tr>
                      );
                    })}
                  </tbody>
                </table>
                <p className="hint">
                  Joins: {set.joins.map((j) => `#${j.id} ${j.a}–${j.b} (${j.type ?? 'conjoin'})`).join('; ')}
                </p>
              </div>
            </div>
          )}
        </div>
      )}
    </section>
  );
}
