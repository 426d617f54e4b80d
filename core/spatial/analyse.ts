import { joinPasses, type JoinFilter } from './filters';
import { bearingDeg, distance3d, horizontalDistance, verticalDisplacement } from './measures';
import { indexSite, resolvePosition } from './positions';
import { maximum, mean, median, shareTrue } from './statistics';
import type {
  ExcludedJoin,
  MeasuredJoin,
  ResolvedPosition,
  SiteDefinitions,
  SpatialJoin,
  SpatialSpecimen,
} from './types';

/** A measured join with the two positions it was measured between (for figures). */
export interface PlacedJoin extends MeasuredJoin {
  from: ResolvedPosition;
  to: ResolvedPosition;
}

/** Crossings of one join, known whether or not the specimens have positions. */
interface Crossings {
  crossesUnit: boolean | null;
  crossesLevel: boolean | null;
  crossesLayer: boolean | null;
}

export interface SpatialSummary {
  /** Joins measured (both specimens have a position, exact or approximate). */
  count: number;
  /** Of those, joins where at least one position came from unit centre or level mid-depth. */
  approximateCount: number;
  /** Joins left out of the distances because a specimen has no position. */
  excludedCount: number;
  meanHorizontalM: number | null;
  medianHorizontalM: number | null;
  maxHorizontalM: number | null;
  meanVerticalM: number | null;
  medianVerticalM: number | null;
  maxVerticalM: number | null;
  /**
   * Shares of joins crossing a unit, level or layer boundary. These need no coordinates, so
   * they count every join in the selection (measured or not) whose two specimens both have
   * the unit, level or layer recorded; null when none has.
   */
  shareCrossingUnit: number | null;
  shareCrossingLevel: number | null;
  shareCrossingLayer: number | null;
}

/** For one layer: the joins that reach it, and how many of them leave it. */
export interface LayerCrossing {
  /** Joins with at least one specimen in this layer. */
  joins: number;
  /** Both specimens in this layer. */
  withinLayer: number;
  /** The other specimen in a different (recorded) layer. */
  toOtherLayers: number;
  /** toOtherLayers / (withinLayer + toOtherLayers); null when neither. */
  shareCrossingLayer: number | null;
  /** Of the joins reaching this layer whose two levels are recorded, the share between levels. */
  shareCrossingLevel: number | null;
}

export interface SpatialAnalysis {
  filter: JoinFilter;
  joins: PlacedJoin[];
  excluded: ExcludedJoin[];
  summary: SpatialSummary;
  /**
   * Layer-to-layer connection matrix: matrix[p][q] is the number of joins between a specimen in
   * layer p and one in layer q. Symmetric: a join between different layers appears in both
   * [p][q] and [q][p]; the diagonal holds joins within one layer.
   */
  layerMatrix: Record<string, Record<string, number>>;
  perLayer: Record<string, LayerCrossing>;
  /**
   * The layers in reading order (numbers numerically, then text: 2, 3a, 3b, 4). JSON objects
   * put integer-like keys first whatever their order, so readers go by this list, not by keys.
   */
  layers: string[];
}

const differs = (p: string | null, q: string | null): boolean | null =>
  p === null || q === null ? null : p !== q;

function crossingsOf(a: SpatialSpecimen, b: SpatialSpecimen): Crossings {
  const crossesUnit = differs(a.unit, b.unit);
  // Level names repeat from unit to unit (level 3 of one unit is not level 3 of the next as a
  // place, but it is as a depth interval): levels are compared by name, as recorded.
  const crossesLevel = differs(a.level, b.level);
  const crossesLayer = differs(a.layer, b.layer);
  return { crossesUnit, crossesLevel, crossesLayer };
}

/** Sort layer names the way an analyst reads them: numbers numerically, then text. */
export function compareLayerNames(p: string, q: string): number {
  return p.localeCompare(q, undefined, { numeric: true, sensitivity: 'base' });
}

/**
 * Measure every accepted join that passes the filter. Joins naming a specimen that is not in
 * `specimens` are reported as excluded (the catalogue should never produce them).
 */
export function analyseRefits(
  specimens: readonly SpatialSpecimen[],
  joins: readonly SpatialJoin[],
  site: SiteDefinitions,
  filter: JoinFilter = {},
): SpatialAnalysis {
  const byId = new Map<number, SpatialSpecimen>();
  for (const s of specimens) byId.set(s.id, s);
  const siteIndex = indexSite(site);

  const placed: PlacedJoin[] = [];
  const excluded: ExcludedJoin[] = [];
  const crossings: Crossings[] = [];
  const matrix = new Map<string, Map<string, number>>();
  const perLayer = new Map<string, { joins: number; within: number; other: number; levels: (boolean | null)[] }>();
  const bump = (p: string, q: string) => {
    let row = matrix.get(p);
    if (!row) matrix.set(p, (row = new Map()));
    row.set(q, (row.get(q) ?? 0) + 1);
  };
  const layerEntry = (layer: string) => {
    let e = perLayer.get(layer);
    if (!e) perLayer.set(layer, (e = { joins: 0, within: 0, other: 0, levels: [] }));
    return e;
  };

  for (const join of joins) {
    const a = byId.get(join.a);
    const b = byId.get(join.b);
    if (!joinPasses(join, a, b, filter)) continue;
    if (!a || !b) {
      excluded.push({
        id: join.id,
        a: a?.catalogueNo ?? `#${join.a}`,
        b: b?.catalogueNo ?? `#${join.b}`,
        type: join.type,
        reason: `join ${join.id} names a specimen that is not in the catalogue`,
        crossesUnit: null,
        crossesLevel: null,
        crossesLayer: null,
      });
      continue;
    }
    const c = crossingsOf(a, b);
    crossings.push(c);

    // Layers: the matrix and the per-layer shares need only the recorded layers.
    if (a.layer !== null && b.layer !== null) {
      bump(a.layer, b.layer);
      if (a.layer !== b.layer) bump(b.layer, a.layer);
    }
    const reached = new Set([a.layer, b.layer].filter((l): l is string => l !== null));
    for (const layer of reached) {
      const e = layerEntry(layer);
      e.joins++;
      if (c.crossesLayer === false) e.within++;
      else if (c.crossesLayer === true) e.other++;
      e.levels.push(c.crossesLevel);
    }

    const pa = resolvePosition(a, siteIndex);
    const pb = resolvePosition(b, siteIndex);
    if (!pa.ok || !pb.ok) {
      const reasons = [pa, pb].filter((r): r is { ok: false; reason: string } => !r.ok).map((r) => r.reason);
      excluded.push({ id: join.id, a: a.catalogueNo, b: b.catalogueNo, type: join.type, reason: reasons.join('; '), ...c });
      continue;
    }
    const from = pa.position;
    const to = pb.position;
    placed.push({
      id: join.id,
      a: a.catalogueNo,
      b: b.catalogueNo,
      type: join.type,
      breakAge: join.breakAge ?? null,
      horizontalM: horizontalDistance(from, to),
      verticalM: verticalDisplacement(from, to),
      distance3dM: distance3d(from, to),
      bearingDeg: bearingDeg(from, to),
      ...c,
      approximate: from.approximate || to.approximate,
      from,
      to,
    });
  }

  const horizontal = placed.map((j) => j.horizontalM);
  const vertical = placed.map((j) => j.verticalM);
  const summary: SpatialSummary = {
    count: placed.length,
    approximateCount: placed.filter((j) => j.approximate).length,
    excludedCount: excluded.length,
    meanHorizontalM: mean(horizontal),
    medianHorizontalM: median(horizontal),
    maxHorizontalM: maximum(horizontal),
    meanVerticalM: mean(vertical),
    medianVerticalM: median(vertical),
    maxVerticalM: maximum(vertical),
    shareCrossingUnit: shareTrue(crossings.map((c) => c.crossesUnit)),
    shareCrossingLevel: shareTrue(crossings.map((c) => c.crossesLevel)),
    shareCrossingLayer: shareTrue(crossings.map((c) => c.crossesLayer)),
  };

  const layers = [...new Set([...matrix.keys(), ...perLayer.keys()])].sort(compareLayerNames);
  const layerMatrix: Record<string, Record<string, number>> = {};
  const matrixLayers = [...matrix.keys()].sort(compareLayerNames);
  for (const p of matrixLayers) {
    layerMatrix[p] = {};
    for (const q of matrixLayers) layerMatrix[p][q] = matrix.get(p)?.get(q) ?? 0;
  }
  const perLayerOut: Record<string, LayerCrossing> = {};
  for (const layer of layers) {
    const e = perLayer.get(layer);
    if (!e) continue;
    perLayerOut[layer] = {
      joins: e.joins,
      withinLayer: e.within,
      toOtherLayers: e.other,
      shareCrossingLayer: e.within + e.other === 0 ? null : e.other / (e.within + e.other),
      shareCrossingLevel: shareTrue(e.levels),
    };
  }

  return { filter, joins: placed, excluded, summary, layerMatrix, perLayer: perLayerOut, layers };
}
