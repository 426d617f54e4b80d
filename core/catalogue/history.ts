import type Database from 'better-sqlite3';
import type { HistoryEntry } from './records';

export interface NewHistoryEntry {
  who: string;
  entity: string;
  entityId: string | number | null;
  action: string;
  before?: unknown;
  after?: unknown;
  /** ISO time; defaults to now. */
  at?: string;
}

export interface HistoryFilter {
  entity?: string;
  entityId?: string | number;
  /** Only entries with id greater than this (to read what happened since a point). */
  afterId?: number;
  limit?: number;
}

interface HistoryRow {
  id: number;
  at: string;
  who: string;
  entity: string;
  entity_id: string | null;
  action: string;
  before: string | null;
  after: string | null;
}

/**
 * The append-only log of every decision and edit. Rows are only ever inserted; the schema's
 * triggers refuse UPDATE and DELETE, so a mistake is corrected by a new entry, never by
 * rewriting an old one.
 */
export class HistoryRepository {
  private readonly insertStmt: Database.Statement;

  constructor(private readonly db: Database.Database) {
    this.insertStmt = db.prepare(
      `INSERT INTO history (at, who, entity, entity_id, action, before, after) VALUES (?, ?, ?, ?, ?, ?, ?)`,
    );
  }

  record(e: NewHistoryEntry): number {
    const info = this.insertStmt.run(
      e.at ?? new Date().toISOString(),
      e.who,
      e.entity,
      e.entityId === null ? null : String(e.entityId),
      e.action,
      e.before === undefined ? null : JSON.stringify(e.before),
      e.after === undefined ? null : JSON.stringify(e.after),
    );
    return Number(info.lastInsertRowid);
  }

  list(filter: HistoryFilter = {}): HistoryEntry[] {
    const where: string[] = [];
    const args: unknown[] = [];
    if (filter.entity !== undefined) { where.push('entity = ?'); args.push(filter.entity); }
    if (filter.entityId !== undefined) { where.push('entity_id = ?'); args.push(String(filter.entityId)); }
    if (filter.afterId !== undefined) { where.push('id > ?'); args.push(filter.afterId); }
    const sql = `SELECT * FROM history ${where.length ? 'WHERE ' + where.join(' AND ') : ''} ORDER BY id` +
      (filter.limit !== undefined ? ` LIMIT ${Math.max(0, Math.floor(filter.limit))}` : '');
    return (this.db.prepare(sql).all(...args) as HistoryRow[]).map(fromRow);
  }

  count(): number {
    return (this.db.prepare('SELECT count(*) AS n FROM history').get() as { n: number }).n;
  }
}

function fromRow(r: HistoryRow): HistoryEntry {
  return {
    id: r.id,
    at: r.at,
    who: r.who,
    entity: r.entity,
    entityId: r.entity_id,
    action: r.action,
    before: r.before === null ? null : JSON.parse(r.before),
    after: r.after === null ? null : JSON.parse(r.after),
  };
}
