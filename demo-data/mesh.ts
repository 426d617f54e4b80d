/** A triangle mesh as flat typed arrays: xyz per vertex (mm), three vertex indices per triangle. */
export interface TriangleMesh {
  positions: Float32Array;
  triangles: Uint32Array;
}

/** Signed volume by the divergence theorem (positive for outward-facing triangles). */
export function signedVolume(positions: ArrayLike<number>, triangles: ArrayLike<number>): number {
  let v = 0;
  for (let t = 0; t < triangles.length; t += 3) {
    const a = triangles[t] * 3;
    const b = triangles[t + 1] * 3;
    const c = triangles[t + 2] * 3;
    const ax = positions[a], ay = positions[a + 1], az = positions[a + 2];
    const bx = positions[b], by = positions[b + 1], bz = positions[b + 2];
    const cx = positions[c], cy = positions[c + 1], cz = positions[c + 2];
    v += ax * (by * cz - bz * cy) - ay * (bx * cz - bz * cx) + az * (bx * cy - by * cx);
  }
  return v / 6;
}

/** Reverse every triangle in place. */
export function flipTriangles(triangles: Uint32Array): void {
  for (let t = 0; t < triangles.length; t += 3) {
    const b = triangles[t + 1];
    triangles[t + 1] = triangles[t + 2];
    triangles[t + 2] = b;
  }
}

/** Make the triangles face outwards (positive volume). */
export function orientOutwards(mesh: TriangleMesh): TriangleMesh {
  if (signedVolume(mesh.positions, mesh.triangles) < 0) flipTriangles(mesh.triangles);
  return mesh;
}

/**
 * Every edge of a closed, consistently oriented mesh is used exactly twice, once in each
 * direction. Returns the number of edges that break this rule (0 for a closed 2-manifold).
 */
export function openEdgeCount(triangles: Uint32Array, vertexCount: number): number {
  const counts = new Map<number, number>();
  const key = (a: number, b: number) => a * vertexCount + b;
  for (let t = 0; t < triangles.length; t += 3) {
    for (let e = 0; e < 3; e++) {
      const a = triangles[t + e];
      const b = triangles[t + ((e + 1) % 3)];
      const k = key(a, b);
      counts.set(k, (counts.get(k) ?? 0) + 1);
    }
  }
  let bad = 0;
  for (const [k, n] of counts) {
    const a = Math.floor(k / vertexCount);
    const b = k - a * vertexCount;
    if (n !== 1 || counts.get(key(b, a)) !== 1) bad++;
  }
  return bad;
}
