-- knitbone catalogue, schema 1: specimens, scans, joins, derived identifications,
-- append-only history, settings and user-added vocabulary terms.
--
-- Conventions: times are ISO 8601 UTC text; lists and structured values are JSON text;
-- coordinates are metres on the site grid with z as elevation (positive up); the join
-- transform is a 4x4 row-major rigid matrix in millimetres mapping points of B's scan
-- file into A's scan file frame. Observed values (specimen) and derived values
-- (derived_identification) live in separate tables: nothing derived overwrites what the
-- analyst recorded.

CREATE TABLE specimen (
  id            INTEGER PRIMARY KEY,
  catalogue_no  TEXT NOT NULL UNIQUE CHECK (length(trim(catalogue_no)) > 0),
  unit          TEXT,
  level         TEXT,
  layer         TEXT,
  x             REAL,
  y             REAL,
  z             REAL,
  taxon         TEXT,
  element       TEXT,
  side          TEXT CHECK (side IN ('left', 'right', 'axial', 'indeterminate')),
  portion       TEXT NOT NULL DEFAULT '[]' CHECK (json_valid(portion) AND json_type(portion) = 'array'),
  fusion        TEXT,
  size_class    INTEGER CHECK (size_class BETWEEN 1 AND 6),
  break_age     TEXT CHECK (break_age IN ('fresh', 'dry', 'modern', 'indeterminate')),
  modifications TEXT NOT NULL DEFAULT '[]' CHECK (json_valid(modifications) AND json_type(modifications) = 'array'),
  weight_g      REAL CHECK (weight_g IS NULL OR weight_g >= 0),
  notes         TEXT,
  created_at    TEXT NOT NULL,
  updated_at    TEXT NOT NULL
);
CREATE INDEX specimen_unit ON specimen (unit);
CREATE INDEX specimen_taxon_element ON specimen (taxon, element);

CREATE TABLE scan (
  id           INTEGER PRIMARY KEY,
  specimen_id  INTEGER NOT NULL REFERENCES specimen (id) ON DELETE RESTRICT,
  path         TEXT NOT NULL,
  content_hash TEXT NOT NULL,
  units        TEXT NOT NULL DEFAULT 'mm' CHECK (units IN ('mm', 'cm', 'm')),
  stats        TEXT NOT NULL DEFAULT '{}' CHECK (json_valid(stats)),
  created_at   TEXT NOT NULL,
  UNIQUE (specimen_id, content_hash)
);
CREATE INDEX scan_specimen ON scan (specimen_id);

CREATE TABLE specimen_join (
  id               INTEGER PRIMARY KEY,
  specimen_a       INTEGER NOT NULL REFERENCES specimen (id) ON DELETE RESTRICT,
  specimen_b       INTEGER NOT NULL REFERENCES specimen (id) ON DELETE RESTRICT,
  scan_a           INTEGER REFERENCES scan (id) ON DELETE RESTRICT,
  scan_b           INTEGER REFERENCES scan (id) ON DELETE RESTRICT,
  status           TEXT NOT NULL DEFAULT 'proposed' CHECK (status IN ('proposed', 'accepted', 'rejected')),
  type             TEXT CHECK (type IN ('conjoin', 'articulation', 'pair')),
  break_age        TEXT CHECK (break_age IN ('fresh', 'dry', 'modern', 'indeterminate')),
  transform        TEXT CHECK (transform IS NULL OR (json_valid(transform) AND json_array_length(transform) = 16)),
  score            REAL,
  score_components TEXT NOT NULL DEFAULT '{}' CHECK (json_valid(score_components)),
  method_version   TEXT,
  parameters       TEXT NOT NULL DEFAULT '{}' CHECK (json_valid(parameters)),
  note             TEXT,
  forced           INTEGER NOT NULL DEFAULT 0 CHECK (forced IN (0, 1)),
  decided_by       TEXT,
  decided_at       TEXT,
  created_at       TEXT NOT NULL,
  CHECK (specimen_a <> specimen_b)
);
CREATE INDEX specimen_join_a ON specimen_join (specimen_a);
CREATE INDEX specimen_join_b ON specimen_join (specimen_b);
CREATE INDEX specimen_join_status ON specimen_join (status);

-- What propagation concluded for a specimen (field: taxon, element or side), and from which
-- accepted join(s). One derived value per specimen and field.
CREATE TABLE derived_identification (
  id              INTEGER PRIMARY KEY,
  specimen_id     INTEGER NOT NULL REFERENCES specimen (id) ON DELETE CASCADE,
  field           TEXT NOT NULL CHECK (field IN ('taxon', 'element', 'side')),
  value           TEXT NOT NULL,
  source_join_ids TEXT NOT NULL DEFAULT '[]' CHECK (json_valid(source_join_ids) AND json_type(source_join_ids) = 'array'),
  created_at      TEXT NOT NULL,
  UNIQUE (specimen_id, field)
);

-- Every decision and edit, append-only: the triggers below refuse UPDATE and DELETE.
CREATE TABLE history (
  id        INTEGER PRIMARY KEY,
  at        TEXT NOT NULL,
  who       TEXT NOT NULL,
  entity    TEXT NOT NULL,
  entity_id TEXT,
  action    TEXT NOT NULL,
  before    TEXT CHECK (before IS NULL OR json_valid(before)),
  after     TEXT CHECK (after IS NULL OR json_valid(after))
);
CREATE INDEX history_entity ON history (entity, entity_id);

CREATE TRIGGER history_no_update BEFORE UPDATE ON history
BEGIN
  SELECT RAISE(ABORT, 'history is append-only: rows cannot be changed');
END;

CREATE TRIGGER history_no_delete BEFORE DELETE ON history
BEGIN
  SELECT RAISE(ABORT, 'history is append-only: rows cannot be deleted');
END;

CREATE TABLE setting (
  key   TEXT PRIMARY KEY,
  value TEXT NOT NULL CHECK (json_valid(value))
);

-- Taxa, elements and other terms an analyst adds to this catalogue without editing code.
-- kind: taxon | element | modification | fusion. parent names a canonical term of the same
-- kind (built in or added); details holds kind-specific facts (rank, count per skeleton,
-- paired, size class, synonyms) as JSON.
CREATE TABLE vocabulary_term (
  id         INTEGER PRIMARY KEY,
  kind       TEXT NOT NULL CHECK (kind IN ('taxon', 'element', 'modification', 'fusion')),
  term       TEXT NOT NULL CHECK (length(trim(term)) > 0),
  parent     TEXT,
  details    TEXT NOT NULL DEFAULT '{}' CHECK (json_valid(details)),
  source     TEXT,
  created_at TEXT NOT NULL,
  UNIQUE (kind, term)
);
