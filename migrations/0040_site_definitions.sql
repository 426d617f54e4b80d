-- Where excavation units, levels and layers are, for spatial refit analysis.
--
-- Coordinates are metres on the site grid (x easting, y northing), elevations z in metres,
-- positive up, as for specimens. These are definitions the analyst records; nothing here
-- is derived. Specimens name units, levels and layers as text; these tables give those
-- names a place, and need not cover every name in use.

-- An excavation unit: an axis-aligned rectangle on the grid.
CREATE TABLE excavation_unit (
  unit       TEXT PRIMARY KEY CHECK (length(trim(unit)) > 0),
  x_min      REAL NOT NULL,
  y_min      REAL NOT NULL,
  x_max      REAL NOT NULL,
  y_max      REAL NOT NULL,
  created_at TEXT NOT NULL,
  updated_at TEXT NOT NULL,
  CHECK (x_max > x_min AND y_max > y_min)
);

-- An excavation level: top and bottom elevation. unit NULL: the level applies in every unit
-- that has no definition of its own for that level name.
CREATE TABLE excavation_level (
  id         INTEGER PRIMARY KEY,
  unit       TEXT CHECK (unit IS NULL OR length(trim(unit)) > 0),
  level      TEXT NOT NULL CHECK (length(trim(level)) > 0),
  top_z      REAL NOT NULL,
  bottom_z   REAL NOT NULL,
  created_at TEXT NOT NULL,
  updated_at TEXT NOT NULL,
  CHECK (top_z > bottom_z)
);
CREATE UNIQUE INDEX excavation_level_key ON excavation_level (coalesce(unit, ''), level);

-- Observed points on the top surface of a stratigraphic layer (for drawing sections).
CREATE TABLE layer_boundary_point (
  id         INTEGER PRIMARY KEY,
  layer      TEXT NOT NULL CHECK (length(trim(layer)) > 0),
  x          REAL NOT NULL,
  y          REAL NOT NULL,
  z          REAL NOT NULL,
  created_at TEXT NOT NULL
);
CREATE INDEX layer_boundary_point_layer ON layer_boundary_point (layer);
