import type { AnalysisSettings } from './settings';
import { acrossAxisBasis, outerRadius, type ShaftAxis } from './shaft-axis';

/** What homothetyCentre reads of the inward wall rays (wall-rays.ts). */
export interface HomothetyRays { triangles: Uint32Array; exitCosine: Float32Array; exitTriangle: Int32Array }

export interface HomothetyCentre {
  /** The centre on the plane across the axis through axis.point. */
  point: [number, number, number];
  /** Ratio of cavity to outer size (0 < k < 1). */
  k: number;
  /** Normal-direction bins holding both faces. */
  pairs: number;
  /** Area-weighted RMS distance (mm) of the cavity points from the outer points mapped by the homothety. */
  rms: number;
  /**
   * Area share of the head-on pairs whose two triangles face squarely (|radial| >= 0.8) and
   * oppositely about the homothety centre, and about the axis point it started from.
   */
  square: number;
  squareBefore: number;
}

/**
 * The shaft centre as the centre of the homothety that maps the outer wall onto the cavity
 * wall. A section whose outer and cavity outlines share their relative shape, r_in(θ) = k
 * r_out(θ) about the centre c (a tube, a three-lobed section r = ρ (1 + e cos 3θ) with its
 * cavity scaled from it, an ellipse and a similar one), has parallel normals at points
 * p_in = c + k (p_out - c) (a homothety maps each curve's tangent to a parallel tangent);
 * the normal lines themselves miss c on any but a round section (by up to atan(3e) on the
 * lobed one), the line through such a pair of points does not. Outer and cavity faces come
 * from head-on wall-ray pairs (a ray that leaves through the other face of the wall squarely;
 * of each pair the triangle farther from the current centre is taken for outer), both within
 * 20 degrees of perpendicular to the axis; they are binned by the direction of their normal
 * across the axis (cavity normals reversed) in `binDeg` bins, and the area-weighted mean
 * points of the bins holding both give p_in = k p_out + m, linear least squares in k and m,
 * c = m / (1 - k). Repeated `passes` times from the axis point (the outer / cavity split
 * follows the centre). Undefined when fewer than `minBins` bins hold both faces or k falls
 * outside (0, 1).
 */
export function homothetyCentre(
  axis: ShaftAxis, centroids: Float32Array, normals: Float32Array, areas: Float64Array, rays: HomothetyRays, headOnCosineMin: number,
  options: { binDeg?: number; minBins?: number; passes?: number } = {},
): HomothetyCentre | undefined {
  const binDeg = options.binDeg ?? 3, minBins = options.minBins ?? 6, passes = options.passes ?? 3;
  const [ax, ay, az] = axis.direction;
  const [[ux, uy, uz], [vx, vy, vz]] = acrossAxisBasis(axis.direction);
  // 2D rows of both triangles of each head-on pair: position, normal angle, area.
  const x: number[] = [], y: number[] = [], phi: number[] = [], w: number[] = [];
  const add = (f: number): boolean => {
    const nx = normals[3 * f], ny = normals[3 * f + 1], nz = normals[3 * f + 2];
    if (Math.abs(nx * ax + ny * ay + nz * az) > 0.342) return false;
    x.push(centroids[3 * f] * ux + centroids[3 * f + 1] * uy + centroids[3 * f + 2] * uz);
    y.push(centroids[3 * f] * vx + centroids[3 * f + 1] * vy + centroids[3 * f + 2] * vz);
    phi.push(Math.atan2(nx * vx + ny * vy + nz * vz, nx * ux + ny * uy + nz * uz));
    w.push(areas[f]);
    return true;
  };
  for (let k = 0; k < rays.triangles.length; k++) {
    const g = rays.exitTriangle[k];
    if (g < 0 || rays.exitCosine[k] < headOnCosineMin) continue;
    if (!add(rays.triangles[k])) continue;
    if (!add(g)) { x.pop(); y.pop(); phi.pop(); w.pop(); }
  }
  const n = x.length / 2;
  if (n < minBins) return undefined;
  let cu = axis.point[0] * ux + axis.point[1] * uy + axis.point[2] * uz;
  let cv = axis.point[0] * vx + axis.point[1] * vy + axis.point[2] * vz;
  const bins = Math.round(360 / binDeg);
  let result: Omit<HomothetyCentre, 'point'> | undefined;
  for (let pass = 0; pass < passes; pass++) {
    // Per bin and face (0 outer, 1 cavity): area, area-weighted position sums.
    const acc = new Float64Array(bins * 2 * 3);
    for (let p = 0; p < n; p++) {
      const i = 2 * p, j = 2 * p + 1;
      const outerFirst = Math.hypot(x[i] - cu, y[i] - cv) >= Math.hypot(x[j] - cu, y[j] - cv);
      for (const [t, face] of [[i, outerFirst ? 0 : 1], [j, outerFirst ? 1 : 0]]) {
        // Cavity normals point towards the centre: reversed, they match the outer ones.
        const angle = face === 0 ? phi[t] : phi[t] + Math.PI;
        const b = ((Math.floor((angle / (2 * Math.PI)) * bins) % bins) + bins) % bins;
        const o = (b * 2 + face) * 3;
        acc[o] += w[t]; acc[o + 1] += w[t] * x[t]; acc[o + 2] += w[t] * y[t];
      }
    }
    // Least squares in (k, mx, my): cavity = k outer + m, weight min(area) per bin.
    let sw = 0, sx = 0, sy = 0, sxx = 0, sxX = 0, sX = 0, sY = 0, used = 0;
    const bx: number[] = [], by: number[] = [], bX: number[] = [], bY: number[] = [], bw: number[] = [];
    for (let b = 0; b < bins; b++) {
      const o = b * 6, c = b * 6 + 3;
      if (!(acc[o] > 0 && acc[c] > 0)) continue;
      const wt = Math.min(acc[o], acc[c]);
      const px = acc[o + 1] / acc[o], py = acc[o + 2] / acc[o], qx = acc[c + 1] / acc[c], qy = acc[c + 2] / acc[c];
      bx.push(px); by.push(py); bX.push(qx); bY.push(qy); bw.push(wt);
      sw += wt; sx += wt * px; sy += wt * py; sxx += wt * (px * px + py * py); sxX += wt * (px * qx + py * qy); sX += wt * qx; sY += wt * qy;
      used++;
    }
    if (used < minBins) return undefined;
    // Normal equations: [sxx sx sy; sx sw 0; sy 0 sw] [k mx my] = [sxX sX sY].
    const det = sxx * sw - sx * sx - sy * sy;
    if (!(Math.abs(det) > 1e-12 * sw * sxx)) return undefined;
    const k = (sxX * sw - sx * sX - sy * sY) / det;
    const mx = (sX - k * sx) / sw, my = (sY - k * sy) / sw;
    if (!(k > 0 && k < 1)) return undefined;
    cu = mx / (1 - k); cv = my / (1 - k);
    let ss = 0;
    for (let i = 0; i < bx.length; i++) ss += bw[i] * ((bX[i] - k * bx[i] - mx) ** 2 + (bY[i] - k * by[i] - my) ** 2);
    result = { k, pairs: used, rms: Math.sqrt(ss / sw), square: 0, squareBefore: 0 };
  }
  if (!result) return undefined;
  // Head-on pairs facing squarely and oppositely about a centre (as fitSectionSegment scores wall pairs).
  const squareShare = (su: number, sv: number): number => {
    let good = 0, all = 0;
    for (let p = 0; p < n; p++) {
      const i = 2 * p, j = 2 * p + 1;
      const ri = radialOf(x[i] - su, y[i] - sv, phi[i]), rj = radialOf(x[j] - su, y[j] - sv, phi[j]);
      all += w[i];
      if (Math.abs(ri) >= 0.8 && Math.abs(rj) >= 0.8 && ri * rj < 0) good += w[i];
    }
    return all > 0 ? good / all : 0;
  };
  result.square = squareShare(cu, cv);
  result.squareBefore = squareShare(axis.point[0] * ux + axis.point[1] * uy + axis.point[2] * uz, axis.point[0] * vx + axis.point[1] * vy + axis.point[2] * vz);
  const t = axis.point[0] * ax + axis.point[1] * ay + axis.point[2] * az;
  return { ...result, point: [cu * ux + cv * vx + t * ax, cu * uy + cv * vy + t * ay, cu * uz + cv * vz + t * az] };
}

/** Cosine between a 2D offset and a unit normal given by its angle. */
function radialOf(qx: number, qy: number, angle: number): number {
  return (qx * Math.cos(angle) + qy * Math.sin(angle)) / (Math.hypot(qx, qy) || 1e-9);
}

/**
 * The axis with its point moved to the homothety centre (homothetyCentre) when the head-on
 * wall pairs face squarely and oppositely about it by at least `sectionHomothetyGain` (a share
 * of their area, settings.ts) more than about the current point. The guard is needed because
 * not every cavity is the outer outline scaled: where the wall keeps one thickness round a
 * flattened section (the cavity an offset curve of the outer one, as the generator's radius
 * and metapodials), the matched pairs carry no centre and the fitted one is spurious (dev,
 * with a range of k, 0.45-0.8, in place of this guard: s16 97.43 -> 97.16, s104 98.47 ->
 * 98.27). Unchanged on fragments
 * without shaft support (under one half).
 */
export function homothetyAxis(
  axis: ShaftAxis, centroids: Float32Array, normals: Float32Array, areas: Float64Array, rays: HomothetyRays,
  s: Pick<AnalysisSettings, 'sectionHomothetyGain' | 'sectionHomothetyBinDeg' | 'sectionHomothetyMinBins' | 'headOnCosineMin'>,
): ShaftAxis {
  if (!(s.sectionHomothetyGain < 1) || !(axis.support >= 0.5)) return axis;
  const h = homothetyCentre(axis, centroids, normals, areas, rays, s.headOnCosineMin, { binDeg: s.sectionHomothetyBinDeg, minBins: s.sectionHomothetyMinBins });
  if (!h || !(h.square >= h.squareBefore + s.sectionHomothetyGain)) return axis;
  return { ...axis, point: h.point, radius: outerRadius(centroids, normals, areas, axis.direction, h.point) };
}
