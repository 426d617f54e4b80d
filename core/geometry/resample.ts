import type { TriangleMesh } from './mesh';
import { hypot } from './hypot';

/** Points on the surface at a roughly fixed spacing, each with its triangle's normal. */
export interface SurfaceSamples {
  spacing: number;
  points: Float32Array;
  normals: Float32Array;
  /** Triangle of the mesh each point lies on. */
  triangle: Uint32Array;
}

/**
 * Resample a surface at a fixed spacing: every triangle is split into k x k sub-triangles
 * small enough (edge below spacing / 2) and their centroids are candidates; a voxel grid
 * of the given spacing keeps, per cell, the candidate nearest the cell centre. Deterministic,
 * and independent of how finely the scanner triangulated.
 */
export function resampleSurface(mesh: TriangleMesh, triNormals: Float32Array, spacing: number): SurfaceSamples {
  const p = mesh.positions, t = mesh.triangles;
  const nt = t.length / 3;
  const inv = 1 / spacing;
  const cells = new Map<number, number>(); // cell key -> candidate index
  const cand: number[] = []; // x, y, z, tri, dist2
  const keyOf = (ix: number, iy: number, iz: number): number => ((ix + 1048576) * 2097152 + (iy + 1048576)) * 2097152 + (iz + 1048576);
  for (let f = 0; f < nt; f++) {
    const a = 3 * t[3 * f], b = 3 * t[3 * f + 1], c = 3 * t[3 * f + 2];
    const lab = hypot(p[b] - p[a], p[b + 1] - p[a + 1], p[b + 2] - p[a + 2]);
    const lbc = hypot(p[c] - p[b], p[c + 1] - p[b + 1], p[c + 2] - p[b + 2]);
    const lca = hypot(p[a] - p[c], p[a + 1] - p[c + 1], p[a + 2] - p[c + 2]);
    const k = Math.min(64, Math.max(1, Math.ceil((2 * Math.max(lab, lbc, lca)) / spacing)));
    for (let i = 0; i < k; i++) {
      for (let j = 0; j < k - i; j++) {
        // Upright and (where present) inverted sub-triangle centroids in barycentric form.
        for (let up = 0; up < 2; up++) {
          if (up === 1 && j >= k - i - 1) continue;
          const u = up === 0 ? (i + 1 / 3) / k : (i + 2 / 3) / k;
          const v = up === 0 ? (j + 1 / 3) / k : (j + 2 / 3) / k;
          const w = 1 - u - v;
          const x = w * p[a] + u * p[b] + v * p[c];
          const y = w * p[a + 1] + u * p[b + 1] + v * p[c + 1];
          const z = w * p[a + 2] + u * p[b + 2] + v * p[c + 2];
          const ix = Math.floor(x * inv), iy = Math.floor(y * inv), iz = Math.floor(z * inv);
          const dx = x * inv - ix - 0.5, dy = y * inv - iy - 0.5, dz = z * inv - iz - 0.5;
          const d2 = dx * dx + dy * dy + dz * dz;
          const key = keyOf(ix, iy, iz);
          const at = cells.get(key);
          if (at === undefined) {
            cells.set(key, cand.length);
            cand.push(x, y, z, f, d2);
          } else if (d2 < cand[at + 4]) {
            cand[at] = x; cand[at + 1] = y; cand[at + 2] = z; cand[at + 3] = f; cand[at + 4] = d2;
          }
        }
      }
    }
  }
  const n = cand.length / 5;
  const points = new Float32Array(n * 3), normals = new Float32Array(n * 3), triangle = new Uint32Array(n);
  for (let i = 0; i < n; i++) {
    const f = cand[5 * i + 3];
    points[3 * i] = cand[5 * i]; points[3 * i + 1] = cand[5 * i + 1]; points[3 * i + 2] = cand[5 * i + 2];
    normals[3 * i] = triNormals[3 * f]; normals[3 * i + 1] = triNormals[3 * f + 1]; normals[3 * i + 2] = triNormals[3 * f + 2];
    triangle[i] = f;
  }
  return { spacing, points, normals, triangle };
}
