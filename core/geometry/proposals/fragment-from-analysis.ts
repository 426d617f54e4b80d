/**
 * What the matcher takes from a fragment's scan analysis (core/geometry/analyse-fragment.ts):
 * the cleaned mesh and, per fracture face, its samples with outward normals, its outline loops
 * and its area. Typed structurally so this module depends on no more of the analysis than it uses.
 */
import type { FragmentInput } from './prepared-fragment';

export interface AnalysisForMatching {
  mesh: { positions: Float32Array; triangles: Uint32Array };
  fractureFaces: ReadonlyArray<{ points: Float32Array; normals: Float32Array; outlines: Float32Array[]; area: number; triangleIds?: Uint32Array; pieces?: Uint32Array[] }>;
}

export function fragmentFromAnalysis(a: AnalysisForMatching): FragmentInput {
  return {
    positions: a.mesh.positions,
    triangles: a.mesh.triangles,
    faces: a.fractureFaces.map((f) => {
      let n = 0;
      for (const o of f.outlines) n += o.length;
      const outline = new Float32Array(n);
      let at = 0;
      for (const o of f.outlines) {
        outline.set(o, at);
        at += o.length;
      }
      return { points: f.points, normals: f.normals, outline, area: f.area, triangleIds: f.triangleIds, ...(f.pieces ? { pieces: f.pieces } : {}) };
    }),
  };
}
