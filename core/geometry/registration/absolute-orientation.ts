/**
 * Closed-form absolute orientation with unit quaternions (Horn 1987, "Closed-form solution of
 * absolute orientation using unit quaternions", J. Opt. Soc. Am. A 4(4)): the rotation and
 * translation that carry points `from` onto points `to` with the least weighted sum of squared
 * distances. The rotation is the eigenvector of the largest eigenvalue of Horn's symmetric 4x4
 * matrix N built from the cross-covariance of the centred point sets.
 */
import { transformFrom, rotationFromQuaternion, type RigidTransform } from './rigid-transform';

export interface AbsoluteOrientation {
  transform: RigidTransform;
  /** Root mean square residual after the fit (same units as the points). */
  rms: number;
}

/**
 * Fit to(i) ~ R from(i) + t. Points are packed xyz; `indices` (optional) picks pairs
 * (from index, to index) so callers need not copy; weights are optional per pair.
 */
export function absoluteOrientation(
  from: ArrayLike<number>,
  to: ArrayLike<number>,
  options: { pairs?: ArrayLike<number>; weights?: ArrayLike<number> } = {},
): AbsoluteOrientation {
  const pairs = options.pairs;
  const n = pairs ? pairs.length / 2 : from.length / 3;
  if (n < 3) throw new Error('absolute orientation needs at least three point pairs');
  const w = options.weights;
  const fi = (k: number): number => (pairs ? pairs[2 * k] : k) * 3;
  const ti = (k: number): number => (pairs ? pairs[2 * k + 1] : k) * 3;

  let W = 0;
  const cf = [0, 0, 0], ct = [0, 0, 0];
  for (let k = 0; k < n; k++) {
    const wk = w ? w[k] : 1;
    W += wk;
    const a = fi(k), b = ti(k);
    for (let d = 0; d < 3; d++) {
      cf[d] += wk * from[a + d];
      ct[d] += wk * to[b + d];
    }
  }
  if (!(W > 0)) throw new Error('absolute orientation needs positive weights');
  for (let d = 0; d < 3; d++) {
    cf[d] /= W;
    ct[d] /= W;
  }
  // M = sum w (from - cf)(to - ct)^T; Horn's S_xy etc.
  const M = new Float64Array(9);
  for (let k = 0; k < n; k++) {
    const wk = w ? w[k] : 1;
    const a = fi(k), b = ti(k);
    const px = from[a] - cf[0], py = from[a + 1] - cf[1], pz = from[a + 2] - cf[2];
    const qx = to[b] - ct[0], qy = to[b + 1] - ct[1], qz = to[b + 2] - ct[2];
    M[0] += wk * px * qx; M[1] += wk * px * qy; M[2] += wk * px * qz;
    M[3] += wk * py * qx; M[4] += wk * py * qy; M[5] += wk * py * qz;
    M[6] += wk * pz * qx; M[7] += wk * pz * qy; M[8] += wk * pz * qz;
  }
  const [Sxx, Sxy, Sxz, Syx, Syy, Syz, Szx, Szy, Szz] = M;
  // Horn 1987, equation in section 4: N is symmetric with trace zero.
  const N = [
    Sxx + Syy + Szz, Syz - Szy, Szx - Sxz, Sxy - Syx,
    Syz - Szy, Sxx - Syy - Szz, Sxy + Syx, Szx + Sxz,
    Szx - Sxz, Sxy + Syx, -Sxx + Syy - Szz, Syz + Szy,
    Sxy - Syx, Szx + Sxz, Syz + Szy, -Sxx - Syy + Szz,
  ];
  const q = largestEigenvector4(N);
  const R = rotationFromQuaternion(q[0], q[1], q[2], q[3]);
  const t = [
    ct[0] - (R[0] * cf[0] + R[1] * cf[1] + R[2] * cf[2]),
    ct[1] - (R[3] * cf[0] + R[4] * cf[1] + R[5] * cf[2]),
    ct[2] - (R[6] * cf[0] + R[7] * cf[1] + R[8] * cf[2]),
  ];
  let sum = 0;
  for (let k = 0; k < n; k++) {
    const wk = w ? w[k] : 1;
    const a = fi(k), b = ti(k);
    const x = from[a], y = from[a + 1], z = from[a + 2];
    const dx = R[0] * x + R[1] * y + R[2] * z + t[0] - to[b];
    const dy = R[3] * x + R[4] * y + R[5] * z + t[1] - to[b + 1];
    const dz = R[6] * x + R[7] * y + R[8] * z + t[2] - to[b + 2];
    sum += wk * (dx * dx + dy * dy + dz * dz);
  }
  return { transform: transformFrom(R, t), rms: Math.sqrt(sum / W) };
}

/**
 * Eigenvector of the largest eigenvalue of a symmetric 4x4 matrix (row-major), by cyclic
 * Jacobi rotations: small, exact enough (1e-12), and free of allocation-heavy libraries so
 * it can run inside RANSAC loops.
 */
export function largestEigenvector4(sym: ArrayLike<number>): [number, number, number, number] {
  const a = Float64Array.from(sym);
  const v = new Float64Array([1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1]);
  for (let sweep = 0; sweep < 50; sweep++) {
    let off = 0;
    for (let p = 0; p < 4; p++) for (let q = p + 1; q < 4; q++) off += a[p * 4 + q] * a[p * 4 + q];
    if (off < 1e-24) break;
    for (let p = 0; p < 4; p++) {
      for (let q = p + 1; q < 4; q++) {
        const apq = a[p * 4 + q];
        if (Math.abs(apq) < 1e-300) continue;
        const app = a[p * 4 + p], aqq = a[q * 4 + q];
        const theta = (aqq - app) / (2 * apq);
        const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
        const c = 1 / Math.sqrt(t * t + 1), s = t * c;
        for (let k = 0; k < 4; k++) {
          const akp = a[k * 4 + p], akq = a[k * 4 + q];
          a[k * 4 + p] = c * akp - s * akq;
          a[k * 4 + q] = s * akp + c * akq;
        }
        for (let k = 0; k < 4; k++) {
          const apk = a[p * 4 + k], aqk = a[q * 4 + k];
          a[p * 4 + k] = c * apk - s * aqk;
          a[q * 4 + k] = s * apk + c * aqk;
        }
        for (let k = 0; k < 4; k++) {
          const vkp = v[k * 4 + p], vkq = v[k * 4 + q];
          v[k * 4 + p] = c * vkp - s * vkq;
          v[k * 4 + q] = s * vkp + c * vkq;
        }
      }
    }
  }
  let best = 0;
  for (let i = 1; i < 4; i++) if (a[i * 4 + i] > a[best * 4 + best]) best = i;
  return [v[best], v[4 + best], v[8 + best], v[12 + best]];
}
