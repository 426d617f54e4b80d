import type { Side } from '../refits/observation';
import type { CountingSpecimen } from './counting-specimen';

/**
 * A counting unit for MNE: a lone specimen, or a whole refit set, whose zones are the union
 * of its members' (conjoined pieces are one element; Marean et al. 2001 count refitted
 * fragments as one). Members of one set that were identified differently (only after a
 * forced, conflicting join) form one unit per identification.
 */
export interface ElementUnit {
  key: string;
  taxon: string;
  element: string;
  side: Side | null;
  zones: Set<string>;
  /** Recorded fusion states of the unit's members (usually one, or none). */
  fusion: Set<string>;
  specimens: string[];
}

export function unitKeyOf(s: Pick<CountingSpecimen, 'set' | 'taxon' | 'element' | 'side'>): string {
  return `${s.set}\u0000${s.taxon}\u0000${s.element}\u0000${s.side ?? ''}`;
}

/** Group identified specimens into units (see ElementUnit). */
export function elementUnits(identified: readonly CountingSpecimen[]): ElementUnit[] {
  const units = new Map<string, ElementUnit>();
  for (const s of identified) {
    if (!s.taxon || !s.element) continue;
    const key = unitKeyOf(s);
    let u = units.get(key);
    if (!u) {
      u = { key, taxon: s.taxon, element: s.element, side: s.side, zones: new Set(), fusion: new Set(), specimens: [] };
      units.set(key, u);
    }
    for (const z of s.zones) u.zones.add(z);
    if (s.fusion && s.fusion !== 'indeterminate') u.fusion.add(s.fusion);
    u.specimens.push(s.specimen);
  }
  return [...units.values()];
}
