import { useEffect, useRef, useState } from 'react';
import { callByName } from '../../api/loose';
import { savePng, saveSvg } from '../../app/figure-export';
import { Problems } from '../../app/Problems';
import { useWorkspace } from '../../app/workspace';

/** The figures the host draws (core/spatial/figures), in the order an analyst reads them. */
const FIGURES = [
  { kind: 'plan', label: 'Plan' },
  { kind: 'section', label: 'Section' },
  { kind: 'histogram', label: 'Distances' },
  { kind: 'rose', label: 'Directions' },
  { kind: 'layers', label: 'Layer links' },
] as const;
type FigureKind = (typeof FIGURES)[number]['kind'];

interface SpatialSummary {
  count: number;
  meanHorizontalM: number | null;
  medianHorizontalM: number | null;
  maxHorizontalM: number | null;
  medianVerticalM: number | null;
  maxVerticalM: number | null;
  shareCrossingLevel: number | null;
  shareCrossingLayer: number | null;
}

const metres = (v: number | null | undefined): string => (v === null || v === undefined ? '–' : `${v.toFixed(2)} m`);
const share = (v: number | null | undefined): string => (v === null || v === undefined ? '–' : `${Math.round(v * 100)}%`);

/**
 * Site map: where refitted pieces lie. The host measures the accepted joins (spatial.analyse)
 * and draws each figure as SVG (spatial.figure); the screen shows them and saves them as SVG
 * or PNG for print.
 */
export function SiteMapScreen() {
  const ws = useWorkspace();
  const available = ws.has('spatial.figure') && ws.has('spatial.analyse');
  const [kind, setKind] = useState<FigureKind>('plan');
  const [summary, setSummary] = useState<SpatialSummary | null>(null);
  const [svgText, setSvgText] = useState<string | null>(null);
  const [error, setError] = useState<unknown>(null);
  const holder = useRef<HTMLDivElement>(null);

  useEffect(() => {
    if (!available) return;
    let live = true;
    callByName<{ summary: SpatialSummary }>(ws.client, 'spatial.analyse', { catalogue: ws.catalogue })
      .then((r) => live && setSummary(r.summary))
      .catch((e) => live && setError(e));
    return () => {
      live = false;
    };
  }, [ws.client, ws.catalogue, ws.revision, available]);

  useEffect(() => {
    if (!available) return;
    let live = true;
    setSvgText(null);
    callByName<{ svg: string }>(ws.client, 'spatial.figure', { catalogue: ws.catalogue, kind, width: 900 })
      .then((r) => {
        if (live) {
          setSvgText(r.svg);
          setError(null);
        }
      })
      .catch((e) => live && setError(e));
    return () => {
      live = false;
    };
  }, [ws.client, ws.catalogue, ws.revision, available, kind]);

  // The figure is SVG text from our own host: parse it and place the element, so it can be
  // saved again as SVG or PNG (no inline script or style is involved).
  useEffect(() => {
    const box = holder.current;
    if (!box) return;
    box.replaceChildren();
    if (!svgText) return;
    const doc = new DOMParser().parseFromString(svgText, 'image/svg+xml');
    const svg = doc.documentElement;
    if (svg.nodeName !== 'svg') return;
    svg.setAttribute('role', 'img');
    svg.setAttribute('aria-label', `${FIGURES.find((f) => f.kind === kind)?.label ?? kind} of the refits`);
    box.appendChild(document.importNode(svg, true));
  }, [svgText, kind]);

  const currentSvg = (): SVGSVGElement | null => holder.current?.querySelector('svg') ?? null;

  if (!available) return <p className="empty">Spatial analysis is not available in this knitbone yet.</p>;

  return (
    <section className="site-map-screen" aria-labelledby="site-map-title">
      <div className="screen-head">
        <h1 id="site-map-title">Site map</h1>
        <div className="figure-actions">
          <button type="button" disabled={!svgText} onClick={() => { const s = currentSvg(); if (s) saveSvg(s, `refits-${kind}.svg`); }}>
            Save SVG
          </button>
          <button
            type="button"
            disabled={!svgText}
            onClick={() => {
              const s = currentSvg();
              if (s) savePng(s, `refits-${kind}.png`).catch((e: unknown) => ws.say(e instanceof Error ? e.message : String(e), 'error'));
            }}
          >
            Save PNG
          </button>
        </div>
      </div>

      {summary && (
        <div className="summary-cards" role="group" aria-label="Refit distances">
          <div className="card" data-testid="spatial-count">
            <span className="caption">Accepted joins placed</span>
            <strong>{summary.count}</strong>
            <span className="hint">with coordinates or unit and level</span>
          </div>
          <div className="card">
            <span className="caption">Horizontal distance</span>
            <strong>{metres(summary.medianHorizontalM)}</strong>
            <span className="hint">median; longest {metres(summary.maxHorizontalM)}</span>
          </div>
          <div className="card">
            <span className="caption">Vertical displacement</span>
            <strong>{metres(summary.medianVerticalM)}</strong>
            <span className="hint">median; largest {metres(summary.maxVerticalM)}</span>
          </div>
          <div className="card">
            <span className="caption">Crossing levels / layers</span>
            <strong>
              {share(summary.shareCrossingLevel)} / {share(summary.shareCrossingLayer)}
            </strong>
            <span className="hint">share of placed joins</span>
          </div>
        </div>
      )}

      <div className="panel">
        <div role="radiogroup" aria-label="Figure" className="figure-choice">
          {FIGURES.map((f) => (
            <label key={f.kind}>
              <input type="radio" name="site-figure" value={f.kind} checked={kind === f.kind} onChange={() => setKind(f.kind)} />
              {f.label}
            </label>
          ))}
        </div>
        {error ? <Problems error={error} /> : null}
        {!svgText && !error && <p className="empty" aria-busy="true">Drawing...</p>}
        <div ref={holder} className="site-figure" data-testid="site-figure" />
      </div>
    </section>
  );
}
