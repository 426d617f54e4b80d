import type { FragmentAnalysis } from './analyse-fragment';
import { boxDiagonal } from './mesh';

/** One surface region as reported to people and stored with a scan: small, JSON-ready. */
export interface FaceSummary {
  id: number;
  kind: 'fracture' | 'original';
  surfaceClass: string;
  area: number;
  /** Triangle count. */
  triangles: number;
  /** Region ids (of analysis.regions) that make up this face. */
  regions: number[];
  meanWidth: number | null;
  meanAngleDeg: number | null;
  angleClass: string | null;
  outlineClass: string | null;
  breakAge: { suggestion: string; evidence: string[] } | null;
}

export interface FragmentSummary {
  /** Triangles in the file as read (labels are one byte per one of these). */
  triangles: number;
  vertices: number;
  analysedTriangles: number;
  area: number;
  volume: number;
  closed: boolean;
  boundaryEdges: number;
  nonManifoldEdges: number;
  components: number;
  droppedComponentTriangles: number;
  bboxMm: { min: number[]; max: number[]; diagonal: number };
  shaftAxis: { direction: number[]; point: number[]; radius: number; support: number };
  faces: FaceSummary[];
  /** Every region of the segmentation with its class (ids for corrections). */
  regions: Array<{ id: number; surfaceClass: string; area: number; triangles: number }>;
  warnings: string[];
}

const round = (x: number, d = 3): number => (Number.isFinite(x) ? Math.round(x * 10 ** d) / 10 ** d : x);

/**
 * The figures of an analysis that a person reads and a catalogue keeps: fracture faces
 * first (id = fracture face id), then original surface regions.
 */
export function summariseFragment(a: FragmentAnalysis, warnings: string[] = []): FragmentSummary {
  const faces: FaceSummary[] = [];
  for (const f of a.fractureFaces) {
    const regions = [...new Set(Array.from(f.triangleIds, (t) => a.regionOfTriangle[t]))].sort((x, y) => x - y);
    faces.push({
      id: faces.length,
      kind: 'fracture',
      surfaceClass: 'fracture',
      area: round(f.area),
      triangles: f.triangleIds.length,
      regions,
      meanWidth: round(f.meanWidth),
      meanAngleDeg: Number.isFinite(f.meanAngleDeg) ? round(f.meanAngleDeg, 1) : null,
      angleClass: f.angleClass,
      outlineClass: f.outlineClass,
      breakAge: f.breakAge,
    });
  }
  for (const r of a.regions) {
    if (r.kind !== 'original' || r.triangleCount === 0) continue;
    faces.push({
      id: faces.length,
      kind: 'original',
      surfaceClass: r.surfaceClass,
      area: round(r.area),
      triangles: r.triangleCount,
      regions: [r.id],
      meanWidth: null,
      meanAngleDeg: null,
      angleClass: null,
      outlineClass: null,
      breakAge: null,
    });
  }
  const s = a.stats;
  const w = [...warnings];
  const diagonal = boxDiagonal(s.bbox);
  if (diagonal < 2) w.push(`the scan is only ${round(diagonal, 4)} mm across: check the units (a bone fragment is rarely under 2 mm)`);
  if (diagonal > 1000) w.push(`the scan is ${round(diagonal, 0)} mm across: check the units (a bone fragment is rarely over 1 m)`);
  if (s.components > 1) w.push(`the mesh has ${s.components} separate pieces; only the largest was analysed (${s.droppedComponentTriangles} triangles left out)`);
  if (s.nonManifoldEdges > 0) w.push(`${s.nonManifoldEdges} edges are shared by three or more triangles (non-manifold)`);
  if (!s.closed && s.boundaryEdges > 0) w.push(`the surface is open (${s.boundaryEdges} edges on holes or rims): volume is approximate`);
  return {
    triangles: s.inputTriangles,
    vertices: s.inputVertices,
    analysedTriangles: s.triangles,
    area: round(s.area),
    volume: round(s.volume),
    closed: s.closed,
    boundaryEdges: s.boundaryEdges,
    nonManifoldEdges: s.nonManifoldEdges,
    components: s.components,
    droppedComponentTriangles: s.droppedComponentTriangles,
    bboxMm: { min: s.bbox.min.map((x) => round(x)), max: s.bbox.max.map((x) => round(x)), diagonal: round(diagonal) },
    shaftAxis: {
      direction: a.axis.direction.map((x) => round(x, 5)),
      point: a.axis.point.map((x) => round(x)),
      radius: round(a.axis.radius),
      support: round(a.axis.support),
    },
    faces,
    regions: a.regions.map((r) => ({ id: r.id, surfaceClass: r.surfaceClass, area: round(r.area), triangles: r.triangleCount })),
    warnings: w,
  };
}
