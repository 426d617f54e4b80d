import { bottomAxis, leftAxis, linearScale, niceStep } from './axis';
import { heading, label, MUTED, px, svgOpen } from './svg';

export type DistanceMeasure = 'horizontal' | 'vertical' | '3d';

export interface HistogramOptions {
  /** Added to the subtitle, e.g. which joins were selected. */
  note?: string;
  width?: number;
  height?: number;
  title?: string;
  /** Bin width in metres; by default a round width giving about 20 bins. */
  binM?: number;
}

const measureLabel: Record<DistanceMeasure, string> = {
  horizontal: 'Horizontal distance between joined specimens (m)',
  vertical: 'Vertical displacement between joined specimens (m)',
  '3d': 'Distance in space between joined specimens (m)',
};

/** Counts of values in bins [i*w, (i+1)*w); the last bin also takes the maximum. */
export function binCounts(values: readonly number[], binM: number): number[] {
  const max = values.reduce((m, v) => (v > m ? v : m), 0);
  const n = Math.max(1, Math.ceil(max / binM - 1e-9));
  const counts = new Array<number>(n).fill(0);
  for (const v of values) counts[Math.min(n - 1, Math.max(0, Math.floor(v / binM)))]++;
  return counts;
}

/** Histogram of refit distances: one bar per bin, joins counted on the vertical axis. */
export function distanceHistogram(values: readonly number[], measure: DistanceMeasure, options: HistogramOptions = {}): string {
  const width = options.width ?? 720;
  const height = options.height ?? 420;
  const left = 80;
  const top = 64;
  const right = 24;
  const bottom = 62;
  const max = values.reduce((m, v) => (v > m ? v : m), 0);
  const binM = options.binM ?? niceStep(max || 1, 20);
  const counts = binCounts(values, binM);
  const top_ = Math.max(1, ...counts);
  const countStep = Math.max(1, niceStep(top_, 5));
  const yMax = Math.ceil(top_ / countStep) * countStep;
  const sx = linearScale([0, counts.length * binM], [left, width - right]);
  const sy = linearScale([0, yMax], [height - bottom, top]);
  const title = options.title ?? 'Refit distances';
  let out = svgOpen(width, height, title, `Histogram of ${values.length} joins in bins of ${label(binM, 3)} m.`);
  out += heading(left, 24, title, `${values.length.toLocaleString('en-GB')} joins, bins of ${label(binM, 3)} m${options.note ? `; ${options.note}` : ''}`);
  out += `<g id="bars" fill="#4d7ab0" stroke="#1d3f6e" stroke-width=".8">`;
  counts.forEach((c, i) => {
    if (c === 0) return;
    const x0 = sx(i * binM);
    const x1 = sx((i + 1) * binM);
    out += `<rect x="${px(x0)}" y="${px(sy(c))}" width="${px(x1 - x0)}" height="${px(sy(0) - sy(c))}"/>`;
  });
  out += `</g>`;
  out += `<path d="M${px(left)} ${px(top)}H${px(width - right)}V${px(height - bottom)}" fill="none" stroke="${MUTED}" stroke-opacity=".4"/>`;
  out += bottomAxis(sx, height - bottom, niceStep(counts.length * binM, 8), measureLabel[measure]);
  out += leftAxis(sy, left, countStep, 'Number of joins');
  return out + '</svg>';
}
