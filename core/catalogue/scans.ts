import type Database from 'better-sqlite3';
import { KnitboneError } from '../host/errors';
import type { HistoryRepository } from './history';
import type { Scan } from './records';

interface ScanRow {
  id: number;
  specimen_id: number;
  path: string;
  content_hash: string;
  units: string;
  stats: string;
  created_at: string;
}

export interface NewScan {
  specimenId: number;
  path: string;
  contentHash: string;
  units?: Scan['units'];
  stats?: Record<string, unknown>;
}

/** Mesh files linked to specimens. Reading and measuring the files is the scans area's job. */
export class ScanRepository {
  constructor(
    private readonly db: Database.Database,
    private readonly history: HistoryRepository,
    private readonly defaultWho: string,
  ) {}

  insert(s: NewScan, who: string = this.defaultWho, action = 'insert'): Scan {
    const run = this.db.transaction((): Scan => {
      const at = new Date().toISOString();
      const info = this.db
        .prepare('INSERT INTO scan (specimen_id, path, content_hash, units, stats, created_at) VALUES (?, ?, ?, ?, ?, ?)')
        .run(s.specimenId, s.path, s.contentHash, s.units ?? 'mm', JSON.stringify(s.stats ?? {}), at);
      const scan = this.require(Number(info.lastInsertRowid));
      this.history.record({ at, who, entity: 'scan', entityId: scan.id, action, after: scan });
      return scan;
    });
    return run();
  }

  /** Replace the measured stats of a scan (history keeps the old ones). */
  updateStats(id: number, stats: Record<string, unknown>, who: string = this.defaultWho): Scan {
    const run = this.db.transaction((): Scan => {
      const before = this.require(id);
      this.db.prepare('UPDATE scan SET stats = ? WHERE id = ?').run(JSON.stringify(stats), id);
      this.history.record({ who, entity: 'scan', entityId: id, action: 'update', before: { stats: before.stats }, after: { stats } });
      return this.require(id);
    });
    return run();
  }

  get(id: number): Scan | undefined {
    const row = this.db.prepare('SELECT * FROM scan WHERE id = ?').get(id) as ScanRow | undefined;
    return row && scanFromRow(row);
  }

  require(id: number): Scan {
    const s = this.get(id);
    if (!s) throw new KnitboneError('not-found', `no scan with id ${id} in this catalogue`);
    return s;
  }

  list(filter: { specimenId?: number } = {}): Scan[] {
    const rows = filter.specimenId === undefined
      ? this.db.prepare('SELECT * FROM scan ORDER BY id').all()
      : this.db.prepare('SELECT * FROM scan WHERE specimen_id = ? ORDER BY id').all(filter.specimenId);
    return (rows as ScanRow[]).map(scanFromRow);
  }

  findByHash(specimenId: number, contentHash: string): Scan | undefined {
    const row = this.db.prepare('SELECT * FROM scan WHERE specimen_id = ? AND content_hash = ?').get(specimenId, contentHash) as ScanRow | undefined;
    return row && scanFromRow(row);
  }
}

function scanFromRow(r: ScanRow): Scan {
  return {
    id: r.id,
    specimenId: r.specimen_id,
    path: r.path,
    contentHash: r.content_hash,
    units: r.units as Scan['units'],
    stats: JSON.parse(r.stats) as Record<string, unknown>,
    createdAt: r.created_at,
  };
}
