import type { SpatialJoin, SpatialSpecimen } from './types';

/**
 * Which accepted joins an analysis looks at. Every given criterion must hold; within one
 * criterion a join qualifies when either of its specimens matches (a join reaching into
 * layer 3 belongs to the picture of layer 3).
 */
export interface JoinFilter {
  /**
   * Join types to keep. A label keeps that type and its subtypes: "conjoin" keeps
   * "conjoin-green", "conjoin-dry" and "conjoin-modern"; "conjoin-dry" keeps only itself.
   */
  types?: string[];
  /** Keep joins where either specimen has one of these taxa (exact labels). */
  taxa?: string[];
  /** Keep joins where either specimen lies in one of these layers. */
  layers?: string[];
}

export function isFilterEmpty(f: JoinFilter): boolean {
  return !f.types?.length && !f.taxa?.length && !f.layers?.length;
}

export function joinPasses(
  join: SpatialJoin,
  a: SpatialSpecimen | undefined,
  b: SpatialSpecimen | undefined,
  f: JoinFilter,
): boolean {
  if (f.types?.length && !f.types.some((t) => join.type === t || join.type.startsWith(`${t}-`))) return false;
  const either = (pick: (s: SpatialSpecimen) => string | null, wanted: string[]) =>
    [a, b].some((s) => s !== undefined && pick(s) !== null && wanted.includes(pick(s) as string));
  if (f.taxa?.length && !either((s) => s.taxon, f.taxa)) return false;
  if (f.layers?.length && !either((s) => s.layer, f.layers)) return false;
  return true;
}
