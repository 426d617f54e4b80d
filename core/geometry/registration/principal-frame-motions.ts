/**
 * Coarse motions that lay one break face onto another by their principal frames (the moment
 * matching of a face's samples: centroid and principal axes of their scatter; e.g. Besl & McKay
 * 1992, section IV, use the same frames to start ICP). Two faces of one clean break that both
 * survive are mirror images of each other: their centroids meet and their long axes lie along
 * each other, the faces' mean normals opposed. A face's frame is its samples' centroid, its mean
 * normal n (the samples are evenly spaced, so this is the area's mean normal) and its principal
 * direction of largest spread e1 taken across n, e2 = n x e1. B's frame is carried onto A's with
 * n_B onto -n_A and e1_B onto +e1_A or -e1_A (the sign of a principal direction is not defined),
 * so that the motion is a proper rotation; with `quarterTurns` also e1_B onto +-e2_A (for faces
 * whose two in-plane spreads are close, where the principal directions swap easily).
 * Returns nothing when either face has under 3 samples or a mean normal of no length.
 */
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import type { RigidTransform } from './rigid-transform';

interface Frame { c: [number, number, number]; e1: number[]; e2: number[]; n: number[] }

function faceFrame(points: Float32Array, normals: Float32Array): Frame | null {
  const m = points.length / 3;
  if (m < 3) return null;
  const c: [number, number, number] = [0, 0, 0];
  const n = [0, 0, 0];
  for (let i = 0; i < m; i++) for (let d = 0; d < 3; d++) { c[d] += points[3 * i + d] / m; n[d] += normals[3 * i + d]; }
  const ln = Math.hypot(n[0], n[1], n[2]);
  if (!(ln > 1e-9 * m)) return null;
  for (let d = 0; d < 3; d++) n[d] /= ln;
  const C = [0, 0, 0, 0, 0, 0, 0, 0, 0];
  for (let i = 0; i < m; i++) {
    const x = points[3 * i] - c[0], y = points[3 * i + 1] - c[1], z = points[3 * i + 2] - c[2];
    C[0] += x * x; C[1] += x * y; C[2] += x * z; C[4] += y * y; C[5] += y * z; C[8] += z * z;
  }
  C[3] = C[1]; C[6] = C[2]; C[7] = C[5];
  // the scatter's spread across the mean normal: (I - nn^T) C (I - nn^T), largest eigenvector
  const P = [0, 1, 2].map((i) => [0, 1, 2].map((j) => (i === j ? 1 : 0) - n[i] * n[j]));
  const PC = [0, 1, 2].map((i) => [0, 1, 2].map((j) => P[i][0] * C[j] + P[i][1] * C[3 + j] + P[i][2] * C[6 + j]));
  const S = [0, 1, 2].map((i) => [0, 1, 2].map((j) => PC[i][0] * P[0][j] + PC[i][1] * P[1][j] + PC[i][2] * P[2][j]));
  const e = new EigenvalueDecomposition(new Matrix(S), { assumeSymmetric: true });
  const vals = e.realEigenvalues, V = e.eigenvectorMatrix;
  let k = 0;
  for (let i = 1; i < 3; i++) if (vals[i] > vals[k]) k = i;
  const e1 = [V.get(0, k), V.get(1, k), V.get(2, k)];
  // remove any part along n left by rounding, then normalise
  const dn = e1[0] * n[0] + e1[1] * n[1] + e1[2] * n[2];
  for (let d = 0; d < 3; d++) e1[d] -= dn * n[d];
  const l1 = Math.hypot(e1[0], e1[1], e1[2]);
  if (!(l1 > 0)) return null;
  for (let d = 0; d < 3; d++) e1[d] /= l1;
  const e2 = [n[1] * e1[2] - n[2] * e1[1], n[2] * e1[0] - n[0] * e1[2], n[0] * e1[1] - n[1] * e1[0]];
  return { c, e1, e2, n };
}

/** Motions carrying B's face onto A's face by their principal frames (2, or 4 with quarterTurns). */
export function principalFrameMotions(pointsA: Float32Array, normalsA: Float32Array, pointsB: Float32Array, normalsB: Float32Array, options: { quarterTurns?: boolean } = {}): RigidTransform[] {
  const fa = faceFrame(pointsA, normalsA), fb = faceFrame(pointsB, normalsB);
  if (!fa || !fb) return [];
  const targets: Array<[number[], number[]]> = [];
  // images of e1_B and e2_B; n_B goes to -n_A; each pair with (image e1) x (image e2) = -n_A
  const neg = (v: number[]): number[] => v.map((x) => -x);
  targets.push([fa.e1, neg(fa.e2)], [neg(fa.e1), fa.e2]);
  if (options.quarterTurns) targets.push([fa.e2, fa.e1], [neg(fa.e2), neg(fa.e1)]);
  const out: RigidTransform[] = [];
  const nA = neg(fa.n);
  for (const [u, v] of targets) {
    // R = [u v -n_A] [e1_B e2_B n_B]^T
    const R = [0, 1, 2].map((i) => [0, 1, 2].map((j) => u[i] * fb.e1[j] + v[i] * fb.e2[j] + nA[i] * fb.n[j]));
    const t = [0, 1, 2].map((i) => fa.c[i] - (R[i][0] * fb.c[0] + R[i][1] * fb.c[1] + R[i][2] * fb.c[2]));
    out.push([R[0][0], R[0][1], R[0][2], t[0], R[1][0], R[1][1], R[1][2], t[1], R[2][0], R[2][1], R[2][2], t[2], 0, 0, 0, 1]);
  }
  return out;
}
