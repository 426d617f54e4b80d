/**
 * Feature correspondences between two sets of descriptors (packed rows of `dim` numbers): each
 * source row's two nearest target rows and each target row's nearest source row, by Euclidean
 * distance in descriptor space (the mutual-ish matching RANSAC draws from; Rusu et al. 2009).
 *
 * Exact search by one pass over every (source, target) pair, with partial distance elimination
 * (Bei & Gray 1985): a pair's sum of squares is abandoned, at each third of the row, once it
 * exceeds both what the source row's second best and what the target row's best already beat.
 * In 33 dimensions a k-d tree prunes little (its nodes are cut on one coordinate at a time), so
 * the two directions from one pass cost about half of two k-d searches. Distances are summed
 * in the same order as KdTree's, and ties keep the lowest index.
 */

export interface FeatureMatches {
  /** Per source row: its nearest and second nearest target row (-1 when fewer targets). */
  sourceBest: Int32Array;
  sourceSecond: Int32Array;
  /** Per target row: its nearest source row (-1 when no sources). */
  targetBest: Int32Array;
}

export function featureCorrespondences(S: Float32Array, T: Float32Array, dim: number): FeatureMatches {
  if (dim === 33) return featureCorrespondences33(S, T);
  const ns = Math.floor(S.length / dim), nt = Math.floor(T.length / dim);
  const sourceBest = new Int32Array(ns).fill(-1), sourceSecond = new Int32Array(ns).fill(-1);
  const targetBest = new Int32Array(nt).fill(-1);
  const colBest = new Float64Array(nt).fill(Infinity);
  const c1 = Math.max(1, Math.floor(dim / 3)), c2 = Math.max(c1, Math.floor((2 * dim) / 3));
  for (let i = 0; i < ns; i++) {
    const a = i * dim;
    let d0 = Infinity, d1 = Infinity, b0 = -1, b1 = -1;
    for (let j = 0; j < nt; j++) {
      const b = j * dim;
      const cb = colBest[j];
      // the pair matters only while below the row's second best or the column's best
      const bound = d1 > cb ? d1 : cb;
      let s = 0, d = 0;
      for (; d < c1; d++) { const t = S[a + d] - T[b + d]; s += t * t; }
      if (s > bound) continue;
      for (; d < c2; d++) { const t = S[a + d] - T[b + d]; s += t * t; }
      if (s > bound) continue;
      for (; d < dim; d++) { const t = S[a + d] - T[b + d]; s += t * t; }
      if (s < d1) {
        if (s < d0) { d1 = d0; b1 = b0; d0 = s; b0 = j; } else { d1 = s; b1 = j; }
      }
      if (s < cb) { colBest[j] = s; targetBest[j] = i; }
    }
    sourceBest[i] = b0;
    sourceSecond[i] = b1;
  }
  return { sourceBest, sourceSecond, targetBest };
}

/**
 * featureCorrespondences for rows of 33 numbers (FPFH, fpfh.ts), written out: the source row in
 * locals and each row's sum unrolled, in the same order and with the same checks at 11 and 22
 * as the loop above (so the same answers), about twice as fast (the search is a large share of
 * RANSAC's time; tests/bench/propose-profile.ts).
 */
function featureCorrespondences33(S: Float32Array, T: Float32Array): FeatureMatches {
  const ns = Math.floor(S.length / 33), nt = Math.floor(T.length / 33);
  const sourceBest = new Int32Array(ns).fill(-1), sourceSecond = new Int32Array(ns).fill(-1);
  const targetBest = new Int32Array(nt).fill(-1);
  const colBest = new Float64Array(nt).fill(Infinity);
  for (let i = 0; i < ns; i++) {
    const a = i * 33;
    const s0 = S[a + 0], s1 = S[a + 1], s2 = S[a + 2], s3 = S[a + 3], s4 = S[a + 4], s5 = S[a + 5];
    const s6 = S[a + 6], s7 = S[a + 7], s8 = S[a + 8], s9 = S[a + 9], s10 = S[a + 10];
    const s11 = S[a + 11], s12 = S[a + 12], s13 = S[a + 13], s14 = S[a + 14], s15 = S[a + 15], s16 = S[a + 16];
    const s17 = S[a + 17], s18 = S[a + 18], s19 = S[a + 19], s20 = S[a + 20], s21 = S[a + 21];
    const s22 = S[a + 22], s23 = S[a + 23], s24 = S[a + 24], s25 = S[a + 25], s26 = S[a + 26], s27 = S[a + 27];
    const s28 = S[a + 28], s29 = S[a + 29], s30 = S[a + 30], s31 = S[a + 31], s32 = S[a + 32];
    let d0 = Infinity, d1 = Infinity, b0 = -1, b1 = -1;
    for (let j = 0, b = 0; j < nt; j++, b += 33) {
      const cb = colBest[j];
      const bound = d1 > cb ? d1 : cb;
      let s = 0, t = 0;
      t = s0 - T[b + 0]; s += t * t; t = s1 - T[b + 1]; s += t * t; t = s2 - T[b + 2]; s += t * t; t = s3 - T[b + 3]; s += t * t;
      t = s4 - T[b + 4]; s += t * t; t = s5 - T[b + 5]; s += t * t; t = s6 - T[b + 6]; s += t * t; t = s7 - T[b + 7]; s += t * t;
      t = s8 - T[b + 8]; s += t * t; t = s9 - T[b + 9]; s += t * t; t = s10 - T[b + 10]; s += t * t;
      if (s > bound) continue;
      t = s11 - T[b + 11]; s += t * t; t = s12 - T[b + 12]; s += t * t; t = s13 - T[b + 13]; s += t * t; t = s14 - T[b + 14]; s += t * t;
      t = s15 - T[b + 15]; s += t * t; t = s16 - T[b + 16]; s += t * t; t = s17 - T[b + 17]; s += t * t; t = s18 - T[b + 18]; s += t * t;
      t = s19 - T[b + 19]; s += t * t; t = s20 - T[b + 20]; s += t * t; t = s21 - T[b + 21]; s += t * t;
      if (s > bound) continue;
      t = s22 - T[b + 22]; s += t * t; t = s23 - T[b + 23]; s += t * t; t = s24 - T[b + 24]; s += t * t; t = s25 - T[b + 25]; s += t * t;
      t = s26 - T[b + 26]; s += t * t; t = s27 - T[b + 27]; s += t * t; t = s28 - T[b + 28]; s += t * t; t = s29 - T[b + 29]; s += t * t;
      t = s30 - T[b + 30]; s += t * t; t = s31 - T[b + 31]; s += t * t; t = s32 - T[b + 32]; s += t * t;
      if (s < d1) {
        if (s < d0) { d1 = d0; b1 = b0; d0 = s; b0 = j; } else { d1 = s; b1 = j; }
      }
      if (s < cb) { colBest[j] = s; targetBest[j] = i; }
    }
    sourceBest[i] = b0;
    sourceSecond[i] = b1;
  }
  return { sourceBest, sourceSecond, targetBest };
}
