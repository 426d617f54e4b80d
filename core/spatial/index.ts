/**
 * Spatial analysis of refits: distances, displacement and crossings of accepted joins, the
 * layer-to-layer matrix, and plan, section, histogram and rose figures as SVG text. Pure: no
 * I/O, no SQLite, no DOM.
 */
export * from './types';
export * from './measures';
export { analyseRefits, compareLayerNames, type PlacedJoin, type SpatialAnalysis, type SpatialSummary, type LayerCrossing } from './analyse';
export { joinKind, joinPasses, type JoinFilter } from './filters';
export { indexSite, resolvePosition } from './positions';
export { spatialReport, type SpatialReport } from './report';
export * from './figures/index';
