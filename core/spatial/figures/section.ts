import type { PlacedJoin } from '../analyse';
import { compareLayerNames } from '../analyse';
import type { LayerBoundaryPoint } from '../types';
import { bottomAxis, leftAxis, linearScale, niceStep } from './axis';
import { densityClasses, densityDots } from './point-density';
import { joinKind } from '../filters';
import { lineWidthFor, stylesFor, strokeAttrs } from './join-styles';
import { esc, heading, label, MUTED, px, svgOpen, text } from './svg';

/** The line a section is drawn along: its direction as a bearing, and optionally a strip. */
export interface SectionAxis {
  /** Direction in which distance along the section grows, degrees clockwise from grid north: 90 = eastwards (x), 0 = northwards (y). */
  bearingDeg: number;
  /** Keep only what lies this far (metres) to either side of the line through `origin`; all when absent. */
  halfWidthM?: number;
  /** A point on the section line (default 0, 0). */
  origin?: { x: number; y: number };
}

export interface SectionInput {
  specimens: readonly { x: number; y: number; z: number }[];
  joins: readonly PlacedJoin[];
  layerBoundaries: readonly LayerBoundaryPoint[];
}

export interface SectionOptions {
  /** Added to the subtitle, e.g. which joins were selected. */
  note?: string;
  width?: number;
  height?: number;
  title?: string;
  cellPx?: number;
}

/** Distance along the section line and signed offset from it (positive to the right looking along it). */
export function projectOnAxis(axis: SectionAxis, x: number, y: number): { along: number; offset: number } {
  const t = (axis.bearingDeg * Math.PI) / 180;
  const ux = Math.sin(t);
  const uy = Math.cos(t);
  const dx = x - (axis.origin?.x ?? 0);
  const dy = y - (axis.origin?.y ?? 0);
  return { along: dx * ux + dy * uy, offset: dx * uy - dy * ux };
}

const LEGEND_W = 220;
const BOUNDARY = '#6b4f24';
/** Pale tints for alternate layers, told apart by their lightness as much as by hue. */
const BANDS = ['#f6f1e6', '#e8eef5', '#efefef', '#f3ebe0'];

/**
 * Section: specimens and refit lines projected on a vertical plane along the chosen axis,
 * elevation up, with the top of each layer drawn through its boundary points where the
 * catalogue defines them. Vertical and horizontal scales differ (sites are wide and shallow);
 * the vertical exaggeration is printed on the figure.
 */
export function sectionFigure(input: SectionInput, axis: SectionAxis, options: SectionOptions = {}): string {
  const width = options.width ?? 900;
  const height = options.height ?? 480;
  const cell = options.cellPx ?? 3;
  const left = 84;
  const top = 64;
  const bottom = 62;
  const plotW = width - left - LEGEND_W - 20;
  const plotH = height - top - bottom;
  const inStrip = (offset: number) => axis.halfWidthM === undefined || Math.abs(offset) <= axis.halfWidthM;

  const pts: { along: number; z: number }[] = [];
  for (const s of input.specimens) {
    const p = projectOnAxis(axis, s.x, s.y);
    if (inStrip(p.offset)) pts.push({ along: p.along, z: s.z });
  }
  const lines: { j: PlacedJoin; a0: number; z0: number; a1: number; z1: number }[] = [];
  for (const j of input.joins) {
    const p = projectOnAxis(axis, j.from.x, j.from.y);
    const q = projectOnAxis(axis, j.to.x, j.to.y);
    if (!inStrip(p.offset) && !inStrip(q.offset)) continue;
    lines.push({ j, a0: p.along, z0: j.from.z, a1: q.along, z1: j.to.z });
  }
  const boundaries = new Map<string, { along: number; z: number }[]>();
  for (const b of input.layerBoundaries) {
    const p = projectOnAxis(axis, b.x, b.y);
    if (!inStrip(p.offset)) continue;
    const list = boundaries.get(b.layer) ?? [];
    list.push({ along: p.along, z: b.z });
    boundaries.set(b.layer, list);
  }

  let aMin = Infinity, aMax = -Infinity, zMin = Infinity, zMax = -Infinity;
  const take = (a: number, z: number) => {
    if (a < aMin) aMin = a;
    if (a > aMax) aMax = a;
    if (z < zMin) zMin = z;
    if (z > zMax) zMax = z;
  };
  for (const p of pts) take(p.along, p.z);
  for (const l of lines) {
    take(l.a0, l.z0);
    take(l.a1, l.z1);
  }
  for (const list of boundaries.values()) for (const p of list) take(p.along, p.z);
  if (!Number.isFinite(aMin)) {
    aMin = 0; aMax = 1; zMin = 0; zMax = 1;
  }
  const padA = Math.max(0.2, 0.03 * (aMax - aMin));
  const padZ = Math.max(0.05, 0.06 * (zMax - zMin));
  const sa = linearScale([aMin - padA, aMax + padA], [left, left + plotW]);
  const sz = linearScale([zMin - padZ, zMax + padZ], [top + plotH, top]);
  const pxPerMAlong = plotW / (aMax - aMin + 2 * padA);
  const pxPerMUp = plotH / (zMax - zMin + 2 * padZ);
  const exaggeration = pxPerMUp / pxPerMAlong;

  const kinds = lines.map((l) => joinKind(l.j.type, l.j.breakAge));
  const styles = stylesFor(kinds);
  const title = options.title ?? 'Section of refits';
  const direction = `bearing ${label(((axis.bearingDeg % 360) + 360) % 360, 1)}°`;
  let out = svgOpen(width, height, title,
    `Section along ${direction}: ${pts.length} specimens and ${lines.length} refit lines projected; vertical exaggeration ${label(exaggeration, 1)} times.`);
  out += heading(left, 24, title,
    `Projected along ${direction}${axis.origin ? ` from (${label(axis.origin.x, 2)}, ${label(axis.origin.y, 2)})` : ''}${axis.halfWidthM !== undefined ? `, within ${label(axis.halfWidthM, 2)} m of the line` : ''}; vertical exaggeration ×${label(exaggeration, 1)}${options.note ? `; ${options.note}` : ''}`);
  out += `<rect x="${px(left)}" y="${px(top)}" width="${px(plotW)}" height="${px(plotH)}" fill="none" stroke="${MUTED}"/>`;

  // Layers: each drawn as a pale band from its top down to the plot's floor, the highest layer
  // first so that each lower one covers the rest; the tops are drawn again over the refit lines.
  const layerNames = [...boundaries.keys()].sort(compareLayerNames);
  const meanZ = (name: string) => {
    const list = boundaries.get(name) as { along: number; z: number }[];
    return list.reduce((t, p) => t + p.z, 0) / list.length;
  };
  const topDown = [...layerNames].sort((p, q) => meanZ(q) - meanZ(p));
  const tops = new Map<string, string>();
  for (const name of topDown) {
    const list = (boundaries.get(name) as { along: number; z: number }[]).sort((p, q) => p.along - q.along);
    // Carried flat to the frame beyond the first and last boundary points.
    const xsL = [left, ...list.map((p) => sa(p.along)), left + plotW];
    const ysL = [sz(list[0].z), ...list.map((p) => sz(p.z)), sz(list[list.length - 1].z)];
    tops.set(name, xsL.map((x, i) => `${i ? 'L' : 'M'}${px(Math.min(left + plotW, Math.max(left, x)))} ${px(ysL[i])}`).join(''));
  }
  if (topDown.length) {
    out += `<g id="layer-bands" stroke="none">`;
    topDown.forEach((name, i) => {
      out += `<path d="${tops.get(name)}V${px(top + plotH)}H${px(left)}Z" fill="${BANDS[i % BANDS.length]}"/>`;
    });
    out += `</g>`;
  }
  const xs = new Float64Array(pts.length);
  const ys = new Float64Array(pts.length);
  pts.forEach((p, i) => {
    xs[i] = sa(p.along);
    ys[i] = sz(p.z);
  });
  out += `<g id="specimens">${densityDots(xs, ys, cell, cell).svg}</g>`;

  out += `<g id="refits" fill="none" stroke-linecap="round">`;
  for (const [type, style] of styles) {
    out += `<g data-type="${esc(type)}" ${strokeAttrs(style, lineWidthFor(style, input.joins.length))}>`;
    for (let i = 0; i < lines.length; i++) {
      if (kinds[i] !== type) continue;
      const l = lines[i];
      out += `<line x1="${px(sa(l.a0))}" y1="${px(sz(l.z0))}" x2="${px(sa(l.a1))}" y2="${px(sz(l.z1))}"${l.j.approximate ? ' stroke-opacity=".4"' : ''}/>`;
    }
    out += `</g>`;
  }
  out += `</g>`;

  if (topDown.length) {
    out += `<g id="layer-boundaries" fill="none" stroke-linejoin="round">`;
    for (const name of topDown) {
      out += `<path d="${tops.get(name)}" stroke="#ffffff" stroke-width="4.5"/><path d="${tops.get(name)}" stroke="${BOUNDARY}" stroke-width="2"/>`;
    }
    out += `</g><g id="layer-names" font-size="12" font-weight="bold" fill="${BOUNDARY}" stroke="#ffffff" stroke-width="3" paint-order="stroke">`;
    for (const name of topDown) {
      const list = boundaries.get(name) as { along: number; z: number }[];
      out += text(left + 6, sz(list[0].z) + 15, `Layer ${name}`);
    }
    out += `</g>`;
  }

  out += bottomAxis(sa, top + plotH, niceStep(aMax - aMin + 2 * padA, 7), `Distance along the section, ${direction} (m)`);
  out += leftAxis(sz, left, niceStep(zMax - zMin + 2 * padZ, 9), 'Elevation (m)');

  // Legend.
  const lx = width - LEGEND_W;
  let row = top + 4;
  out += `<g id="legend" font-size="11">` + text(lx, row, 'Refit lines', 'font-weight="bold" font-size="12"');
  row += 20;
  for (const [, style] of styles) {
    out += `<path d="M${px(lx)} ${px(row - 4)}h34" fill="none" ${strokeAttrs(style, 2.2)}/>` + text(lx + 42, row, style.label);
    row += 19;
  }
  if (topDown.length) {
    row += 6;
    out += `<path d="M${px(lx)} ${px(row - 4)}h34" stroke="${BOUNDARY}" stroke-width="2"/>` + text(lx + 42, row, 'Top of a layer (shaded bands:');
    out += text(lx + 42, row + 13, 'layers, top flat beyond data)');
    row += 32;
  }
  row += 8;
  out += text(lx, row, 'Specimens per dot', 'font-weight="bold" font-size="12"');
  row += 18;
  for (const c of densityClasses) {
    out += `<path d="M${px(lx + 17)} ${px(row - 4)}h0" stroke="${c.colour}" stroke-width="${Math.max(cell, 5)}" stroke-linecap="round"/>` + text(lx + 42, row, c.label);
    row += 17;
  }
  out += `</g>`;
  return out + '</svg>';
}
