import type Database from 'better-sqlite3';
import { KnitboneError } from '../host/errors';
import type { HistoryRepository } from './history';
import type { BreakAge, Join, JoinStatus, JoinType, Transform } from './records';

interface JoinRow {
  id: number;
  specimen_a: number;
  specimen_b: number;
  scan_a: number | null;
  scan_b: number | null;
  status: string;
  type: string | null;
  break_age: string | null;
  transform: string | null;
  score: number | null;
  score_components: string;
  method_version: string | null;
  parameters: string;
  note: string | null;
  forced: number;
  decided_by: string | null;
  decided_at: string | null;
  created_at: string;
}

export interface NewJoin {
  specimenA: number;
  specimenB: number;
  scanA?: number | null;
  scanB?: number | null;
  status?: JoinStatus;
  type?: JoinType | null;
  breakAge?: BreakAge | null;
  transform?: Transform | null;
  score?: number | null;
  scoreComponents?: Record<string, number>;
  methodVersion?: string | null;
  parameters?: Record<string, unknown>;
  note?: string | null;
  forced?: boolean;
  decidedBy?: string | null;
  decidedAt?: string | null;
}

/** Fields of a join that may change after it was made (the two specimens never do). */
export type JoinPatch = Partial<Omit<NewJoin, 'specimenA' | 'specimenB'>>;

export interface JoinFilter {
  status?: JoinStatus;
  type?: JoinType;
  /** Joins that involve this specimen on either side. */
  specimenId?: number;
}

const COLUMN: Record<keyof Omit<NewJoin, 'specimenA' | 'specimenB'>, string> = {
  scanA: 'scan_a', scanB: 'scan_b', status: 'status', type: 'type', breakAge: 'break_age', transform: 'transform',
  score: 'score', scoreComponents: 'score_components', methodVersion: 'method_version', parameters: 'parameters',
  note: 'note', forced: 'forced', decidedBy: 'decided_by', decidedAt: 'decided_at',
};

/**
 * Joins between two specimens: proposed by the geometry, found by hand, accepted or
 * rejected by a person. Insert and update are transactions with a history entry each.
 * The decision rules (conflicts, propagation) live in core/refits and the joins requests;
 * this repository only stores.
 */
export class JoinRepository {
  constructor(
    private readonly db: Database.Database,
    private readonly history: HistoryRepository,
    private readonly defaultWho: string,
  ) {}

  insert(j: NewJoin, who: string = this.defaultWho, action = 'insert'): Join {
    checkTransform(j.transform);
    const run = this.db.transaction((): Join => {
      const at = new Date().toISOString();
      const info = this.db
        .prepare(
          `INSERT INTO specimen_join (specimen_a, specimen_b, scan_a, scan_b, status, type, break_age, transform, score,
             score_components, method_version, parameters, note, forced, decided_by, decided_at, created_at)
           VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
        )
        .run(
          j.specimenA, j.specimenB, j.scanA ?? null, j.scanB ?? null, j.status ?? 'proposed', j.type ?? null,
          j.breakAge ?? null, j.transform ? JSON.stringify(j.transform) : null, j.score ?? null,
          JSON.stringify(j.scoreComponents ?? {}), j.methodVersion ?? null, JSON.stringify(j.parameters ?? {}),
          j.note ?? null, j.forced ? 1 : 0, j.decidedBy ?? null, j.decidedAt ?? null, at,
        );
      const join = this.require(Number(info.lastInsertRowid));
      this.history.record({ at, who, entity: 'join', entityId: join.id, action, after: join });
      return join;
    });
    return run();
  }

  get(id: number): Join | undefined {
    const row = this.db.prepare('SELECT * FROM specimen_join WHERE id = ?').get(id) as JoinRow | undefined;
    return row && joinFromRow(row);
  }

  require(id: number): Join {
    const j = this.get(id);
    if (!j) throw new KnitboneError('not-found', `no join with id ${id} in this catalogue`);
    return j;
  }

  list(filter: JoinFilter = {}): Join[] {
    const where: string[] = [];
    const args: unknown[] = [];
    if (filter.status) { where.push('status = ?'); args.push(filter.status); }
    if (filter.type) { where.push('type = ?'); args.push(filter.type); }
    if (filter.specimenId !== undefined) { where.push('(specimen_a = ? OR specimen_b = ?)'); args.push(filter.specimenId, filter.specimenId); }
    const sql = `SELECT * FROM specimen_join ${where.length ? 'WHERE ' + where.join(' AND ') : ''} ORDER BY id`;
    return (this.db.prepare(sql).all(...args) as JoinRow[]).map(joinFromRow);
  }

  /** Change a join (status, type, decision...); history gets before/after of the changed fields. */
  update(id: number, patch: JoinPatch, who: string = this.defaultWho, action = 'update'): Join {
    checkTransform(patch.transform);
    const run = this.db.transaction((): Join => {
      const current = this.require(id);
      const keys = (Object.keys(patch) as (keyof JoinPatch)[]).filter(
        (k) => patch[k] !== undefined && JSON.stringify(current[k]) !== JSON.stringify(patch[k]),
      );
      if (keys.length === 0) return current;
      const values = keys.map((k) => {
        const v = patch[k];
        if (k === 'transform') return v ? JSON.stringify(v) : null;
        if (k === 'scoreComponents' || k === 'parameters') return JSON.stringify(v ?? {});
        if (k === 'forced') return v ? 1 : 0;
        return v ?? null;
      });
      this.db.prepare(`UPDATE specimen_join SET ${keys.map((k) => `${COLUMN[k]} = ?`).join(', ')} WHERE id = ?`).run(...values, id);
      const before: Record<string, unknown> = {};
      const after: Record<string, unknown> = {};
      for (const k of keys) { before[k] = current[k]; after[k] = patch[k]; }
      this.history.record({ who, entity: 'join', entityId: id, action, before, after });
      return this.require(id);
    });
    return run();
  }

  /** Remove a join (the undo of a link made by hand); history keeps what it was. */
  remove(id: number, who: string = this.defaultWho, action = 'delete'): Join {
    const run = this.db.transaction((): Join => {
      const current = this.require(id);
      this.db.prepare('DELETE FROM specimen_join WHERE id = ?').run(id);
      this.history.record({ who, entity: 'join', entityId: id, action, before: current });
      return current;
    });
    return run();
  }
}

function checkTransform(t: Transform | null | undefined): void {
  if (t && (t.length !== 16 || t.some((v) => !Number.isFinite(v)))) {
    throw new KnitboneError('bad-input', [{ field: 'transform', message: 'a transform is 16 finite numbers (4x4, row-major)' }]);
  }
}

export function joinFromRow(r: JoinRow): Join {
  return {
    id: r.id,
    specimenA: r.specimen_a,
    specimenB: r.specimen_b,
    scanA: r.scan_a,
    scanB: r.scan_b,
    status: r.status as JoinStatus,
    type: r.type as JoinType | null,
    breakAge: r.break_age as BreakAge | null,
    transform: r.transform === null ? null : (JSON.parse(r.transform) as number[]),
    score: r.score,
    scoreComponents: JSON.parse(r.score_components) as Record<string, number>,
    methodVersion: r.method_version,
    parameters: JSON.parse(r.parameters) as Record<string, unknown>,
    note: r.note,
    forced: r.forced === 1,
    decidedBy: r.decided_by,
    decidedAt: r.decided_at,
    createdAt: r.created_at,
  };
}
