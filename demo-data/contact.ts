import { type LabelledMesh, triangleArea } from './labelled-mesh';

/**
 * Area (mm²) of A's face of one break that lies on B's face of the same break, before any
 * resampling: both sides come from one boolean split, so their shared vertices are identical
 * and a triangle of A whose three corners are all corners of B's face lies on B's face.
 */
export function contactArea(a: LabelledMesh, b: LabelledMesh, label: number): number {
  const keys = new Set<string>();
  const pb = b.positions;
  for (let t = 0; t < b.labels.length; t++) {
    if (b.labels[t] !== label) continue;
    for (let k = 0; k < 3; k++) keys.add(vertexKey(pb, b.triangles[t * 3 + k]));
  }
  if (keys.size === 0) return 0;
  let area = 0;
  const pa = a.positions;
  for (let t = 0; t < a.labels.length; t++) {
    if (a.labels[t] !== label) continue;
    const ta = a.triangles;
    if (keys.has(vertexKey(pa, ta[t * 3])) && keys.has(vertexKey(pa, ta[t * 3 + 1])) && keys.has(vertexKey(pa, ta[t * 3 + 2]))) {
      area += triangleArea(pa, ta, t);
    }
  }
  return area;
}

/** Area (mm²) of the triangles with a given label. */
export function labelArea(m: LabelledMesh, label: number): number {
  let area = 0;
  for (let t = 0; t < m.labels.length; t++) if (m.labels[t] === label) area += triangleArea(m.positions, m.triangles, t);
  return area;
}

function vertexKey(p: Float32Array, v: number): string {
  return `${p[v * 3]},${p[v * 3 + 1]},${p[v * 3 + 2]}`;
}
