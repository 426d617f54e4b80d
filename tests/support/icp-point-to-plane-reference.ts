/**
 * The trimmed point-to-plane ICP of core/geometry/registration/icp-point-to-plane.ts exactly as
 * it stood at main 1d5e97e (session 18), before its loop read the motion's entries from locals
 * and asked a sampled target's k-d tree directly: kept verbatim, under the name
 * `referenceIcpPointToPlane`, only so that icp-guess.test.ts can prove the faster loop ends
 * at the same motions to the last bit. Not for use outside tests.
 */
import { compose, transformFromTwist, type RigidTransform } from '../../core/geometry/registration/rigid-transform';
import type { ClosestPoint, ClosestPointSource } from '../../core/geometry/registration/target-surface';
import { sortIndicesByKey } from '../../core/geometry/registration/sort-indices';
import { autoTrimKeep, type IcpOptions, type IcpResult } from '../../core/geometry/registration/icp-point-to-plane';

export function referenceIcpPointToPlane(
  sourcePoints: ArrayLike<number>,
  sourceNormals: ArrayLike<number>,
  target: ClosestPointSource,
  initial: RigidTransform,
  options: IcpOptions,
): IcpResult {
  const n = sourcePoints.length / 3;
  const trim = options.trim ?? 0.8;
  const cosLimit = Math.cos(((options.minNormalAngleDeg ?? 120) * Math.PI) / 180);
  const opposed = options.opposedNormals ?? true;
  const maxIter = options.maxIterations ?? 40;
  const tol = options.tolerance ?? 1e-4;
  const lambda = options.autoTrimLambda ?? 0;
  const autoMin = options.autoTrimMin ?? 0.4;
  let T = initial.slice();
  let rms = Infinity;
  let inliers = 0;
  let iter = 0;
  const px = new Float64Array(n), py = new Float64Array(n), pz = new Float64Array(n);
  const qx = new Float64Array(n), qy = new Float64Array(n), qz = new Float64Array(n);
  const nx = new Float64Array(n), ny = new Float64Array(n), nz = new Float64Array(n);
  const dist = new Float64Array(n);
  const indices = new Int32Array(n), scratch = new Int32Array(n);
  const cp = {} as ClosestPoint;
  // each sample's closest target sample in the last round that found one (a sampled target's hint: same answers, fewer searches)
  const hints = new Int32Array(n).fill(-1);
  let maxD = options.maxDistance;
  for (iter = 0; iter < maxIter; iter++) {
    let m = 0;
    for (let i = 0; i < n; i++) {
      const x = sourcePoints[3 * i], y = sourcePoints[3 * i + 1], z = sourcePoints[3 * i + 2];
      const X = T[0] * x + T[1] * y + T[2] * z + T[3];
      const Y = T[4] * x + T[5] * y + T[6] * z + T[7];
      const Z = T[8] * x + T[9] * y + T[10] * z + T[11];
      const sx = sourceNormals[3 * i], sy = sourceNormals[3 * i + 1], sz = sourceNormals[3 * i + 2];
      const SX = T[0] * sx + T[1] * sy + T[2] * sz;
      const SY = T[4] * sx + T[5] * sy + T[6] * sz;
      const SZ = T[8] * sx + T[9] * sy + T[10] * sz;
      const hit = target.closest(X, Y, Z, maxD, cp, hints[i]);
      if (!hit) continue;
      hints[i] = hit.sample ?? -1;
      let c = SX * hit.nx + SY * hit.ny + SZ * hit.nz;
      if (!opposed) c = -c;
      if (c > cosLimit) continue;
      px[m] = X; py[m] = Y; pz[m] = Z;
      qx[m] = hit.x; qy[m] = hit.y; qz[m] = hit.z;
      nx[m] = hit.nx; ny[m] = hit.ny; nz[m] = hit.nz;
      dist[m] = hit.distance;
      m++;
    }
    if (m < 6) break;
    for (let i = 0; i < m; i++) indices[i] = i;
    let keep = Math.max(6, Math.floor(m * trim));
    // the kept pairs, nearest first (sums below run in this order)
    const order = keep < m || lambda > 0 ? sortIndicesByKey(indices, m, dist, scratch) : indices;
    if (lambda > 0) keep = Math.min(m, Math.max(6, autoTrimKeep(order, m, dist, autoMin, lambda)));
    // Normal equations A^T A x = A^T b for x = (omega, t), row a = (p x n, n), b = -(p - q).n
    // (the 21 sums of the upper triangle and the 6 of A^T b in locals, each summed in sample order)
    // centre for conditioning
    let cx = 0, cy = 0, cz = 0;
    for (let k = 0; k < keep; k++) {
      const i = order[k];
      cx += px[i]; cy += py[i]; cz += pz[i];
    }
    cx /= keep; cy /= keep; cz /= keep;
    let ss = 0;
    let s00 = 0, s01 = 0, s02 = 0, s03 = 0, s04 = 0, s05 = 0, s11 = 0, s12 = 0, s13 = 0, s14 = 0, s15 = 0;
    let s22 = 0, s23 = 0, s24 = 0, s25 = 0, s33 = 0, s34 = 0, s35 = 0, s44 = 0, s45 = 0, s55 = 0;
    let b0 = 0, b1 = 0, b2 = 0, b3 = 0, b4 = 0, b5 = 0;
    for (let k = 0; k < keep; k++) {
      const i = order[k];
      const X = px[i] - cx, Y = py[i] - cy, Z = pz[i] - cz;
      const r0 = Y * nz[i] - Z * ny[i];
      const r1 = Z * nx[i] - X * nz[i];
      const r2 = X * ny[i] - Y * nx[i];
      const r3 = nx[i], r4 = ny[i], r5 = nz[i];
      const r = (px[i] - qx[i]) * nx[i] + (py[i] - qy[i]) * ny[i] + (pz[i] - qz[i]) * nz[i];
      ss += r * r;
      b0 -= r0 * r; s00 += r0 * r0; s01 += r0 * r1; s02 += r0 * r2; s03 += r0 * r3; s04 += r0 * r4; s05 += r0 * r5;
      b1 -= r1 * r; s11 += r1 * r1; s12 += r1 * r2; s13 += r1 * r3; s14 += r1 * r4; s15 += r1 * r5;
      b2 -= r2 * r; s22 += r2 * r2; s23 += r2 * r3; s24 += r2 * r4; s25 += r2 * r5;
      b3 -= r3 * r; s33 += r3 * r3; s34 += r3 * r4; s35 += r3 * r5;
      b4 -= r4 * r; s44 += r4 * r4; s45 += r4 * r5;
      b5 -= r5 * r; s55 += r5 * r5;
    }
    const AtA = Float64Array.of(
      s00, s01, s02, s03, s04, s05,
      s01, s11, s12, s13, s14, s15,
      s02, s12, s22, s23, s24, s25,
      s03, s13, s23, s33, s34, s35,
      s04, s14, s24, s34, s44, s45,
      s05, s15, s25, s35, s45, s55,
    );
    const Atb = Float64Array.of(b0, b1, b2, b3, b4, b5);
    rms = Math.sqrt(ss / keep);
    inliers = keep;
    // light damping keeps sliding directions of thin bands from running away
    let trace = 0;
    for (let a = 0; a < 6; a++) trace += AtA[a * 6 + a];
    for (let a = 0; a < 6; a++) AtA[a * 6 + a] += 1e-9 * trace + 1e-12;
    const x = solveSymmetric6(AtA, Atb);
    if (!x) break;
    // update about the centre c: p' = R (p - c) + c + t
    const step = transformFromTwist([x[0], x[1], x[2]], [0, 0, 0]);
    const R = step;
    const tx = cx + x[3] - (R[0] * cx + R[1] * cy + R[2] * cz);
    const ty = cy + x[4] - (R[4] * cx + R[5] * cy + R[6] * cz);
    const tz = cz + x[5] - (R[8] * cx + R[9] * cy + R[10] * cz);
    R[3] = tx; R[7] = ty; R[11] = tz;
    T = compose(R, T);
    const moved = Math.hypot(x[3], x[4], x[5]);
    const turned = Math.hypot(x[0], x[1], x[2]);
    // shrink the pairing distance as we converge (never below 3x the residual)
    maxD = Math.max(Math.min(maxD, 3 * rms + 2 * moved), options.maxDistance * 0.25);
    if (moved < tol && turned < tol * 1e-2) {
      iter++;
      break;
    }
  }
  return { transform: T, rms, inliers, iterations: iter };
}

/** Solve a symmetric positive (semi)definite 6x6 system by Gaussian elimination with pivoting. */
function solveSymmetric6(A: Float64Array, b: Float64Array): Float64Array | null {
  const n = 6;
  const M = new Float64Array(n * (n + 1));
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) M[i * 7 + j] = A[i * 6 + j];
    M[i * 7 + 6] = b[i];
  }
  for (let c = 0; c < n; c++) {
    let p = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(M[r * 7 + c]) > Math.abs(M[p * 7 + c])) p = r;
    if (Math.abs(M[p * 7 + c]) < 1e-18) return null;
    if (p !== c) for (let j = 0; j < 7; j++) { const t = M[c * 7 + j]; M[c * 7 + j] = M[p * 7 + j]; M[p * 7 + j] = t; }
    for (let r = c + 1; r < n; r++) {
      const f = M[r * 7 + c] / M[c * 7 + c];
      for (let j = c; j < 7; j++) M[r * 7 + j] -= f * M[c * 7 + j];
    }
  }
  const x = new Float64Array(n);
  for (let r = n - 1; r >= 0; r--) {
    let s = M[r * 7 + 6];
    for (let j = r + 1; j < n; j++) s -= M[r * 7 + j] * x[j];
    x[r] = s / M[r * 7 + r];
  }
  return x;
}
