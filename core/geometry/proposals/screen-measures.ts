/**
 * Cheap measures of a screened motion (face samples and k-d trees only, no triangles), used to
 * pick which motions of a fragment pair go on to the fine step (pairwise-match.ts).
 */
import { hypot } from '../hypot';
import { applyToPoint, type RigidTransform } from '../registration/rigid-transform';
import { axisAgreement } from '../registration/score';
import { SIDE_FULL, SIDE_NONE, TRUSTED_RADIUS_RATIO } from '../registration/score-model';
import type { ShaftFrame } from '../registration/shaft-axis-search';
import type { PreparedFace } from './prepared-fragment';

/**
 * How well a screened motion of two shaft pieces agrees with their fitted shaft axes, 0..1:
 * the outer surfaces of two joined pieces of one shaft continue one another, so under the true
 * motion the two axis lines run about the same way (a small tilt: fitted directions of bowed or
 * partial pieces differ by a few degrees) and lie on the same side of the wall seen from the
 * join. 1 up to `tiltDeg[0]` degrees between the axes, falling to 0 at `tiltDeg[1]`, times the
 * score's side rule (score-model.ts SIDE_NONE, SIDE_FULL; not applied to a join within
 * SIDE_MIN_OFF_AXIS of A's axis, as axisAgreement measures it); 1 when either piece has no axis or
 * the fitted radii differ by more than TRUSTED_RADIUS_RATIO (a fit that far off places its axis
 * anywhere). B's face centroid `centroidB` is where the axes are compared (as score.ts does).
 */
export function screenAxisConsistency(axisA: ShaftFrame | null | undefined, axisB: ShaftFrame | null | undefined, T: RigidTransform, centroidB: ArrayLike<number>, tiltDeg: readonly [number, number]): number {
  if (!axisA || !axisB) return 1;
  const c = applyToPoint(T, centroidB[0], centroidB[1], centroidB[2]);
  const ax = axisAgreement(axisA, axisB, T, Float64Array.from(c));
  if (!ax.axesCompared || ax.radiusRatio > TRUSTED_RADIUS_RATIO) return 1;
  const clamp = (x: number): number => Math.min(1, Math.max(0, x));
  // the side is only defined seen from a join off A's axis: axisAgreement gives 1 nearer to it (SIDE_MIN_OFF_AXIS)
  const side = clamp((ax.axisSide - SIDE_NONE) / (SIDE_FULL - SIDE_NONE));
  const tilt = clamp((tiltDeg[1] - ax.axisAngleDeg) / Math.max(1e-9, tiltDeg[1] - tiltDeg[0]));
  return side * tilt;
}

/**
 * How firmly a screened motion locks the faces (as the score's interlock, score.ts, but on face
 * samples and k-d trees): B's face samples moved by T that have a sample of A's face within
 * `within` with opposed normals form the contact; sqrt of the smallest over the largest
 * eigenvalue of its point-to-plane information matrix (rotations scaled by the contact's
 * radius of gyration). Flat or cylindrical contacts, which could slide or turn, give about 0.
 */
export function screenInterlock(fa: PreparedFace, fb: PreparedFace, T: RigidTransform, within: number, maxSamples = 200): number {
  const P = fb.points, Nb = fb.normals, NA = fa.normals;
  const n = P.length / 3;
  const step = Math.max(1, n / maxSamples);
  const xs: number[] = [];
  const q = [0, 0, 0];
  for (let k = 0; k < n; k += step) {
    const i = Math.floor(k);
    const x = T[0] * P[3 * i] + T[1] * P[3 * i + 1] + T[2] * P[3 * i + 2] + T[3];
    const y = T[4] * P[3 * i] + T[5] * P[3 * i + 1] + T[6] * P[3 * i + 2] + T[7];
    const z = T[8] * P[3 * i] + T[9] * P[3 * i + 1] + T[10] * P[3 * i + 2] + T[11];
    q[0] = x; q[1] = y; q[2] = z;
    const j = fa.tree.nearestOne(q, within * within).index;
    if (j < 0) continue;
    const nx = T[0] * Nb[3 * i] + T[1] * Nb[3 * i + 1] + T[2] * Nb[3 * i + 2];
    const ny = T[4] * Nb[3 * i] + T[5] * Nb[3 * i + 1] + T[6] * Nb[3 * i + 2];
    const nz = T[8] * Nb[3 * i] + T[9] * Nb[3 * i + 1] + T[10] * Nb[3 * i + 2];
    if (nx * NA[3 * j] + ny * NA[3 * j + 1] + nz * NA[3 * j + 2] > -0.5) continue;
    xs.push(x, y, z, nx, ny, nz);
  }
  const m = xs.length / 6;
  if (m < 12) return 0;
  let cx = 0, cy = 0, cz = 0;
  for (let k = 0; k < m; k++) { cx += xs[6 * k]; cy += xs[6 * k + 1]; cz += xs[6 * k + 2]; }
  cx /= m; cy /= m; cz /= m;
  let rg = 0;
  for (let k = 0; k < m; k++) rg += (xs[6 * k] - cx) ** 2 + (xs[6 * k + 1] - cy) ** 2 + (xs[6 * k + 2] - cz) ** 2;
  rg = Math.sqrt(rg / m) || 1;
  const M = new Float64Array(36);
  const r = new Float64Array(6);
  for (let k = 0; k < m; k++) {
    const x = xs[6 * k] - cx, y = xs[6 * k + 1] - cy, z = xs[6 * k + 2] - cz;
    const nx = xs[6 * k + 3], ny = xs[6 * k + 4], nz = xs[6 * k + 5];
    r[0] = (y * nz - z * ny) / rg; r[1] = (z * nx - x * nz) / rg; r[2] = (x * ny - y * nx) / rg;
    r[3] = nx; r[4] = ny; r[5] = nz;
    for (let a = 0; a < 6; a++) for (let b = 0; b < 6; b++) M[6 * a + b] += r[a] * r[b];
  }
  const e = symmetricEigenvalues6(M);
  const lo = Math.max(0, Math.min(...e)), hi = Math.max(...e);
  return hi > 0 ? Math.sqrt(lo / hi) : 0;
}

/** Eigenvalues of a symmetric 6x6 matrix (cyclic Jacobi rotations; Golub & Van Loan, section 8.5). */
function symmetricEigenvalues6(A: Float64Array): number[] {
  const a = Float64Array.from(A);
  const n = 6;
  for (let sweep = 0; sweep < 30; sweep++) {
    let off = 0;
    for (let p = 0; p < n; p++) for (let q = p + 1; q < n; q++) off += a[p * n + q] ** 2;
    if (off < 1e-22) break;
    for (let p = 0; p < n; p++) for (let q = p + 1; q < n; q++) {
      const apq = a[p * n + q];
      if (Math.abs(apq) < 1e-300) continue;
      const theta = (a[q * n + q] - a[p * n + p]) / (2 * apq);
      const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
      const c = 1 / Math.sqrt(t * t + 1), s = t * c;
      for (let k = 0; k < n; k++) {
        const akp = a[k * n + p], akq = a[k * n + q];
        a[k * n + p] = c * akp - s * akq;
        a[k * n + q] = s * akp + c * akq;
      }
      for (let k = 0; k < n; k++) {
        const apk = a[p * n + k], aqk = a[q * n + k];
        a[p * n + k] = c * apk - s * aqk;
        a[q * n + k] = s * apk + c * aqk;
      }
    }
  }
  return Array.from({ length: n }, (_, i) => a[i * n + i]);
}
