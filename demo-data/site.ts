import type { Random } from './random';

/**
 * The invented site of the demo assemblage. Quarnel Shelter is an imaginary limestone
 * rock-shelter above the equally imaginary river Lirn, dug in 1 m squares (columns A-H east,
 * rows 1-6 north) in 5 cm spits within natural layers that dip gently to the east. Elevations
 * are metres above the site datum (100.000 m); x and y are metres on the site grid.
 */
export const SITE = {
  name: 'Quarnel Shelter',
  setting: 'An invented limestone rock-shelter above the invented river Lirn; a hunting camp with butchery and marrow-cracking debris.',
  grid: 'Squares of 1 m: columns A-H from x = 0 to 8 m, rows 1-6 from y = 0 to 6 m; unit = column letter + row number.',
  levels: '5 cm spits dug level in each square, numbered down from the highest point of its surface (its west edge; spit 1 starts there).',
  datum: 'Elevations in metres above the site datum (100.000 m).',
  catalogue: 'QS-<five digits>',
} as const;

const COLUMNS = 'ABCDEFGH';

export interface LayerDef {
  name: string;
  /** Top elevation at x = 0 (m); layers dip 2 cm per metre to the east. */
  top: number;
}

export const LAYERS: readonly LayerDef[] = [
  { name: '1', top: 100.0 },
  { name: '2', top: 99.85 },
  { name: '3a', top: 99.6 },
  { name: '3b', top: 99.4 },
  { name: '4', top: 99.1 },
];
const BASE = 98.8;
const DIP = 0.02;
const SPIT_MM = 50;

export function surfaceAt(x: number): number {
  return LAYERS[0].top - DIP * x;
}

export function layerAt(x: number, z: number): string {
  let name = LAYERS[0].name;
  for (const l of LAYERS) if (z <= l.top - DIP * x) name = l.name;
  return name;
}

export function unitAt(x: number, y: number): string {
  const c = Math.min(COLUMNS.length - 1, Math.max(0, Math.floor(x)));
  const r = Math.min(6, Math.max(1, Math.floor(y) + 1));
  return `${COLUMNS[c]}${r}`;
}

/** The units of the grid: 1 m squares, columns A-H (x 0-8 m), rows 1-6 (y 0-6 m). */
export function siteUnits(): Array<{ unit: string; xMin: number; yMin: number; xMax: number; yMax: number }> {
  const out = [];
  for (let c = 0; c < COLUMNS.length; c++) for (let r = 1; r <= 6; r++) out.push({ unit: `${COLUMNS[c]}${r}`, xMin: c, yMin: r - 1, xMax: c + 1, yMax: r });
  return out;
}

/** Elevation (whole millimetres) where spit 1 of a unit starts: the surface at its west edge. */
function spitDatumMm(unit: string): number {
  return Math.round(LAYERS[0].top * 1000) - Math.round(DIP * 1000) * COLUMNS.indexOf(unit[0]);
}

/** Spit of an elevation z (m) in a unit: 5 cm spits dug level down from the unit's datum. */
export function levelAt(unit: string, z: number): string {
  return String(1 + Math.floor((spitDatumMm(unit) - Math.round(z * 1000)) / SPIT_MM));
}

/** Top and bottom (m) of every spit of a unit down to the base of the deposit. */
export function unitLevels(unit: string): Array<{ unit: string; level: string; topZ: number; bottomZ: number }> {
  const out = [];
  const base = Math.round(BASE * 1000);
  for (let n = 1, top = spitDatumMm(unit); top > base; n++, top -= SPIT_MM) out.push({ unit, level: String(n), topZ: top / 1000, bottomZ: (top - SPIT_MM) / 1000 });
  return out;
}

/** Points on the top of each layer: every metre of the grid (the tops are planes dipping east). */
export function layerTopPoints(): Array<{ layer: string; x: number; y: number; z: number }> {
  const out = [];
  for (const l of LAYERS) for (let x = 0; x <= COLUMNS.length; x++) for (let y = 0; y <= 6; y++) out.push({ layer: l.name, x, y, z: round(l.top - DIP * x, 3) });
  return out;
}

export interface Provenience {
  unit: string;
  level: string;
  layer: string;
  x: number;
  y: number;
  z: number;
}

/** Where a bone came to rest: mostly in the occupation layers 3a and 3b. */
export function depositionPoint(random: Random): [number, number, number] {
  const layer = random.weighted([[1, 2], [2, 4], [3, 4], [4, 1]] as const);
  const x = random.uniform(0.3, 7.7);
  const y = random.uniform(0.3, 5.7);
  const top = LAYERS[layer].top - DIP * x;
  const bottom = (layer + 1 < LAYERS.length ? LAYERS[layer + 1].top : BASE) - DIP * x;
  return [x, y, random.uniform(bottom + 0.02, top - 0.02)];
}

/**
 * Where one fragment of that bone was found: scattered around the bone's resting point, a
 * few moved far by trampling or clearing, some displaced up or down by bioturbation.
 */
export function fragmentFind(random: Random, origin: readonly [number, number, number]): Provenience {
  const far = random.chance(0.12);
  const h = far ? 1.5 : 0.35;
  const deep = random.chance(0.1);
  const x = clamp(origin[0] + random.normal(0, h), 0.02, 7.98);
  const y = clamp(origin[1] + random.normal(0, h), 0.02, 5.98);
  const z = clamp(origin[2] + random.normal(0, deep ? 0.15 : 0.03), BASE + 0.01, surfaceAt(x) - 0.01);
  // unit, spit and layer from the coordinates as recorded (to the millimetre)
  const [rx, ry, rz] = [round(x, 3), round(y, 3), round(z, 3)];
  const unit = unitAt(rx, ry);
  return { unit, level: levelAt(unit, rz), layer: layerAt(rx, rz), x: rx, y: ry, z: rz };
}

function clamp(v: number, lo: number, hi: number): number {
  return Math.min(hi, Math.max(lo, v));
}
export function round(v: number, digits: number): number {
  const f = 10 ** digits;
  return Math.round(v * f) / f;
}
