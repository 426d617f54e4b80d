import type Database from 'better-sqlite3';
import type { HistoryRepository } from './history';

export type RegionSurfaceClass = 'fracture' | 'outer-cortical' | 'medullary' | 'articular';

export interface RegionClassCorrection {
  id: number;
  scanId: number;
  regionId: number;
  /** null: the correction is withdrawn and the program's class applies. */
  surfaceClass: RegionSurfaceClass | null;
  who: string;
  createdAt: string;
}

interface Row {
  id: number;
  scan_id: number;
  region_id: number;
  surface_class: string | null;
  who: string;
  created_at: string;
}

/** The analyst's corrections of a scan's region classes (migration 0020): append-only. */
export class RegionClassRepository {
  constructor(
    private readonly db: Database.Database,
    private readonly history: HistoryRepository,
    private readonly defaultWho: string,
  ) {}

  /**
   * Record a correction (or, with null, withdraw one). `shown` is the class the region had on
   * screen before and has after (the program's class where no correction is in force), so the
   * history reads "fracture -> medullary" rather than "no correction -> medullary".
   */
  correct(
    scanId: number,
    regionId: number,
    surfaceClass: RegionSurfaceClass | null,
    who: string = this.defaultWho,
    shown: { before?: string; after?: string } = {},
  ): RegionClassCorrection {
    const run = this.db.transaction((): RegionClassCorrection => {
      const at = new Date().toISOString();
      const before = this.inForce(scanId).get(regionId) ?? null;
      const info = this.db
        .prepare('INSERT INTO scan_region_class (scan_id, region_id, surface_class, who, created_at) VALUES (?, ?, ?, ?, ?)')
        .run(scanId, regionId, surfaceClass, who, at);
      const row = this.db.prepare('SELECT * FROM scan_region_class WHERE id = ?').get(Number(info.lastInsertRowid)) as Row;
      this.history.record({
        at, who, entity: 'scan', entityId: scanId, action: 'correct-region-class',
        before: { regionId, surfaceClass: before, ...(shown.before ? { shownClass: shown.before } : {}) },
        after: { regionId, surfaceClass, ...(shown.after ? { shownClass: shown.after } : {}) },
      });
      return fromRow(row);
    });
    return run();
  }

  /** Every correction of a scan, oldest first. */
  list(scanId: number): RegionClassCorrection[] {
    return (this.db.prepare('SELECT * FROM scan_region_class WHERE scan_id = ? ORDER BY id').all(scanId) as Row[]).map(fromRow);
  }

  /** The corrections in force: region id -> class (withdrawn ones left out). */
  inForce(scanId: number): Map<number, RegionSurfaceClass> {
    const out = new Map<number, RegionSurfaceClass | null>();
    for (const c of this.list(scanId)) out.set(c.regionId, c.surfaceClass);
    const result = new Map<number, RegionSurfaceClass>();
    for (const [k, v] of out) if (v) result.set(k, v);
    return result;
  }
}

function fromRow(r: Row): RegionClassCorrection {
  return {
    id: r.id,
    scanId: r.scan_id,
    regionId: r.region_id,
    surfaceClass: r.surface_class as RegionSurfaceClass | null,
    who: r.who,
    createdAt: r.created_at,
  };
}
