import type { LayerCrossing, SpatialAnalysis, SpatialSummary } from './analyse';
import type { JoinFilter } from './filters';
import type { ExcludedJoin, MeasuredJoin } from './types';

/**
 * The document `knitbone spatial --json` prints and `spatial.analyse` returns (issue 8):
 * joins, summary and layer matrix, plus the joins left out and the per-layer crossing shares.
 * Lengths are rounded to the millimetre, bearings to a hundredth of a degree and shares to
 * four decimals: piece-plotting is not more precise than that.
 */
export interface SpatialReport {
  filter: JoinFilter;
  joins: MeasuredJoin[];
  summary: SpatialSummary;
  layerMatrix: Record<string, Record<string, number>>;
  perLayer: Record<string, LayerCrossing>;
  /** Layers in reading order (see SpatialAnalysis.layers). */
  layers: string[];
  excluded: ExcludedJoin[];
}

const round = (v: number, places: number) => {
  const f = 10 ** places;
  const r = Math.round(v * f) / f;
  return Object.is(r, -0) ? 0 : r;
};
const roundOrNull = (v: number | null, places: number) => (v === null ? null : round(v, places));
const M = 3;
const SHARE = 4;

export function spatialReport(analysis: SpatialAnalysis): SpatialReport {
  const s = analysis.summary;
  return {
    filter: analysis.filter,
    joins: analysis.joins.map((j) => ({
      id: j.id,
      a: j.a,
      b: j.b,
      type: j.type,
      breakAge: j.breakAge,
      horizontalM: round(j.horizontalM, M),
      verticalM: round(j.verticalM, M),
      distance3dM: round(j.distance3dM, M),
      bearingDeg: j.bearingDeg === null ? null : round(j.bearingDeg, 2) % 360,
      crossesUnit: j.crossesUnit,
      crossesLevel: j.crossesLevel,
      crossesLayer: j.crossesLayer,
      approximate: j.approximate,
    })),
    summary: {
      count: s.count,
      approximateCount: s.approximateCount,
      excludedCount: s.excludedCount,
      meanHorizontalM: roundOrNull(s.meanHorizontalM, M),
      medianHorizontalM: roundOrNull(s.medianHorizontalM, M),
      maxHorizontalM: roundOrNull(s.maxHorizontalM, M),
      meanVerticalM: roundOrNull(s.meanVerticalM, M),
      medianVerticalM: roundOrNull(s.medianVerticalM, M),
      maxVerticalM: roundOrNull(s.maxVerticalM, M),
      shareCrossingUnit: roundOrNull(s.shareCrossingUnit, SHARE),
      shareCrossingLevel: roundOrNull(s.shareCrossingLevel, SHARE),
      shareCrossingLayer: roundOrNull(s.shareCrossingLayer, SHARE),
    },
    layerMatrix: analysis.layerMatrix,
    layers: analysis.layers,
    perLayer: Object.fromEntries(
      Object.entries(analysis.perLayer).map(([k, v]) => [
        k,
        { ...v, shareCrossingLayer: roundOrNull(v.shareCrossingLayer, SHARE), shareCrossingLevel: roundOrNull(v.shareCrossingLevel, SHARE) },
      ]),
    ),
    excluded: analysis.excluded,
  };
}
