/**
 * Coarse alignment of two shaft pieces from their axis directions alone (design.md section 7,
 * notes for long bones). The shared-axis search (shaft-axis-search.ts) lays both fitted axis
 * lines on one line, which fails when a piece holds only part of the shaft's circumference: its
 * fitted axis point and radius are then poor (off by several mm) while its axis direction is
 * still good to a few degrees. Here only the directions are trusted: B's axis is laid along A's
 * (either way round, and tilted by a few degrees about two directions across the axis, since
 * directions fitted on bowed shafts or partial arcs differ a little), which leaves the turn about
 * the axis and a free translation. Every pair of samples whose normals can be opposed by a turn
 * fixes that turn (from the normals' components across the axis) and then the translation; the
 * pairs vote in (turn, translation) bins and the peaks are the hypotheses (a generalised Hough
 * transform, Ballard 1981).
 */
import { hypot } from '../hypot';
import { roundHalfUp } from '../round-half-up';
import type { RigidTransform } from './rigid-transform';
import { acrossAxisBasis } from '../shaft-axis';
import { turnBetweenFrames } from './shaft-axis-search';

export interface AxisDirectionSearchOptions {
  spacing: number;
  /** Most samples per face used in the vote. */
  maxSamples?: number;
  /** Hypotheses returned (best voted, distinct bins). */
  peaks?: number;
  /** Tilts tried about each of two directions across A's axis (degrees), e.g. [-6, 0, 6]. */
  tiltsDeg?: number[];
  /** Width of a turn bin (degrees). */
  turnBinDeg?: number;
  /** Width of a translation bin in sample spacings. */
  shiftBinSpacings?: number;
  /** Bins that may become peaks: at least this many votes (3). */
  minPeakVotes?: number;
  /**
   * Most bins whose support is counted (the fullest of the same flip and tilt, by whole counts:
   * a count that would pass this is left out with all its bins); when they hold too few distinct
   * peaks, the other bins of at least minPeakVotes follow by their own votes.
   */
  maxCandidates?: number;
}

export interface DirectionHypothesis {
  transform: RigidTransform;
  /** The peak's support: the votes of its bin and of the bins next to it. */
  votes: number;
  flip: boolean;
  tiltDeg: [number, number];
}

type V3 = [number, number, number];

function rotateAbout(v: V3, axis: V3, angle: number): V3 {
  const c = Math.cos(angle), s = Math.sin(angle);
  const d = axis[0] * v[0] + axis[1] * v[1] + axis[2] * v[2];
  const cx = axis[1] * v[2] - axis[2] * v[1], cy = axis[2] * v[0] - axis[0] * v[2], cz = axis[0] * v[1] - axis[1] * v[0];
  return [v[0] * c + cx * s + axis[0] * d * (1 - c), v[1] * c + cy * s + axis[1] * d * (1 - c), v[2] * c + cz * s + axis[2] * d * (1 - c)];
}

function strided(points: ArrayLike<number>, normals: ArrayLike<number>, max: number): { p: Float64Array; n: Float64Array; count: number } {
  const total = points.length / 3;
  const step = Math.max(1, total / max);
  const count = Math.min(total, Math.ceil(total / step));
  const p = new Float64Array(3 * count), n = new Float64Array(3 * count);
  for (let k = 0; k < count; k++) {
    const i = Math.min(total - 1, Math.floor(k * step));
    for (let d = 0; d < 3; d++) {
      p[3 * k + d] = points[3 * i + d];
      n[3 * k + d] = normals[3 * i + d];
    }
  }
  return { p, n, count };
}

/** Coordinates of packed vectors in the frame (x, y, z) (rows of the frame's transpose). */
function toFrame(v: Float64Array, count: number, x: V3, y: V3, z: V3): Float64Array {
  const out = new Float64Array(3 * count);
  for (let i = 0; i < count; i++) {
    const a = v[3 * i], b = v[3 * i + 1], c = v[3 * i + 2];
    out[3 * i] = a * x[0] + b * x[1] + c * x[2];
    out[3 * i + 1] = a * y[0] + b * y[1] + c * y[2];
    out[3 * i + 2] = a * z[0] + b * z[1] + c * z[2];
  }
  return out;
}

/** A bin that may become a peak: its slot, its indices (turn, translation) and its support. */
interface Candidate { h: number; kt: number; ix: number; iy: number; iz: number; support: number; tie: number }

interface VoteTable {
  /**
   * Per slot: the bin's tag (-1: empty) and its count of votes. The tag is the bin's key when
   * every key is below 2^31 (the usual case: 4 bytes a slot keep the table in the cache), else
   * the key modulo 2^31 with the whole key in `wideKey` (only read when the tags agree).
   */
  tKey: Int32Array;
  wideKey: Float64Array;
  tCount: Int32Array;
  /** Slots in the order their bins got their first vote. */
  used: Int32Array;
  /** Per vote, in voting order: its bin's slot. */
  voteSlot: Int32Array;
  /** Per vote, in voting order: its A sample (an index into the packed A arrays). */
  voteA: Int32Array;
  /** Per slot: the peak it holds (-1: none). */
  peakOf: Int32Array;
}

/** Vote tables by size, kept between searches (each search leaves its bins empty again: key -1, count 0). */
const tables = new Map<number, VoteTable>();

function voteTable(size: number, votes: number): VoteTable {
  let t = tables.get(size);
  if (!t) {
    t = { tKey: new Int32Array(size).fill(-1), wideKey: new Float64Array(size), tCount: new Int32Array(size), used: new Int32Array(size), voteSlot: new Int32Array(votes), voteA: new Int32Array(votes), peakOf: new Int32Array(size).fill(-1) };
    tables.set(size, t);
  }
  if (t.voteSlot.length < votes) { t.voteSlot = new Int32Array(votes); t.voteA = new Int32Array(votes); }
  return t;
}

/**
 * Motions carrying B's face onto A's face with B's axis direction laid along A's (within the
 * tilts tried), best supported first. Faces are packed xyz samples with outward normals.
 *
 * Without tilts (tiltsDeg [0], the matcher's default) the search is symmetric in the two faces:
 * run with A and B exchanged it finds the inverse motions with the same support, so which
 * fragment is A does not decide what the screen gets. Three things make it so. (1) A vote's
 * translation is binned in the frame turned by half its turn, Rz(-turn/2) t, not in A's frame:
 * exchanging the faces turns the translation by the turn and reverses it, which in that frame is
 * only a change of sign of one or two coordinates, and rounding keeps the bins' edges where they
 * were. (2) A bin is ranked by its support, its own votes and those of the 80 bins around it (in
 * turn and translation), and a peak that lies next to a better one is left out: a cluster of
 * votes cut by a bin's edge still counts whole, the peaks are distinct clusters, and ties of
 * single bins (peaks often hold 3-6 votes on a break across the shaft, where few normals point
 * across the axis) are not broken by the order of voting. (3) A peak's motion is the mean turn of
 * its votes and the translation that carries the mean of their B samples onto the mean of their
 * A samples under that turn (its inverse is the same sum the other way round).
 */
export function searchAlongAxisDirections(
  directionA: V3,
  faceAPoints: ArrayLike<number>,
  faceANormals: ArrayLike<number>,
  directionB: V3,
  faceBPoints: ArrayLike<number>,
  faceBNormals: ArrayLike<number>,
  options: AxisDirectionSearchOptions,
): DirectionHypothesis[] {
  const max = options.maxSamples ?? 150;
  const A = strided(faceAPoints, faceANormals, max), B = strided(faceBPoints, faceBNormals, max);
  if (A.count < 3 || B.count < 3) return [];
  const tilts = options.tiltsDeg ?? [0];
  const nTh = Math.max(3, Math.round(360 / (options.turnBinDeg ?? 6)));
  const dTh = (2 * Math.PI) / nTh;
  const bs = (options.shiftBinSpacings ?? 1.5) * options.spacing;
  const minVotes = options.minPeakVotes ?? 3;
  const maxCandidates = options.maxCandidates ?? 32;
  const [xa0, ya0] = acrossAxisBasis(directionA);
  const [xb, yb] = acrossAxisBasis(directionB);
  const zb = directionB;
  // bound on any translation's coordinates: |a| + |b| (coordinates taken about the faces' centres below)
  const ca = [0, 0, 0], cb = [0, 0, 0];
  for (let i = 0; i < A.count; i++) for (let d = 0; d < 3; d++) ca[d] += A.p[3 * i + d] / A.count;
  for (let i = 0; i < B.count; i++) for (let d = 0; d < 3; d++) cb[d] += B.p[3 * i + d] / B.count;
  const Ap = new Float64Array(A.p), Bp = new Float64Array(B.p);
  let ra = 0, rb = 0;
  for (let i = 0; i < A.count; i++) { for (let d = 0; d < 3; d++) Ap[3 * i + d] -= ca[d]; ra = Math.max(ra, hypot(Ap[3 * i], Ap[3 * i + 1], Ap[3 * i + 2])); }
  for (let i = 0; i < B.count; i++) { for (let d = 0; d < 3; d++) Bp[3 * i + d] -= cb[d]; rb = Math.max(rb, hypot(Bp[3 * i], Bp[3 * i + 1], Bp[3 * i + 2])); }
  const half = Math.ceil((ra + rb) / bs) + 1;
  const nb = 2 * half + 1;
  // vote table: open addressing on the bin key, more slots than votes (so never full). The slot
  // only decides where a bin is kept, never which bins win (`used` keeps the bins in the order of
  // their first vote whatever their slots): it is the tag scrambled (Fibonacci hashing, Knuth,
  // TAOCP vol. 3, 6.4): on the 1,277 face pairs of two shaft pieces among 300 fragment pairs of
  // dev seed 340, 0.22 extra probes a vote against 1.46 with the key's own low bits as the slot
  // (the turn planes, nb^3 keys apart, fell on one another's slots), and 14% less CPU for the vote
  let size = 1024;
  while (size <= A.count * B.count) size <<= 1;
  const mask = size - 1;
  const shift = 32 - Math.log2(size);
  const wide = nTh * nb * nb * nb > 2147483647;
  const { tKey, wideKey, tCount, used, voteSlot, voteA, peakOf } = voteTable(size, A.count * B.count);
  const slotOf = (key: number): number => {
    const tag = wide ? key % 2147483648 : key;
    let h = Math.imul(tag, -1640531535) >>> shift;
    let at = tKey[h];
    while (at !== -1 && (at !== tag || (wide && wideKey[h] !== key))) { h = (h + 1) & mask; at = tKey[h]; }
    return at === -1 ? -1 : h;
  };
  const keyOf = (h: number): number => (wide ? wideKey[h] : tKey[h]);
  const peaks = options.peaks ?? 3;
  const found: DirectionHypothesis[] = [];
  for (const flip of [false, true]) {
    const f: 1 | -1 = flip ? -1 : 1;
    // B in its own axis frame, flipped or not (half turn about x): fixed for every tilt and turn
    const bP = toFrame(Bp, B.count, xb, yb, zb), bN = toFrame(B.n, B.count, xb, yb, zb);
    if (flip) for (let i = 0; i < B.count; i++) { bP[3 * i + 1] *= f; bP[3 * i + 2] *= f; bN[3 * i + 1] *= f; bN[3 * i + 2] *= f; }
    const phiB = new Float64Array(B.count).fill(NaN), cB = new Float64Array(B.count), sB = new Float64Array(B.count);
    for (let i = 0; i < B.count; i++) {
      const u = bN[3 * i], v = bN[3 * i + 1], h = Math.hypot(u, v);
      if (h < 0.3) continue;
      phiB[i] = Math.atan2(v, u); cB[i] = u / h; sB[i] = v / h;
    }
    for (const t1 of tilts) for (const t2 of tilts) {
      // A's frame tilted: about x by t1, then about the new y by t2
      const a1 = (t1 * Math.PI) / 180, a2 = (t2 * Math.PI) / 180;
      const za1 = rotateAbout(directionA, xa0, a1), ya1 = rotateAbout(ya0, xa0, a1);
      const za: V3 = rotateAbout(za1, ya1, a2), xa: V3 = rotateAbout(xa0, ya1, a2), ya = ya1;
      const aP = toFrame(Ap, A.count, xa, ya, za), aN = toFrame(A.n, A.count, xa, ya, za);
      // A's normal across the axis, reversed: where B's must point after the turn; only the
      // samples where that is defined, packed in their order (the votes come in the same order)
      const vA = new Int32Array(A.count), phiA = new Float64Array(A.count), cA = new Float64Array(A.count), sA = new Float64Array(A.count);
      const xA = new Float64Array(A.count), yA = new Float64Array(A.count), zA = new Float64Array(A.count), nzA = new Float64Array(A.count);
      let nA = 0;
      for (let j = 0; j < A.count; j++) {
        const p = -aN[3 * j], q = -aN[3 * j + 1], h = Math.hypot(p, q);
        if (h < 0.3) continue;
        vA[nA] = j; phiA[nA] = Math.atan2(q, p); cA[nA] = p / h; sA[nA] = q / h;
        xA[nA] = aP[3 * j]; yA[nA] = aP[3 * j + 1]; zA[nA] = aP[3 * j + 2]; nzA[nA] = aN[3 * j + 2];
        nA++;
      }
      // Each pair of samples whose normals can be opposed votes for one (turn, translation) bin,
      // the translation taken in the frame turned by half the turn; each vote's bin is noted
      let nUsed = 0, nVotes = 0, most = 0;
      const votesOfB = new Int32Array(B.count);
      for (let i = 0; i < B.count; i++) {
        if (Number.isNaN(phiB[i])) continue;
        const first = nVotes;
        const w = bN[3 * i + 2];
        const bx = bP[3 * i], by = bP[3 * i + 1], bz = bP[3 * i + 2];
        const pB = phiB[i], cBi = cB[i], sBi = sB[i];
        for (let k = 0; k < nA; k++) {
          if (Math.abs(w + nzA[k]) > 0.3) continue;
          // turn that makes B's normal across the axis point opposite to A's
          let th = phiA[k] - pB;
          if (th < 0) th += 2 * Math.PI;
          const c = cA[k] * cBi + sA[k] * sBi, s = sA[k] * cBi - cA[k] * sBi;
          const tx = xA[k] - (c * bx - s * by), ty = yA[k] - (s * bx + c * by), tz = zA[k] - bz;
          // half the turn (th in [0, 2 pi], so its half in [0, pi]): cos and sin from c
          const hc = Math.sqrt(Math.max(0, 0.5 * (1 + c))), hs = Math.sqrt(Math.max(0, 0.5 * (1 - c)));
          const ch = th < Math.PI ? hc : -hc;
          const mx = ch * tx + hs * ty, my = ch * ty - hs * tx;
          // th in [0, 2 pi]: its bin is at most nTh, which is bin 0 again
          let kt = Math.floor(th / dTh);
          if (kt >= nTh) kt -= nTh;
          const key = ((kt * nb + roundHalfUp(mx / bs) + half) * nb + roundHalfUp(my / bs) + half) * nb + roundHalfUp(tz / bs) + half;
          const tag = wide ? key % 2147483648 : key;
          let h = Math.imul(tag, -1640531535) >>> shift;
          let at = tKey[h];
          while (at !== -1 && (at !== tag || (wide && wideKey[h] !== key))) { h = (h + 1) & mask; at = tKey[h]; }
          if (at === -1) { tKey[h] = tag; used[nUsed++] = h; if (wide) wideKey[h] = key; }
          if (++tCount[h] > most) most = tCount[h];
          voteA[nVotes] = k;
          voteSlot[nVotes++] = h;
        }
        votesOfB[i] = nVotes - first;
      }
      // candidate bins: the fullest, at most maxCandidates of them (all bins of one count or none),
      // and at least minPeakVotes; each one's support is the votes of the 3 x 3 x 3 x 3 bins
      // about it (across turn 0 the half turn changes by pi: the translation bins there are
      // mirrored in x and y)
      const byCount = new Int32Array(most + 2);
      for (let k = 0; k < nUsed; k++) byCount[tCount[used[k]]]++;
      let floor = most + 1;
      for (let n = byCount[most]; floor > minVotes && n <= maxCandidates; n += byCount[floor - 1]) floor--;
      const pool: number[] = [], rest: number[] = [];
      for (let k = 0; k < nUsed; k++) {
        const h = used[k];
        if (tCount[h] >= floor) pool.push(h);
        else if (tCount[h] >= minVotes) rest.push(h);
      }
      const cand: Candidate[] = [];
      const adjacent = (p: Candidate, q: Candidate): boolean => {
        let dk = Math.abs(p.kt - q.kt);
        const wrap = dk > nTh / 2;
        if (wrap) dk = nTh - dk;
        if (dk > 1) return false;
        const qx = wrap ? 2 * half - q.ix : q.ix, qy = wrap ? 2 * half - q.iy : q.iy;
        return Math.abs(p.ix - qx) <= 1 && Math.abs(p.iy - qy) <= 1 && Math.abs(p.iz - q.iz) <= 1;
      };
      const binOf = (h: number, support: number): Candidate => {
        let key = keyOf(h);
        const iz = key % nb; key = (key - iz) / nb;
        const iy = key % nb; key = (key - iy) / nb;
        const ix = key % nb; const kt = (key - ix) / nb;
        // ties of support and own votes: the bin nearer no turn and no shift first (both unchanged when A and B are exchanged)
        const tie = hypot(ix - half, iy - half, iz - half) + nb * Math.abs(kt + 0.5 - nTh / 2);
        return { h, kt, ix, iy, iz, support, tie };
      };
      for (const h of pool) {
        const bin = binOf(h, 0);
        const { kt, ix, iy, iz } = bin;
        let support = 0;
        for (let dk = -1; dk <= 1; dk++) {
          let k2 = kt + dk, mirror = false;
          if (k2 < 0) { k2 += nTh; mirror = true; } else if (k2 >= nTh) { k2 -= nTh; mirror = true; }
          const x0 = mirror ? 2 * half - ix : ix, y0 = mirror ? 2 * half - iy : iy;
          for (let dx = -1; dx <= 1; dx++) {
            const x = x0 + dx;
            if (x < 0 || x >= nb) continue;
            for (let dy = -1; dy <= 1; dy++) {
              const y = y0 + dy;
              if (y < 0 || y >= nb) continue;
              for (let dz = -1; dz <= 1; dz++) {
                const z = iz + dz;
                if (z < 0 || z >= nb) continue;
                const at = slotOf(((k2 * nb + x) * nb + y) * nb + z);
                if (at >= 0) support += tCount[at];
              }
            }
          }
        }
        bin.support = support;
        cand.push(bin);
      }
      cand.sort((p, q) => q.support - p.support || tCount[q.h] - tCount[p.h] || p.tie - q.tie);
      // peaks: the best candidates, none next to a better one
      const best: Candidate[] = [];
      for (const c of cand) {
        if (best.length >= peaks) break;
        if (!best.some((b) => adjacent(b, c))) best.push(c);
      }
      if (best.length < peaks && rest.length) {
        // too few distinct peaks above the floor: the bins below it follow by their own votes (support not counted)
        const more = rest.map((h) => binOf(h, tCount[h])).sort((p, q) => q.support - p.support || p.tie - q.tie);
        for (const c of more) {
          if (best.length >= peaks) break;
          if (!best.some((b) => adjacent(b, c))) best.push(c);
        }
      }
      if (best.length) {
        // each peak's motion from its own votes: sums of the turn (cos, sin) and of the paired samples
        const sums = best.map(() => new Float64Array(8));
        best.forEach((b, k) => { peakOf[b.h] = k; });
        // a vote's slot against the peaks' slots (at most three compared in place, no table read)
        const p0 = best[0].h, p1 = best.length > 1 ? best[1].h : -2, p2 = best.length > 2 ? best[2].h : -2;
        const few = best.length <= 3;
        let v = 0;
        // the votes again in voting order, B's sample by B's sample (the same sums in the same order)
        for (let i = 0; i < B.count; i++) {
          const end = v + votesOfB[i];
          if (v === end) continue;
          const bx = bP[3 * i], by = bP[3 * i + 1], bz = bP[3 * i + 2];
          const cBi = cB[i], sBi = sB[i];
          for (; v < end; v++) {
            const slot = voteSlot[v];
            if (few && slot !== p0 && slot !== p1 && slot !== p2) continue;
            const b = few ? (slot === p0 ? 0 : slot === p1 ? 1 : 2) : peakOf[slot];
            if (b < 0) continue;
            const k = voteA[v];
            const S = sums[b];
            S[0] += cA[k] * cBi + sA[k] * sBi; S[1] += sA[k] * cBi - cA[k] * sBi;
            S[2] += xA[k]; S[3] += yA[k]; S[4] += zA[k]; S[5] += bx; S[6] += by; S[7] += bz;
          }
        }
        best.forEach((p, b) => {
          const n = tCount[p.h], S = sums[b];
          const turn = Math.atan2(S[1], S[0]), c = Math.cos(turn), s = Math.sin(turn);
          const mbx = S[5] / n, mby = S[6] / n;
          const t: V3 = [S[2] / n - (c * mbx - s * mby), S[3] / n - (s * mbx + c * mby), S[4] / n - S[7] / n];
          const transform = motion([xa, ya, za], [xb, yb, zb], f, turn, t, ca, cb);
          found.push({ transform, votes: p.support, flip, tiltDeg: [t1, t2] });
          peakOf[p.h] = -1;
        });
      }
      for (let k = 0; k < nUsed; k++) {
        const h = used[k];
        tKey[h] = -1; tCount[h] = 0;
      }
    }
  }
  found.sort((x, y) => y.votes - x.votes);
  return found.slice(0, peaks);
}

/**
 * p_A = FA (Rz(turn) Fl FB^T (p - cB) + t) + cA, with FA, FB the frames as columns and Fl the
 * half turn about x when flipped.
 */
function motion(FA: [V3, V3, V3], FB: [V3, V3, V3], f: 1 | -1, turn: number, t: V3, cA: number[], cB: number[]): RigidTransform {
  const R = turnBetweenFrames(FA, FB, f, turn);
  const out: number[] = [];
  for (let i = 0; i < 3; i++) {
    const ti = cA[i] + FA[0][i] * t[0] + FA[1][i] * t[1] + FA[2][i] * t[2] - (R[3 * i] * cB[0] + R[3 * i + 1] * cB[1] + R[3 * i + 2] * cB[2]);
    out.push(R[3 * i], R[3 * i + 1], R[3 * i + 2], ti);
  }
  out.push(0, 0, 0, 1);
  return out;
}
