/**
 * Coarse alignment of two shaft pieces about their shared shaft axis (design.md section 7,
 * notes for long bones). The outer surfaces of two joined shaft pieces continue one another,
 * so once each piece's fitted axis is laid along one line the only freedom left is the turn
 * about that line, the shift along it, and which way the second piece points (flip). Both
 * break faces are written in cylinder coordinates (radius, angle, height) with their normals
 * in the local radial / tangential / axial frame, which a turn about the axis and a shift
 * along it leave unchanged. Every pair of samples at about the same radius whose normals are
 * opposed votes for one (turn, shift); the peaks of the vote are the hypotheses (a generalised
 * Hough transform, Ballard 1981). Nothing is assumed about the finished bone: only each
 * piece's own axis, fitted from its own surface.
 */
import type { RigidTransform } from './rigid-transform';
import { acrossAxisBasis } from '../shaft-axis';
import { axisMeetingOuterSurface } from './axis-meeting-outer-surface';

export interface ShaftFrame {
  direction: [number, number, number];
  point: [number, number, number];
  radius: number;
}

export interface AxisHypothesis {
  transform: RigidTransform;
  votes: number;
  flip: boolean;
  turn: number;
  shift: number;
}

export interface AxisSearchOptions {
  spacing: number;
  /** Most samples per face used in the vote. */
  maxSamples?: number;
  /** Peaks kept per flip. */
  peaks?: number;
  /** Opposed normals: cosine between one normal and the other reversed, at least. */
  minNormalCos?: number;
  /**
   * FPFH of each face's samples (B's described with flipped normals, see mirrorFpfh), FPFH_DIM
   * numbers per sample: when given, a pair's vote is weighted by how alike the two histograms
   * are, so pairs of the same local shape count more than pairs that merely face each other.
   */
  featuresA?: Float32Array;
  featuresB?: Float32Array;
  featureDim?: number;
  /**
   * When given, A's axis is first moved so that B's outer surface meets A's at A's face
   * (axis-meeting-outer-surface.ts; each face's outer radius read as this quantile of its
   * samples' distances from its own axis), when the two outer radii differ by more than the
   * vote's radial tolerance: pieces whose fitted radii differ still pair samples at the join.
   * Left out: the two axes laid on one line.
   */
  outerQuantile?: number;
}

interface Cyl {
  index: Uint32Array;
  r: Float64Array;
  th: Float64Array;
  z: Float64Array;
  nr: Float64Array;
  nt: Float64Array;
  nz: Float64Array;
  n: number;
}

function cylinder(points: ArrayLike<number>, normals: ArrayLike<number>, frame: ShaftFrame, max: number): Cyl {
  const total = points.length / 3;
  const step = Math.max(1, total / max);
  const n = Math.min(total, Math.ceil(total / step));
  const out: Cyl = { index: new Uint32Array(n), r: new Float64Array(n), th: new Float64Array(n), z: new Float64Array(n), nr: new Float64Array(n), nt: new Float64Array(n), nz: new Float64Array(n), n };
  const [x, y] = acrossAxisBasis(frame.direction);
  const z = frame.direction, o = frame.point;
  for (let k = 0; k < n; k++) {
    const i = Math.min(total - 1, Math.floor(k * step));
    out.index[k] = i;
    const px = points[3 * i] - o[0], py = points[3 * i + 1] - o[1], pz = points[3 * i + 2] - o[2];
    const u = px * x[0] + py * x[1] + pz * x[2], v = px * y[0] + py * y[1] + pz * y[2], w = px * z[0] + py * z[1] + pz * z[2];
    const r = Math.hypot(u, v) || 1e-9;
    const cu = u / r, cv = v / r;
    const nx = normals[3 * i], ny = normals[3 * i + 1], nzz = normals[3 * i + 2];
    const nu = nx * x[0] + ny * x[1] + nzz * x[2], nv = nx * y[0] + ny * y[1] + nzz * y[2], nw = nx * z[0] + ny * z[1] + nzz * z[2];
    out.r[k] = r;
    out.th[k] = Math.atan2(v, u);
    out.z[k] = w;
    out.nr[k] = nu * cu + nv * cv;
    out.nt[k] = -nu * cv + nv * cu;
    out.nz[k] = nw;
  }
  return out;
}

/** Two samples vote together when their radii differ by at most this (mm): 2 spacings, or 12% of A's face's mean radius. */
function radialTolerance(spacing: number, meanRadius: number): number {
  return Math.max(2 * spacing, 0.12 * meanRadius);
}

/**
 * Motions carrying B's face onto A's face with the two shaft axes laid on one line, best
 * voted first. `faceB` and `faceA` are packed xyz samples with outward normals.
 */
export function searchAboutSharedAxis(
  axisA: ShaftFrame,
  faceAPoints: ArrayLike<number>,
  faceANormals: ArrayLike<number>,
  axisB: ShaftFrame,
  faceBPoints: ArrayLike<number>,
  faceBNormals: ArrayLike<number>,
  options: AxisSearchOptions,
): AxisHypothesis[] {
  const max = options.maxSamples ?? 220;
  let A = cylinder(faceAPoints, faceANormals, axisA, max);
  const B = cylinder(faceBPoints, faceBNormals, axisB, max);
  if (A.n < 3 || B.n < 3) return [];
  const s = options.spacing;
  const meanRadius = (c: Cyl): number => { let m = 0; for (let j = 0; j < c.n; j++) m += c.r[j] / c.n; return m; };
  let rMean = meanRadius(A);
  if (options.outerQuantile !== undefined) {
    // moved only when the two outer radii differ by more than the vote pairs across (radialTolerance)
    const moved = axisMeetingOuterSurface(axisA, faceAPoints, axisB, faceBPoints, options.outerQuantile);
    if (Math.abs(moved.move) > radialTolerance(s, rMean)) {
      axisA = moved.frame;
      A = cylinder(faceAPoints, faceANormals, axisA, max);
      rMean = meanRadius(A);
    }
  }
  const dTh = Math.min(0.2, s / Math.max(rMean, s));
  const nTh = Math.ceil((2 * Math.PI) / dTh);
  let zaMin = Infinity, zaMax = -Infinity, zbMin = Infinity, zbMax = -Infinity;
  for (let j = 0; j < A.n; j++) { zaMin = Math.min(zaMin, A.z[j]); zaMax = Math.max(zaMax, A.z[j]); }
  for (let i = 0; i < B.n; i++) { zbMin = Math.min(zbMin, B.z[i]); zbMax = Math.max(zbMax, B.z[i]); }
  const rTol = radialTolerance(s, rMean);
  const minCos = options.minNormalCos ?? 0.6;
  // feature likeness per (B sample, A sample): 1 / (1 + (d / d0)^2), d0 the median distance
  let like: Float32Array | null = null;
  const FD = options.featureDim ?? 0;
  if (options.featuresA && options.featuresB && FD > 0) {
    like = new Float32Array(B.n * A.n);
    const fa = options.featuresA, fb = options.featuresB;
    for (let i = 0; i < B.n; i++) {
      const bi = B.index[i] * FD;
      for (let j = 0; j < A.n; j++) {
        const aj = A.index[j] * FD;
        let d = 0;
        for (let k = 0; k < FD; k++) { const t = fb[bi + k] - fa[aj + k]; d += t * t; }
        like[i * A.n + j] = d;
      }
    }
    const probe: number[] = [];
    for (let k = 0; k < like.length; k += Math.max(1, Math.floor(like.length / 2000))) probe.push(like[k]);
    probe.sort((x, y) => x - y);
    const d0 = Math.max(1e-9, probe[Math.floor(probe.length / 2)]);
    for (let k = 0; k < like.length; k++) like[k] = 1 / (1 + (like[k] / d0) ** 2);
  }
  const out: AxisHypothesis[] = [];
  for (const flip of [false, true]) {
    const zLo = flip ? zaMin + zbMin : zaMin - zbMax;
    const zHi = flip ? zaMax + zbMax : zaMax - zbMin;
    const nZ = Math.max(1, Math.ceil((zHi - zLo) / s) + 1);
    const acc = new Float32Array(nTh * nZ);
    for (let i = 0; i < B.n; i++) {
      const th = flip ? -B.th[i] : B.th[i];
      const z = flip ? -B.z[i] : B.z[i];
      // B's normal after the flip, reversed: what A's normal should be
      const wr = -B.nr[i], wt = flip ? B.nt[i] : -B.nt[i], wz = flip ? B.nz[i] : -B.nz[i];
      for (let j = 0; j < A.n; j++) {
        const dr = A.r[j] - B.r[i];
        if (dr > rTol || dr < -rTol) continue;
        const c = A.nr[j] * wr + A.nt[j] * wt + A.nz[j] * wz;
        if (c < minCos) continue;
        let dth = A.th[j] - th;
        dth -= 2 * Math.PI * Math.floor(dth / (2 * Math.PI));
        const bt = Math.floor(dth / dTh) % nTh;
        const bz = Math.round((A.z[j] - z - zLo) / s);
        if (bz < 0 || bz >= nZ) continue;
        acc[bt * nZ + bz] += like ? c * like[i * A.n + j] : c;
      }
    }
    // smooth over 3x3 (turn wraps round)
    const sm = new Float32Array(nTh * nZ);
    for (let t = 0; t < nTh; t++) {
      for (let z = 0; z < nZ; z++) {
        let v = 0;
        for (let dt = -1; dt <= 1; dt++) {
          const tt = (t + dt + nTh) % nTh;
          for (let dz = -1; dz <= 1; dz++) {
            const zz = z + dz;
            if (zz < 0 || zz >= nZ) continue;
            v += acc[tt * nZ + zz] * (dt === 0 && dz === 0 ? 1 : 0.5);
          }
        }
        sm[t * nZ + z] = v;
      }
    }
    // peaks: greedy with suppression of a neighbourhood of 3 bins
    const peaks = options.peaks ?? 3;
    for (let p = 0; p < peaks; p++) {
      let bi = -1, bv = 0;
      for (let k = 0; k < sm.length; k++) if (sm[k] > bv) { bv = sm[k]; bi = k; }
      if (bi < 0) break;
      const bt = Math.floor(bi / nZ), bz = bi % nZ;
      for (let dt = -3; dt <= 3; dt++) for (let dz = -3; dz <= 3; dz++) {
        const zz = bz + dz;
        if (zz < 0 || zz >= nZ) continue;
        sm[((bt + dt + nTh) % nTh) * nZ + zz] = 0;
      }
      const turn = (bt + 0.5) * dTh, shift = zLo + bz * s;
      out.push({ transform: axisMotion(axisA, axisB, flip, turn, shift), votes: bv, flip, turn, shift });
    }
  }
  return out.sort((a, b) => b.votes - a.votes);
}

/**
 * R = F_A Rz(turn) Fl F_B^T, row-major 3x3: from B's frame to A's frame (each given as its three
 * unit axes, the columns of its rotation), turned by `turn` about the shared z axis; `flip` -1
 * adds a half turn about x (the second piece pointing the other way), +1 none.
 */
export function turnBetweenFrames(FA: ReadonlyArray<ArrayLike<number>>, FB: ReadonlyArray<ArrayLike<number>>, flip: 1 | -1, turn: number): number[] {
  const c = Math.cos(turn), sn = Math.sin(turn), f = flip;
  const M = [
    [c, -sn * f, 0],
    [sn, c * f, 0],
    [0, 0, f],
  ];
  const R = new Array<number>(9).fill(0);
  for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) {
    let v = 0;
    for (let a = 0; a < 3; a++) for (let b = 0; b < 3; b++) v += FA[a][i] * M[a][b] * FB[b][j];
    R[3 * i + j] = v;
  }
  return R;
}

/** p_A = R_A (Rz(turn) F R_B^T (p - o_B) + (0, 0, shift)) + o_A, with F a half turn about x when flipped. */
export function axisMotion(axisA: ShaftFrame, axisB: ShaftFrame, flip: boolean, turn: number, shift: number): RigidTransform {
  const [xa, ya] = acrossAxisBasis(axisA.direction), za = axisA.direction;
  const [xb, yb] = acrossAxisBasis(axisB.direction), zb = axisB.direction;
  const RA = [xa, ya, za]; // columns of R_A
  const R = turnBetweenFrames(RA, [xb, yb, zb], flip ? -1 : 1, turn);
  const ob = axisB.point, oa = axisA.point;
  const t = [0, 0, 0];
  for (let i = 0; i < 3; i++) {
    t[i] = oa[i] + RA[2][i] * shift - (R[3 * i] * ob[0] + R[3 * i + 1] * ob[1] + R[3 * i + 2] * ob[2]);
  }
  return [R[0], R[1], R[2], t[0], R[3], R[4], R[5], t[1], R[6], R[7], R[8], t[2], 0, 0, 0, 1];
}
