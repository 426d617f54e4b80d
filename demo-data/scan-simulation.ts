import { flipEdges } from './edge-flips';
import type { LabelledMesh } from './labelled-mesh';
import { applyToPoint, type Matrix4 } from './pose';
import type { Random } from './random';

/**
 * What a structured-light scan of a fragment gives: the surface resampled at the scanner's
 * point spacing with its own triangulation (edges flipped at random, edge-flips.ts), the
 * vertices jittered along the surface so that no vertex sits where the partner fragment's does, noise on every point, the fragment in the
 * pose it lay on the turntable, and vertex and triangle order of its own.
 *
 * `mesh` must already be refined to about the point spacing.
 */
export function simulateScan(mesh: LabelledMesh, pose: Matrix4, noiseSd: number, random: Random): LabelledMesh {
  for (let pass = 0; pass < 2; pass++) flipEdges(mesh.positions, mesh.triangles, mesh.labels, random);
  const { positions: p, triangles: t } = mesh;
  const nv = p.length / 3;
  const nt = t.length / 3;
  // incident triangles per vertex (CSR)
  const start = new Uint32Array(nv + 1);
  for (let i = 0; i < t.length; i++) start[t[i] + 1]++;
  for (let v = 0; v < nv; v++) start[v + 1] += start[v];
  const fill = start.slice(0, nv);
  const inc = new Uint32Array(t.length);
  for (let i = 0; i < t.length; i++) inc[fill[t[i]]++] = Math.floor(i / 3);
  // vertex normals (area weighted)
  const normals = new Float64Array(nv * 3);
  for (let f = 0; f < nt; f++) {
    const a = t[f * 3] * 3, b = t[f * 3 + 1] * 3, c = t[f * 3 + 2] * 3;
    const ux = p[b] - p[a], uy = p[b + 1] - p[a + 1], uz = p[b + 2] - p[a + 2];
    const vx = p[c] - p[a], vy = p[c + 1] - p[a + 1], vz = p[c + 2] - p[a + 2];
    const nx = uy * vz - uz * vy, ny = uz * vx - ux * vz, nz = ux * vy - uy * vx;
    for (const v of [a, b, c]) {
      normals[v] += nx;
      normals[v + 1] += ny;
      normals[v + 2] += nz;
    }
  }
  const moved = new Float64Array(nv * 3);
  for (let v = 0; v < nv; v++) {
    let x = p[v * 3], y = p[v * 3 + 1], z = p[v * 3 + 2];
    const count = start[v + 1] - start[v];
    if (count > 0) {
      // slide towards the centroid of one incident triangle: stays on the original surface
      const f = inc[start[v] + Math.floor(random.next() * count)];
      const s = random.uniform(0.05, 0.4);
      const a = t[f * 3] * 3, b = t[f * 3 + 1] * 3, c = t[f * 3 + 2] * 3;
      x += s * ((p[a] + p[b] + p[c]) / 3 - x);
      y += s * ((p[a + 1] + p[b + 1] + p[c + 1]) / 3 - y);
      z += s * ((p[a + 2] + p[b + 2] + p[c + 2]) / 3 - z);
    }
    if (noiseSd > 0) {
      const n = Math.hypot(normals[v * 3], normals[v * 3 + 1], normals[v * 3 + 2]) || 1;
      const along = random.normal(0, noiseSd);
      x += (normals[v * 3] / n) * along + random.normal(0, noiseSd * 0.3);
      y += (normals[v * 3 + 1] / n) * along + random.normal(0, noiseSd * 0.3);
      z += (normals[v * 3 + 2] / n) * along + random.normal(0, noiseSd * 0.3);
    }
    moved[v * 3] = x;
    moved[v * 3 + 1] = y;
    moved[v * 3 + 2] = z;
  }
  const vperm = random.permutation(nv);
  const positions = new Float32Array(nv * 3);
  for (let v = 0; v < nv; v++) {
    const q = applyToPoint(pose, moved[v * 3], moved[v * 3 + 1], moved[v * 3 + 2]);
    positions.set(q, vperm[v] * 3);
  }
  const tperm = random.permutation(nt);
  const triangles = new Uint32Array(nt * 3);
  const labels = new Uint8Array(nt);
  for (let f = 0; f < nt; f++) {
    const o = tperm[f];
    const rot = Math.floor(random.next() * 3);
    for (let k = 0; k < 3; k++) triangles[o * 3 + k] = vperm[t[f * 3 + ((k + rot) % 3)]];
    labels[o] = mesh.labels[f];
  }
  return { positions, triangles, labels };
}
