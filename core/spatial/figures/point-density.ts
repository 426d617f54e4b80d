import { px } from './svg';

/**
 * Many specimens on a small figure: points falling in the same small square of the drawing
 * are drawn once, shaded by how many they are. A figure of 10,000 specimens then holds a few
 * thousand dots at most, whatever the site.
 */
export interface DensityClass {
  /** Lowest count drawn in this class. */
  from: number;
  colour: string;
  label: string;
}

export const densityClasses: DensityClass[] = [
  { from: 1, colour: '#a9a9a9', label: '1' },
  { from: 2, colour: '#6e6e6e', label: '2-4' },
  { from: 5, colour: '#262626', label: '5 or more' },
];

export interface DensityDots {
  /** One SVG path per class (empty classes give ''). */
  svg: string;
  /** How many dots were drawn. */
  dots: number;
}

/**
 * Bin pixel positions into square cells of `cell` pixels and draw each occupied cell as a
 * round dot of `dot` pixels at the cell centre (a zero-length stroke with round caps: the
 * smallest way to write a dot in SVG).
 */
export function densityDots(xs: ArrayLike<number>, ys: ArrayLike<number>, cell: number, dot: number): DensityDots {
  const counts = new Map<number, number>();
  const stride = 1 << 16;
  for (let i = 0; i < xs.length; i++) {
    const cx = Math.floor(xs[i] / cell);
    const cy = Math.floor(ys[i] / cell);
    if (!Number.isFinite(cx) || !Number.isFinite(cy) || cx < 0 || cy < 0 || cx >= stride || cy >= stride) continue;
    const key = cy * stride + cx;
    counts.set(key, (counts.get(key) ?? 0) + 1);
  }
  const keys = [...counts.keys()].sort((p, q) => p - q);
  let svg = '';
  for (let c = 0; c < densityClasses.length; c++) {
    const lo = densityClasses[c].from;
    const hi = c + 1 < densityClasses.length ? densityClasses[c + 1].from : Infinity;
    // Cells come row by row; along a row, a relative move ("m dx 0") is shorter than a new "M x y".
    let d = '';
    let lastRow = -1;
    let lastCol = 0;
    for (const key of keys) {
      const n = counts.get(key) as number;
      if (n < lo || n >= hi) continue;
      const col = key % stride;
      const row = Math.floor(key / stride);
      if (row === lastRow) d += `m${px((col - lastCol) * cell)} 0h0`;
      else d += `M${px(col * cell + cell / 2)} ${px(row * cell + cell / 2)}h0`;
      lastRow = row;
      lastCol = col;
    }
    if (d) {
      svg += `<path d="${d}" stroke="${densityClasses[c].colour}" stroke-width="${dot}" stroke-linecap="round" fill="none"/>`;
    }
  }
  return { svg, dots: counts.size };
}
