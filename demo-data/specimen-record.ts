import type { BreakAge } from './break-plan';
import type { Random } from './random';
import type { Provenience } from './site';
import { round } from './site';
import type { ElementSpec } from './skeleton';

/** Long-bone portion zones of the catalogue (issue 2), proximal to distal. */
export const ZONES = ['proximal-end', 'proximal-shaft', 'midshaft', 'distal-shaft', 'distal-end'] as const;
export type Zone = (typeof ZONES)[number];

/** Columns of the catalogue's specimen import (issue 2, item 5), in that order. */
export const SPECIMEN_COLUMNS = [
  'catalogue_no', 'unit', 'level', 'layer', 'x', 'y', 'z', 'taxon', 'element', 'side', 'portion',
  'fusion', 'size_class', 'break_age', 'modifications', 'weight_g', 'notes',
] as const;

export type SpecimenRow = Record<(typeof SPECIMEN_COLUMNS)[number], string>;

export interface FragmentFacts {
  catalogueNo: string;
  spec: ElementSpec;
  side: 'left' | 'right';
  /** Share of each zone's bone volume present in this fragment (0..1). */
  coverage: Record<Zone, number>;
  /** Fracture faces by break age with their area (mm²). */
  faceAges: Array<{ age: BreakAge; area: number }>;
  volumeMm3: number;
  /** Share of the shaft's circumference present (0..1), estimated from the shaft zones. */
  completeCircumference: boolean;
  damaged: boolean;
  provenience: Provenience;
}

/**
 * The catalogue row an analyst would write for a fragment: end pieces identified to taxon,
 * element, side and zones (a zone is listed when more than half of it is present, after
 * Dobney & Rielly 1988); whole shaft cylinders often to element and family; most shaft
 * splinters only to "long bone" and size class.
 */
export function specimenRow(f: FragmentFacts, random: Random): SpecimenRow {
  const s = f.spec;
  const endShare = Math.max(f.coverage['proximal-end'], f.coverage['distal-end']);
  const zones = ZONES.filter((z) => f.coverage[z] > 0.5);
  let taxon = '';
  let element = 'long bone';
  let side = '';
  let portion: string[] = [];
  let fusion = '';
  if (endShare >= 0.25) {
    taxon = s.taxon;
    element = s.element;
    side = f.side;
    portion = zones;
    fusion = 'fused';
  } else if (f.completeCircumference && random.chance(0.6)) {
    taxon = s.family;
    element = s.element;
    portion = zones;
  }
  const largest = [...f.faceAges].sort((a, b) => b.area - a.area)[0];
  const mods: string[] = [];
  const fresh = f.faceAges.some((a) => a.age === 'fresh');
  // terms of the catalogue's modification vocabulary (core/vocab/terms.ts)
  if (fresh && random.chance(0.2)) mods.push('percussion-notch');
  if (random.chance(0.07)) mods.push('cut-mark');
  if (random.chance(0.04)) mods.push('carnivore-tooth-mark');
  if (random.chance(0.15)) mods.push('root-etching');
  if (!fresh && random.chance(0.3)) mods.push('weathering-1');
  const notes: string[] = [];
  if (f.faceAges.some((a) => a.age === 'modern') && largest?.age !== 'modern') notes.push('also a modern break');
  if (f.damaged) notes.push('edges chipped or worn');
  const p = f.provenience;
  return {
    catalogue_no: f.catalogueNo,
    unit: p.unit,
    level: p.level,
    layer: p.layer,
    x: p.x.toFixed(3),
    y: p.y.toFixed(3),
    z: p.z.toFixed(3),
    taxon,
    element,
    side,
    portion: portion.join(';'),
    fusion,
    size_class: String(s.sizeClass),
    break_age: largest ? largest.age : '',
    modifications: mods.join(';'),
    // dry cortical bone about 1.8 g/cm³ (from memory)
    weight_g: round(f.volumeMm3 * 0.0018, 1).toFixed(1),
    notes: notes.join('; '),
  };
}

export function csvLine(values: readonly string[]): string {
  return values.map((v) => (/[",\n;]/.test(v) ? `"${v.replace(/"/g, '""')}"` : v)).join(',') + '\n';
}
