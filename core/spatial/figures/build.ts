import type { SpatialAnalysis } from '../analyse';
import type { SiteDefinitions, SpatialSpecimen } from '../types';
import { distanceHistogram, type DistanceMeasure } from './histogram';
import { layerMatrixFigure } from './layer-matrix';
import { planFigure } from './plan';
import { roseDiagram } from './rose';
import { sectionFigure, type SectionAxis } from './section';

export type FigureKind = 'plan' | 'section' | 'histogram' | 'rose' | 'layers';
export const figureKinds: readonly FigureKind[] = ['plan', 'section', 'histogram', 'rose', 'layers'];

export interface FigureRequest {
  kind: FigureKind;
  width?: number;
  /** Section only: the axis to project on (default: eastwards, along x). */
  section?: SectionAxis;
  /** Histogram only: which distance (default horizontal). */
  measure?: DistanceMeasure;
  /** Rose only: sector width in degrees and whether to fold directions onto an axis. */
  sectorDeg?: number;
  axial?: boolean;
  title?: string;
}

/**
 * The specimens a figure shows: those piece-plotted (x, y and z recorded), narrowed to the
 * analysis's taxa and layers when it was filtered by them.
 */
export function plottedSpecimens(specimens: readonly SpatialSpecimen[], analysis: SpatialAnalysis) {
  const { taxa, layers } = analysis.filter;
  const out: { x: number; y: number; z: number }[] = [];
  for (const s of specimens) {
    if (s.x === null || s.y === null || s.z === null) continue;
    if (!Number.isFinite(s.x) || !Number.isFinite(s.y) || !Number.isFinite(s.z)) continue;
    if (taxa?.length && (s.taxon === null || !taxa.includes(s.taxon))) continue;
    if (layers?.length && (s.layer === null || !layers.includes(s.layer))) continue;
    out.push({ x: s.x, y: s.y, z: s.z });
  }
  return out;
}

/** One figure of an analysis, as SVG text. */
export function buildFigure(
  request: FigureRequest,
  specimens: readonly SpatialSpecimen[],
  analysis: SpatialAnalysis,
  site: SiteDefinitions,
): string {
  const base = { width: request.width, title: request.title, note: filterNote(analysis.filter) };
  switch (request.kind) {
    case 'plan':
      return planFigure({ units: site.units, specimens: plottedSpecimens(specimens, analysis), joins: analysis.joins }, base);
    case 'section':
      return sectionFigure(
        { specimens: plottedSpecimens(specimens, analysis), joins: analysis.joins, layerBoundaries: site.layerBoundaries },
        request.section ?? { bearingDeg: 90 },
        base,
      );
    case 'histogram': {
      const measure = request.measure ?? 'horizontal';
      const pick = measure === 'horizontal' ? 'horizontalM' : measure === 'vertical' ? 'verticalM' : 'distance3dM';
      return distanceHistogram(analysis.joins.map((j) => j[pick]), measure, base);
    }
    case 'layers':
      return layerMatrixFigure(analysis.layerMatrix, analysis.perLayer, analysis.layers, base);
    case 'rose':
      return roseDiagram(
        analysis.joins.flatMap((j) => (j.bearingDeg === null ? [] : [j.bearingDeg])),
        { ...base, sectorDeg: request.sectorDeg, axial: request.axial },
      );
  }
}

/** "conjoin only; taxon Bos primigenius; layer C", or undefined when nothing was filtered. */
export function filterNote(f: SpatialAnalysis['filter']): string | undefined {
  const parts: string[] = [];
  if (f.types?.length) parts.push(`${f.types.join(' or ')} only`);
  if (f.taxa?.length) parts.push(`taxon ${f.taxa.join(' or ')}`);
  if (f.layers?.length) parts.push(`layer ${f.layers.join(' or ')}`);
  return parts.length ? parts.join('; ') : undefined;
}
