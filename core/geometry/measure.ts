import type { TriangleMesh } from './mesh';

/** Total surface area: half the length of each triangle's edge cross product, summed. */
export function surfaceArea(mesh: TriangleMesh): number {
  const { positions: p, triangles: t } = mesh;
  let sum = 0;
  for (let f = 0; f < t.length; f += 3) {
    const a = t[f] * 3, b = t[f + 1] * 3, c = t[f + 2] * 3;
    const ux = p[b] - p[a], uy = p[b + 1] - p[a + 1], uz = p[b + 2] - p[a + 2];
    const vx = p[c] - p[a], vy = p[c + 1] - p[a + 1], vz = p[c + 2] - p[a + 2];
    const cx = uy * vz - uz * vy, cy = uz * vx - ux * vz, cz = ux * vy - uy * vx;
    sum += Math.sqrt(cx * cx + cy * cy + cz * cz) / 2;
  }
  return sum;
}

/**
 * Enclosed volume by the divergence theorem: the sum over triangles of the signed volume of
 * the tetrahedron (origin, a, b, c) = a . (b x c) / 6. Exact for a closed, consistently
 * oriented mesh; positive when triangles wind counter-clockwise seen from outside.
 * Coordinates are taken relative to the first vertex to keep rounding small.
 */
export function enclosedVolume(mesh: TriangleMesh): number {
  const { positions: p, triangles: t } = mesh;
  if (p.length === 0) return 0;
  const ox = p[0], oy = p[1], oz = p[2];
  let sum = 0;
  for (let f = 0; f < t.length; f += 3) {
    const a = t[f] * 3, b = t[f + 1] * 3, c = t[f + 2] * 3;
    const ax = p[a] - ox, ay = p[a + 1] - oy, az = p[a + 2] - oz;
    const bx = p[b] - ox, by = p[b + 1] - oy, bz = p[b + 2] - oz;
    const cx = p[c] - ox, cy = p[c + 1] - oy, cz = p[c + 2] - oz;
    sum += ax * (by * cz - bz * cy) - ay * (bx * cz - bz * cx) + az * (bx * cy - by * cx);
  }
  return sum / 6;
}
