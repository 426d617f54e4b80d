/**
 * Coarse alignment of two break faces from local feature correspondences with RANSAC
 * (Fischler & Bolles 1981): correspondences are nearest neighbours in FPFH space (Rusu et al.
 * 2009), three at a time give a rigid motion by Horn's closed form (Horn 1987); a motion is
 * kept when the three pairs keep their lengths, their normals end up opposed, and many moved
 * samples land near the other face with opposed normals.
 */
import { hypot } from '../hypot';
import { absoluteOrientation } from './absolute-orientation';
import { FPFH_BINS, FPFH_DIM } from './fpfh';
import { KdTree } from './nearest-neighbours';
import { featureCorrespondences } from './feature-correspondences';
import { inOpposedContact } from './opposed-contact';
import { displacementAt, rotationErrorDegrees, type RigidTransform } from './rigid-transform';
import { mulberry32 } from '../seeded-random';

export interface FaceSamples {
  points: Float32Array;
  normals: Float32Array;
  /** FPFH per sample computed with the sample's own (outward) normals. */
  fpfh: Float32Array;
  tree?: KdTree;
  /**
   * The samples whose features are matched (all when absent): on a large face an even subset
   * is enough for correspondences, and the search grows with the product of the two counts.
   */
  featureIndex?: Uint32Array;
  /** Made once per face and reused across pairs when given: the fpfh (and mirrored fpfh) rows of the featureIndex samples, packed, and the mirrored fpfh of every sample. */
  featureFpfh?: Float32Array;
  mirroredFpfh?: Float32Array;
  mirroredFeatureFpfh?: Float32Array;
}

export interface RansacOptions {
  /** A moved sample counts as an inlier within this distance (mm). */
  inlierDistance: number;
  iterations?: number;
  /** Keep this many distinct best motions. */
  keep?: number;
  /** Deterministic random numbers (tests and reproducible runs). */
  seed?: number;
  /** Cap on samples used to count inliers. */
  maxCheckSamples?: number;
}

export interface Hypothesis {
  transform: RigidTransform;
  inliers: number;
  /** inliers over samples checked */
  inlierFraction: number;
}

/** Mirror an FPFH to describe the same surface with flipped normals (phi and theta change sign). */
export function mirrorFpfh(f: Float32Array): Float32Array {
  const out = new Float32Array(f.length);
  const B = FPFH_BINS;
  const n = f.length / FPFH_DIM;
  for (let i = 0; i < n; i++) {
    const o = i * FPFH_DIM;
    for (let b = 0; b < B; b++) {
      out[o + b] = f[o + b];
      out[o + B + b] = f[o + B + (B - 1 - b)];
      out[o + 2 * B + b] = f[o + 2 * B + (B - 1 - b)];
    }
  }
  return out;
}

/** Motions that carry `source` (B's face) onto `target` (A's face), best first. */
export function ransacAlignFaces(source: FaceSamples, target: FaceSamples, options: RansacOptions): Hypothesis[] {
  const ns = source.points.length / 3, nt = target.points.length / 3;
  if (ns < 3 || nt < 3) return [];
  const rand = mulberry32(options.seed ?? 1);
  const iterations = options.iterations ?? 4000;
  const keep = options.keep ?? 4;
  const eps = options.inlierDistance;
  const targetTree = target.tree ?? new KdTree(target.points, 3);

  // correspondences: each source sample's 2 nearest target samples in feature space (source
  // described with flipped normals), plus each target sample's nearest source sample
  const srcFeat = source.mirroredFpfh ?? mirrorFpfh(source.fpfh);
  const srcIdx = source.featureIndex, tgtIdx = target.featureIndex;
  const featT = target.featureFpfh ?? (tgtIdx ? gatherFeatures(target.fpfh, tgtIdx) : target.fpfh);
  const featS = source.mirroredFeatureFpfh ?? (srcIdx ? gatherFeatures(srcFeat, srcIdx) : srcFeat);
  const found = featureCorrespondences(featS, featT, FPFH_DIM);
  const corr: number[] = [];
  for (let k = 0; k < found.sourceBest.length; k++) {
    const i = srcIdx ? srcIdx[k] : k;
    for (const j of [found.sourceBest[k], found.sourceSecond[k]]) if (j >= 0) corr.push(i, tgtIdx ? tgtIdx[j] : j);
  }
  for (let k = 0; k < found.targetBest.length; k++) {
    const i = found.targetBest[k];
    if (i >= 0) corr.push(srcIdx ? srcIdx[i] : i, tgtIdx ? tgtIdx[k] : k);
  }
  const nc = corr.length / 2;
  if (nc < 3) return [];

  // samples used to count inliers
  const checkCap = options.maxCheckSamples ?? 250;
  const check: number[] = [];
  const stride = Math.max(1, Math.floor(ns / checkCap));
  for (let i = 0; i < ns; i += stride) check.push(i);

  const S = source.points, Sn = source.normals, T = target.points, Tn = target.normals;
  const centre = [0, 0, 0];
  for (let i = 0; i < ns; i++) for (let d = 0; d < 3; d++) centre[d] += S[3 * i + d] / ns;
  const best: Hypothesis[] = [];
  const pairs = new Uint32Array(6);
  const q = [0, 0, 0];
  for (let it = 0; it < iterations; it++) {
    const c0 = Math.floor(rand() * nc), c1 = Math.floor(rand() * nc), c2 = Math.floor(rand() * nc);
    if (c0 === c1 || c1 === c2 || c0 === c2) continue;
    const s = [corr[2 * c0], corr[2 * c1], corr[2 * c2]];
    const t = [corr[2 * c0 + 1], corr[2 * c1 + 1], corr[2 * c2 + 1]];
    // edge lengths must agree (rigid) and not be tiny
    let ok = true;
    for (let a = 0; a < 3 && ok; a++) {
      const b = (a + 1) % 3;
      const ls = dist(S, s[a], s[b]), lt = dist(T, t[a], t[b]);
      if (ls < 2 * eps || lt < 2 * eps || Math.abs(ls - lt) > 0.1 * Math.max(ls, lt) + 0.5 * eps) ok = false;
    }
    if (!ok) continue;
    for (let a = 0; a < 3; a++) {
      pairs[2 * a] = s[a];
      pairs[2 * a + 1] = t[a];
    }
    let fit;
    try {
      fit = absoluteOrientation(S, T, { pairs });
    } catch {
      continue;
    }
    const M = fit.transform;
    if (fit.rms > eps * 2) continue;
    // the three normals must end up opposed
    for (let a = 0; a < 3 && ok; a++) {
      const i = s[a], j = t[a];
      const nx = M[0] * Sn[3 * i] + M[1] * Sn[3 * i + 1] + M[2] * Sn[3 * i + 2];
      const ny = M[4] * Sn[3 * i] + M[5] * Sn[3 * i + 1] + M[6] * Sn[3 * i + 2];
      const nz = M[8] * Sn[3 * i] + M[9] * Sn[3 * i + 1] + M[10] * Sn[3 * i + 2];
      if (nx * Tn[3 * j] + ny * Tn[3 * j + 1] + nz * Tn[3 * j + 2] > -0.5) ok = false;
    }
    if (!ok) continue;
    let inl = 0;
    const worst = best.length >= keep ? best[best.length - 1].inliers : 0;
    const preview = Math.min(check.length, 40);
    for (let c = 0; c < check.length; c++) {
      // after a preview, give up on motions that cannot reach the kept ones
      if (c === preview && worst > 0 && (inl * check.length) / preview < 0.5 * worst) break;
      if (inOpposedContact(M, S, Sn, check[c], targetTree, Tn, eps, q)) inl++;
    }
    if (inl < 3) continue;
    insertHypothesis(best, { transform: M, inliers: inl, inlierFraction: inl / check.length }, keep, 3 * eps, centre);
  }
  return best;
}

/** The FPFH rows of the given samples, packed. */
export function gatherFeatures(f: Float32Array, index: Uint32Array): Float32Array {
  const out = new Float32Array(index.length * FPFH_DIM);
  for (let k = 0; k < index.length; k++) out.set(f.subarray(index[k] * FPFH_DIM, index[k] * FPFH_DIM + FPFH_DIM), k * FPFH_DIM);
  return out;
}

function dist(P: ArrayLike<number>, i: number, j: number): number {
  return hypot(P[3 * i] - P[3 * j], P[3 * i + 1] - P[3 * j + 1], P[3 * i + 2] - P[3 * j + 2]);
}

/** Keep the best `keep` motions, merging near-duplicates (within 5 degrees, and moving the source centre to within sameShift). */
function insertHypothesis(list: Hypothesis[], h: Hypothesis, keep: number, sameShift: number, centre: number[]): void {
  for (let k = 0; k < list.length; k++) {
    const o = list[k];
    const dt = displacementAt(o.transform, h.transform, centre);
    if (rotationErrorDegrees(o.transform, h.transform) < 5 && dt < sameShift) {
      if (h.inliers > o.inliers) list[k] = h;
      list.sort((a, b) => b.inliers - a.inliers);
      return;
    }
  }
  list.push(h);
  list.sort((a, b) => b.inliers - a.inliers);
  if (list.length > keep) list.length = keep;
}
