import type { Manifold } from 'manifold-3d';

/** A fragment's mesh with one surface label per triangle (see shatter.ts for the legend). */
export interface LabelledMesh {
  positions: Float32Array;
  triangles: Uint32Array;
  labels: Uint8Array;
}

/** Read a solid's mesh and label each triangle by the original mesh it came from. */
export function labelledMesh(solid: Manifold, labelOf: ReadonlyMap<number, number>): LabelledMesh {
  const mesh = solid.getMesh();
  const np = mesh.numProp;
  const nv = mesh.vertProperties.length / np;
  let positions: Float32Array;
  if (np === 3) positions = new Float32Array(mesh.vertProperties);
  else {
    positions = new Float32Array(nv * 3);
    for (let i = 0; i < nv; i++) {
      positions[i * 3] = mesh.vertProperties[i * np];
      positions[i * 3 + 1] = mesh.vertProperties[i * np + 1];
      positions[i * 3 + 2] = mesh.vertProperties[i * np + 2];
    }
  }
  const triangles = new Uint32Array(mesh.triVerts);
  const labels = new Uint8Array(triangles.length / 3);
  const runIndex = mesh.runIndex;
  const runOriginalID = mesh.runOriginalID;
  for (let r = 0; r < runOriginalID.length; r++) {
    const label = labelOf.get(runOriginalID[r]);
    if (label === undefined) throw new Error(`triangle run from an unknown mesh ${runOriginalID[r]}`);
    labels.fill(label, runIndex[r] / 3, runIndex[r + 1] / 3);
  }
  return { positions, triangles, labels };
}

export function triangleArea(p: Float32Array, t: Uint32Array, i: number): number {
  const a = t[i * 3] * 3, b = t[i * 3 + 1] * 3, c = t[i * 3 + 2] * 3;
  const ux = p[b] - p[a], uy = p[b + 1] - p[a + 1], uz = p[b + 2] - p[a + 2];
  const vx = p[c] - p[a], vy = p[c + 1] - p[a + 1], vz = p[c + 2] - p[a + 2];
  return 0.5 * Math.hypot(uy * vz - uz * vy, uz * vx - ux * vz, ux * vy - uy * vx);
}
