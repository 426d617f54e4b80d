export { planFigure, type PlanInput, type PlanOptions } from './plan';
export { sectionFigure, projectOnAxis, type SectionAxis, type SectionInput, type SectionOptions } from './section';
export { distanceHistogram, binCounts, type DistanceMeasure, type HistogramOptions } from './histogram';
export { layerMatrixFigure } from './layer-matrix';
export { roseDiagram, sectorCounts, type RoseOptions } from './rose';
export { stylesFor, type JoinStyle } from './join-styles';
export { buildFigure, plottedSpecimens, figureKinds, type FigureKind, type FigureRequest } from './build';
