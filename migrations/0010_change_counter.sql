-- knitbone counting: a counter that goes up with every change to what refits and counts
-- read (specimens, joins, user-added vocabulary terms, settings), whoever makes it
-- (knitbone or any other SQLite tool). A reading of the catalogue kept in memory is current
-- while the counter has not moved. Derived identifications are written from that reading
-- and do not move it.

CREATE TABLE change_counter (
  id INTEGER PRIMARY KEY CHECK (id = 1),
  n  INTEGER NOT NULL
);
INSERT INTO change_counter (id, n) VALUES (1, 0);

CREATE TRIGGER change_counter_specimen_insert AFTER INSERT ON specimen BEGIN UPDATE change_counter SET n = n + 1 WHERE id = 1; END;
CREATE TRIGGER change_counter_specimen_update AFTER UPDATE ON specimen BEGIN UPDATE change_counter SET n = n + 1 WHERE id = 1; END;
CREATE TRIGGER change_counter_specimen_delete AFTER DELETE ON specimen BEGIN UPDATE change_counter SET n = n + 1 WHERE id = 1; END;
CREATE TRIGGER change_counter_join_insert AFTER INSERT ON specimen_join BEGIN UPDATE change_counter SET n = n + 1 WHERE id = 1; END;
CREATE TRIGGER change_counter_join_update AFTER UPDATE ON specimen_join BEGIN UPDATE change_counter SET n = n + 1 WHERE id = 1; END;
CREATE TRIGGER change_counter_join_delete AFTER DELETE ON specimen_join BEGIN UPDATE change_counter SET n = n + 1 WHERE id = 1; END;
CREATE TRIGGER change_counter_term_insert AFTER INSERT ON vocabulary_term BEGIN UPDATE change_counter SET n = n + 1 WHERE id = 1; END;
CREATE TRIGGER change_counter_term_update AFTER UPDATE ON vocabulary_term BEGIN UPDATE change_counter SET n = n + 1 WHERE id = 1; END;
CREATE TRIGGER change_counter_term_delete AFTER DELETE ON vocabulary_term BEGIN UPDATE change_counter SET n = n + 1 WHERE id = 1; END;
CREATE TRIGGER change_counter_setting_insert AFTER INSERT ON setting BEGIN UPDATE change_counter SET n = n + 1 WHERE id = 1; END;
CREATE TRIGGER change_counter_setting_update AFTER UPDATE ON setting BEGIN UPDATE change_counter SET n = n + 1 WHERE id = 1; END;
CREATE TRIGGER change_counter_setting_delete AFTER DELETE ON setting BEGIN UPDATE change_counter SET n = n + 1 WHERE id = 1; END;
