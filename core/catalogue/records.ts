/**
 * The records of a catalogue as the rest of knitbone sees them (camelCase, lists as arrays,
 * JSON columns parsed). Only core/catalogue knows the SQL column names behind them.
 */

export const SIDES = ['left', 'right', 'axial', 'indeterminate'] as const;
export type Side = (typeof SIDES)[number];

export const BREAK_AGES = ['fresh', 'dry', 'modern', 'indeterminate'] as const;
export type BreakAge = (typeof BREAK_AGES)[number];

export const JOIN_STATUSES = ['proposed', 'accepted', 'rejected'] as const;
export type JoinStatus = (typeof JOIN_STATUSES)[number];

export const JOIN_TYPES = ['conjoin', 'articulation', 'pair'] as const;
export type JoinType = (typeof JOIN_TYPES)[number];

/** What the analyst observed and recorded for one specimen. Never changed by derivation. */
export interface SpecimenFields {
  catalogueNo: string;
  unit: string | null;
  level: string | null;
  layer: string | null;
  /** Metres on the site grid. */
  x: number | null;
  y: number | null;
  /** Elevation in metres, positive up. */
  z: number | null;
  taxon: string | null;
  element: string | null;
  side: Side | null;
  /** Portion zones present (more than half of each zone, Dobney & Rielly 1988). */
  portion: string[];
  fusion: string | null;
  /** Body-size class 1 (smallest) to 6, for specimens identified only to size. */
  sizeClass: number | null;
  breakAge: BreakAge | null;
  modifications: string[];
  weightG: number | null;
  notes: string | null;
}

export interface Specimen extends SpecimenFields {
  id: number;
  createdAt: string;
  updatedAt: string;
}

/** The field names of SpecimenFields in CSV/column order. */
export const SPECIMEN_FIELDS = [
  'catalogueNo', 'unit', 'level', 'layer', 'x', 'y', 'z', 'taxon', 'element', 'side', 'portion',
  'fusion', 'sizeClass', 'breakAge', 'modifications', 'weightG', 'notes',
] as const satisfies readonly (keyof SpecimenFields)[];
export type SpecimenField = (typeof SPECIMEN_FIELDS)[number];

export function emptySpecimenFields(catalogueNo: string): SpecimenFields {
  return {
    catalogueNo, unit: null, level: null, layer: null, x: null, y: null, z: null, taxon: null,
    element: null, side: null, portion: [], fusion: null, sizeClass: null, breakAge: null,
    modifications: [], weightG: null, notes: null,
  };
}

export interface Scan {
  id: number;
  specimenId: number;
  /** Path of the mesh file, as given (relative to the catalogue's folder when it was inside it). */
  path: string;
  /** SHA-256 of the file's bytes, hex. */
  contentHash: string;
  units: 'mm' | 'cm' | 'm';
  /** Measured figures (vertex count, area, volume, watertight...), as the scans area records them. */
  stats: Record<string, unknown>;
  createdAt: string;
}

/** 4x4 row-major rigid matrix, millimetres, mapping points of B's scan file into A's frame. */
export type Transform = number[];

export interface Join {
  id: number;
  specimenA: number;
  specimenB: number;
  scanA: number | null;
  scanB: number | null;
  status: JoinStatus;
  type: JoinType | null;
  breakAge: BreakAge | null;
  transform: Transform | null;
  score: number | null;
  scoreComponents: Record<string, number>;
  methodVersion: string | null;
  parameters: Record<string, unknown>;
  note: string | null;
  /** Accepted although it raised a conflict the analyst chose to overrule. */
  forced: boolean;
  decidedBy: string | null;
  decidedAt: string | null;
  createdAt: string;
}

export type DerivedField = 'taxon' | 'element' | 'side';

export interface DerivedIdentification {
  id: number;
  specimenId: number;
  field: DerivedField;
  value: string;
  sourceJoinIds: number[];
  createdAt: string;
}

export interface HistoryEntry {
  id: number;
  at: string;
  who: string;
  /** Table-level name of what changed: specimen, join, scan, derived_identification, setting, vocabulary_term... */
  entity: string;
  entityId: string | null;
  /** insert, update, delete, accept, reject, import... */
  action: string;
  before: unknown;
  after: unknown;
}

export type VocabularyKind = 'taxon' | 'element' | 'modification' | 'fusion';

export interface VocabularyTermRecord {
  id: number;
  kind: VocabularyKind;
  term: string;
  parent: string | null;
  details: Record<string, unknown>;
  source: string | null;
  createdAt: string;
}
