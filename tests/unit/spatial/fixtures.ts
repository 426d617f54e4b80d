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
export function join(a: number, b: number, type = 'conjoin-green', id = nextJoin++): SpatialJoin {
  return { id, a, b, type };
}
