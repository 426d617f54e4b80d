import type Database from 'better-sqlite3';
import type { HistoryRepository } from './history';
import type { DerivedField, DerivedIdentification } from './records';

interface DerivedRow {
  id: number;
  specimen_id: number;
  field: string;
  value: string;
  source_join_ids: string;
  created_at: string;
}

/**
 * Derived identifications: what propagation through accepted joins concluded for a
 * specimen. Kept apart from the specimen table so an observation is never overwritten;
 * each value names the join(s) it came from so undoing a join removes exactly what it derived.
 */
export class DerivedIdentificationRepository {
  constructor(
    private readonly db: Database.Database,
    private readonly history: HistoryRepository,
    private readonly defaultWho: string,
  ) {}

  /** Set (or replace) the derived value of one field of one specimen. */
  set(specimenId: number, field: DerivedField, value: string, sourceJoinIds: number[], who: string = this.defaultWho): DerivedIdentification {
    const run = this.db.transaction((): DerivedIdentification => {
      const before = this.get(specimenId, field);
      const same = before && before.value === value && JSON.stringify(before.sourceJoinIds) === JSON.stringify(sourceJoinIds);
      if (same) return before;
      const at = new Date().toISOString();
      this.db
        .prepare(
          `INSERT INTO derived_identification (specimen_id, field, value, source_join_ids, created_at) VALUES (?, ?, ?, ?, ?)
           ON CONFLICT (specimen_id, field) DO UPDATE SET value = excluded.value, source_join_ids = excluded.source_join_ids, created_at = excluded.created_at`,
        )
        .run(specimenId, field, value, JSON.stringify(sourceJoinIds), at);
      const after = this.get(specimenId, field)!;
      this.history.record({
        at, who, entity: 'derived_identification', entityId: specimenId, action: before ? 'update' : 'insert',
        before: before ? { field, value: before.value, sourceJoinIds: before.sourceJoinIds } : undefined,
        after: { field, value, sourceJoinIds },
      });
      return after;
    });
    return run();
  }

  /** Remove the derived value of one field; returns whether there was one. */
  remove(specimenId: number, field: DerivedField, who: string = this.defaultWho): boolean {
    const run = this.db.transaction((): boolean => {
      const before = this.get(specimenId, field);
      if (!before) return false;
      this.db.prepare('DELETE FROM derived_identification WHERE specimen_id = ? AND field = ?').run(specimenId, field);
      this.history.record({
        who, entity: 'derived_identification', entityId: specimenId, action: 'delete',
        before: { field, value: before.value, sourceJoinIds: before.sourceJoinIds },
      });
      return true;
    });
    return run();
  }

  get(specimenId: number, field: DerivedField): DerivedIdentification | undefined {
    const row = this.db.prepare('SELECT * FROM derived_identification WHERE specimen_id = ? AND field = ?').get(specimenId, field) as DerivedRow | undefined;
    return row && fromRow(row);
  }

  list(filter: { specimenId?: number } = {}): DerivedIdentification[] {
    const rows = filter.specimenId === undefined
      ? this.db.prepare('SELECT * FROM derived_identification ORDER BY specimen_id, field').all()
      : this.db.prepare('SELECT * FROM derived_identification WHERE specimen_id = ? ORDER BY field').all(filter.specimenId);
    return (rows as DerivedRow[]).map(fromRow);
  }
}

function fromRow(r: DerivedRow): DerivedIdentification {
  return {
    id: r.id,
    specimenId: r.specimen_id,
    field: r.field as DerivedField,
    value: r.value,
    sourceJoinIds: JSON.parse(r.source_join_ids) as number[],
    createdAt: r.created_at,
  };
}
