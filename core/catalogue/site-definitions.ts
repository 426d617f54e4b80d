import type Database from 'better-sqlite3';
import type { LayerBoundaryPoint, LevelDefinition, SiteDefinitions, SpatialJoin, SpatialSpecimen, UnitDefinition } from '../spatial/types';
import type { HistoryRepository } from './history';

/**
 * Where units, levels and layers are (migration 0040): read them, and store a set of
 * definitions in one transaction with a history entry per change. Built from an open
 * catalogue: `new SiteDefinitionRepository(cat.db, cat.history, cat.who)`.
 */
export interface SiteDefinitionChanges {
  unitsAdded: number;
  unitsChanged: number;
  levelsAdded: number;
  levelsChanged: number;
  /** Layers whose boundary points were replaced, and how many points they now have in all. */
  layersReplaced: string[];
  boundaryPoints: number;
}

interface UnitRow { unit: string; x_min: number; y_min: number; x_max: number; y_max: number }
interface LevelRow { id: number; unit: string | null; level: string; top_z: number; bottom_z: number }
interface PointRow { id: number; layer: string; x: number; y: number; z: number }

export class SiteDefinitionRepository {
  constructor(
    private readonly db: Database.Database,
    private readonly history: HistoryRepository,
    private readonly defaultWho: string,
  ) {}

  units(): UnitDefinition[] {
    return (this.db.prepare('SELECT * FROM excavation_unit ORDER BY unit').all() as UnitRow[]).map(unitFromRow);
  }

  levels(): LevelDefinition[] {
    return (this.db.prepare('SELECT * FROM excavation_level ORDER BY unit IS NOT NULL, unit, level').all() as LevelRow[]).map(levelFromRow);
  }

  layerBoundaries(): LayerBoundaryPoint[] {
    return (this.db.prepare('SELECT * FROM layer_boundary_point ORDER BY layer, id').all() as PointRow[]).map((r) => ({
      layer: r.layer,
      x: r.x,
      y: r.y,
      z: r.z,
    }));
  }

  /**
   * Every specimen's provenience and taxon, for spatial analysis. The taxon is the analyst's
   * own, or where they recorded none, the one derived through accepted joins.
   */
  spatialSpecimens(): SpatialSpecimen[] {
    const rows = this.db
      .prepare(
        `SELECT s.id, s.catalogue_no, s.unit, s.level, s.layer, s.x, s.y, s.z, coalesce(s.taxon, d.value) AS taxon
           FROM specimen s LEFT JOIN derived_identification d ON d.specimen_id = s.id AND d.field = 'taxon'
          ORDER BY s.id`,
      )
      .all() as { id: number; catalogue_no: string; unit: string | null; level: string | null; layer: string | null; x: number | null; y: number | null; z: number | null; taxon: string | null }[];
    return rows.map((r) => ({ id: r.id, catalogueNo: r.catalogue_no, unit: r.unit, level: r.level, layer: r.layer, x: r.x, y: r.y, z: r.z, taxon: r.taxon }));
  }

  /** Accepted joins, in the order they were made; a join without a type is reported as "unspecified". */
  acceptedJoins(): SpatialJoin[] {
    const rows = this.db
      .prepare(`SELECT id, specimen_a, specimen_b, type, break_age FROM specimen_join WHERE status = 'accepted' ORDER BY id`)
      .all() as { id: number; specimen_a: number; specimen_b: number; type: string | null; break_age: string | null }[];
    return rows.map((r) => ({ id: r.id, a: r.specimen_a, b: r.specimen_b, type: r.type ?? 'unspecified', breakAge: r.break_age }));
  }

  all(): SiteDefinitions {
    return { units: this.units(), levels: this.levels(), layerBoundaries: this.layerBoundaries() };
  }

  /**
   * Store definitions, all or none: a unit or level with the name of an existing one replaces
   * it; the boundary points of each layer named replace that layer's points. Every change is
   * written to the history with what it was before.
   */
  store(defs: SiteDefinitions, who: string = this.defaultWho): SiteDefinitionChanges {
    const run = this.db.transaction((): SiteDefinitionChanges => {
      const at = new Date().toISOString();
      const out: SiteDefinitionChanges = { unitsAdded: 0, unitsChanged: 0, levelsAdded: 0, levelsChanged: 0, layersReplaced: [], boundaryPoints: 0 };
      const getUnit = this.db.prepare('SELECT * FROM excavation_unit WHERE unit = ?');
      for (const u of defs.units) {
        const before = getUnit.get(u.unit) as UnitRow | undefined;
        if (before) {
          const old = unitFromRow(before);
          if (sameUnit(old, u)) continue;
          this.db
            .prepare('UPDATE excavation_unit SET x_min = ?, y_min = ?, x_max = ?, y_max = ?, updated_at = ? WHERE unit = ?')
            .run(u.xMin, u.yMin, u.xMax, u.yMax, at, u.unit);
          this.history.record({ at, who, entity: 'excavation_unit', entityId: u.unit, action: 'update', before: old, after: u });
          out.unitsChanged++;
        } else {
          this.db
            .prepare('INSERT INTO excavation_unit (unit, x_min, y_min, x_max, y_max, created_at, updated_at) VALUES (?, ?, ?, ?, ?, ?, ?)')
            .run(u.unit, u.xMin, u.yMin, u.xMax, u.yMax, at, at);
          this.history.record({ at, who, entity: 'excavation_unit', entityId: u.unit, action: 'insert', after: u });
          out.unitsAdded++;
        }
      }
      const getLevel = this.db.prepare(`SELECT * FROM excavation_level WHERE coalesce(unit, '') = coalesce(?, '') AND level = ?`);
      for (const l of defs.levels) {
        const before = getLevel.get(l.unit, l.level) as LevelRow | undefined;
        const key = `${l.unit ?? '*'}/${l.level}`;
        if (before) {
          const old = levelFromRow(before);
          if (old.topZ === l.topZ && old.bottomZ === l.bottomZ) continue;
          this.db.prepare('UPDATE excavation_level SET top_z = ?, bottom_z = ?, updated_at = ? WHERE id = ?').run(l.topZ, l.bottomZ, at, before.id);
          this.history.record({ at, who, entity: 'excavation_level', entityId: key, action: 'update', before: old, after: l });
          out.levelsChanged++;
        } else {
          this.db
            .prepare('INSERT INTO excavation_level (unit, level, top_z, bottom_z, created_at, updated_at) VALUES (?, ?, ?, ?, ?, ?)')
            .run(l.unit, l.level, l.topZ, l.bottomZ, at, at);
          this.history.record({ at, who, entity: 'excavation_level', entityId: key, action: 'insert', after: l });
          out.levelsAdded++;
        }
      }
      const layers = [...new Set(defs.layerBoundaries.map((p) => p.layer))];
      const pointsOf = this.db.prepare('SELECT * FROM layer_boundary_point WHERE layer = ? ORDER BY id');
      const insertPoint = this.db.prepare('INSERT INTO layer_boundary_point (layer, x, y, z, created_at) VALUES (?, ?, ?, ?, ?)');
      for (const layer of layers) {
        const before = (pointsOf.all(layer) as PointRow[]).map((r) => ({ x: r.x, y: r.y, z: r.z }));
        const after = defs.layerBoundaries.filter((p) => p.layer === layer).map((p) => ({ x: p.x, y: p.y, z: p.z }));
        this.db.prepare('DELETE FROM layer_boundary_point WHERE layer = ?').run(layer);
        for (const p of after) insertPoint.run(layer, p.x, p.y, p.z, at);
        this.history.record({
          at, who, entity: 'layer_boundary', entityId: layer, action: before.length ? 'replace' : 'insert',
          before: before.length ? before : undefined, after,
        });
        out.layersReplaced.push(layer);
      }
      out.boundaryPoints = (this.db.prepare('SELECT count(*) AS n FROM layer_boundary_point').get() as { n: number }).n;
      return out;
    });
    return run();
  }
}

function unitFromRow(r: UnitRow): UnitDefinition {
  return { unit: r.unit, xMin: r.x_min, yMin: r.y_min, xMax: r.x_max, yMax: r.y_max };
}

function levelFromRow(r: LevelRow): LevelDefinition {
  return { unit: r.unit, level: r.level, topZ: r.top_z, bottomZ: r.bottom_z };
}

function sameUnit(p: UnitDefinition, q: UnitDefinition): boolean {
  return p.xMin === q.xMin && p.yMin === q.yMin && p.xMax === q.xMax && p.yMax === q.yMax;
}
