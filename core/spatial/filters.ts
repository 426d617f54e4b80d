import type { SpatialJoin, SpatialSpecimen } from './types';

/**
 * The finer kind of a join used to style and filter it: a conjoin with a known break age is
 * "conjoin-fresh", "conjoin-dry" or "conjoin-modern"; anything else is its type as recorded.
 */
export function joinKind(type: string, breakAge: string | null | undefined): string {
  if (type === 'conjoin' && (breakAge === 'fresh' || breakAge === 'dry' || breakAge === 'modern')) return `conjoin-${breakAge}`;
  return type;
}

/**
 * Which accepted joins an analysis looks at. Every given criterion must hold; within one
 * criterion a join qualifies when either of its specimens matches (a join reaching into
 * layer 3 belongs to the picture of layer 3).
 */
export interface JoinFilter {
  /**
   * Join types to keep. A label keeps that type and its subtypes: "conjoin" keeps every
   * conjoin; "conjoin-dry" keeps conjoins across dry breaks only (type plus break age);
   * "conjoin-green" is a synonym of "conjoin-fresh" (a green break is a fresh one).
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
  if (f.types?.length) {
    const full = joinKind(join.type, join.breakAge);
    const wanted = f.types.map((t) => (t === 'conjoin-green' ? 'conjoin-fresh' : t));
    if (!wanted.some((t) => join.type === t || full === t || join.type.startsWith(`${t}-`))) return false;
  }
  const either = (pick: (s: SpatialSpecimen) => string | null, wanted: string[]) =>
    [a, b].some((s) => s !== undefined && pick(s) !== null && wanted.includes(pick(s) as string));
  if (f.taxa?.length && !either((s) => s.taxon, f.taxa)) return false;
  if (f.layers?.length && !either((s) => s.layer, f.layers)) return false;
  return true;
}
