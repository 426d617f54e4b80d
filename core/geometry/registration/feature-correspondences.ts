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
