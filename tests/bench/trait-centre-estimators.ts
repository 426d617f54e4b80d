/**
 * Shaft-centre estimators studied by trait-centre-study.ts: each takes the analysed fragment and
 * its fitted axis and returns an axis with the fitted direction through another centre.
 */
import type { ShaftAxisLike } from '../../core/geometry/proposals/face-traits';
import type { FragmentInput } from '../../core/geometry/proposals/prepared-fragment';
import { acrossAxisBasis } from '../../core/geometry/shaft-axis';
import { weightedMedian as weightedMedianOfPairs } from '../../core/geometry/weighted-median';

/** Weighted median of xs with weights ws (core/geometry/weighted-median.ts). */
export const weightedMedian = (xs: number[], ws: number[]): number => weightedMedianOfPairs(xs.map((x, i) => [x, ws[i]] as [number, number]));

export interface SectionSurface {
  /** Per original-surface triangle across the axis: u, v (about the fitted point), unit normal's u, v (across part normalised), weight (area x across part). */
  q: Float64Array;
  n: number;
  u: [number, number, number];
  v: [number, number, number];
}

/** Original surface (triangles on no break face) facing across the fitted axis (|normal . d| < 0.5), in the plane across it. */
export function sectionSurface(input: FragmentInput, axis: ShaftAxisLike): SectionSurface {
  const d = axis.direction;
  const [u, v] = acrossAxisBasis(d);
  const T = input.triangles, P = input.positions;
  const nt = T.length / 3;
  const onFace = new Uint8Array(nt);
  for (const f of input.faces) if (f.triangleIds) for (const t of f.triangleIds) onFace[t] = 1;
  const rows: number[] = [];
  for (let t = 0; t < nt; t++) {
    if (onFace[t]) continue;
    const a = 3 * T[3 * t], b = 3 * T[3 * t + 1], c = 3 * T[3 * t + 2];
    const e1 = [P[b] - P[a], P[b + 1] - P[a + 1], P[b + 2] - P[a + 2]];
    const e2 = [P[c] - P[a], P[c + 1] - P[a + 1], P[c + 2] - P[a + 2]];
    const nx = e1[1] * e2[2] - e1[2] * e2[1], ny = e1[2] * e2[0] - e1[0] * e2[2], nz = e1[0] * e2[1] - e1[1] * e2[0];
    const nl = Math.hypot(nx, ny, nz);
    if (!(nl > 0)) continue;
    const area = nl / 2;
    const nd = (nx * d[0] + ny * d[1] + nz * d[2]) / nl;
    if (Math.abs(nd) > 0.5) continue;
    const cx = (P[a] + P[b] + P[c]) / 3 - axis.point[0], cy = (P[a + 1] + P[b + 1] + P[c + 1]) / 3 - axis.point[1], cz = (P[a + 2] + P[b + 2] + P[c + 2]) / 3 - axis.point[2];
    const mu = (nx * u[0] + ny * u[1] + nz * u[2]) / nl, mv = (nx * v[0] + ny * v[1] + nz * v[2]) / nl;
    const ml = Math.hypot(mu, mv);
    rows.push(cx * u[0] + cy * u[1] + cz * u[2], cx * v[0] + cy * v[1] + cz * v[2], mu / ml, mv / ml, area * ml);
  }
  return { q: Float64Array.from(rows), n: rows.length / 5, u, v };
}

export function axisThrough(axis: ShaftAxisLike, s: SectionSurface, cu: number, cv: number): ShaftAxisLike {
  const p = axis.point;
  return { direction: axis.direction, support: axis.support, point: [p[0] + cu * s.u[0] + cv * s.v[0], p[1] + cu * s.u[1] + cv * s.v[1], p[2] + cu * s.u[2] + cv * s.v[2]] };
}

/** Side of each row about a centre: +1 outer (faces away, radial > cut), -1 medullary (faces it), 0 neither. */
export function sides(s: SectionSurface, cu: number, cv: number, cut = 0.7): Int8Array {
  const out = new Int8Array(s.n);
  for (let i = 0; i < s.n; i++) {
    const du = s.q[5 * i] - cu, dv = s.q[5 * i + 1] - cv;
    const l = Math.hypot(du, dv) || 1;
    const r = (du * s.q[5 * i + 2] + dv * s.q[5 * i + 3]) / l;
    out[i] = r > cut ? 1 : r < -cut ? -1 : 0;
  }
  return out;
}

/**
 * Geometric fit of concentric circles to the rows of the chosen sides (Gauss-Newton on
 * |q - c| - R_side, weights w, biweight on residuals beyond `tol` mm), from (cu, cv).
 * An optional prior on the outer radius pulls R towards r0 with weight lambda (per unit total weight).
 */
export function concentricFit(s: SectionSurface, side: Int8Array, use: (sd: number) => boolean, cu0: number, cv0: number, opts: { iters?: number; tol?: number; r0?: number; lambda?: number; fixed?: boolean } = {}): { cu: number; cv: number; R: number; r: number; wOut: number; wIn: number } | undefined {
  let cu = cu0, cv = cv0;
  const tol = opts.tol ?? 3;
  // initial radii: weighted means
  let R = 0, r = 0, wo = 0, wi = 0;
  for (let i = 0; i < s.n; i++) {
    if (!use(side[i])) continue;
    const d = Math.hypot(s.q[5 * i] - cu, s.q[5 * i + 1] - cv), w = s.q[5 * i + 4];
    if (side[i] > 0) { R += w * d; wo += w; } else { r += w * d; wi += w; }
  }
  if (wo + wi <= 0) return undefined;
  R = wo > 0 ? R / wo : 0;
  r = wi > 0 ? r / wi : 0;
  const W = wo + wi;
  for (let it = 0; it < (opts.iters ?? 30); it++) {
    // unknowns: cu, cv, R, r  (normal equations 4x4)
    const A = new Float64Array(16), b = new Float64Array(4);
    for (let i = 0; i < s.n; i++) {
      const sd = side[i];
      if (!use(sd)) continue;
      const du = s.q[5 * i] - cu, dv = s.q[5 * i + 1] - cv;
      const d = Math.hypot(du, dv) || 1e-9;
      const res = d - (sd > 0 ? R : r);
      let w = s.q[5 * i + 4];
      const x = res / tol;
      w *= Math.abs(x) < 1 ? (1 - x * x) ** 2 : 0;
      if (w <= 0) continue;
      const J = [-du / d, -dv / d, sd > 0 ? -1 : 0, sd > 0 ? 0 : -1];
      for (let a = 0; a < 4; a++) {
        b[a] -= w * J[a] * res;
        for (let c = 0; c < 4; c++) A[4 * a + c] += w * J[a] * J[c];
      }
    }
    if (opts.r0 !== undefined && opts.lambda) {
      const w = opts.lambda * W;
      A[10] += w;
      b[2] -= w * (R - opts.r0);
    }
    if (wo <= 0) A[10] += 1;
    if (wi <= 0) A[15] += 1;
    if (opts.fixed) { A[0] += 1e9; A[5] += 1e9; }
    const x = solve4(A, b);
    if (!x) return undefined;
    cu += x[0]; cv += x[1]; R += x[2]; r += x[3];
    if (Math.hypot(x[0], x[1]) < 1e-4) break;
  }
  return { cu, cv, R, r, wOut: wo, wIn: wi };
}

function solve4(A: Float64Array, b: Float64Array): number[] | undefined {
  const M = [0, 1, 2, 3].map((i) => [A[4 * i], A[4 * i + 1], A[4 * i + 2], A[4 * i + 3], b[i]]);
  for (let c = 0; c < 4; c++) {
    let p = c;
    for (let i = c + 1; i < 4; i++) if (Math.abs(M[i][c]) > Math.abs(M[p][c])) p = i;
    if (!(Math.abs(M[p][c]) > 1e-12)) return undefined;
    [M[c], M[p]] = [M[p], M[c]];
    for (let i = 0; i < 4; i++) {
      if (i === c) continue;
      const f = M[i][c] / M[c][c];
      for (let k = c; k < 5; k++) M[i][k] -= f * M[c][k];
    }
  }
  return M.map((row, i) => row[4] / row[i]);
}

/** Least-squares meeting point of the normal lines of the chosen rows. */
export function normalLinesPoint(s: SectionSurface, side: Int8Array, use: (sd: number) => boolean): [number, number] | undefined {
  let s11 = 0, s12 = 0, s22 = 0, b1 = 0, b2 = 0;
  for (let i = 0; i < s.n; i++) {
    if (!use(side[i])) continue;
    const pu = -s.q[5 * i + 3], pv = s.q[5 * i + 2], w = s.q[5 * i + 4];
    const r = s.q[5 * i] * pu + s.q[5 * i + 1] * pv;
    s11 += w * pu * pu; s12 += w * pu * pv; s22 += w * pv * pv; b1 += w * pu * r; b2 += w * pv * r;
  }
  const det = s11 * s22 - s12 * s12;
  if (!(det > 1e-9 * (s11 + s22) ** 2)) return undefined;
  return [(b1 * s22 - b2 * s12) / det, (s11 * b2 - s12 * b1) / det];
}

type Estimator = (input: FragmentInput, fitted: ShaftAxisLike) => ShaftAxisLike;
const withSection = (f: (s: SectionSurface, side: Int8Array) => [number, number] | undefined): Estimator => (input, fitted) => {
  const s = sectionSurface(input, fitted);
  const side = sides(s, 0, 0);
  const c = f(s, side);
  return c ? axisThrough(fitted, s, c[0], c[1]) : fitted;
};

export const TRAIT_CENTRE_ESTIMATORS: Record<string, Estimator> = {
  fitted: (_i, a) => a,
  normals: withSection((s, side) => normalLinesPoint(s, side, (x) => x !== 0)),
  outer: withSection((s, side) => {
    const f = concentricFit(s, side, (x) => x > 0, 0, 0);
    return f && [f.cu, f.cv];
  }),
  inner: withSection((s, side) => {
    const f = concentricFit(s, side, (x) => x < 0, 0, 0);
    return f && [f.cu, f.cv];
  }),
  concentric: withSection((s, side) => {
    const f = concentricFit(s, side, (x) => x !== 0, 0, 0);
    return f && [f.cu, f.cv];
  }),
};

/**
 * Move the centre along the line from it to the piece (w: towards the outer surface's centroid)
 * until the cavity radius over the outer radius (weighted medians) is k0. Undefined without
 * both surfaces.
 */
export function wallRatioCentre(s: SectionSurface, side: Int8Array, k0: number): { cu: number; cv: number; R: number; r: number; w: [number, number] } | undefined {
  let wu = 0, wv = 0, wo = 0, wi = 0;
  for (let i = 0; i < s.n; i++) {
    const w = s.q[5 * i + 4];
    if (side[i] > 0) { wu += w * s.q[5 * i]; wv += w * s.q[5 * i + 1]; wo += w; } else if (side[i] < 0) wi += w;
  }
  if (!(wo > 0 && wi > 0)) return undefined;
  const wl = Math.hypot(wu, wv);
  if (!(wl > 0)) return undefined;
  wu /= wl; wv /= wl;
  const radii = (t: number): [number, number] => {
    const ro: number[] = [], wro: number[] = [], ri: number[] = [], wri: number[] = [];
    for (let i = 0; i < s.n; i++) {
      if (!side[i]) continue;
      const d = Math.hypot(s.q[5 * i] - t * wu, s.q[5 * i + 1] - t * wv);
      if (side[i] > 0) { ro.push(d); wro.push(s.q[5 * i + 4]); } else { ri.push(d); wri.push(s.q[5 * i + 4]); }
    }
    return [weightedMedian(ro, wro), weightedMedian(ri, wri)];
  };
  const [R0, r0] = radii(0);
  if (!(R0 > r0)) return undefined;
  // ratio r/R falls as the centre moves towards the piece (t up): bisect on t
  let lo = -4 * R0, hi = r0 * 0.98;
  const ratio = (t: number): number => { const [R, r] = radii(t); return r / R; };
  if (ratio(lo) < k0 || ratio(hi) > k0) {
    const t = ratio(lo) < k0 ? lo : hi;
    const [R, r] = radii(t);
    return { cu: t * wu, cv: t * wv, R, r, w: [wu, wv] };
  }
  for (let it = 0; it < 40; it++) {
    const mid = (lo + hi) / 2;
    if (ratio(mid) > k0) lo = mid; else hi = mid;
  }
  const t = (lo + hi) / 2;
  const [R, r] = radii(t);
  return { cu: t * wu, cv: t * wv, R, r, w: [wu, wv] };
}

for (const k of [0.45, 0.5, 0.55, 0.6, 0.65, 0.7]) {
  TRAIT_CENTRE_ESTIMATORS[`kprior${k}`] = withSection((s, side) => {
    const f = wallRatioCentre(s, side, k);
    return f && [f.cu, f.cv];
  });
}

/** The fitted centre, moved along the line to the piece only when its cavity-to-outer radius ratio lies outside [kMin, kMax] (to the nearer bound). */
export function wallRatioClamp(s: SectionSurface, side: Int8Array, kMin: number, kMax: number): [number, number] | undefined {
  const at = wallRatioCentre(s, side, kMax);
  if (!at) return undefined;
  const k = ((): number => {
    const ro: number[] = [], wro: number[] = [], ri: number[] = [], wri: number[] = [];
    for (let i = 0; i < s.n; i++) {
      if (!side[i]) continue;
      const d = Math.hypot(s.q[5 * i], s.q[5 * i + 1]);
      if (side[i] > 0) { ro.push(d); wro.push(s.q[5 * i + 4]); } else { ri.push(d); wri.push(s.q[5 * i + 4]); }
    }
    return weightedMedian(ri, wri) / weightedMedian(ro, wro);
  })();
  if (k > kMax) return [at.cu, at.cv];
  if (k < kMin) {
    const lo = wallRatioCentre(s, side, kMin);
    return lo && [lo.cu, lo.cv];
  }
  return [0, 0];
}
for (const [a, b] of [[0.3, 0.75], [0.3, 0.8], [0.3, 0.85], [0.4, 0.8]]) {
  TRAIT_CENTRE_ESTIMATORS[`kclamp${a}-${b}`] = withSection((s, side) => wallRatioClamp(s, side, a, b));
}

/** Area-weighted mean |cosine| between the original surface's normal (across the axis) and the direction out from the centre: how squarely the surface faces it (1 on a round tube about its axis). */
export function facingSquareness(s: SectionSurface, cu: number, cv: number): number {
  let a = 0, w = 0;
  for (let i = 0; i < s.n; i++) {
    const du = s.q[5 * i] - cu, dv = s.q[5 * i + 1] - cv;
    const l = Math.hypot(du, dv) || 1;
    a += s.q[5 * i + 4] * Math.abs((du * s.q[5 * i + 2] + dv * s.q[5 * i + 3]) / l);
    w += s.q[5 * i + 4];
  }
  return w > 0 ? a / w : 0;
}
for (const [a, b] of [[0.45, 0.75], [0.5, 0.7]]) {
  TRAIT_CENTRE_ESTIMATORS[`kclamp${a}-${b}`] = withSection((s, side) => wallRatioClamp(s, side, a, b));
}

/** normalLinesPoint, then re-weighted: each row by a biweight of the centre's distance from its normal line over `scale` times the median distance of the outer rows from the centre. */
export function robustNormalLinesPoint(s: SectionSurface, side: Int8Array, scale: number, iters = 5): [number, number] | undefined {
  let c = normalLinesPoint(s, side, (x) => x !== 0);
  if (!c) return undefined;
  for (let it = 0; it < iters; it++) {
    const ro: number[] = [], wro: number[] = [];
    for (let i = 0; i < s.n; i++) if (side[i] > 0) { ro.push(Math.hypot(s.q[5 * i] - c[0], s.q[5 * i + 1] - c[1])); wro.push(s.q[5 * i + 4]); }
    if (!ro.length) return c;
    const tol = scale * weightedMedian(ro, wro);
    let s11 = 0, s12 = 0, s22 = 0, b1 = 0, b2 = 0;
    for (let i = 0; i < s.n; i++) {
      if (!side[i]) continue;
      const pu = -s.q[5 * i + 3], pv = s.q[5 * i + 2];
      const r = s.q[5 * i] * pu + s.q[5 * i + 1] * pv;
      const x = (c[0] * pu + c[1] * pv - r) / tol;
      if (Math.abs(x) >= 1) continue;
      const w = s.q[5 * i + 4] * (1 - x * x) ** 2;
      s11 += w * pu * pu; s12 += w * pu * pv; s22 += w * pv * pv; b1 += w * pu * r; b2 += w * pv * r;
    }
    const det = s11 * s22 - s12 * s12;
    if (!(det > 1e-9 * (s11 + s22) ** 2)) return c;
    c = [(b1 * s22 - b2 * s12) / det, (s11 * b2 - s12 * b1) / det];
  }
  return c;
}
for (const k of [0.15, 0.3]) TRAIT_CENTRE_ESTIMATORS[`normals-robust${k}`] = withSection((s, side) => robustNormalLinesPoint(s, side, k));
TRAIT_CENTRE_ESTIMATORS['normals-out'] = withSection((s, side) => normalLinesPoint(s, side, (x) => x > 0));

/** normalLinesPoint only where the rows' normal lines spread across (smaller eigenvalue of their scatter over its trace, as cavity-centre.ts) by at least spreadMin; else the fitted centre. */
export function spreadNormalLinesPoint(s: SectionSurface, side: Int8Array, spreadMin: number): [number, number] | undefined {
  let s11 = 0, s12 = 0, s22 = 0;
  for (let i = 0; i < s.n; i++) {
    if (!side[i]) continue;
    const pu = -s.q[5 * i + 3], pv = s.q[5 * i + 2], w = s.q[5 * i + 4];
    s11 += w * pu * pu; s12 += w * pu * pv; s22 += w * pv * pv;
  }
  const tr = s11 + s22;
  if (!(tr > 0)) return undefined;
  const spread = (tr / 2 - Math.sqrt(Math.max(0, (tr * tr) / 4 - (s11 * s22 - s12 * s12)))) / tr;
  return spread >= spreadMin ? normalLinesPoint(s, side, (x) => x !== 0) : undefined;
}
for (const m of [0.1, 0.2]) TRAIT_CENTRE_ESTIMATORS[`normals-spread${m}`] = withSection((s, side) => spreadNormalLinesPoint(s, side, m));
