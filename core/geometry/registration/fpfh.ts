/**
 * Fast Point Feature Histograms (Rusu, Blodow & Beetz 2009, "Fast Point Feature Histograms
 * (FPFH) for 3D registration", ICRA): for each sample, the Darboux-frame angles (alpha, phi,
 * theta) to its neighbours within a radius, binned into three 11-bin histograms (SPFH), then
 * blended with the neighbours' SPFH weighted by inverse distance. 33 numbers per sample.
 *
 * Two sides of one break are the same surface seen from opposite sides, so callers describe
 * one side with its normals flipped (see `flipNormals`) before comparing histograms.
 */
import { KdTree } from './nearest-neighbours';

export const FPFH_BINS = 11;
export const FPFH_DIM = 3 * FPFH_BINS;

export function flipNormals(normals: ArrayLike<number>): Float32Array {
  const out = new Float32Array(normals.length);
  for (let i = 0; i < normals.length; i++) out[i] = -normals[i];
  return out;
}

export function computeFpfh(points: ArrayLike<number>, normals: ArrayLike<number>, radius: number, tree?: KdTree): Float32Array {
  const n = points.length / 3;
  const kd = tree ?? new KdTree(points, 3);
  const spfh = new Float32Array(n * FPFH_DIM);
  const neighbours: number[][] = new Array(n);
  const buf: number[] = [];
  const B = FPFH_BINS;
  for (let i = 0; i < n; i++) {
    const q = [points[3 * i], points[3 * i + 1], points[3 * i + 2]];
    kd.within(q, radius, buf);
    const list = buf.filter((j) => j !== i);
    neighbours[i] = list;
    if (list.length === 0) continue;
    const inc = 100 / list.length;
    for (const j of list) {
      const f = pairFeatures(points, normals, i, j);
      if (!f) continue;
      const [alpha, phi, theta] = f;
      const ba = binOf((alpha + 1) / 2, B);
      const bp = binOf((phi + 1) / 2, B);
      const bt = binOf((theta + Math.PI) / (2 * Math.PI), B);
      spfh[i * FPFH_DIM + ba] += inc;
      spfh[i * FPFH_DIM + B + bp] += inc;
      spfh[i * FPFH_DIM + 2 * B + bt] += inc;
    }
  }
  const out = new Float32Array(n * FPFH_DIM);
  for (let i = 0; i < n; i++) {
    const list = neighbours[i];
    for (let d = 0; d < FPFH_DIM; d++) out[i * FPFH_DIM + d] = spfh[i * FPFH_DIM + d];
    if (list.length === 0) continue;
    let wsum = 0;
    const acc = new Float64Array(FPFH_DIM);
    for (const j of list) {
      const dx = points[3 * j] - points[3 * i], dy = points[3 * j + 1] - points[3 * i + 1], dz = points[3 * j + 2] - points[3 * i + 2];
      const w = 1 / Math.max(1e-9, Math.hypot(dx, dy, dz));
      wsum += w;
      for (let d = 0; d < FPFH_DIM; d++) acc[d] += w * spfh[j * FPFH_DIM + d];
    }
    // Rusu et al.: FPFH = SPFH(p) + (1/k) sum SPFH(p_k)/w_k; normalised per histogram to sum 100
    for (let d = 0; d < FPFH_DIM; d++) out[i * FPFH_DIM + d] += acc[d] / wsum;
    for (let h = 0; h < 3; h++) {
      let s = 0;
      for (let b = 0; b < B; b++) s += out[i * FPFH_DIM + h * B + b];
      if (s > 0) for (let b = 0; b < B; b++) out[i * FPFH_DIM + h * B + b] *= 100 / s;
    }
  }
  return out;
}

function binOf(u: number, bins: number): number {
  const b = Math.floor(u * bins);
  return b < 0 ? 0 : b >= bins ? bins - 1 : b;
}

/** Rusu's pair features (alpha, phi, theta) for samples i and j, source chosen as in the paper. */
function pairFeatures(p: ArrayLike<number>, n: ArrayLike<number>, i: number, j: number): [number, number, number] | null {
  let dx = p[3 * j] - p[3 * i], dy = p[3 * j + 1] - p[3 * i + 1], dz = p[3 * j + 2] - p[3 * i + 2];
  const d = Math.hypot(dx, dy, dz);
  if (d < 1e-12) return null;
  dx /= d; dy /= d; dz /= d;
  let s = i, t = j;
  let ux = n[3 * i], uy = n[3 * i + 1], uz = n[3 * i + 2];
  const a1 = ux * dx + uy * dy + uz * dz;
  const a2 = n[3 * j] * dx + n[3 * j + 1] * dy + n[3 * j + 2] * dz;
  if (Math.abs(a1) < Math.abs(a2)) {
    // swap source and target so the source normal makes the smaller angle with the line
    s = j; t = i;
    dx = -dx; dy = -dy; dz = -dz;
    ux = n[3 * s]; uy = n[3 * s + 1]; uz = n[3 * s + 2];
  }
  // v = u x d, w = u x v
  let vx = uy * dz - uz * dy, vy = uz * dx - ux * dz, vz = ux * dy - uy * dx;
  const vl = Math.hypot(vx, vy, vz);
  if (vl < 1e-12) return null;
  vx /= vl; vy /= vl; vz /= vl;
  const wx = uy * vz - uz * vy, wy = uz * vx - ux * vz, wz = ux * vy - uy * vx;
  const ntx = n[3 * t], nty = n[3 * t + 1], ntz = n[3 * t + 2];
  const alpha = vx * ntx + vy * nty + vz * ntz;
  const phi = ux * dx + uy * dy + uz * dz;
  const theta = Math.atan2(wx * ntx + wy * nty + wz * ntz, ux * ntx + uy * nty + uz * ntz);
  return [alpha, phi, theta];
}
