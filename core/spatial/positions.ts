import type { LevelDefinition, ResolvedPosition, SiteDefinitions, SpatialSpecimen, UnitDefinition } from './types';

/**
 * Where a specimen lies. Piece-plotted x, y, z are used as recorded. A specimen without them
 * takes the centre of its excavation unit (for x and y) and the mid-depth of its level (for z)
 * when the catalogue defines them, and is marked approximate. Otherwise it has no position.
 */
export type PositionResult =
  | { ok: true; position: ResolvedPosition }
  | { ok: false; reason: string };

/** Look-ups built once per analysis. */
export interface SiteIndex {
  unitCentre(unit: string): { x: number; y: number } | undefined;
  levelMidDepth(unit: string | null, level: string): number | undefined;
}

export function indexSite(site: SiteDefinitions): SiteIndex {
  const units = new Map<string, UnitDefinition>();
  for (const u of site.units) units.set(u.unit, u);
  const levels = new Map<string, LevelDefinition>();
  const key = (unit: string | null, level: string) => `${unit ?? ''}\u0000${level}`;
  for (const l of site.levels) levels.set(key(l.unit, l.level), l);
  return {
    unitCentre(unit) {
      const u = units.get(unit);
      return u ? { x: (u.xMin + u.xMax) / 2, y: (u.yMin + u.yMax) / 2 } : undefined;
    },
    levelMidDepth(unit, level) {
      // A level defined for this unit wins over a site-wide one of the same name.
      const l = (unit !== null ? levels.get(key(unit, level)) : undefined) ?? levels.get(key(null, level));
      return l ? (l.topZ + l.bottomZ) / 2 : undefined;
    },
  };
}

const finite = (v: number | null): v is number => v !== null && Number.isFinite(v);

export function resolvePosition(s: SpatialSpecimen, site: SiteIndex): PositionResult {
  let approximate = false;
  let x: number;
  let y: number;
  let z: number;
  if (finite(s.x) && finite(s.y)) {
    x = s.x;
    y = s.y;
  } else {
    const centre = s.unit !== null ? site.unitCentre(s.unit) : undefined;
    if (!centre) {
      return {
        ok: false,
        reason: s.unit === null
          ? `specimen ${s.catalogueNo} has no x, y and no unit; record its coordinates or its unit`
          : `specimen ${s.catalogueNo} has no x, y and unit ${s.unit} is not defined; define the unit's extent`,
      };
    }
    x = centre.x;
    y = centre.y;
    approximate = true;
  }
  if (finite(s.z)) {
    z = s.z;
  } else {
    const mid = s.level !== null ? site.levelMidDepth(s.unit, s.level) : undefined;
    if (mid === undefined) {
      return {
        ok: false,
        reason: s.level === null
          ? `specimen ${s.catalogueNo} has no z and no level; record its elevation or its level`
          : `specimen ${s.catalogueNo} has no z and level ${s.level} is not defined; define the level's top and bottom`,
      };
    }
    z = mid;
    approximate = true;
  }
  return { ok: true, position: { x, y, z, approximate } };
}
