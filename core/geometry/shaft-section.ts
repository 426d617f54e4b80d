import { EigenvalueDecomposition, Matrix, inverse } from 'ml-matrix';
import { acrossAxisBasis, offsetFromAxis, type ShaftAxis, type ShaftWallCheck } from './shaft-axis';
import { weightedMedian, weightedMedianOf } from './weighted-median';
import { hypot } from './hypot';
import { sectionWallRatio } from './section-wall-ratio';
import { strictWallCheck } from './strict-wall-check';
import type { AnalysisSettings } from './settings';

/**
 * A flattened shaft section: the outer surface and the medullary cavity as two ellipses in the
 * plane across the shaft axis, sharing centre (the axis point) and orientation, with semi-axes
 * (A, B) outside and (Ai, Bi) inside. The wall between them is read as the family of ellipses
 * E(t) with semi-axes a(t) = Ai + t (A - Ai), b(t) = Bi + t (B - Bi): E(0) is the cavity, E(1)
 * the outer surface, and every point across the axis lies on exactly one E(t) (a(t), b(t) grow
 * with t). The direction in which a point "faces out from the axis" is the outward normal of
 * the E(t) through it, (x / a², y / b²) in the section's frame: it is the surface normal on the
 * outer and on the cavity surface, and runs along the wall (so across a break through the
 * wall) in between. For a round section (A = B, Ai = Bi) it is the radial direction.
 */
export interface EllipseSection {
  /** Unit direction of the major semi-axes, across the axis. */
  major: [number, number, number];
  /** Outer surface semi-axes (major, minor), mm. */
  outer: [number, number];
  /** Medullary cavity semi-axes (major, minor), mm; each smaller than the outer one. */
  inner: [number, number];
}

/**
 * t of the family ellipse E(t) through the in-plane point (x, y) (x along the major axis): the
 * root of x²/a(t)² + y²/b(t)² = 1, found by bisection between the t where a or b reaches zero
 * and a t far outside (the left side falls with t).
 */
export function sectionLevel(s: EllipseSection, x: number, y: number): number {
  const [A, B] = s.outer, [Ai, Bi] = s.inner;
  const da = A - Ai, db = B - Bi;
  let lo = Math.max(-Ai / da, -Bi / db) + 1e-9;
  const r = hypot(x, y);
  let hi = 1 + r / Math.min(da, db) + 1;
  const f = (t: number): number => {
    const a = Ai + t * da, b = Bi + t * db;
    return (x / a) ** 2 + (y / b) ** 2 - 1;
  };
  if (f(lo) <= 0) return lo;
  for (let i = 0; i < 48 && hi - lo > 1e-7; i++) {
    const mid = 0.5 * (lo + hi);
    if (f(mid) > 0) lo = mid; else hi = mid;
  }
  return 0.5 * (lo + hi);
}

/**
 * Offset from the axis under an elliptic section: a vector across the axis along the outward
 * normal of the family ellipse through the point, of length the mean radius of that ellipse
 * ((a + b) / 2: the outer surface lies at about the fitted radius, as under a round section).
 * (qx, qy, qz): the point's offset from the axis line, across it; `minor` = axis x major.
 */
export function ellipseOffset(
  s: EllipseSection, minor: [number, number, number], qx: number, qy: number, qz: number, out: [number, number, number],
): [number, number, number] {
  const x = qx * s.major[0] + qy * s.major[1] + qz * s.major[2];
  const y = qx * minor[0] + qy * minor[1] + qz * minor[2];
  const t = sectionLevel(s, x, y);
  const a = s.inner[0] + t * (s.outer[0] - s.inner[0]), b = s.inner[1] + t * (s.outer[1] - s.inner[1]);
  const gx = x / (a * a), gy = y / (b * b);
  const gl = hypot(gx, gy);
  if (!(gl > 0)) { out[0] = qx; out[1] = qy; out[2] = qz; return out; }
  const k = (0.5 * (a + b)) / gl;
  out[0] = k * (gx * s.major[0] + gy * minor[0]);
  out[1] = k * (gx * s.major[1] + gy * minor[1]);
  out[2] = k * (gx * s.major[2] + gy * minor[2]);
  return out;
}

/** What fitEllipseSection reads of the inward wall rays (wall-rays.ts). */
export interface EllipseRays { triangles: Uint32Array; exitCosine: Float32Array; exitTriangle: Int32Array }

/** Cut-offs of fitEllipseSection (settings.ts, ellipseSection*). */
export interface EllipseFitOptions {
  /** Least axis support (share of the area along the axis) for a fit. */
  supportMin: number;
  /** Least and largest ratio of the outer semi-axes (major / minor) for an ellipse to be kept. */
  ratioMin: number;
  ratioMax: number;
  /** Least gain in wall-pair score over the axis as fitted before (share of its score). */
  gain: number;
  /** An inward ray that leaves with at least this cosine against the exit surface crossed the wall head-on. */
  headOnCosineMin: number;
  /** Most wall pairs and surface triangles read (even samples). */
  maxRows: number;
  /** Surface within this distance (mm) of an ellipse, with its normal, is explained by it. */
  distanceTolerance: number;
  /** Centres tried on a grid of (2 gridSteps + 1)² points, width / 8 apart, about the wall's middle (0: none). */
  gridSteps: number;
  /** Steps of the grid on which a cavity ratio the closed form reads the wrong way is read again (planeModel, robustRatio; 0: closed form only). */
  cavityRatioSteps: number;
  /** Where the cavity ellipse explains less than this share of the outer one's surface, its ratio is read again robustly (evaluate; 0: never). */
  cavityRetryShare?: number;
  /** Largest ratio of the wall's thickness across the major axis to across the minor one, either way (sectionWallRatio; 0: no limit). */
  wallRatioMax?: number;
  /** Largest ratio of the wall's thickness across the major axis to across the minor one above which the section must also beat the best circle pair by `gain` (0: no limit). */
  minorWallRatioMax?: number;
  /**
   * Refuse a section whose centre lies inside the wall on a clear shaft piece (the wall check
   * given to fitEllipseSection, at its strict share and support; wall-crossing.ts).
   */
  wallCheck?: boolean;
  /** The wall-crossing share above which that check refuses the section's centre (default: the check's strictShareMax). */
  wallShareMax?: number;
}

/** fitEllipseSection's cut-offs as the settings give them (settings.ts, ellipseSection*). */
export function ellipseFitOptions(s: AnalysisSettings): EllipseFitOptions {
  return {
    supportMin: s.ellipseSectionSupportMin, ratioMin: s.ellipseSectionRatioMin, ratioMax: s.ellipseSectionRatioMax, gain: s.ellipseSectionGain,
    headOnCosineMin: s.headOnCosineMin, maxRows: s.ellipseSectionMaxRays, distanceTolerance: s.ellipseSectionToleranceMm, gridSteps: s.ellipseSectionGridSteps,
    cavityRatioSteps: s.ellipseSectionCavityRatioSteps, cavityRetryShare: s.ellipseSectionCavityRetryShare, wallRatioMax: s.ellipseSectionWallRatioMax,
    minorWallRatioMax: s.ellipseSectionMinorWallRatioMax, wallCheck: s.ellipseSectionWallCheck, wallShareMax: s.ellipseSectionWallShareMax,
  };
}

interface Rows {
  n: number;
  /** Shooter and exit triangle of each wall pair (3D, for the final score). */
  f: number[]; g: number[];
  /** In-plane positions and unit normals of both, and the shooter's area. */
  px: Float64Array; py: Float64Array; nx: Float64Array; ny: Float64Array;
  qx: Float64Array; qy: Float64Array; mx: Float64Array; my: Float64Array; w: Float64Array;
}

/** A section model in the plane: centre, major direction angle, and the squared axis ratios (a/b)² outside and inside. */
interface PlaneModel { cu: number; cv: number; phi: number; rhoOut: number; rhoIn: number }

/**
 * Squared axis ratio ρ = (a/b)² of the ellipses about (cu, cv), major axis at angle phi, whose
 * normals (x, ρ y) (section frame) best match the given unit normals in the least-squares
 * sense of the cross product: nx ρ y - ny x = 0, so ρ = Σ w (nx y)(ny x) / Σ w (nx y)².
 */
function ratioFit(sumNum: number, sumDen: number): number {
  const rho = sumDen > 1e-12 ? sumNum / sumDen : 1;
  return Math.min(64, Math.max(1 / 64, rho));
}

/**
 * Axis ratios of the wall pairs under centre (cu, cv) and major axis angle phi: of each pair the
 * member farther from the centre is the outer surface, the nearer the cavity's; the ratio of
 * each is fitted in closed form (ratioFit). Where the two disagree on which way the section is
 * flattened (one ratio above 1, the other below) and `cavityGrid` > 0, the cavity's ratio is
 * read again robustly (robustRatio): on a piece holding the pointed tip of a slit-like cavity
 * the closed form's weights (nx y)² are largest on the few members off both axes (break faces
 * that pass for cavity, the turn at the tip), which can set its sign; at the true centre of a
 * narrow-edge radius piece (dev seed 105 QS-10816) it read 0.46 against the true 11, so no model
 * near the truth was scored at all and the fit settled on a small ellipse about a nearer centre.
 */
function planeModel(r: Rows, cu: number, cv: number, phi: number, cavityGrid = 0): PlaneModel {
  const c = Math.cos(phi), s = Math.sin(phi);
  let no = 0, dOut = 0, ni = 0, dIn = 0;
  if (cavityGrid > 0 && cavity.length < 5 * r.n) cavity = new Float64Array(5 * r.n);
  for (let k = 0; k < r.n; k++) {
    const p = split(r, k, cu, cv, c, s);
    const ox = p[0], oy = p[1], onx = p[2], ony = p[3], ix = p[4], iy = p[5], inx = p[6], iny = p[7];
    no += r.w[k] * (onx * oy) * (ony * ox); dOut += r.w[k] * (onx * oy) ** 2;
    ni += r.w[k] * (inx * iy) * (iny * ix); dIn += r.w[k] * (inx * iy) ** 2;
    if (cavityGrid > 0) {
      cavity[5 * k] = ix; cavity[5 * k + 1] = iy; cavity[5 * k + 2] = inx; cavity[5 * k + 3] = iny; cavity[5 * k + 4] = r.w[k];
    }
  }
  const rhoOut = ratioFit(no, dOut);
  let rhoIn = ratioFit(ni, dIn);
  if (cavityGrid > 0 && (rhoOut - 1) * (rhoIn - 1) < 0) rhoIn = robustRatio(cavity, r.n, -1, cavityGrid);
  return { cu, cv, phi, rhoOut, rhoIn };
}

/** planeModel's cavity members (x, y, nx, ny, w in the section frame), reused between calls. */
let cavity = new Float64Array(0);

/** Largest squared axis ratio robustRatio tries (and its inverse the smallest): a/b up to 5.7, a slit. */
const ROBUST_RATIO_MAX = 32;
/** Most members robustRatio's grid reads (an even sample; as the centre grid of fitEllipseSection reads 300 pairs). */
const ROBUST_RATIO_ROWS = 100;

/**
 * Squared axis ratio ρ read robustly from members (x, y, nx, ny, w rows; normals facing out for
 * `sign` 1, in for -1): of `steps` + 1 values on a geometric grid from 1/32 to 32, the one whose
 * ellipse normals (x, ρ y) the most member area matches within about 20 degrees (biweight of
 * 1 - cos, as explained() counts surface; read on an even sample of at most ROBUST_RATIO_ROWS
 * members), then refined by the closed form (ratioFit) on all the members it matches, weighted
 * by the biweight, while that matches no less.
 */
function robustRatio(m: Float64Array, n: number, sign: number, steps: number): number {
  const match = (rho: number, refit: boolean, stride = 1): [number, number, number] => {
    let sum = 0, num = 0, den = 0;
    for (let k = 0; k < n; k += stride) {
      const x = m[5 * k], y = m[5 * k + 1], nx = m[5 * k + 2], ny = m[5 * k + 3];
      const gy = rho * y, gl = hypot(x, gy);
      if (!(gl > 0)) continue;
      const miss = 1 - (sign * (nx * x + ny * gy)) / gl;
      if (!(miss < EXPLAINED_MISS)) continue;
      const w = m[5 * k + 4] * (1 - (miss / EXPLAINED_MISS) ** 2) ** 2;
      sum += w;
      if (refit) { num += w * (nx * y) * (ny * x); den += w * (nx * y) ** 2; }
    }
    return [sum, num, den];
  };
  let best = 1, bestScore = -1;
  const lo = Math.log(1 / ROBUST_RATIO_MAX), span = 2 * Math.log(ROBUST_RATIO_MAX);
  const stride = Math.max(1, Math.ceil(n / ROBUST_RATIO_ROWS));
  for (let i = 0; i <= steps; i++) {
    const rho = Math.exp(lo + (i * span) / steps);
    const [score] = match(rho, false, stride);
    if (score > bestScore) { bestScore = score; best = rho; }
  }
  bestScore = match(best, false)[0];
  for (let it = 0; it < 2; it++) {
    const [, num, den] = match(best, true);
    const next = ratioFit(num, den);
    const [score] = match(next, false);
    if (!(score >= bestScore)) break;
    best = next; bestScore = score;
  }
  return best;
}

/** split()'s answer, overwritten by every call (split runs for every wall pair of every model tried). */
const splitOut = new Float64Array(8);

/**
 * Pair k in the section frame about (cu, cv) (x along cos/sin): outer x, y, normal; then the
 * cavity member's. Returns a shared buffer: read it before the next call.
 */
function split(r: Rows, k: number, cu: number, cv: number, c: number, s: number): Float64Array {
  const ax = r.px[k] - cu, ay = r.py[k] - cv, bx = r.qx[k] - cu, by = r.qy[k] - cv;
  const o = ax * ax + ay * ay >= bx * bx + by * by ? 0 : 4, i = 4 - o;
  splitOut[o] = ax * c + ay * s; splitOut[o + 1] = -ax * s + ay * c;
  splitOut[o + 2] = r.nx[k] * c + r.ny[k] * s; splitOut[o + 3] = -r.nx[k] * s + r.ny[k] * c;
  splitOut[i] = bx * c + by * s; splitOut[i + 1] = -bx * s + by * c;
  splitOut[i + 2] = r.mx[k] * c + r.my[k] * s; splitOut[i + 3] = -r.mx[k] * s + r.my[k] * c;
  return splitOut;
}

/**
 * An elliptic section fitted to the wall of a flattened shaft (outer surface and medullary
 * cavity, shared centre and orientation; see EllipseSection), read from the wall pairs of the
 * inward rays: a ray that leaves through the other wall face head-on joins a triangle of the
 * outer surface and one of the cavity's (the member farther from a candidate centre taken for
 * the outer one). For a centre and an orientation each surface's axis ratio has a closed form
 * from its normals (the normal of x²/a² + y²/b² = 1 at (x, y) runs along (x/a², y/b²), a
 * linear condition on (a/b)²; ratioFit), and its size is the members' area-weighted median of
 * sqrt(x² + (a/b)² y²). A model is scored by the surface it explains (explained(): lying within
 * `distanceTolerance` of one of the ellipses and facing as its normal does). Candidates: the
 * axis centre as fitted (and its medial segment's middle) with 12 orientations, the centres of
 * direct ellipse fits of the outer and of the cavity members' points (directEllipseFit;
 * Fitzgibbon, Pilu & Fisher 1999 in the form of Halir & Flusser 1998), and a grid of centres
 * about the wall's middle, each with the orientation its normals give (orientationAt; on a
 * splinter from the flat side the normal lines are nearly parallel and meet far off, so no
 * local search from the round centre reaches the true one); the best is refined by coordinate
 * search. The section is kept only when its outer ratio lies within [`ratioMin`, `ratioMax`]
 * (a round shaft keeps the round model exactly) and it explains at least `gain` more surface
 * than the round model of the axis as fitted before (circles, or the medial segment's offsets,
 * at the medians of the surface facing out and in; explainedRound).
 */
export function fitEllipseSection(
  axis: ShaftAxis, centroids: Float32Array, normals: Float32Array, areas: Float64Array, rays: EllipseRays, options: EllipseFitOptions,
  wall?: ShaftWallCheck,
): ShaftAxis {
  if (!(axis.support >= options.supportMin) || rays.triangles.length === 0) return axis;
  const [ax, ay, az] = axis.direction;
  const [[ux, uy, uz], [vx, vy, vz]] = acrossAxisBasis(axis.direction);
  const across = (f: number): boolean => Math.abs(normals[3 * f] * ax + normals[3 * f + 1] * ay + normals[3 * f + 2] * az) <= 0.342;
  const rows: Rows = { n: 0, f: [], g: [], px: new Float64Array(0), py: new Float64Array(0), nx: new Float64Array(0), ny: new Float64Array(0), qx: new Float64Array(0), qy: new Float64Array(0), mx: new Float64Array(0), my: new Float64Array(0), w: new Float64Array(0) };
  const stride = Math.max(1, Math.ceil(rays.triangles.length / options.maxRows));
  for (let k = 0; k < rays.triangles.length; k += stride) {
    const f = rays.triangles[k], g = rays.exitTriangle[k];
    if (g < 0 || !(rays.exitCosine[k] >= options.headOnCosineMin) || !across(f) || !across(g)) continue;
    rows.f.push(f); rows.g.push(g);
  }
  const n = rows.f.length;
  if (n < 20) return axis;
  rows.n = n;
  for (const key of ['px', 'py', 'nx', 'ny', 'qx', 'qy', 'mx', 'my', 'w'] as const) rows[key] = new Float64Array(n);
  let su = 0, sv = 0, sw = 0, uMin = Infinity, uMax = -Infinity, vMin = Infinity, vMax = -Infinity;
  const plane = (f: number): number[] => {
    const x = centroids[3 * f], y = centroids[3 * f + 1], z = centroids[3 * f + 2];
    const nu = normals[3 * f] * ux + normals[3 * f + 1] * uy + normals[3 * f + 2] * uz;
    const nv = normals[3 * f] * vx + normals[3 * f + 1] * vy + normals[3 * f + 2] * vz;
    const l = hypot(nu, nv) || 1;
    return [x * ux + y * uy + z * uz, x * vx + y * vy + z * vz, nu / l, nv / l];
  };
  for (let k = 0; k < n; k++) {
    const [p0, p1, p2, p3] = plane(rows.f[k]);
    const [q0, q1, q2, q3] = plane(rows.g[k]);
    rows.px[k] = p0; rows.py[k] = p1; rows.nx[k] = p2; rows.ny[k] = p3;
    rows.qx[k] = q0; rows.qy[k] = q1; rows.mx[k] = q2; rows.my[k] = q3;
    rows.w[k] = areas[rows.f[k]];
    su += rows.w[k] * (p0 + q0) / 2; sv += rows.w[k] * (p1 + q1) / 2; sw += rows.w[k];
    uMin = Math.min(uMin, p0, q0); uMax = Math.max(uMax, p0, q0); vMin = Math.min(vMin, p1, q1); vMax = Math.max(vMax, p1, q1);
  }
  const width = Math.max(uMax - uMin, vMax - vMin);
  if (!(sw > 0) || !(width > 0)) return axis;
  const toPlane = (p: [number, number, number]): [number, number] => [p[0] * ux + p[1] * uy + p[2] * uz, p[0] * vx + p[1] * vy + p[2] * vz];
  const starts: Array<[number, number]> = [toPlane(axis.point)];
  if (axis.medial) {
    const m = axis.medial;
    const h = m.length / 2;
    starts.push(toPlane([axis.point[0] + h * m.direction[0], axis.point[1] + h * m.direction[1], axis.point[2] + h * m.direction[2]]));
  }
  // Surface rows: an even sample of the triangles whose normals run across the axis.
  const surf: number[] = [];
  const sstride = Math.max(1, Math.ceil(areas.length / options.maxRows));
  for (let f = 0; f < areas.length; f += sstride) {
    if (!across(f)) continue;
    const [x, y, nu, nv] = plane(f);
    surf.push(x, y, nu, nv, areas[f]);
  }
  const tol = options.distanceTolerance;
  let wallMax = 0, circles = false;
  const ellipses = (cu: number, cv: number, phi: number, retry = 0): Ellipses | undefined => evaluate(rows, surf, cu, cv, phi, tol, options.cavityRatioSteps, retry, wallMax, circles);
  // Direct fits of the outer and the cavity members' points (farther and nearer from the first start) give more starts.
  {
    const c0 = starts[0];
    const outer: number[] = [], inner: number[] = [];
    for (let k = 0; k < n; k++) {
      const p = split(rows, k, c0[0], c0[1], 1, 0);
      outer.push(p[0] + c0[0], p[1] + c0[1], rows.w[k]);
      inner.push(p[4] + c0[0], p[5] + c0[1], rows.w[k]);
    }
    const fo = directEllipseFit(outer), fi = directEllipseFit(inner);
    for (const fit of [fo, fi]) if (fit && hypot(fit.cu - c0[0], fit.cv - c0[1]) < 4 * width) starts.push([fit.cu, fit.cv]);
  }
  // Starts, grid and coordinate search; `retry`: evaluate's cavity re-read share (0: closed form only).
  const search = (retry: number): Ellipses | undefined => {
    let best: Ellipses | undefined;
    for (const [cu, cv] of starts) {
      for (let i = 0; i < 12; i++) {
        const e = ellipses(cu, cv, (Math.PI * i) / 12, retry);
        if (e && (!best || e.score > best.score)) best = e;
      }
    }
    // A grid of centres about the wall's middle, each with the orientation its normals give, on a sample of the rows.
    if (options.gridSteps > 0) {
      const few = subsample(rows, 300), fewSurf = subsampleSurf(surf, 600);
      const step = width / 8, mu = su / sw, mv = sv / sw;
      let gridBest: Ellipses | undefined;
      for (let i = -options.gridSteps; i <= options.gridSteps; i++) {
        for (let j = -options.gridSteps; j <= options.gridSteps; j++) {
          const cu = mu + i * step, cv = mv + j * step;
          const phi = circles ? 0 : orientationAt(few, cu, cv);
          if (phi === undefined) continue;
          const e = evaluate(few, fewSurf, cu, cv, phi, tol, options.cavityRatioSteps, retry, wallMax, circles);
          if (e && (!gridBest || e.score > gridBest.score)) gridBest = e;
        }
      }
      if (gridBest) {
        const e = ellipses(gridBest.cu, gridBest.cv, gridBest.phi, retry);
        if (e && (!best || e.score > best.score)) best = e;
      }
    }
    if (!best) return undefined;
    let step = 0.05 * width, turn = Math.PI / 24;
    for (let round = 0; round < 60 && step > 0.005 * width; round++) {
      let moved = false;
      for (const [a, b, t] of [[step, 0, 0], [-step, 0, 0], [0, step, 0], [0, -step, 0], [0, 0, turn], [0, 0, -turn]]) {
        const trial = ellipses(best.cu + a, best.cv + b, best.phi + t, retry);
        if (trial && trial.score > best.score) { best = trial; moved = true; }
      }
      if (!moved) { step /= 2; turn /= 2; }
    }
    return best;
  };
  // The round model's own explained area: circles (or the medial segment's offsets) about the axis at the medians of the surface facing out and in.
  let roundArea: number | undefined;
  const roundScore = (): number => (roundArea ??= explainedRound(axis, centroids, normals, areas, sstride, across, tol));
  const retryShare = options.cavityRetryShare ?? 0;
  // The search, then (where the best model's cavity ellipse explains little beside its outer
  // one, under `cavityRetryShare` of it) the whole search again with the cavity ratio re-read
  // wherever a model's cavity explains that little (evaluate); the better of the two is kept.
  // Re-reading in the first search already moves fits whose cavity explains enough (dev s370
  // QS-10296, a metacarpal: 93.9 -> 87.0, the search then settles elsewhere).
  const searched = (): Ellipses | undefined => {
    let best = search(0);
    if (best && retryShare > 0 && options.cavityRatioSteps > 0 && best.inner < retryShare * best.outer) {
      const again = search(retryShare);
      if (again && again.score > best.score) best = again;
    }
    return best;
  };
  const kept = (e: Ellipses | undefined): e is Ellipses => !!e && e.A / e.B >= options.ratioMin && e.A / e.B <= options.ratioMax && e.score > roundScore() * (1 + options.gain);
  let e = searched();
  // A section that would be kept although its wall is much thinner at the ends of its major
  // axis than at those of its minor one (the cavity ellipse nearly as long as the outer one,
  // thickness ratio over `wallRatioMax`, sectionWallRatio) is searched for again among models
  // whose wall is within that ratio either way; where that search finds none the first stays.
  // Such a cavity is the closed-form ratio's failure on a slit-like cavity (evaluate): break faces
  // through the narrow edge read as cavity wall. Where the wall is thin at the minor axis
  // instead (a round cavity touching the outer ellipse) searching again lost as often as it won
  // on dev (s108 QS-10925 86.3 -> 72.6, QS-10495 95.7 -> 44.8; s21 QS-10346 44.9 -> 84.6).
  const wallLimit = options.wallRatioMax ?? 0;
  if (wallLimit > 0 && kept(e) && e.B - e.Bi > wallLimit * (e.A - e.Ai)) {
    wallMax = wallLimit;
    e = searched() ?? e;
  }
  // A section whose wall is much thicker at the ends of its major axis than at those of its
  // minor one (over `minorWallRatioMax` times) must also explain `gain` more surface than the
  // best pair of concentric circles the same search finds (the round model given the
  // ellipse's freedom of centre; the round model of the axis is tied to the fitted centre).
  // Searching again among even walls there lost as often as it won (above). On dev these are
  // lobed tibia shafts read as the flat side of a large ellipse (s372 QS-10709: 72.5 x 41.2 /
  // 55.4 x 34.4 mm about a 20 x 18 mm shaft, walls 17.1 and 6.8 mm, explaining 715 against the
  // circles' 698), where the round model reads the piece better; dropping every section thin
  // at the minor ends lost a tibia piece whose section explains clearly more than any circle
  // (check seed 476 QS-10664, 99.6 -> 71.9).
  if (!kept(e)) return axis;
  // A section whose centre lies inside the wall is refused on a clear shaft piece (no bone end:
  // its axis runs through the cavity or the air about the piece), as the consensus and the
  // section segment / point search refuse such centres (wall-crossing.ts; the wall check's
  // strict share at its strict support). The round axis fitted before passed that check. On a
  // thick tibia wall (dev s398 QS-10994, support 0.93) the search took a 14.7 x 9.4 / 7.9 x 1.8
  // mm section whose small flat cavity lay along a break through the wall and whose centre
  // read a crossing share of 0.81 (the round centre's 0.00): 83.7 -> 99.4 % with the check.
  // Searching again among centres outside the wall read the same there (a 56.7 x 23.6 mm
  // section); the plain check (share 0.5 from support 0.65) refused true sections of radius,
  // metapodial and humerus pieces towards a bone end (support 0.69-0.77, 0.3-1.5 points each).
  if (options.wallCheck && strictWallCheck(wall, axis.support, axis.direction, centroids, normals, areas, options.wallShareMax ?? wall?.strictShareMax)?.(e.cu, e.cv)) return axis;
  const minorLimit = options.minorWallRatioMax ?? 0;
  if (minorLimit > 0 && !(e.A - e.Ai <= minorLimit * (e.B - e.Bi))) {
    circles = true;
    const circle = search(0);
    circles = false;
    if (circle && !(e.score > circle.score * (1 + options.gain))) return axis;
  }
  const c = Math.cos(e.phi), s = Math.sin(e.phi);
  const t0 = axis.point[0] * ax + axis.point[1] * ay + axis.point[2] * az;
  const point: [number, number, number] = [e.cu * ux + e.cv * vx + t0 * ax, e.cu * uy + e.cv * vy + t0 * ay, e.cu * uz + e.cv * vz + t0 * az];
  const major: [number, number, number] = [c * ux + s * vx, c * uy + s * vy, c * uz + s * vz];
  return { ...axis, point, radius: (e.A + e.B) / 2, medial: undefined, section: { major, outer: [e.A, e.B], inner: [e.Ai, e.Bi] } };
}

/**
 * The model at centre (cu, cv) and angle phi: ratios from the wall pairs' normals (planeModel),
 * sizes their medians, scored by explained() (sized). With `retryShare` > 0, where that model's
 * cavity ellipse explains less than `retryShare` of what its outer ellipse explains and the
 * closed-form ratios agree on the way the section is flattened (else planeModel read the cavity
 * again already), the cavity ratio is read again robustly (robustRatio) and the model that
 * explains more is kept: where the cavity is not an ellipse (a wall of even thickness about a
 * flattened outline is its parallel curve, pointed where the outline's radius of curvature is
 * under the wall's thickness) the closed form is set by the members off both axes.
 */
function evaluate(rows: Rows, surf: number[], cu: number, cv: number, phi: number, tol: number, cavityGrid: number, retryShare: number, wallMax = 0, circles = false): Ellipses | undefined {
  if (circles) return sized(rows, surf, cu, cv, phi, tol, 1, 1);
  const pm = planeModel(rows, cu, cv, phi, cavityGrid);
  const first = sized(rows, surf, cu, cv, phi, tol, pm.rhoOut, pm.rhoIn, wallMax);
  if (!(cavityGrid > 0 && retryShare > 0) || (first && first.inner >= retryShare * first.outer)) return first;
  if (!((pm.rhoOut - 1) * (pm.rhoIn - 1) >= 0)) return first;
  const alt = sized(rows, surf, cu, cv, phi, tol, pm.rhoOut, robustRatio(cavity, rows.n, -1, cavityGrid), wallMax);
  return alt && (!first || alt.score > first.score) ? alt : first;
}

/**
 * The model about (cu, cv), angle phi, with squared axis ratios rhoOut0 and rhoIn0: sizes the
 * members' medians, scored by explained(). Undefined where the wall's thickness across the
 * major axis and across the minor one differ by more than `wallMax` times (sectionWallRatio;
 * 0: no limit).
 */
/** Work space of sized(), grown as needed (one per thread: the analysis is synchronous). */
let sizedSpace = { outA: new Float64Array(0), inA: new Float64Array(0), order: new Uint32Array(0) };
function sizedWork(n: number): typeof sizedSpace {
  if (sizedSpace.outA.length < n) {
    const m = Math.max(n, 2 * sizedSpace.outA.length);
    sizedSpace = { outA: new Float64Array(m), inA: new Float64Array(m), order: new Uint32Array(2 * m) };
  }
  return sizedSpace;
}

function sized(rows: Rows, surf: number[], cu: number, cv: number, phi: number, tol: number, rhoOut0: number, rhoIn0: number, wallMax = 0): Ellipses | undefined {
  const n = rows.n;
  let rhoOut = rhoOut0, rhoIn = rhoIn0;
  let ph = phi;
  if (rhoOut < 1 && rhoIn <= 1) { ph += Math.PI / 2; rhoOut = 1 / rhoOut; rhoIn = 1 / rhoIn; }
  if (!(rhoOut >= 1 && rhoIn >= 1)) return undefined;
  const c = Math.cos(ph), s = Math.sin(ph);
  const work = sizedWork(n);
  const outA = work.outA, inA = work.inA;
  for (let k = 0; k < n; k++) {
    const p = split(rows, k, cu, cv, c, s);
    const ox = p[0], oy = p[1], ix = p[4], iy = p[5];
    outA[k] = Math.sqrt(ox * ox + rhoOut * oy * oy);
    inA[k] = Math.sqrt(ix * ix + rhoIn * iy * iy);
  }
  const A = weightedMedianOf(outA, rows.w, n, work.order), Ai = weightedMedianOf(inA, rows.w, n, work.order);
  const B = A / Math.sqrt(rhoOut), Bi = Ai / Math.sqrt(rhoIn);
  if (!(A > Ai && B > Bi && Bi > 0)) return undefined;
  if (wallMax > 0 && !(sectionWallRatio(A, B, Ai, Bi) <= wallMax)) return undefined;
  const e: Ellipses = { cu, cv, phi: ph, A, B, Ai, Bi, score: 0, outer: 0, inner: 0 };
  explained(surf, e, tol);
  return e;
}

/**
 * Major axis angle of the outer members' ellipse about (cu, cv) from their normals alone: the
 * conic's quadratic part M (symmetric 2x2, up to scale) with n x M (p - c) = 0 for every member,
 * a linear condition on (m11, m12, m22) (smallest eigenvector of its 3x3 scatter); the major
 * axis is M's eigenvector of the smaller eigenvalue. Undefined when M is not definite.
 */
function orientationAt(rows: Rows, cu: number, cv: number): number | undefined {
  const S = [0, 0, 0, 0, 0, 0, 0, 0, 0];
  for (let k = 0; k < rows.n; k++) {
    const p = split(rows, k, cu, cv, 1, 0);
    const ox = p[0], oy = p[1], onx = p[2], ony = p[3];
    const r = [-ony * ox, onx * ox - ony * oy, onx * oy];
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) S[3 * i + j] += rows.w[k] * r[i] * r[j];
  }
  const e = new EigenvalueDecomposition(new Matrix([S.slice(0, 3), S.slice(3, 6), S.slice(6, 9)]), { assumeSymmetric: true });
  const vals = e.realEigenvalues;
  let k = 0;
  for (let i = 1; i < 3; i++) if (vals[i] < vals[k]) k = i;
  const m11 = e.eigenvectorMatrix.get(0, k), m12 = e.eigenvectorMatrix.get(1, k), m22 = e.eigenvectorMatrix.get(2, k);
  if (!(m11 * m22 - m12 * m12 > 0)) return undefined;
  // Eigenvector of the smaller eigenvalue (in absolute terms; M may come out negative definite).
  const sg = m11 + m22 < 0 ? -1 : 1;
  const a = sg * m11, b = sg * m12, c = sg * m22;
  return 0.5 * Math.atan2(-2 * b, c - a);
}

/** Every k-th wall pair, at most about `most`. */
function subsample(rows: Rows, most: number): Rows {
  const k = Math.max(1, Math.ceil(rows.n / most));
  if (k === 1) return rows;
  const pick = <T extends Float64Array>(x: T): Float64Array => Float64Array.from({ length: Math.ceil(rows.n / k) }, (_, i) => x[i * k]);
  return {
    n: Math.ceil(rows.n / k), f: rows.f.filter((_, i) => i % k === 0), g: rows.g.filter((_, i) => i % k === 0),
    px: pick(rows.px), py: pick(rows.py), nx: pick(rows.nx), ny: pick(rows.ny), qx: pick(rows.qx), qy: pick(rows.qy), mx: pick(rows.mx), my: pick(rows.my), w: pick(rows.w),
  };
}

/** Every k-th surface row (five numbers each), at most about `most`. */
function subsampleSurf(surf: number[], most: number): number[] {
  const rowsIn = surf.length / 5, k = Math.max(1, Math.ceil(rowsIn / most));
  if (k === 1) return surf;
  const out: number[] = [];
  for (let i = 0; i < rowsIn; i += k) for (let j = 0; j < 5; j++) out.push(surf[5 * i + j] * (j === 4 ? k : 1));
  return out;
}

interface Ellipses { cu: number; cv: number; phi: number; A: number; B: number; Ai: number; Bi: number; score: number; outer: number; inner: number }

/** Largest 1 - cos between a surface normal and a model's normal for the surface to count as explained (about 20 degrees). */
const EXPLAINED_MISS = 0.06;

/**
 * Explained share of a surface row of this area, d mm from a model curve whose normal it misses
 * by `miss` (1 - cos): area (1 - (d/tol)²)² (1 - (miss/EXPLAINED_MISS)²)² (biweights), zero
 * outside either window.
 */
function explainedArea(area: number, d: number, miss: number, tol: number): number {
  if (Math.abs(d) >= tol || miss >= EXPLAINED_MISS) return 0;
  return area * (1 - (d / tol) ** 2) ** 2 * (1 - (miss / EXPLAINED_MISS) ** 2) ** 2;
}

/**
 * Surface the two ellipses explain: area of the rows (x, y, normal, area; in the plane) lying
 * within `tol` mm of the outer ellipse with the outward normal, or of the cavity's with the
 * inward one, each weighted (1 - (d/tol)²)² (1 - ((1 - cos)/0.06)²)² (biweights: within tol and
 * about 20 degrees). The distance is the first-order one, F / |∇F| for F = x²/a² + y²/b² - 1 (/ 2).
 */
function explained(surf: number[], e: Ellipses, tol: number): number {
  const c = Math.cos(e.phi), s = Math.sin(e.phi);
  const curves: Array<[number, number, number]> = [[e.A, e.B, 1], [e.Ai, e.Bi, -1]];
  const sums = [0, 0];
  let sum = 0;
  for (let k = 0; k < surf.length; k += 5) {
    const dx = surf[k] - e.cu, dy = surf[k + 1] - e.cv;
    const x = dx * c + dy * s, y = -dx * s + dy * c;
    const nx = surf[k + 2] * c + surf[k + 3] * s, ny = -surf[k + 2] * s + surf[k + 3] * c;
    for (let i = 0; i < 2; i++) {
      const [a, b, sign] = curves[i];
      const gx = x / (a * a), gy = y / (b * b);
      const gl = hypot(gx, gy);
      if (!(gl > 0)) continue;
      const d = (x * gx + y * gy - 1) / (2 * gl);
      const w = explainedArea(surf[k + 4], d, 1 - sign * (nx * gx + ny * gy) / gl, tol);
      sums[i] += w; sum += w;
    }
  }
  e.outer = sums[0]; e.inner = sums[1]; e.score = sum;
  return e.score;
}

/** explained() for the round model of the axis (point or medial segment): offsets of R (surface facing out) and r (facing in), area-weighted medians. */
function explainedRound(
  axis: ShaftAxis, centroids: Float32Array, normals: Float32Array, areas: Float64Array, stride: number, across: (f: number) => boolean, tol: number,
): number {
  const q: [number, number, number] = [0, 0, 0];
  const rows: number[] = [];
  const outR: Array<[number, number]> = [], inR: Array<[number, number]> = [];
  for (let f = 0; f < areas.length; f += stride) {
    if (!across(f)) continue;
    offsetFromAxis(axis, centroids[3 * f], centroids[3 * f + 1], centroids[3 * f + 2], q);
    const d = hypot(q[0], q[1], q[2]);
    if (!(d > 0)) continue;
    const radial = (q[0] * normals[3 * f] + q[1] * normals[3 * f + 1] + q[2] * normals[3 * f + 2]) / d;
    rows.push(d, radial, areas[f]);
    if (radial >= 0.8) outR.push([d, areas[f]]);
    if (radial <= -0.8) inR.push([d, areas[f]]);
  }
  let sum = 0;
  for (const [r, sign] of [[weightedMedian(outR), 1], [weightedMedian(inR), -1]]) {
    if (!(r > 0)) continue;
    for (let k = 0; k < rows.length; k += 3) sum += explainedArea(rows[k + 2], rows[k] - r, 1 - sign * rows[k + 1], tol);
  }
  return sum;
}


/**
 * Direct least-squares ellipse fit of weighted points (x, y, w triples): Fitzgibbon, Pilu &
 * Fisher 1999 (the conic a x² + b xy + c y² + d x + e y + f = 0 under 4ac - b² = 1), in the
 * numerically stable form of Halir & Flusser 1998 (the quadratic and linear parts split, the
 * 3x3 reduced eigenproblem), on coordinates centred and scaled to unit spread. Returns the
 * centre, the semi-axes (major first) and the major axis angle; undefined when no ellipse fits.
 */
export function directEllipseFit(points: number[]): { cu: number; cv: number; a: number; b: number; phi: number } | undefined {
  const m = points.length / 3;
  if (m < 6) return undefined;
  let mx = 0, my = 0, sw = 0;
  for (let k = 0; k < m; k++) { mx += points[3 * k + 2] * points[3 * k]; my += points[3 * k + 2] * points[3 * k + 1]; sw += points[3 * k + 2]; }
  if (!(sw > 0)) return undefined;
  mx /= sw; my /= sw;
  let spread = 0;
  for (let k = 0; k < m; k++) spread += points[3 * k + 2] * ((points[3 * k] - mx) ** 2 + (points[3 * k + 1] - my) ** 2);
  const sc = Math.sqrt(spread / sw) || 1;
  const S1 = [[0, 0, 0], [0, 0, 0], [0, 0, 0]], S2 = [[0, 0, 0], [0, 0, 0], [0, 0, 0]], S3 = [[0, 0, 0], [0, 0, 0], [0, 0, 0]];
  for (let k = 0; k < m; k++) {
    const x = (points[3 * k] - mx) / sc, y = (points[3 * k + 1] - my) / sc, w = points[3 * k + 2] / sw;
    const d1 = [x * x, x * y, y * y], d2 = [x, y, 1];
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) {
      S1[i][j] += w * d1[i] * d1[j]; S2[i][j] += w * d1[i] * d2[j]; S3[i][j] += w * d2[i] * d2[j];
    }
  }
  let T: Matrix;
  try {
    T = inverse(new Matrix(S3)).mmul(new Matrix(S2).transpose()).mul(-1);
  } catch { return undefined; }
  const M = new Matrix(S1).add(new Matrix(S2).mmul(T));
  // Premultiplied by the inverse of the constraint matrix C1 = [[0, 0, 2], [0, -1, 0], [2, 0, 0]].
  const R = new Matrix([
    [M.get(2, 0) / 2, M.get(2, 1) / 2, M.get(2, 2) / 2],
    [-M.get(1, 0), -M.get(1, 1), -M.get(1, 2)],
    [M.get(0, 0) / 2, M.get(0, 1) / 2, M.get(0, 2) / 2],
  ]);
  const eig = new EigenvalueDecomposition(R);
  const V = eig.eigenvectorMatrix;
  let a1: number[] | undefined;
  for (let j = 0; j < 3; j++) {
    if (Math.abs(eig.imaginaryEigenvalues[j]) > 1e-12) continue;
    const v = [V.get(0, j), V.get(1, j), V.get(2, j)];
    if (4 * v[0] * v[2] - v[1] * v[1] > 0) { a1 = v; break; }
  }
  if (!a1) return undefined;
  const a2 = T.mmul(Matrix.columnVector(a1)).to1DArray();
  // The conic's sign is free: make its quadratic part positive definite.
  const sg = a1[0] + a1[2] < 0 ? -1 : 1;
  const [A, B, C] = a1.map((x) => sg * x), [D, E, F] = a2.map((x) => sg * x);
  // Centre: gradient zero. Then the quadratic form about it.
  const det = 4 * A * C - B * B;
  const x0 = (B * E - 2 * C * D) / det, y0 = (B * D - 2 * A * E) / det;
  const f0 = A * x0 * x0 + B * x0 * y0 + C * y0 * y0 + D * x0 + E * y0 + F;
  const tr = A + C, root = hypot(A - C, B);
  const l1 = (tr + root) / 2, l2 = (tr - root) / 2;
  if (!(-f0 / l1 > 0 && -f0 / l2 > 0)) return undefined;
  const small = Math.sqrt(-f0 / l1), big = Math.sqrt(-f0 / l2);
  // Major axis: eigenvector of the smaller eigenvalue l2 of [[A, B/2], [B/2, C]].
  const phi = Math.abs(B) < 1e-15 ? (A <= C ? 0 : Math.PI / 2) : Math.atan2(l2 - A, B / 2);
  return { cu: mx + sc * x0, cv: my + sc * y0, a: sc * big, b: sc * small, phi };
}
