import type { GridPoint } from '../measures';

/** The rectangle of site grid a figure covers. */
export interface Extent {
  xMin: number;
  xMax: number;
  yMin: number;
  yMax: number;
}

/** Grow an extent to hold every point; start from `emptyExtent()`. */
export function emptyExtent(): Extent {
  return { xMin: Infinity, xMax: -Infinity, yMin: Infinity, yMax: -Infinity };
}

export function include(e: Extent, x: number, y: number): void {
  if (!Number.isFinite(x) || !Number.isFinite(y)) return;
  if (x < e.xMin) e.xMin = x;
  if (x > e.xMax) e.xMax = x;
  if (y < e.yMin) e.yMin = y;
  if (y > e.yMax) e.yMax = y;
}

/** Pad by a share of the larger side (at least `minPad`), and give an empty extent 1 m of room. */
export function padded(e: Extent, share: number, minPad: number): Extent {
  if (!Number.isFinite(e.xMin)) return { xMin: 0, xMax: 1, yMin: 0, yMax: 1 };
  const pad = Math.max(minPad, share * Math.max(e.xMax - e.xMin, e.yMax - e.yMin));
  return { xMin: e.xMin - pad, xMax: e.xMax + pad, yMin: e.yMin - pad, yMax: e.yMax + pad };
}

export type { GridPoint };
