import type { CountingSpecimen } from './counting-specimen';

/** NISP of one taxon and element, in both ways of counting refitted fragments. */
export interface NispCount {
  taxon: string;
  element: string;
  /** Each refit set once (the "single" count). */
  nisp: number;
  /** Fragments of green- and dry-break sets apart; fragments joined across modern breaks once. */
  nispFragments: number;
}

/**
 * NISP, the number of identified specimens per taxon (as identified, at its own rank) and
 * element (Grayson 1984; Lyman 2008, chapter 2). Conjoined pieces of one specimen count
 * once (each refit set once); Morin, Boileau & Ready (2021) compare this with counting
 * the fragments, which we report too, except that pieces joined across modern breaks
 * (broken in or after excavation) are one specimen by common practice.
 *
 * Pass only identified specimens. Specimens of one set identified differently (only after
 * a forced, conflicting join) count once under each identification.
 */
export function nispByElement(identified: readonly CountingSpecimen[]): NispCount[] {
  const groups = new Map<string, { taxon: string; element: string; sets: Set<number>; modern: Set<number> }>();
  for (const s of identified) {
    if (!s.taxon || !s.element) continue;
    const key = `${s.taxon}\u0000${s.element}`;
    let g = groups.get(key);
    if (!g) {
      g = { taxon: s.taxon, element: s.element, sets: new Set(), modern: new Set() };
      groups.set(key, g);
    }
    g.sets.add(s.set);
    g.modern.add(s.modernGroup);
  }
  return [...groups.values()].map((g) => ({ taxon: g.taxon, element: g.element, nisp: g.sets.size, nispFragments: g.modern.size }));
}
