import type Database from 'better-sqlite3';
import { KnitboneError } from '../host/errors';
import type { HistoryRepository } from './history';
import { SPECIMEN_FIELDS, type Specimen, type SpecimenField, type SpecimenFields } from './records';

interface SpecimenRow {
  id: number;
  catalogue_no: string;
  unit: string | null;
  level: string | null;
  layer: string | null;
  x: number | null;
  y: number | null;
  z: number | null;
  taxon: string | null;
  element: string | null;
  side: string | null;
  portion: string;
  fusion: string | null;
  size_class: number | null;
  break_age: string | null;
  modifications: string;
  weight_g: number | null;
  notes: string | null;
  created_at: string;
  updated_at: string;
}

/** SQL column of each specimen field. */
export const SPECIMEN_COLUMNS: Record<SpecimenField, string> = {
  catalogueNo: 'catalogue_no', unit: 'unit', level: 'level', layer: 'layer', x: 'x', y: 'y', z: 'z',
  taxon: 'taxon', element: 'element', side: 'side', portion: 'portion', fusion: 'fusion',
  sizeClass: 'size_class', breakAge: 'break_age', modifications: 'modifications', weightG: 'weight_g', notes: 'notes',
};

export interface SpecimenFilter {
  unit?: string;
  taxon?: string;
  element?: string;
}

export interface SpecimenUpdate {
  specimen: Specimen;
  /** Fields whose value changed; empty when the patch changed nothing (no history is written then). */
  changed: SpecimenField[];
}

/**
 * The analyst's observed specimen records. Every insert and update is one transaction and
 * leaves one history entry (insert: the full record; update: before/after of the changed
 * fields only). Values are stored as given: callers normalise them through the vocabulary
 * first (see specimen-input.ts); the schema still refuses impossible sides, size classes...
 */
export class SpecimenRepository {
  private readonly insertStmt: Database.Statement;
  private readonly byId: Database.Statement;
  private readonly byNo: Database.Statement;

  constructor(
    private readonly db: Database.Database,
    private readonly history: HistoryRepository,
    private readonly defaultWho: string,
  ) {
    const cols = SPECIMEN_FIELDS.map((f) => SPECIMEN_COLUMNS[f]);
    this.insertStmt = db.prepare(
      `INSERT INTO specimen (${cols.join(', ')}, created_at, updated_at) VALUES (${cols.map(() => '?').join(', ')}, ?, ?)`,
    );
    this.byId = db.prepare('SELECT * FROM specimen WHERE id = ?');
    this.byNo = db.prepare('SELECT * FROM specimen WHERE catalogue_no = ?');
  }

  list(filter: SpecimenFilter = {}): Specimen[] {
    const where: string[] = [];
    const args: unknown[] = [];
    for (const key of ['unit', 'taxon', 'element'] as const) {
      if (filter[key] !== undefined) { where.push(`${key} = ?`); args.push(filter[key]); }
    }
    const sql = `SELECT ${LIST_COLUMNS} FROM specimen ${where.length ? 'WHERE ' + where.join(' AND ') : ''} ORDER BY id`;
    // Rows as arrays: noticeably cheaper than objects for the full list of a large assemblage.
    return (this.db.prepare(sql).raw(true).all(...args) as unknown[][]).map(specimenFromArray);
  }

  /** Every catalogue number with its specimen id (cheaper than list() for lookups). */
  catalogueNumbers(): Map<string, number> {
    const rows = this.db.prepare('SELECT catalogue_no, id FROM specimen').raw(true).all() as [string, number][];
    return new Map(rows);
  }

  count(): number {
    return (this.db.prepare('SELECT count(*) AS n FROM specimen').get() as { n: number }).n;
  }

  get(id: number): Specimen | undefined {
    const row = this.byId.get(id) as SpecimenRow | undefined;
    return row && specimenFromRow(row);
  }

  getByCatalogueNo(catalogueNo: string): Specimen | undefined {
    const row = this.byNo.get(catalogueNo) as SpecimenRow | undefined;
    return row && specimenFromRow(row);
  }

  /** Like get/getByCatalogueNo, but a missing specimen is a 'not-found' KnitboneError. */
  require(ref: number | string): Specimen {
    const s = typeof ref === 'number' ? this.get(ref) : this.getByCatalogueNo(ref);
    if (!s) throw new KnitboneError('not-found', `no specimen ${typeof ref === 'number' ? `with id ${ref}` : `"${ref}"`} in this catalogue`);
    return s;
  }

  insert(fields: SpecimenFields, who: string = this.defaultWho, action = 'insert'): Specimen {
    return this.insertMany([fields], who, action)[0];
  }

  /** Insert many in one transaction (all or none). A duplicate catalogue number is a 'conflict'. */
  insertMany(list: SpecimenFields[], who: string = this.defaultWho, action = 'insert'): Specimen[] {
    const at = new Date().toISOString();
    const run = this.db.transaction(() => {
      const out: Specimen[] = [];
      for (const f of list) {
        let id: number;
        try {
          id = Number(this.insertStmt.run(...toValues(f), at, at).lastInsertRowid);
        } catch (err) {
          if ((err as { code?: string }).code === 'SQLITE_CONSTRAINT_UNIQUE') {
            throw new KnitboneError('conflict', [{ field: 'catalogueNo', message: `catalogue number "${f.catalogueNo}" is already in this catalogue` }]);
          }
          throw err;
        }
        this.history.record({ at, who, entity: 'specimen', entityId: id, action, after: pickFields(f) });
        out.push({ ...pickFields(f), id, createdAt: at, updatedAt: at });
      }
      return out;
    });
    return run();
  }

  /**
   * Remove a specimen entered by mistake. Refused ('conflict') while scans, joins or derived
   * identifications refer to it; the full record goes to history, so it can be re-entered.
   */
  remove(id: number, who: string = this.defaultWho): Specimen {
    const run = this.db.transaction((): Specimen => {
      const current = this.require(id);
      const refs = this.db
        .prepare(
          `SELECT (SELECT count(*) FROM scan WHERE specimen_id = ?) AS scans,
                  (SELECT count(*) FROM specimen_join WHERE specimen_a = ? OR specimen_b = ?) AS joins,
                  (SELECT count(*) FROM derived_identification WHERE specimen_id = ?) AS derived`,
        )
        .get(id, id, id, id) as { scans: number; joins: number; derived: number };
      const held = [refs.scans && `${refs.scans} scan(s)`, refs.joins && `${refs.joins} join(s)`, refs.derived && `${refs.derived} derived identification(s)`].filter(Boolean);
      if (held.length) {
        throw new KnitboneError('conflict', [{ field: 'catalogueNo', message: `specimen "${current.catalogueNo}" still has ${held.join(', ')}; remove those first` }]);
      }
      this.db.prepare('DELETE FROM specimen WHERE id = ?').run(id);
      const { id: _id, createdAt: _c, updatedAt: _u, ...before } = current;
      this.history.record({ who, entity: 'specimen', entityId: id, action: 'delete', before });
      return current;
    });
    return run();
  }

  /** Change some fields of one specimen; records before/after of what changed. */
  update(id: number, patch: Partial<SpecimenFields>, who: string = this.defaultWho, action = 'update'): SpecimenUpdate {
    const run = this.db.transaction((): SpecimenUpdate => {
      const current = this.require(id);
      const changed = SPECIMEN_FIELDS.filter((f) => f in patch && patch[f] !== undefined && !sameValue(current[f], patch[f]));
      if (changed.length === 0) return { specimen: current, changed };
      const at = new Date().toISOString();
      const sets = changed.map((f) => `${SPECIMEN_COLUMNS[f]} = ?`).join(', ');
      const values = changed.map((f) => toColumnValue(f, patch[f]));
      try {
        this.db.prepare(`UPDATE specimen SET ${sets}, updated_at = ? WHERE id = ?`).run(...values, at, id);
      } catch (err) {
        if ((err as { code?: string }).code === 'SQLITE_CONSTRAINT_UNIQUE') {
          throw new KnitboneError('conflict', [{ field: 'catalogueNo', message: `catalogue number "${patch.catalogueNo}" is already in this catalogue` }]);
        }
        throw err;
      }
      const before: Record<string, unknown> = {};
      const after: Record<string, unknown> = {};
      for (const f of changed) { before[f] = current[f]; after[f] = patch[f]; }
      this.history.record({ at, who, entity: 'specimen', entityId: id, action, before, after });
      return { specimen: this.require(id), changed };
    });
    return run();
  }
}

const LIST_COLUMNS =
  'id, catalogue_no, unit, level, layer, x, y, z, taxon, element, side, portion, fusion, size_class, break_age, modifications, weight_g, notes, created_at, updated_at';

function specimenFromArray(r: unknown[]): Specimen {
  return {
    id: r[0] as number,
    catalogueNo: r[1] as string,
    unit: r[2] as string | null,
    level: r[3] as string | null,
    layer: r[4] as string | null,
    x: r[5] as number | null,
    y: r[6] as number | null,
    z: r[7] as number | null,
    taxon: r[8] as string | null,
    element: r[9] as string | null,
    side: r[10] as Specimen['side'],
    portion: parseList(r[11] as string),
    fusion: r[12] as string | null,
    sizeClass: r[13] as number | null,
    breakAge: r[14] as Specimen['breakAge'],
    modifications: parseList(r[15] as string),
    weightG: r[16] as number | null,
    notes: r[17] as string | null,
    createdAt: r[18] as string,
    updatedAt: r[19] as string,
  };
}

export function specimenFromRow(r: SpecimenRow): Specimen {
  return {
    id: r.id,
    catalogueNo: r.catalogue_no,
    unit: r.unit,
    level: r.level,
    layer: r.layer,
    x: r.x,
    y: r.y,
    z: r.z,
    taxon: r.taxon,
    element: r.element,
    side: r.side as Specimen['side'],
    portion: parseList(r.portion),
    fusion: r.fusion,
    sizeClass: r.size_class,
    breakAge: r.break_age as Specimen['breakAge'],
    modifications: parseList(r.modifications),
    weightG: r.weight_g,
    notes: r.notes,
    createdAt: r.created_at,
    updatedAt: r.updated_at,
  };
}

function parseList(text: string): string[] {
  return text === '[]' ? [] : (JSON.parse(text) as string[]);
}

function pickFields(f: SpecimenFields): SpecimenFields {
  const out = {} as Record<SpecimenField, unknown>;
  for (const k of SPECIMEN_FIELDS) out[k] = f[k] ?? (k === 'portion' || k === 'modifications' ? [] : null);
  return out as unknown as SpecimenFields;
}

function toColumnValue(f: SpecimenField, v: unknown): unknown {
  if (f === 'portion' || f === 'modifications') return JSON.stringify(v ?? []);
  return v ?? null;
}

function toValues(f: SpecimenFields): unknown[] {
  return SPECIMEN_FIELDS.map((k) => toColumnValue(k, f[k]));
}

function sameValue(a: unknown, b: unknown): boolean {
  if (Array.isArray(a) || Array.isArray(b)) return JSON.stringify(a ?? []) === JSON.stringify(b ?? []);
  return (a ?? null) === (b ?? null);
}
