import type { PlacedJoin } from '../analyse';
import type { UnitDefinition } from '../types';
import { bottomAxis, leftAxis, linearScale, niceStep } from './axis';
import { densityClasses, densityDots } from './point-density';
import { emptyExtent, include, padded } from './frame';
import { joinKind } from '../filters';
import { lineWidthFor, stylesFor, strokeAttrs } from './join-styles';
import { esc, heading, INK, label, MUTED, px, svgOpen, text } from './svg';

export interface PlanInput {
  /** Excavation units to outline. */
  units: readonly UnitDefinition[];
  /** Piece-plotted specimens (x easting, y northing, in metres). */
  specimens: readonly { x: number; y: number }[];
  /** Measured joins to draw as refit lines. */
  joins: readonly PlacedJoin[];
}

export interface PlanOptions {
  /** Added to the subtitle, e.g. which joins were selected. */
  note?: string;
  /** Width of the whole figure in pixels (height follows the site's shape). */
  width?: number;
  title?: string;
  /** Side of the square cell, in pixels, within which specimens are drawn as one dot. */
  cellPx?: number;
}

const LEGEND_W = 250;

/**
 * Plan of the excavation: units, piece-plotted specimens (aggregated into dots), and one
 * refit line per join, styled by join type. True scale in both directions (1 m east is as
 * long as 1 m north), grid north up, with a scale bar, a north arrow and labelled axes.
 */
export function planFigure(input: PlanInput, options: PlanOptions = {}): string {
  const width = options.width ?? 900;
  const cell = options.cellPx ?? 3;
  const left = 84;
  const top = 64;
  const bottom = 62;
  const plotW = width - left - LEGEND_W - 20;

  const e = emptyExtent();
  for (const u of input.units) {
    include(e, u.xMin, u.yMin);
    include(e, u.xMax, u.yMax);
  }
  for (const s of input.specimens) include(e, s.x, s.y);
  for (const j of input.joins) {
    include(e, j.from.x, j.from.y);
    include(e, j.to.x, j.to.y);
  }
  const ext = padded(e, 0.04, 0.25);
  const spanX = ext.xMax - ext.xMin;
  const spanY = ext.yMax - ext.yMin;
  // Same metres-per-pixel both ways; a tall site makes a tall figure, up to 1.4 times its width.
  let k = plotW / spanX;
  let plotH = spanY * k;
  const maxH = plotW * 1.4;
  let plotWUsed = plotW;
  if (plotH > maxH) {
    k = maxH / spanY;
    plotH = maxH;
    plotWUsed = spanX * k;
  }
  const height = Math.max(top + plotH + bottom, top + 330);
  const sx = linearScale([ext.xMin, ext.xMax], [left, left + plotWUsed]);
  const sy = linearScale([ext.yMin, ext.yMax], [top + plotH, top]);
  const step = niceStep(Math.max(spanX, spanY), 7);

  const kinds = input.joins.map((j) => joinKind(j.type, j.breakAge));
  const styles = stylesFor(kinds);
  const approximateCount = input.joins.filter((j) => j.approximate).length;

  let out = svgOpen(
    width,
    height,
    options.title ?? 'Plan of refits',
    `Plan of ${input.units.length} excavation units, ${input.specimens.length} piece-plotted specimens and ${input.joins.length} refit lines; grid north up.`,
  );
  out += heading(left, 24, options.title ?? 'Plan of refits',
    `${input.joins.length.toLocaleString('en-GB')} joins, ${input.specimens.length.toLocaleString('en-GB')} piece-plotted specimens${options.note ? `; ${options.note}` : ''}`);

  // Plot frame and units.
  out += `<rect x="${px(left)}" y="${px(top)}" width="${px(plotWUsed)}" height="${px(plotH)}" fill="none" stroke="${MUTED}"/>`;
  if (input.units.length) {
    // All units in one path (a site of thousands of 1 m squares stays small).
    let d = '';
    for (const u of input.units) {
      const x = sx(u.xMin);
      const y = sy(u.yMax);
      d += `M${px(x)} ${px(y)}h${px(sx(u.xMax) - x)}v${px(sy(u.yMin) - y)}h${px(x - sx(u.xMax))}z`;
    }
    out += `<path id="units" d="${d}" fill="#f2efe8" stroke="#9a9a9a" stroke-width="0.8"/>`;
    // Unit names only where there is room for them.
    const roomy = input.units.filter((u) => (u.xMax - u.xMin) * k >= 34 && (u.yMax - u.yMin) * k >= 16);
    if (roomy.length) {
      out += `<g id="unit-names" font-size="10" fill="${MUTED}" stroke="#f2efe8" stroke-width="2.5" paint-order="stroke">`;
      for (const u of roomy) out += text(sx(u.xMin) + 3, sy(u.yMax) + 11, u.unit);
      out += `</g>`;
    }
  }

  // Specimens, aggregated; positions relative to the figure's origin so cells are stable.
  const xs = new Float64Array(input.specimens.length);
  const ys = new Float64Array(input.specimens.length);
  input.specimens.forEach((s, i) => {
    xs[i] = sx(s.x);
    ys[i] = sy(s.y);
  });
  const dots = densityDots(xs, ys, cell, cell);
  out += `<g id="specimens">${dots.svg}</g>`;

  // Refit lines, one <line> per join, grouped by type so each group carries its stroke.
  out += `<g id="refits" fill="none" stroke-linecap="round">`;
  for (const [type, style] of styles) {
    out += `<g data-type="${esc(type)}" ${strokeAttrs(style, lineWidthFor(style, input.joins.length))}>`;
    for (let i = 0; i < input.joins.length; i++) {
      if (kinds[i] !== type) continue;
      const j = input.joins[i];
      out += `<line x1="${px(sx(j.from.x))}" y1="${px(sy(j.from.y))}" x2="${px(sx(j.to.x))}" y2="${px(sy(j.to.y))}"${j.approximate ? ' stroke-opacity=".4"' : ''}/>`;
    }
    out += `</g>`;
  }
  out += `</g>`;

  out += northArrow(left + plotWUsed - 26, top + 14);
  out += scaleBar(left + 14, top + plotH - 16, k, spanX);
  out += bottomAxis(sx, top + plotH, step, 'Easting (m)');
  out += leftAxis(sy, left, step, 'Northing (m)');
  out += legend(width - LEGEND_W, top, styles, kinds, approximateCount, cell, input.units.length > 0);
  return out + '</svg>';
}

/** An arrow pointing to grid north (up) with an N above it. */
function northArrow(x: number, y: number): string {
  return (
    `<g id="north-arrow">` +
    `<rect x="${px(x - 13)}" y="${px(y - 4)}" width="26" height="52" fill="#ffffff" fill-opacity=".85"/>` +
    text(x, y + 10, 'N', 'text-anchor="middle" font-weight="bold" font-size="13"') +
    `<path d="M${px(x)} ${px(y + 14)}L${px(x + 8)} ${px(y + 44)}L${px(x)} ${px(y + 37)}Z" fill="${INK}"/>` +
    `<path d="M${px(x)} ${px(y + 14)}L${px(x - 8)} ${px(y + 44)}L${px(x)} ${px(y + 37)}Z" fill="#ffffff" stroke="${INK}" stroke-width="1"/>` +
    `</g>`
  );
}

/** A two-part scale bar of a round length near a fifth of the plot's width, bottom left. */
function scaleBar(x: number, y: number, pxPerM: number, spanM: number): string {
  const lengthM = niceStep(spanM / 5, 1);
  const w = lengthM * pxPerM;
  const half = w / 2;
  const unit = lengthM < 1 ? `${label(lengthM * 100, 0)} cm` : `${label(lengthM, 2)} m`;
  return (
    `<g id="scale-bar">` +
    `<rect x="${px(x - 6)}" y="${px(y - 22)}" width="${px(w + 10 + 6.5 * unit.length)}" height="30" fill="#ffffff" fill-opacity=".85"/>` +
    `<rect x="${px(x)}" y="${px(y - 5)}" width="${px(half)}" height="5" fill="${INK}" stroke="${INK}" stroke-width=".8"/>` +
    `<rect x="${px(x + half)}" y="${px(y - 5)}" width="${px(half)}" height="5" fill="#ffffff" stroke="${INK}" stroke-width=".8"/>` +
    text(x, y - 9, '0', 'text-anchor="middle" font-size="11"') +
    text(x + w, y - 9, unit, 'text-anchor="start" font-size="11" dx="-4"') +
    `</g>`
  );
}

function legend(
  x: number,
  y: number,
  styles: ReturnType<typeof stylesFor>,
  kinds: readonly string[],
  approximateCount: number,
  cell: number,
  hasUnits: boolean,
): string {
  const counts = new Map<string, number>();
  for (const k of kinds) counts.set(k, (counts.get(k) ?? 0) + 1);
  let out = `<g id="legend" font-size="12">`;
  let row = y + 4;
  out += text(x, row, 'Refit lines', 'font-weight="bold"');
  row += 20;
  if (styles.size === 0) {
    out += text(x, row, 'no joins to draw', `fill="${MUTED}"`);
    row += 20;
  }
  for (const [type, style] of styles) {
    out += `<path d="M${px(x)} ${px(row - 4)}h34" fill="none" ${strokeAttrs(style, 2.2)}/>`;
    out += text(x + 42, row, `${style.label} (${counts.get(type) ?? 0})`, 'font-size="11"');
    row += 19;
  }
  if (approximateCount > 0) {
    out += `<path d="M${px(x)} ${px(row - 4)}h34" stroke="${INK}" stroke-width="2" stroke-opacity=".4"/>`;
    out += text(x + 42, row, `paler: an end placed at unit`, 'font-size="11"');
    out += text(x + 42, row + 13, `centre and level mid-depth (${approximateCount})`, 'font-size="11"');
    row += 32;
  }
  row += 10;
  out += text(x, row, 'Specimens per dot', 'font-weight="bold"');
  row += 18;
  for (const c of densityClasses) {
    out += `<path d="M${px(x + 17)} ${px(row - 4)}h0" stroke="${c.colour}" stroke-width="${Math.max(cell, 5)}" stroke-linecap="round"/>`;
    out += text(x + 42, row, c.label, 'font-size="11"');
    row += 17;
  }
  out += text(x, row, `(one dot per ${cell} px square)`, `font-size="10" fill="${MUTED}"`);
  row += 22;
  if (hasUnits) {
    out += `<rect x="${px(x + 6)}" y="${px(row - 11)}" width="22" height="14" fill="#f2efe8" stroke="#9a9a9a"/>`;
    out += text(x + 42, row, 'Excavation unit', 'font-size="11"');
  }
  return out + '</g>';
}
