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
  levels: '5 cm spits numbered from the top of each square (spit 1 starts at the surface).',
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

export function levelAt(x: number, z: number): string {
  return String(1 + Math.floor((surfaceAt(x) - z) / 0.05));
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
  return { unit: unitAt(x, y), level: levelAt(x, z), layer: layerAt(x, z), x: round(x, 3), y: round(y, 3), z: round(z, 3) };
}

function clamp(v: number, lo: number, hi: number): number {
  return Math.min(hi, Math.max(lo, v));
}
export function round(v: number, digits: number): number {
  const f = 10 ** digits;
  return Math.round(v * f) / f;
}
