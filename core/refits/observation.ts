/**
 * What the analyst recorded about one specimen, as refits and counting read it. The
 * analyst's own observations are never changed by anything derived from them
 * (design.md section 4).
 */
export type Side = 'left' | 'right' | 'axial' | 'indeterminate';

export interface Observation {
  /** Catalogue number: the specimen's identity everywhere refits speaks. */
  specimen: string;
  taxon: string | null;
  element: string | null;
  side: Side | null;
  /** Portion zones covered (more than half present; Dobney & Rielly 1988). */
  zones: readonly string[];
  fusion: string | null;
  /** Body-size class 1-6 for specimens identified only to size, or null. */
  sizeClass: number | null;
}
