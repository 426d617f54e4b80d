import { percent } from '../counts/counts-model';
import { useCounts } from '../counts/use-counts';

/** The counts beside the review queue, fetched again after every decision. */
export function CountsPanel() {
  const { counts, available } = useCounts();
  if (!available || !counts) return null;
  const rows = counts.refitted.byElement
    .map((r) => ({ r, rec: counts.recorded.byElement.find((x) => x.taxon === r.taxon && x.element === r.element) }))
    .sort((x, y) => y.r.mne - x.r.mne)
    .slice(0, 8);
  return (
    <section className="panel counts-panel" aria-labelledby="counts-panel-title" aria-live="polite">
      <h2 id="counts-panel-title">Counts with refits</h2>
      <p className="counts-line">
        NISP <strong data-testid="panel-nisp">{counts.refitted.nisp}</strong> · identified to element{' '}
        <strong>{percent(counts.refitted.identifiedToElement)}</strong>
        <span className="hint"> (as recorded {percent(counts.recorded.identifiedToElement)})</span>
      </p>
      <table className="counts-table compact" aria-label="MNE by element">
        <thead>
          <tr>
            <th>Element</th>
            <th className="num">L</th>
            <th className="num">R</th>
            <th className="num">MNE</th>
          </tr>
        </thead>
        <tbody>
          {rows.map(({ r, rec }) => (
            <tr key={`${r.taxon}/${r.element}`} data-element={`${r.taxon} / ${r.element}`}>
              <th scope="row">
                {r.element} <span className="hint">{r.taxon}</span>
              </th>
              <td className="num">{r.mneLeft}</td>
              <td className="num">{r.mneRight}</td>
              <td className={`num refitted${rec && rec.mne !== r.mne ? ' changed' : ''}`} data-testid="panel-mne">
                {r.mne}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </section>
  );
}
