-- knitbone scans, schema 20: the analyst's corrections of surface region classes.
-- A scan's segmentation gives each region a class (fracture, outer-cortical, medullary,
-- articular). An analyst may correct a region; every correction is a new row (append-only),
-- the newest row for a (scan, region) is in force, and a row with surface_class NULL
-- withdraws the correction (the program's class applies again). Region ids are those of
-- the analysis recorded in scan.stats (same file, same settings: same ids).
CREATE TABLE scan_region_class (
  id            INTEGER PRIMARY KEY,
  scan_id       INTEGER NOT NULL REFERENCES scan (id) ON DELETE RESTRICT,
  region_id     INTEGER NOT NULL CHECK (region_id >= 0),
  surface_class TEXT CHECK (surface_class IS NULL OR surface_class IN ('fracture', 'outer-cortical', 'medullary', 'articular')),
  who           TEXT NOT NULL,
  created_at    TEXT NOT NULL
);
CREATE INDEX scan_region_class_scan ON scan_region_class (scan_id, region_id, id);

CREATE TRIGGER scan_region_class_no_update BEFORE UPDATE ON scan_region_class
BEGIN
  SELECT RAISE(ABORT, 'region class corrections are append-only: add a new correction instead');
END;

CREATE TRIGGER scan_region_class_no_delete BEFORE DELETE ON scan_region_class
BEGIN
  SELECT RAISE(ABORT, 'region class corrections are append-only: add a new correction instead');
END;
