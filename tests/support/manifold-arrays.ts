/**
 * Flat arrays (positions xyz, triangle vertex indices) from a mesh returned by manifold-3d's
 * getMesh(), whose vertex properties may hold more than the three coordinates (numProp).
 */
export function manifoldArrays(m: { numProp: number; vertProperties: Float32Array; triVerts: Uint32Array }): { positions: Float32Array; triangles: Uint32Array } {
  const np = m.numProp;
  const nv = m.vertProperties.length / np;
  const positions = new Float32Array(nv * 3);
  for (let i = 0; i < nv; i++) for (let k = 0; k < 3; k++) positions[3 * i + k] = m.vertProperties[i * np + k];
  return { positions, triangles: Uint32Array.from(m.triVerts) };
}
