/**
 * Trimmed point-to-plane ICP (Chen & Medioni 1991; trimming after Chetverikov et al. 2002):
 * move source samples (with normals) onto a target surface held in a BVH. Each round pairs every
 * moved sample with its closest target point, keeps pairs whose normals are opposed (two sides
 * of one break face each other) and the best `trim` share by distance, and solves the linearised
 * point-to-plane least squares for a small rotation and translation.
 */
import { compose, transformFromTwist, type RigidTransform } from './rigid-transform';
import { SampledSurface, type ClosestPoint, type ClosestPointSource } from './target-surface';
import { sortIndicesByKey } from './sort-indices';
import { KdTree } from './nearest-neighbours';

export interface IcpOptions {
  /** Pairs farther apart than this are ignored (mm). */
  maxDistance: number;
  /** Share of the closest pairs kept each round (0..1]. */
  trim?: number;
  /**
   * Choose the share kept each round from the pairs' distances instead (overlap estimated as in
   * the trimmed ICP of Chetverikov et al. 2005 and the fractional RMSD of Phillips et al. 2007,
   * both from memory): the share f in [autoTrimMin, 1] that minimises
   * sqrt(mean squared distance of the f nearest pairs) / f^autoTrimLambda. A contact that covers
   * most of the paired samples keeps nearly all of them (a fixed trim throws away the far pairs
   * that would close a face opened like a book); a small contact keeps few. 0: fixed `trim`.
   */
  autoTrimLambda?: number;
  autoTrimMin?: number;
  /** Keep pairs whose normals meet at more than this angle (degrees); 180 means exactly opposed. */
  minNormalAngleDeg?: number;
  /** true (default): source and target normals must be opposed; false: aligned. */
  opposedNormals?: boolean;
  maxIterations?: number;
  /** Stop when an update moves less than this (mm) and turns less than tolerance/extent. */
  tolerance?: number;
}

export interface IcpResult {
  transform: RigidTransform;
  /** RMS of point-to-plane residuals of kept pairs at the end (mm). */
  rms: number;
  /** Pairs kept in the last round. */
  inliers: number;
  iterations: number;
}

export function icpPointToPlane(
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
  // per-pair buffers kept between calls (every entry read was written this round)
  const bufs = pairBuffers(n);
  const { px, py, pz, qx, qy, qz, nx, ny, nz, dist, indices, scratch, AtA, Atb } = bufs;
  const cp = {} as ClosestPoint;
  let maxD = options.maxDistance;
  const samples = target instanceof SampledSurface && target.tree.dim === 3 ? target : null;
  // a sampled target: what each sample's last search proved (KdTree.nearestOneMoving: same answers,
  // most rounds without a search); another target: each sample's closest target sample in the last
  // round that found one (a hint: same answers)
  const memo = samples ? KdTree.movingMemo(n, bufs.memo) : null;
  const hints = samples ? null : new Int32Array(n).fill(-1);
  for (iter = 0; iter < maxIter; iter++) {
    let m = 0;
    // the motion's entries in locals (the same products and sums as reading them from T)
    const t0 = T[0], t1 = T[1], t2 = T[2], t3 = T[3], t4 = T[4], t5 = T[5], t6 = T[6], t7 = T[7], t8 = T[8], t9 = T[9], t10 = T[10], t11 = T[11];
    const maxD2 = maxD * maxD;
    for (let i = 0; i < n; i++) {
      const x = sourcePoints[3 * i], y = sourcePoints[3 * i + 1], z = sourcePoints[3 * i + 2];
      const X = t0 * x + t1 * y + t2 * z + t3;
      const Y = t4 * x + t5 * y + t6 * z + t7;
      const Z = t8 * x + t9 * y + t10 * z + t11;
      const sx = sourceNormals[3 * i], sy = sourceNormals[3 * i + 1], sz = sourceNormals[3 * i + 2];
      const SX = t0 * sx + t1 * sy + t2 * sz;
      const SY = t4 * sx + t5 * sy + t6 * sz;
      const SZ = t8 * sx + t9 * sy + t10 * sz;
      let hx: number, hy: number, hz: number, hnx: number, hny: number, hnz: number, hd: number;
      if (samples) {
        // oriented samples: the k-d tree asked directly (what SampledSurface.closest does, without its objects)
        const j = samples.tree.nearestOneMoving(X, Y, Z, maxD2, memo!, i);
        if (j < 0) continue;
        const P = samples.points, N = samples.normals;
        hx = P[3 * j]; hy = P[3 * j + 1]; hz = P[3 * j + 2];
        hnx = N[3 * j]; hny = N[3 * j + 1]; hnz = N[3 * j + 2];
        hd = Math.sqrt(samples.tree.lastDist2);
      } else {
        const hit = target.closest(X, Y, Z, maxD, cp, hints![i]);
        if (!hit) continue;
        hints![i] = hit.sample ?? -1;
        hx = hit.x; hy = hit.y; hz = hit.z;
        hnx = hit.nx; hny = hit.ny; hnz = hit.nz;
        hd = hit.distance;
      }
      let c = SX * hnx + SY * hny + SZ * hnz;
      if (!opposed) c = -c;
      if (c > cosLimit) continue;
      px[m] = X; py[m] = Y; pz[m] = Z;
      qx[m] = hx; qy[m] = hy; qz[m] = hz;
      nx[m] = hnx; ny[m] = hny; nz[m] = hnz;
      dist[m] = hd;
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
    AtA[0] = s00; AtA[1] = s01; AtA[2] = s02; AtA[3] = s03; AtA[4] = s04; AtA[5] = s05;
    AtA[6] = s01; AtA[7] = s11; AtA[8] = s12; AtA[9] = s13; AtA[10] = s14; AtA[11] = s15;
    AtA[12] = s02; AtA[13] = s12; AtA[14] = s22; AtA[15] = s23; AtA[16] = s24; AtA[17] = s25;
    AtA[18] = s03; AtA[19] = s13; AtA[20] = s23; AtA[21] = s33; AtA[22] = s34; AtA[23] = s35;
    AtA[24] = s04; AtA[25] = s14; AtA[26] = s24; AtA[27] = s34; AtA[28] = s44; AtA[29] = s45;
    AtA[30] = s05; AtA[31] = s15; AtA[32] = s25; AtA[33] = s35; AtA[34] = s45; AtA[35] = s55;
    Atb[0] = b0; Atb[1] = b1; Atb[2] = b2; Atb[3] = b3; Atb[4] = b4; Atb[5] = b5;
    rms = Math.sqrt(ss / keep);
    inliers = keep;
    // light damping keeps sliding directions of thin bands from running away
    let trace = 0;
    for (let a = 0; a < 6; a++) trace += AtA[a * 6 + a];
    for (let a = 0; a < 6; a++) AtA[a * 6 + a] += 1e-9 * trace + 1e-12;
    const x = solveSymmetric6(AtA, Atb, bufs.M, bufs.x);
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

/**
 * Pairs kept by the fractional-RMSD rule (see IcpOptions.autoTrimLambda): of the m pairs sorted
 * nearest first in `order`, the count k >= minShare m minimising sqrt(mean of the k smallest
 * squared distances) / (k/m)^lambda.
 */
export function autoTrimKeep(order: ArrayLike<number>, m: number, dist: ArrayLike<number>, minShare: number, lambda: number): number {
  const from = Math.max(1, Math.ceil(minShare * m));
  let sum = 0, best = Infinity, keep = m;
  for (let k = 1; k <= m; k++) {
    const d = dist[order[k - 1]];
    sum += d * d;
    if (k < from) continue;
    const v = Math.sqrt(sum / k) / Math.pow(k / m, lambda);
    if (v < best) { best = v; keep = k; }
  }
  return keep;
}

/** icpPointToPlane's working arrays, for at least n pairs (one set, kept between calls and grown when needed: ICP calls never overlap). */
interface PairBuffers {
  size: number;
  px: Float64Array; py: Float64Array; pz: Float64Array;
  qx: Float64Array; qy: Float64Array; qz: Float64Array;
  nx: Float64Array; ny: Float64Array; nz: Float64Array;
  dist: Float64Array;
  indices: Int32Array; scratch: Int32Array;
  /** KdTree.nearestOneMoving's memo. */
  memo: Float64Array;
  AtA: Float64Array; Atb: Float64Array; M: Float64Array; x: Float64Array;
}

let kept: PairBuffers | undefined;

function pairBuffers(n: number): PairBuffers {
  if (kept && kept.size >= n) return kept;
  const size = Math.max(n, 2 * (kept?.size ?? 0), 64);
  const f = (): Float64Array => new Float64Array(size);
  kept = {
    size,
    px: f(), py: f(), pz: f(), qx: f(), qy: f(), qz: f(), nx: f(), ny: f(), nz: f(), dist: f(),
    indices: new Int32Array(size), scratch: new Int32Array(size),
    memo: new Float64Array(KdTree.MEMO * size),
    AtA: new Float64Array(36), Atb: new Float64Array(6), M: new Float64Array(42), x: new Float64Array(6),
  };
  return kept;
}

/** Solve a symmetric positive (semi)definite 6x6 system by Gaussian elimination with pivoting (M: 42 numbers of working space, x: the answer's 6). */
function solveSymmetric6(A: Float64Array, b: Float64Array, M: Float64Array, x: Float64Array): Float64Array | null {
  const n = 6;
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
  for (let r = n - 1; r >= 0; r--) {
    let s = M[r * 7 + 6];
    for (let j = r + 1; j < n; j++) s -= M[r * 7 + j] * x[j];
    x[r] = s / M[r * 7 + r];
  }
  return x;
}
