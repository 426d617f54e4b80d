/**
 * The triangle mesh every geometry function works on: flat typed arrays so a mesh can be
 * transferred to a worker thread without copying (design.md section 2).
 *
 * positions: x, y, z per vertex (millimetres once imported).
 * triangles: three vertex indices per triangle, counter-clockwise seen from outside.
 */
import { hypot } from './hypot';
export interface TriangleMesh {
  positions: Float32Array;
  triangles: Uint32Array;
}

export function vertexCount(mesh: TriangleMesh): number {
  return mesh.positions.length / 3;
}

export function triangleCount(mesh: TriangleMesh): number {
  return mesh.triangles.length / 3;
}

export interface BoundingBox {
  min: [number, number, number];
  max: [number, number, number];
}

export function boundingBox(positions: Float32Array): BoundingBox {
  const min: [number, number, number] = [Infinity, Infinity, Infinity];
  const max: [number, number, number] = [-Infinity, -Infinity, -Infinity];
  for (let i = 0; i < positions.length; i += 3) {
    for (let k = 0; k < 3; k++) {
      const v = positions[i + k];
      if (v < min[k]) min[k] = v;
      if (v > max[k]) max[k] = v;
    }
  }
  return { min, max };
}

export function boxDiagonal(box: BoundingBox): number {
  const dx = box.max[0] - box.min[0];
  const dy = box.max[1] - box.min[1];
  const dz = box.max[2] - box.min[2];
  return Math.sqrt(dx * dx + dy * dy + dz * dz);
}

/** Unit normal and area of every triangle (normal is zero for a degenerate triangle). */
export function triangleNormalsAndAreas(mesh: TriangleMesh): { normals: Float32Array; areas: Float64Array } {
  const { positions: p, triangles: t } = mesh;
  const n = t.length / 3;
  const normals = new Float32Array(n * 3);
  const areas = new Float64Array(n);
  for (let f = 0; f < n; f++) {
    const a = t[3 * f] * 3, b = t[3 * f + 1] * 3, c = t[3 * f + 2] * 3;
    const ux = p[b] - p[a], uy = p[b + 1] - p[a + 1], uz = p[b + 2] - p[a + 2];
    const vx = p[c] - p[a], vy = p[c + 1] - p[a + 1], vz = p[c + 2] - p[a + 2];
    const cx = uy * vz - uz * vy, cy = uz * vx - ux * vz, cz = ux * vy - uy * vx;
    const len = Math.sqrt(cx * cx + cy * cy + cz * cz);
    areas[f] = len / 2;
    if (len > 0) {
      normals[3 * f] = cx / len;
      normals[3 * f + 1] = cy / len;
      normals[3 * f + 2] = cz / len;
    }
  }
  return { normals, areas };
}

/** Area-weighted vertex normals (unit length; zero for an isolated vertex). */
export function vertexNormals(mesh: TriangleMesh): Float32Array {
  const { positions: p, triangles: t } = mesh;
  const out = new Float64Array(p.length);
  for (let f = 0; f < t.length; f += 3) {
    const a = t[f] * 3, b = t[f + 1] * 3, c = t[f + 2] * 3;
    const ux = p[b] - p[a], uy = p[b + 1] - p[a + 1], uz = p[b + 2] - p[a + 2];
    const vx = p[c] - p[a], vy = p[c + 1] - p[a + 1], vz = p[c + 2] - p[a + 2];
    const cx = uy * vz - uz * vy, cy = uz * vx - ux * vz, cz = ux * vy - uy * vx;
    for (const v of [a, b, c]) {
      out[v] += cx;
      out[v + 1] += cy;
      out[v + 2] += cz;
    }
  }
  const n = new Float32Array(p.length);
  for (let i = 0; i < p.length; i += 3) {
    const len = hypot(out[i], out[i + 1], out[i + 2]);
    if (len > 0) {
      n[i] = out[i] / len;
      n[i + 1] = out[i + 1] / len;
      n[i + 2] = out[i + 2] / len;
    }
  }
  return n;
}
