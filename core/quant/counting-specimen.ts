import type { Side } from '../refits/observation';

/**
 * One specimen as counting sees it: an identification (the analyst's own, or raised by
 * refits), its portion zones and fusion, and the groups it belongs to. In a count "as
 * recorded" every specimen is its own set and group.
 */
export interface CountingSpecimen {
  specimen: string;
  taxon: string | null;
  element: string | null;
  side: Side | null;
  zones: readonly string[];
  fusion: string | null;
  /** Refit set: specimens with the same key are conjoined pieces of one specimen. */
  set: number;
  /** Fragments with the same key are joined across modern breaks (one specimen). */
  modernGroup: number;
}

/** A pair join between two specimens (left and right of one element of one individual). */
export interface PairLink {
  a: string;
  b: string;
}
