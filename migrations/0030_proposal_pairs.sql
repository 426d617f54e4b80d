-- Join proposals, bookkeeping: which pairs of scans the matcher has already compared, with
-- which method version and parameters (their hash), and what came of it. A later run skips
-- pairs done with the same parameters, so runs are incremental and can be resumed after a
-- cancel. The proposals themselves are rows of specimen_join with status 'proposed'.
CREATE TABLE proposal_pair (
  scan_a          INTEGER NOT NULL REFERENCES scan (id) ON DELETE CASCADE,
  scan_b          INTEGER NOT NULL REFERENCES scan (id) ON DELETE CASCADE,
  parameters_hash TEXT NOT NULL,
  method_version  TEXT NOT NULL,
  best_score      REAL,
  join_id         INTEGER REFERENCES specimen_join (id) ON DELETE SET NULL,
  done_at         TEXT NOT NULL,
  PRIMARY KEY (scan_a, scan_b, parameters_hash),
  CHECK (scan_a < scan_b)
);
