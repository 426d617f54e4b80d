import type { SpatialJoin, SpatialSpecimen } from '../../../core/spatial/types';

/** A specimen with only what a test cares about; everything else unrecorded. */
export function specimen(id: number, fields: Partial<SpatialSpecimen> = {}): SpatialSpecimen {
  return {
    id,
    catalogueNo: `S-${id}`,
    unit: null,
    level: null,
    layer: null,
    x: null,
    y: null,
    z: null,
    taxon: null,
    ...fields,
  };
}

let nextJoin = 1;
/** A join; "conjoin-dry" stands for a conjoin with break age dry, as the catalogue stores it. */
export function join(a: number, b: number, kind = 'conjoin-fresh', id = nextJoin++): SpatialJoin {
  const m = /^conjoin-(.+)$/.exec(kind);
  return m ? { id, a, b, type: 'conjoin', breakAge: m[1] } : { id, a, b, type: kind, breakAge: null };
}
