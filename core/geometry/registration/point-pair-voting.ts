/**
 * Coarse alignment of two break faces by voting with point pair features (Drost, Ulrich, Navab
 * & Ilic 2010, "Model globally, match locally: efficient and robust 3D object recognition",
 * CVPR). A pair of oriented samples (m1, n1), (m2, n2) is described by four numbers that a rigid
 * motion leaves unchanged: the distance d = |m2 - m1| and the angles of n1 and n2 to the line
 * and to each other. Every pair of the smaller face is filed under its quantised feature; every
 * pair of the larger face that starts at a reference sample looks up the filed pairs with the
 * same feature, and each match fixes the motion up to nothing but the two reference samples and
 * one turn about the reference normal, so it votes for (filed reference sample, turn) in a small
 * table per reference sample. The peaks
 * of all tables, clustered, are the hypotheses.
 *
 * Why here: RANSAC on FPFH needs local histograms that differ from sample to sample, and on a
 * small break face (a few dozen samples, FPFH radius as large as the face) they do not. Point
 * pair features use the geometry of the whole face at once, which on a rough fracture surface
 * is enough to lock the two sides. The two sides of a break face each other, so the filed face's
 * normals are reversed before its pairs are described (the mating surface, seen from the other side).
 */
import { hypot } from '../hypot';
import type { RigidTransform } from './rigid-transform';
import { displacementAt, invert, quaternionOf, rotationErrorDegrees, rotationFromQuaternion } from './rigid-transform';

export interface PointPairVotingOptions {
  spacing: number;
  /** Most samples of the smaller face (an even stride; the larger face is taken at the same stride). */
  maxSamples?: number;
  /** Most samples of the larger face (default 4 maxSamples). */
  maxLargerSamples?: number;
  /** Distance bin (mm); default one spacing. */
  distanceStep?: number;
  /** Angle bin (degrees) for the three angles. */
  angleStepDeg?: number;
  /** Bins of the turn about the reference normal. */
  turnBins?: number;
  /** Reference samples of the larger face (an even stride), each voting with every sample of its face. */
  references?: number;
  /** Hypotheses returned (clusters of votes, best first). */
  hypotheses?: number;
}

export interface PairVoteHypothesis {
  transform: RigidTransform;
  votes: number;
}

interface Oriented {
  p: Float64Array;
  n: Float64Array;
  count: number;
}

function strided(points: ArrayLike<number>, normals: ArrayLike<number>, max: number, flip: boolean): Oriented {
  const total = Math.floor(points.length / 3);
  const step = Math.max(1, total / max);
  const count = Math.min(total, Math.ceil(total / step));
  const p = new Float64Array(3 * count), n = new Float64Array(3 * count);
  const s = flip ? -1 : 1;
  for (let k = 0; k < count; k++) {
    const i = Math.min(total - 1, Math.floor(k * step));
    const l = Math.hypot(normals[3 * i], normals[3 * i + 1], normals[3 * i + 2]) || 1;
    for (let d = 0; d < 3; d++) {
      p[3 * k + d] = points[3 * i + d];
      n[3 * k + d] = (s * normals[3 * i + d]) / l;
    }
  }
  return { p, n, count };
}

/** Row-major rotation taking the unit vector n onto +x (Rodrigues about n x e_x). */
function rotationToX(nx: number, ny: number, nz: number, out: Float64Array, o: number): void {
  // axis = n x (1,0,0) = (0, nz, -ny); cos = nx
  const ax = 0, ay = nz, az = -ny;
  const s = Math.hypot(ay, az);
  const c = nx;
  if (s < 1e-9) {
    // n along +x (identity) or -x (half turn about z)
    const f = c > 0 ? 1 : -1;
    out.set([f, 0, 0, 0, f, 0, 0, 0, 1], o);
    return;
  }
  const x = ax / s, y = ay / s, z = az / s, C = 1 - c;
  out[o] = c + x * x * C; out[o + 1] = x * y * C - z * s; out[o + 2] = x * z * C + y * s;
  out[o + 3] = y * x * C + z * s; out[o + 4] = c + y * y * C; out[o + 5] = y * z * C - x * s;
  out[o + 6] = z * x * C - y * s; out[o + 7] = z * y * C + x * s; out[o + 8] = c + z * z * C;
}

/** Each sample's rotation onto +x. */
function frames(s: Oriented): Float64Array {
  const R = new Float64Array(9 * s.count);
  for (let i = 0; i < s.count; i++) rotationToX(s.n[3 * i], s.n[3 * i + 1], s.n[3 * i + 2], R, 9 * i);
  return R;
}

/**
 * Feature key of the pair (i, j) of one face (or -1 when the pair is too short or too long).
 * `bins` is angleBins(aStep, aBins): each angle's bin is read from a table by its cosine, or is
 * floor(acos / aStep) where the table cannot tell (the same bin either way; see angleBins).
 */
function pairKey(s: Oriented, i: number, j: number, dStep: number, aStep: number, dBins: number, aBins: number, bins: Int8Array): number {
  const dx = s.p[3 * j] - s.p[3 * i], dy = s.p[3 * j + 1] - s.p[3 * i + 1], dz = s.p[3 * j + 2] - s.p[3 * i + 2];
  const d = hypot(dx, dy, dz);
  const kd = Math.floor(d / dStep);
  if (d < 1e-9 || kd >= dBins) return -1;
  const ux = dx / d, uy = dy / d, uz = dz / d;
  const n1x = s.n[3 * i], n1y = s.n[3 * i + 1], n1z = s.n[3 * i + 2];
  const n2x = s.n[3 * j], n2y = s.n[3 * j + 1], n2z = s.n[3 * j + 2];
  const c1 = Math.max(-1, Math.min(1, n1x * ux + n1y * uy + n1z * uz));
  const c2 = Math.max(-1, Math.min(1, n2x * ux + n2y * uy + n2z * uz));
  const c3 = Math.max(-1, Math.min(1, n1x * n2x + n1y * n2y + n1z * n2z));
  // (a NaN cosine fails c >= -1 and takes the arc cosine, as before)
  let q1 = c1 >= -1 ? bins[((c1 + 1) * BIN_CELLS) | 0] : -1;
  if (q1 < 0) q1 = Math.min(aBins - 1, Math.floor(Math.acos(c1) / aStep));
  let q2 = c2 >= -1 ? bins[((c2 + 1) * BIN_CELLS) | 0] : -1;
  if (q2 < 0) q2 = Math.min(aBins - 1, Math.floor(Math.acos(c2) / aStep));
  let q3 = c3 >= -1 ? bins[((c3 + 1) * BIN_CELLS) | 0] : -1;
  if (q3 < 0) q3 = Math.min(aBins - 1, Math.floor(Math.acos(c3) / aStep));
  return ((kd * aBins + q1) * aBins + q2) * aBins + q3;
}

/** Cells of the angle bin table per unit of cosine. */
const BIN_CELLS = 2048;
/** A table cell holds a bin only when no bin boundary lies within this much cosine of it. */
const BIN_MARGIN = 1e-6;

/**
 * The bins min(aBins - 1, floor(acos(c) / aStep)) of pairKey's angles by their cosine c in
 * [-1, 1], read from a table where they cannot differ (the arc cosine, a call of some 20 ns, was
 * most of a key's cost): the cell of c ((c + 1) BIN_CELLS rounded down; 2 BIN_CELLS + 1 cells)
 * holds the bin when no boundary cos(m aStep) lies within BIN_MARGIN of the cell and the bins at
 * its two ends (BIN_MARGIN outside) agree, else -1 (take the arc cosine). An angle moves at
 * least as fast as its cosine (|d acos / dc| >= 1), so a cosine BIN_MARGIN from a boundary is an
 * angle over 1e-6 rad from it, against rounding errors of acos(c) / aStep near 1e-14. Kept by step.
 */
function angleBins(aStep: number, aBins: number): Int8Array {
  const key = `${aStep} ${aBins}`;
  const hit = binTables.get(key);
  if (hit) return hit;
  const exact = (c: number): number => Math.min(aBins - 1, Math.floor(Math.acos(Math.max(-1, Math.min(1, c))) / aStep));
  const bounds: number[] = [];
  for (let m = 1; m < aBins && m * aStep <= Math.PI + 1e-6; m++) bounds.push(Math.cos(m * aStep));
  const table = new Int8Array(2 * BIN_CELLS + 1);
  for (let g = 0; g <= 2 * BIN_CELLS; g++) {
    const lo = g / BIN_CELLS - 1 - BIN_MARGIN, hi = (g + 1) / BIN_CELLS - 1 + BIN_MARGIN;
    const q = exact(lo);
    table[g] = q === exact(hi) && q <= 127 && !bounds.some((b) => b >= lo && b <= hi) ? q : -1;
  }
  binTables.set(key, table);
  return table;
}

const binTables = new Map<string, Int8Array>();

/** The angle of sample j about sample i's normal in i's frame (atan2 of its z and y there). */
function pairAngle(s: Oriented, R: Float64Array, i: number, j: number): number {
  const dx = s.p[3 * j] - s.p[3 * i], dy = s.p[3 * j + 1] - s.p[3 * i + 1], dz = s.p[3 * j + 2] - s.p[3 * i + 2];
  const o = 9 * i;
  // j in i's frame: only the y and z parts matter (the turn about x)
  const vy = R[o + 3] * dx + R[o + 4] * dy + R[o + 5] * dz;
  const vz = R[o + 6] * dx + R[o + 7] * dy + R[o + 8] * dz;
  return Math.atan2(vz, vy);
}

/**
 * Motions carrying B's face onto A's face (normals opposed), best voted first. Faces are packed
 * xyz samples with outward normals. The smaller face's pairs are filed (its normals reversed)
 * and the larger face's pairs look them up, so the table stays small and the larger face is
 * searched for the place that holds the smaller one.
 */
export function pointPairVoting(
  faceAPoints: ArrayLike<number>,
  faceANormals: ArrayLike<number>,
  faceBPoints: ArrayLike<number>,
  faceBNormals: ArrayLike<number>,
  options: PointPairVotingOptions,
): PairVoteHypothesis[] {
  // one density on both faces (the smaller face's stride): a small face's partner may be a large
  // face that holds it in one corner, and pairs only match at the same sample density
  const max = options.maxSamples ?? 120;
  const nA = Math.floor(faceAPoints.length / 3), nB = Math.floor(faceBPoints.length / 3);
  const step = Math.max(1, Math.min(nA, nB) / max);
  const cap = options.maxLargerSamples ?? 4 * max;
  if (nB <= nA) {
    const A = strided(faceAPoints, faceANormals, Math.min(cap, nA / step), false);
    return vote(A, filedFace(faceBPoints, faceBNormals, Math.min(cap, nB / step), options), options);
  }
  // B is the larger face: file A's pairs, vote with B's, and turn the motions round
  const B = strided(faceBPoints, faceBNormals, Math.min(cap, nB / step), false);
  return vote(B, filedFace(faceAPoints, faceANormals, Math.min(cap, nA / step), options), options).map((h) => ({ transform: invert(h.transform), votes: h.votes }));
}

/**
 * The smaller face's pairs filed by feature, with its samples (normals reversed) and frames.
 * Pairs up to the face's own extent are filed; a vote looks up only pairs shorter than the
 * smaller extent of its two faces, whose keys come first (the distance bin is the key's leading
 * part), so the same table serves every partner: pairs of one key in the same order as filing
 * for that partner alone.
 */
interface FiledFace {
  s: Oriented;
  R: Float64Array;
  extent: number;
  /** Pairs of key k are start[k] .. start[k + 1] - 1: their first sample and angle about its normal. */
  start: Int32Array;
  pairRef: Uint16Array;
  pairAlpha: Float32Array;
}

/**
 * Filed faces by their points array and settings: a face meets some twenty partners in a propose
 * run and, when it is the smaller face, is filed the same way for each. The options that shape
 * the table are part of the key; the samples taken depend on the face and `max` only.
 */
const filedFaces = new WeakMap<ArrayLike<number>, Map<string, FiledFace>>();

function filedFace(points: ArrayLike<number>, normals: ArrayLike<number>, max: number, options: PointPairVotingOptions): FiledFace {
  const dStep = options.distanceStep ?? options.spacing;
  const aStepDeg = options.angleStepDeg ?? 12;
  const key = `${max} ${dStep} ${aStepDeg}`;
  let byKey = normalsOf.get(points) === normals ? filedFaces.get(points) : undefined;
  const hit = byKey?.get(key);
  if (hit) return hit;
  const s = strided(points, normals, max, true);
  const R = frames(s);
  const aStep = (aStepDeg * Math.PI) / 180;
  const aBins = Math.ceil(Math.PI / aStep) + 1;
  const extent = extentOf(s);
  const dBins = Math.floor(extent / dStep) + 1;
  const { start, pairRef, pairAlpha } = filePairs(s, R, dStep, aStep, dBins, aBins);
  // kept while the face lives (weakly, by its points array)
  const filed: FiledFace = { s, R, extent, start, pairRef, pairAlpha };
  if (!byKey) {
    byKey = new Map();
    filedFaces.set(points, byKey);
    normalsOf.set(points, normals);
  }
  byKey.set(key, filed);
  return filed;
}

/**
 * The pairs of s filed by key (a counting sort, stable: pairs of one key in the order (i, j)
 * ascending). A function of its own, so that the engine compiles its loops apart from the
 * caching about them (inside filedFace the optimised code was thrown away at the cache's Map).
 * Counts go to start[k + 2] so that after the running sum start[k + 1] is where key k's pairs
 * begin; filing each pair at start[key + 1]++ leaves start[k] there instead (no copy of the
 * table). start has keySpace + 2 entries, its last unused by the lookups.
 */
function filePairs(s: Oriented, R: Float64Array, dStep: number, aStep: number, dBins: number, aBins: number): { start: Int32Array; pairRef: Uint16Array; pairAlpha: Float32Array } {
  const nPairs = s.count * (s.count - 1);
  const bins = angleBins(aStep, aBins);
  const keyOf = new Int32Array(nPairs), refOf = new Uint16Array(nPairs), alphaOf = new Float32Array(nPairs);
  const keySpace = dBins * aBins * aBins * aBins;
  const start = new Int32Array(keySpace + 2);
  let m = 0;
  for (let i = 0; i < s.count; i++) {
    for (let j = 0; j < s.count; j++) {
      if (i === j) continue;
      const k = pairKey(s, i, j, dStep, aStep, dBins, aBins, bins);
      if (k < 0) continue;
      keyOf[m] = k; refOf[m] = i; alphaOf[m] = pairAngle(s, R, i, j);
      start[k + 2]++;
      m++;
    }
  }
  for (let k = 0; k <= keySpace; k++) start[k + 1] += start[k];
  const pairRef = new Uint16Array(m), pairAlpha = new Float32Array(m);
  for (let k = 0; k < m; k++) {
    const at = start[keyOf[k] + 1]++;
    pairRef[at] = refOf[k];
    pairAlpha[at] = alphaOf[k];
  }
  return { start, pairRef, pairAlpha };
}

/** The normals a cached filed face was made with (a points array met again with other normals is filed anew). */
const normalsOf = new WeakMap<ArrayLike<number>, ArrayLike<number>>();

/** Twice the largest distance of a sample from the samples' centroid. */
function extentOf(s: Oriented): number {
  let c0 = 0, c1 = 0, c2 = 0;
  for (let i = 0; i < s.count; i++) { c0 += s.p[3 * i]; c1 += s.p[3 * i + 1]; c2 += s.p[3 * i + 2]; }
  c0 /= s.count; c1 /= s.count; c2 /= s.count;
  let r = 0;
  for (let i = 0; i < s.count; i++) r = Math.max(r, hypot(s.p[3 * i] - c0, s.p[3 * i + 1] - c1, s.p[3 * i + 2] - c2));
  return 2 * r;
}

/** Motions carrying the filed face B (normals already reversed) onto the searched face A, best voted first. */
function vote(A: Oriented, filed: FiledFace, options: PointPairVotingOptions): PairVoteHypothesis[] {
  const B = filed.s, RB = filed.R, { start, pairRef, pairAlpha } = filed;
  if (A.count < 4 || B.count < 4) return [];
  const dStep = options.distanceStep ?? options.spacing;
  const aStep = ((options.angleStepDeg ?? 12) * Math.PI) / 180;
  const aBins = Math.ceil(Math.PI / aStep) + 1;
  const nTurn = options.turnBins ?? 30;
  const dTurn = (2 * Math.PI) / nTurn;
  // pairs longer than the smaller face's extent cannot lie inside the shared patch
  const dBins = Math.floor(Math.min(extentOf(A), filed.extent) / dStep) + 1;
  const RA = frames(A);
  const stride = Math.max(1, Math.ceil(A.count / (options.references ?? 60)));
  const nRefs = Math.ceil(A.count / stride);
  const peakCell = new Int32Array(nRefs), peakVotes = new Int32Array(nRefs);
  referencePeaks(A, RA, stride, dStep, aStep, aBins, dBins, nTurn, start, pairRef, pairAlpha, B.count, peakCell, peakVotes);
  const poses: Array<{ transform: RigidTransform; votes: number }> = [];
  for (let t = 0; t < nRefs; t++) {
    const best = peakCell[t], votes = peakVotes[t];
    if (best >= 0 && votes >= 3) {
      const i = Math.floor(best / nTurn), th = ((best % nTurn) + 0.5) * dTurn;
      poses.push({ transform: poseOf(A, RA, t * stride, B, RB, i, th), votes });
    }
  }
  // cluster the poses (Drost et al.: poses within a rotation and translation threshold), summing votes
  poses.sort((p, q) => q.votes - p.votes);
  const centre = [0, 0, 0];
  for (let i = 0; i < B.count; i++) for (let d = 0; d < 3; d++) centre[d] += B.p[3 * i + d] / B.count;
  // each cluster's motion: the vote-weighted mean of its poses (quaternions on one hemisphere; where B's centre goes)
  const clusters: Array<{ transform: RigidTransform; votes: number; q: number[]; c: number[] }> = [];
  for (const p of poses) {
    const q = quaternionOf(p.transform);
    const moved = [0, 1, 2].map((r) => p.transform[4 * r] * centre[0] + p.transform[4 * r + 1] * centre[1] + p.transform[4 * r + 2] * centre[2] + p.transform[4 * r + 3]);
    const c = clusters.find((k) => rotationErrorDegrees(k.transform, p.transform) < 12 && displacementAt(k.transform, p.transform, centre) < 3 * options.spacing);
    if (!c) {
      clusters.push({ transform: p.transform, votes: p.votes, q: q.map((x) => x * p.votes), c: moved.map((x) => x * p.votes) });
      continue;
    }
    const sign = q[0] * c.q[0] + q[1] * c.q[1] + q[2] * c.q[2] + q[3] * c.q[3] < 0 ? -1 : 1;
    for (let d = 0; d < 4; d++) c.q[d] += sign * p.votes * q[d];
    for (let d = 0; d < 3; d++) c.c[d] += p.votes * moved[d];
    c.votes += p.votes;
  }
  for (const k of clusters) {
    const R = rotationFromQuaternion(k.q[0], k.q[1], k.q[2], k.q[3]);
    const t = [0, 1, 2].map((r) => k.c[r] / k.votes - (R[3 * r] * centre[0] + R[3 * r + 1] * centre[1] + R[3 * r + 2] * centre[2]));
    k.transform = [R[0], R[1], R[2], t[0], R[3], R[4], R[5], t[1], R[6], R[7], R[8], t[2], 0, 0, 0, 1];
  }
  clusters.sort((p, q) => q.votes - p.votes);
  return clusters.slice(0, options.hypotheses ?? 4).map((k) => ({ transform: k.transform, votes: k.votes }));
}

/**
 * The voting itself: for each reference sample r = 0, stride, 2 stride... of the searched face A
 * (frames RA), every pair (r, j) of its face looks up the filed pairs with its feature (pairKey)
 * and each votes for (filed reference sample, turn bin) in a table of nFiled x nTurn cells; the
 * cell with the most votes (the first voted among equals) and its votes go to peakCell[t] /
 * peakVotes[t] for the t-th reference (-1 and 0 when nothing voted).
 *
 * Speed (the innermost loop runs some 110,000 times per call on small faces; 72 million times
 * in match-speed.ts on 300 fragment pairs of s340): this loop has a function of its own, which
 * the engine compiles alone (inside vote() the optimised code was thrown away at the clustering
 * below on most calls, for want of type feedback there); a vote writes its cell at the end of the
 * touched list and only a cell's first vote moves the end on (no unpredictable branch); the turn
 * bin is a product with 1 / dTurn, and the quotient th / dTurn itself where the product lies
 * within 1e-9 of a whole number (the two differ by a few units in the last place, under 1e-14
 * for quotients up to nTurn, so elsewhere their floors agree). Results are bit for bit those of
 * the plain loop (the same votes in the same order).
 */
function referencePeaks(
  A: Oriented, RA: Float64Array, stride: number,
  dStep: number, aStep: number, aBins: number, dBins: number, nTurn: number,
  start: Int32Array, pairRef: Uint16Array, pairAlpha: Float32Array, nFiled: number,
  peakCell: Int32Array, peakVotes: Int32Array,
): void {
  const count = A.count;
  const bins = angleBins(aStep, aBins);
  const dTurn = (2 * Math.PI) / nTurn, twoPi = 2 * Math.PI, perTurn = 1 / dTurn;
  const acc = new Int32Array(nFiled * nTurn);
  // one slot more than the cells: every vote writes its cell at the end of the list
  const touched = new Int32Array(nFiled * nTurn + 1);
  let nTouched = 0;
  for (let r = 0, t = 0; r < count; r += stride, t++) {
    for (let j = 0; j < count; j++) {
      if (j === r) continue;
      const key = pairKey(A, r, j, dStep, aStep, dBins, aBins, bins);
      if (key < 0) continue;
      const aS = pairAngle(A, RA, r, j);
      for (let k = start[key], end = start[key + 1]; k < end; k++) {
        let th = aS - pairAlpha[k];
        if (th < 0) th += twoPi;
        if (th >= twoPi) th -= twoPi;
        // th in [0, 2 pi): its bin is at most nTurn (rounding), which is bin 0 again
        const q = th * perTurn;
        let bin = Math.floor(q) | 0;
        if (q - bin < 1e-9 || q - bin > 1 - 1e-9) bin = Math.floor(th / dTurn) | 0;
        if (bin >= nTurn) bin -= nTurn;
        const cell = pairRef[k] * nTurn + bin;
        const v = acc[cell];
        // (v - 1) >>> 31: 1 for a cell's first vote (v = 0), else 0
        touched[nTouched] = cell;
        nTouched += (v - 1) >>> 31;
        acc[cell] = v + 1;
      }
    }
    // this reference point's best (filed sample, turn)
    let best = -1, votes = 0;
    for (let u = 0; u < nTouched; u++) { const c = touched[u]; if (acc[c] > votes) { votes = acc[c]; best = c; } }
    peakCell[t] = best; peakVotes[t] = votes;
    for (let u = 0; u < nTouched; u++) acc[touched[u]] = 0;
    nTouched = 0;
  }
}

/**
 * The motion that puts B's sample i on A's sample r with their frames' x axes (normals, B's
 * reversed) together and turned by th about them: p -> a_r + RA_r^T Rx(th) RB_i (p - b_i).
 */
function poseOf(A: Oriented, RA: Float64Array, r: number, B: Oriented, RB: Float64Array, i: number, th: number): RigidTransform {
  const c = Math.cos(th), s = Math.sin(th);
  const rb = RB.subarray(9 * i, 9 * i + 9), ra = RA.subarray(9 * r, 9 * r + 9);
  // M = Rx(th) RB
  const M = new Float64Array(9);
  for (let k = 0; k < 3; k++) {
    M[k] = rb[k];
    M[3 + k] = c * rb[3 + k] - s * rb[6 + k];
    M[6 + k] = s * rb[3 + k] + c * rb[6 + k];
  }
  // R = RA^T M
  const R = new Float64Array(9);
  for (let row = 0; row < 3; row++) for (let col = 0; col < 3; col++) R[3 * row + col] = ra[row] * M[col] + ra[3 + row] * M[3 + col] + ra[6 + row] * M[6 + col];
  const bx = B.p[3 * i], by = B.p[3 * i + 1], bz = B.p[3 * i + 2];
  const out: number[] = [];
  for (let row = 0; row < 3; row++) out.push(R[3 * row], R[3 * row + 1], R[3 * row + 2], A.p[3 * r + row] - (R[3 * row] * bx + R[3 * row + 1] * by + R[3 * row + 2] * bz));
  out.push(0, 0, 0, 1);
  return out;
}
