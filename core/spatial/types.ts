/**
 * What spatial refit analysis reads and writes. Coordinates are metres on the site grid:
 * x is easting, y is northing (grid north is +y), z is elevation (positive up).
 */

/** A specimen as spatial analysis needs it: provenience and identification, nothing else. */
export interface SpatialSpecimen {
  id: number;
  catalogueNo: string;
  unit: string | null;
  level: string | null;
  layer: string | null;
  x: number | null;
  y: number | null;
  z: number | null;
  taxon: string | null;
}

/** An accepted join between two specimens (the order A, B is the order it was recorded in). */
export interface SpatialJoin {
  id: number;
  a: number;
  b: number;
  /** Join type: conjoin, articulation, pair (design.md section 6), or a finer label. */
  type: string;
  /** For a conjoin, the age of the break it mends: fresh, dry, modern or indeterminate. */
  breakAge?: string | null;
}

/** An excavation unit: an axis-aligned rectangle on the site grid. */
export interface UnitDefinition {
  unit: string;
  xMin: number;
  yMin: number;
  xMax: number;
  yMax: number;
}

/**
 * An excavation level: its top and bottom elevations. A level defined for one unit applies
 * there only; a level with `unit: null` applies in every unit that has no definition of its own.
 */
export interface LevelDefinition {
  unit: string | null;
  level: string;
  topZ: number;
  bottomZ: number;
}

/** One observed point on the top surface of a stratigraphic layer (used to draw sections). */
export interface LayerBoundaryPoint {
  layer: string;
  x: number;
  y: number;
  z: number;
}

/** Where units, levels and layers are, as the catalogue defines them. */
export interface SiteDefinitions {
  units: UnitDefinition[];
  levels: LevelDefinition[];
  layerBoundaries: LayerBoundaryPoint[];
}

export const noSiteDefinitions: SiteDefinitions = { units: [], levels: [], layerBoundaries: [] };

/** A position on the site grid, and whether any part of it came from unit or level definitions. */
export interface ResolvedPosition {
  x: number;
  y: number;
  z: number;
  approximate: boolean;
}

/** One join measured: the JSON shape of `knitbone spatial --json` (issue 8). */
export interface MeasuredJoin {
  id: number;
  /** Catalogue numbers of the two specimens. */
  a: string;
  b: string;
  type: string;
  breakAge: string | null;
  horizontalM: number;
  /** Absolute difference in elevation. */
  verticalM: number;
  distance3dM: number;
  /** Bearing from A to B, degrees clockwise from grid north in [0, 360); null when A and B share x and y. */
  bearingDeg: number | null;
  /** null when either specimen lacks the unit (level, layer) in question. */
  crossesUnit: boolean | null;
  crossesLevel: boolean | null;
  crossesLayer: boolean | null;
  approximate: boolean;
}

/** Why a join was left out of the measurements. */
export interface ExcludedJoin {
  id: number;
  a: string;
  b: string;
  type: string;
  /** One sentence naming the specimen without a position and what would give it one. */
  reason: string;
  crossesUnit: boolean | null;
  crossesLevel: boolean | null;
  crossesLayer: boolean | null;
}
