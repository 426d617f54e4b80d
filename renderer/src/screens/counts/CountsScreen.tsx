import { useMemo, useRef, useState } from 'react';
import { savePng, saveSvg } from '../../app/figure-export';
import { Problems } from '../../app/Problems';
import { themeColour } from '../../app/theme-colours';
import { download } from '../catalogue/CsvTransfer';
import { countsCsv, elementKey, pairRows, percent, type ElementTally, type TaxonTally } from './counts-model';
import { MauChart } from './MauChart';
import { useCounts } from './use-counts';

/** A value as recorded and with refits; the refitted one is marked when it differs. */
function Both({ rec, ref: fit }: { rec: number | null | undefined; ref: number | null | undefined }) {
  const show = (v: number | null | undefined): string => (v === null || v === undefined ? '–' : String(v));
  const changed = (rec ?? null) !== (fit ?? null);
  return (
    <>
      <td className="num">{show(rec)}</td>
      <td className={`num refitted${changed ? ' changed' : ''}`}>
        {show(fit)}
        {changed && <span className="visually-hidden"> (changed by refits)</span>}
      </td>
    </>
  );
}

/**
 * Counts: NSP, NISP, MNE, MNI, MAU and %MAU as recorded and with refits side by side, the
 * identification rates before and after, and a %MAU chart; CSV, SVG and PNG out.
 */
export function CountsScreen() {
  const { counts, error, available } = useCounts();
  const chart = useRef<SVGSVGElement>(null);
  const taxa = useMemo(() => {
    if (!counts) return [];
    return [...new Set(counts.refitted.byElement.filter((e) => e.percentMau !== null).map((e) => e.taxon))].sort();
  }, [counts]);
  const [taxon, setTaxon] = useState<string>('');
  const chartTaxon = taxa.includes(taxon) ? taxon : (taxa[0] ?? '');

  if (!available) return <p className="empty">Counting is not available in this knitbone yet.</p>;
  if (error) return <Problems error={error} />;
  if (!counts) return <p className="empty" aria-busy="true">Counting...</p>;

  const taxonRows = pairRows<TaxonTally>(counts.recorded.byTaxon, counts.refitted.byTaxon, (t) => t.taxon);
  const elementRows = pairRows<ElementTally>(counts.recorded.byElement, counts.refitted.byElement, elementKey);
  const colours = {
    ink: themeColour('ink'),
    muted: themeColour('muted'),
    recorded: themeColour('chart-a'),
    refitted: themeColour('chart-b'),
    grid: themeColour('line'),
    background: themeColour('panel'),
  };

  return (
    <section className="counts-screen" aria-labelledby="counts-title">
      <div className="screen-head">
        <h1 id="counts-title">Counts</h1>
        <button type="button" onClick={() => download('counts.csv', countsCsv(counts), 'text/csv')}>
          Export counts (CSV)
        </button>
      </div>
      <div className="summary-cards" role="group" aria-label="Summary">
        <Card label="NSP" value={String(counts.nsp)} note="specimens" />
        <Card label="NISP" value={`${counts.recorded.nisp} → ${counts.refitted.nisp}`} note="as recorded → with refits" />
        <Card label="NISP, fragments" value={`${counts.recorded.nispFragments} → ${counts.refitted.nispFragments}`} note="modern breaks count once" />
        <Card
          label="Identified to element"
          value={`${percent(counts.recorded.identifiedToElement)} → ${percent(counts.refitted.identifiedToElement)}`}
          note="share of all specimens"
          testId="rate-element"
        />
        <Card
          label="Identified to taxon"
          value={`${percent(counts.recorded.identifiedToTaxon)} → ${percent(counts.refitted.identifiedToTaxon)}`}
          note="share of all specimens"
        />
      </div>

      <div className="counts-grid">
        <div className="panel">
          <h2>By taxon</h2>
          <table className="counts-table" aria-label="NISP and MNI by taxon">
            <thead>
              <tr>
                <th rowSpan={2}>Taxon</th>
                <th colSpan={2}>NISP</th>
                <th colSpan={2}>MNI</th>
              </tr>
              <tr>
                <th className="sub">rec.</th>
                <th className="sub">refit</th>
                <th className="sub">rec.</th>
                <th className="sub">refit</th>
              </tr>
            </thead>
            <tbody>
              {taxonRows.map((r) => (
                <tr key={r.key}>
                  <th scope="row">{r.key}</th>
                  <Both rec={r.recorded?.nisp} ref={r.refitted?.nisp} />
                  <Both rec={r.recorded?.mni} ref={r.refitted?.mni} />
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        <div className="panel chart-panel">
          <div className="chart-head">
            <h2>%MAU</h2>
            {taxa.length > 1 && (
              <>
                <label htmlFor="mau-taxon">Taxon</label>
                <select id="mau-taxon" value={chartTaxon} onChange={(e) => setTaxon(e.target.value)}>
                  {taxa.map((t) => (
                    <option key={t}>{t}</option>
                  ))}
                </select>
              </>
            )}
            <button type="button" disabled={!chartTaxon} onClick={() => chart.current && saveSvg(chart.current, `mau-${chartTaxon}.svg`)}>
              Save SVG
            </button>
            <button type="button" disabled={!chartTaxon} onClick={() => chart.current && void savePng(chart.current, `mau-${chartTaxon}.png`)}>
              Save PNG
            </button>
          </div>
          {chartTaxon ? (
            <MauChart ref={chart} taxon={chartTaxon} recorded={counts.recorded.byElement} refitted={counts.refitted.byElement} colours={colours} />
          ) : (
            <p className="empty">No element with a known count per skeleton yet.</p>
          )}
        </div>
      </div>

      <div className="panel">
        <h2>By element</h2>
        <table className="counts-table" aria-label="NISP, MNE, MAU and %MAU by element">
          <thead>
            <tr>
              <th rowSpan={2}>Taxon</th>
              <th rowSpan={2}>Element</th>
              <th colSpan={2}>NISP</th>
              <th colSpan={2}>MNE left</th>
              <th colSpan={2}>MNE right</th>
              <th colSpan={2}>MNE</th>
              <th colSpan={2}>MAU</th>
              <th colSpan={2}>%MAU</th>
            </tr>
            <tr>
              {Array.from({ length: 6 }, (_, i) => (
                <SubHeads key={i} />
              ))}
            </tr>
          </thead>
          <tbody>
            {elementRows.map((r) => {
              const any = r.refitted ?? r.recorded!;
              return (
                <tr key={r.key} data-element={r.key}>
                  <td>{any.taxon}</td>
                  <th scope="row">{any.element}</th>
                  <Both rec={r.recorded?.nisp} ref={r.refitted?.nisp} />
                  <Both rec={r.recorded?.mneLeft} ref={r.refitted?.mneLeft} />
                  <Both rec={r.recorded?.mneRight} ref={r.refitted?.mneRight} />
                  <Both rec={r.recorded?.mne} ref={r.refitted?.mne} />
                  <Both rec={r.recorded?.mau} ref={r.refitted?.mau} />
                  <Both rec={r.recorded?.percentMau} ref={r.refitted?.percentMau} />
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
    </section>
  );
}

function SubHeads() {
  return (
    <>
      <th className="sub">rec.</th>
      <th className="sub">refit</th>
    </>
  );
}

function Card({ label, value, note, testId }: { label: string; value: string; note: string; testId?: string }) {
  return (
    <div className="card" data-testid={testId}>
      <span className="caption">{label}</span>
      <strong>{value}</strong>
      <span className="hint">{note}</span>
    </div>
  );
}
