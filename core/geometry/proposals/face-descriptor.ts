/**
 * A few rotation-invariant numbers per break face for the candidate index: size (log area,
 * log of the two in-plane extents from principal components) and the face's mean FPFH, which
 * sums up its roughness and bending. Two faces of one break have about the same size, and the
 * mean FPFH of one equals the mirrored mean FPFH of the other (flipped normals), so a face
 * looks for partners with `partnerDescriptor`.
 */
import { Matrix, EigenvalueDecomposition } from 'ml-matrix';
import { FPFH_DIM } from '../registration/fpfh';
import { mirrorFpfh } from '../registration/ransac-alignment';

export const SIZE_DIMS = 3;
export const DESCRIPTOR_DIM = SIZE_DIMS + FPFH_DIM;
/** Weight of the size part against the shape part (measured on generated assemblages). */
const SIZE_WEIGHT = 2.5;
const SHAPE_WEIGHT = 0.1;

export function faceDescriptor(points: Float32Array, normals: Float32Array, _outline: Float32Array, area: number, fpfh?: Float32Array): Float32Array {
  const d = new Float32Array(DESCRIPTOR_DIM);
  const ext = principalExtents(points);
  d[0] = SIZE_WEIGHT * Math.log(Math.max(area, 1e-9));
  d[1] = SIZE_WEIGHT * Math.log(Math.max(ext[0], 1e-9));
  d[2] = SIZE_WEIGHT * Math.log(Math.max(ext[1], 1e-9));
  void normals;
  if (fpfh && fpfh.length >= FPFH_DIM) {
    const n = fpfh.length / FPFH_DIM;
    for (let i = 0; i < n; i++) for (let k = 0; k < FPFH_DIM; k++) d[SIZE_DIMS + k] += fpfh[i * FPFH_DIM + k];
    for (let k = 0; k < FPFH_DIM; k++) d[SIZE_DIMS + k] *= SHAPE_WEIGHT / n;
  }
  return d;
}

/** What a face's partner looks like in the index: same size, mirrored FPFH. */
export function partnerDescriptor(d: Float32Array): Float32Array {
  const out = new Float32Array(d.length);
  out.set(d.subarray(0, SIZE_DIMS));
  out.set(mirrorFpfh(d.slice(SIZE_DIMS, SIZE_DIMS + FPFH_DIM)), SIZE_DIMS);
  return out;
}

/** Standard deviations of the points along their two largest principal directions. */
export function principalExtents(points: Float32Array): [number, number, number] {
  const n = points.length / 3;
  if (n < 3) return [0, 0, 0];
  let cx = 0, cy = 0, cz = 0;
  for (let i = 0; i < n; i++) {
    cx += points[3 * i]; cy += points[3 * i + 1]; cz += points[3 * i + 2];
  }
  cx /= n; cy /= n; cz /= n;
  const C = [0, 0, 0, 0, 0, 0, 0, 0, 0];
  for (let i = 0; i < n; i++) {
    const v = [points[3 * i] - cx, points[3 * i + 1] - cy, points[3 * i + 2] - cz];
    for (let a = 0; a < 3; a++) for (let b = 0; b < 3; b++) C[a * 3 + b] += v[a] * v[b] / n;
  }
  const e = new EigenvalueDecomposition(new Matrix([C.slice(0, 3), C.slice(3, 6), C.slice(6, 9)]), { assumeSymmetric: true });
  const vals = e.realEigenvalues.map((x) => Math.sqrt(Math.max(0, x))).sort((p, q) => q - p);
  return [vals[0], vals[1], vals[2]];
}
