import type { LayerCrossing } from '../analyse';
import { esc, heading, INK, MUTED, px, svgOpen, text } from './svg';

export interface LayerMatrixOptions {
  title?: string;
  note?: string;
}

/** Cell shade for a share of the largest count: white to deep blue in even steps of lightness. */
function shade(share: number): string {
  const light = [255, 255, 255];
  const dark = [29, 79, 145];
  const c = light.map((l, i) => Math.round(l + (dark[i] - l) * Math.sqrt(share)));
  return `rgb(${c.join(',')})`;
}

const percent = (v: number | null) => (v === null ? '–' : `${Math.round(v * 100)} %`);

/**
 * The layer-to-layer connection matrix as a table: one row and one column per layer, each cell
 * the number of joins between the two (shaded by count, the diagonal outlined: joins within a
 * layer), and beside each row the joins reaching that layer, the share leaving it and the share
 * crossing levels (the usual evidence for or against mixing between layers).
 */
export function layerMatrixFigure(
  matrix: Record<string, Record<string, number>>,
  perLayer: Record<string, LayerCrossing>,
  order: readonly string[],
  options: LayerMatrixOptions = {},
): string {
  // Rows and columns in reading order; only layers that have a row in the matrix.
  const layers = order.filter((l) => matrix[l] !== undefined);
  const cell = 44;
  const left = 20;
  const labelW = Math.max(60, 8 * Math.max(0, ...layers.map((l) => l.length)) + 16);
  const top = 96;
  const gridX = left + labelW;
  const statsX = gridX + layers.length * cell + 24;
  const statCols = ['joins', 'leave layer', 'cross levels'];
  const statW = 86;
  const width = Math.max(560, statsX + statCols.length * statW + 10);
  const height = top + Math.max(1, layers.length) * cell + 62;
  let max = 0;
  for (const p of layers) for (const q of layers) max = Math.max(max, matrix[p][q]);

  const title = options.title ?? 'Joins between layers';
  let out = svgOpen(width, height, title, `Layer-to-layer connection matrix of ${layers.length} layers, with per-layer shares of joins leaving the layer and crossing levels.`);
  out += heading(left, 24, title, options.note ? `Number of joins between a specimen in the row's layer and one in the column's; ${options.note}` : "Number of joins between a specimen in the row's layer and one in the column's");
  if (layers.length === 0) {
    out += text(left, top + 20, 'No joins between specimens with recorded layers.', `fill="${MUTED}"`);
    return out + '</svg>';
  }
  out += `<g id="column-names" font-weight="bold" text-anchor="middle">`;
  layers.forEach((q, j) => (out += text(gridX + j * cell + cell / 2, top - 10, q)));
  statCols.forEach((c, k) => (out += text(statsX + k * statW + statW / 2, top - 10, c, 'font-weight="normal" font-size="11"')));
  out += `</g><g id="matrix" font-size="13" text-anchor="middle">`;
  layers.forEach((p, i) => {
    const y = top + i * cell;
    out += text(gridX - 10, y + cell / 2 + 5, p, 'text-anchor="end" font-weight="bold"');
    layers.forEach((q, j) => {
      const n = matrix[p][q];
      const share = max ? n / max : 0;
      const x = gridX + j * cell;
      out += `<rect x="${px(x)}" y="${px(y)}" width="${cell}" height="${cell}" fill="${shade(share)}" stroke="#c8c8c8"/>`;
      out += `<text x="${px(x + cell / 2)}" y="${px(y + cell / 2 + 5)}" fill="${share > 0.45 ? '#ffffff' : INK}">${n}</text>`;
    });
    const c = perLayer[p];
    const stats = c ? [String(c.joins), percent(c.shareCrossingLayer), percent(c.shareCrossingLevel)] : ['–', '–', '–'];
    stats.forEach((v, k) => (out += `<text x="${px(statsX + k * statW + statW / 2)}" y="${px(y + cell / 2 + 5)}">${esc(v)}</text>`));
  });
  out += `</g><path id="within-layer" d="${layers.map((_, i) => `M${px(gridX + i * cell + 1)} ${px(top + i * cell + 1)}h${cell - 2}v${cell - 2}h${-(cell - 2)}Z`).join('')}" fill="none" stroke="${INK}" stroke-width="2"/>`;
  const foot = top + layers.length * cell + 26;
  out += text(left, foot, 'Outlined: joins within one layer.', `font-size="11" fill="${MUTED}"`);
  out += text(left, foot + 15, 'Shares count the joins whose other specimen has its layer (or level) recorded.', `font-size="11" fill="${MUTED}"`);
  return out + '</svg>';
}
