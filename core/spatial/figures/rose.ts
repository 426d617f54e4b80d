import { axialBearing } from '../measures';
import { niceStep, ticks } from './axis';
import { esc, heading, INK, label, MUTED, px, svgOpen, text } from './svg';

export interface RoseOptions {
  /** Added to the subtitle, e.g. which joins were selected. */
  note?: string;
  width?: number;
  title?: string;
  /** Sector width in degrees (must divide 180); default 15. */
  sectorDeg?: number;
  /**
   * A join has no preferred end, so by default each bearing is folded onto 0-180 and drawn
   * in both opposite sectors (an axial rose). Set false to draw bearings from A to B as recorded.
   */
  axial?: boolean;
}

/** Counts of bearings per sector, sector i covering [i*w, (i+1)*w) clockwise from north. */
export function sectorCounts(bearings: readonly number[], sectorDeg: number, axial: boolean): number[] {
  const n = Math.round(360 / sectorDeg);
  const counts = new Array<number>(n).fill(0);
  for (const b of bearings) {
    if (axial) {
      const f = axialBearing(b);
      const i = Math.floor(f / sectorDeg) % n;
      counts[i]++;
      counts[(i + n / 2) % n]++;
    } else {
      counts[Math.floor((((b % 360) + 360) % 360) / sectorDeg) % n]++;
    }
  }
  return counts;
}

/**
 * Rose diagram of refit directions on the site grid, north up. Sector radius grows with the
 * square root of the count, so sector area is proportional to the number of joins (a wedge's
 * area grows with the square of its radius).
 */
export function roseDiagram(bearings: readonly number[], options: RoseOptions = {}): string {
  const width = options.width ?? 520;
  const sectorDeg = options.sectorDeg ?? 15;
  const axial = options.axial ?? true;
  if (!(sectorDeg > 0) || Math.abs(180 / sectorDeg - Math.round(180 / sectorDeg)) > 1e-9) {
    throw new RangeError(`sector width ${sectorDeg} degrees does not divide 180`);
  }
  const R = (width - 140) / 2;
  const cx = width / 2;
  const cy = 80 + 30 + R;
  const height = cy + R + 66;
  const counts = sectorCounts(bearings, sectorDeg, axial);
  const maxCount = Math.max(1, ...counts);
  const r = (c: number) => R * Math.sqrt(c / maxCount);
  const title = options.title ?? 'Refit directions';
  const sub = `${bearings.length.toLocaleString('en-GB')} joins, ${label(sectorDeg, 1)}° sectors, ${axial ? 'axial (each join drawn both ways)' : 'from A to B'}; area ∝ joins`;
  let out = svgOpen(width, height, title, `Rose diagram of ${bearings.length} refit directions. ${sub}.`);
  out += heading(20, 24, title, options.note ? `${sub}; ${options.note}` : sub);

  // Point at a bearing (clockwise from north, up) and radius.
  const at = (deg: number, radius: number) => {
    const t = (deg * Math.PI) / 180;
    return [cx + radius * Math.sin(t), cy - radius * Math.cos(t)] as const;
  };

  // Rings at round counts, labelled along the north-east diagonal.
  const step = Math.max(1, niceStep(maxCount, 4));
  let rings = '';
  let ringLabels = '';
  for (const c of ticks(step, maxCount, step)) {
    rings += `<circle cx="${px(cx)}" cy="${px(cy)}" r="${px(r(c))}"/>`;
    const [lx, ly] = at(45 + sectorDeg / 2, r(c));
    ringLabels += text(lx + 3, ly - 2, label(c, 0), `font-size="10" fill="${MUTED}"`);
  }
  out += `<g id="rings" fill="none" stroke="#c4c4c4" stroke-width=".8">${rings}<circle cx="${px(cx)}" cy="${px(cy)}" r="${px(R)}" stroke="${MUTED}"/></g>`;
  let spokes = '';
  for (let d = 0; d < 360; d += 45) {
    const [x, y] = at(d, R);
    spokes += `M${px(cx)} ${px(cy)}L${px(x)} ${px(y)}`;
  }
  out += `<path d="${spokes}" stroke="#d8d8d8" stroke-width=".8" fill="none"/>`;

  let wedges = '';
  counts.forEach((c, i) => {
    if (c === 0) return;
    const rr = r(c);
    const [x0, y0] = at(i * sectorDeg, rr);
    const [x1, y1] = at((i + 1) * sectorDeg, rr);
    wedges += `M${px(cx)} ${px(cy)}L${px(x0)} ${px(y0)}A${px(rr)} ${px(rr)} 0 0 1 ${px(x1)} ${px(y1)}Z`;
  });
  out += `<path id="sectors" d="${wedges}" fill="#4d7ab0" fill-opacity=".85" stroke="#1d3f6e" stroke-width=".8"/>`;
  out += `<g id="ring-labels">${ringLabels}</g>`;

  const compass: [number, string][] = [[0, 'N'], [90, 'E'], [180, 'S'], [270, 'W']];
  out += `<g id="compass" font-size="14" font-weight="bold" fill="${INK}" text-anchor="middle">`;
  for (const [deg, name] of compass) {
    const [x, y] = at(deg, R + 18);
    out += `<text x="${px(x)}" y="${px(y + 5)}">${esc(name)}</text>`;
  }
  out += `</g>`;
  out += text(cx, height - 14, 'Bearing clockwise from grid north; rings: number of joins per sector', `text-anchor="middle" font-size="11" fill="${MUTED}"`);
  return out + '</svg>';
}
