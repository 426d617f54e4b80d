import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { weightedMedian } from './weighted-median';
import { mulberry32 } from './seeded-random';
import { analysisSettings } from './settings';
import { ellipseOffset, type EllipseSection } from './shaft-section';
import { hypot } from './hypot';
import { wallCrossingShare, wallSegments } from './wall-crossing';
import { strictWallCheck } from './strict-wall-check';

/**
 * The long axis of a shaft fragment from its surface normals: on a (roughly) cylindrical
 * bone surface every normal is nearly perpendicular to the axis, so the axis is the
 * eigenvector of the smallest eigenvalue of sum(w n n^T). Fracture faces, whose normals lean
 * along the axis, are down-weighted by refitting on the triangles already perpendicular to
 * the first estimate. The axis point is where the normal lines, projected onto the plane
 * across the axis, meet: started from the candidate (meeting point of two lines) that most
 * lines pass close to, then refined by reweighted least squares. On a splinter the break faces
 * along the shaft can outweigh the bone surface; a plain least-squares fit of all lines then
 * lands inside the wall, and outer and medullary surface no longer face out and in.
 */
export interface ShaftAxis {
  direction: [number, number, number];
  point: [number, number, number];
  /** Area-weighted median distance of the outer surface from the axis. */
  radius: number;
  /** Share of the area whose normal is within 20 degrees of perpendicular to the axis. */
  support: number;
  /**
   * A flattened section's medial segment (fitMedialSegment): from `point` along `direction`
   * (across the axis) for `length` mm. Radial directions are then taken from the nearest point
   * of the segment instead of from the axis line. Absent: the axis line alone.
   */
  medial?: { direction: [number, number, number]; length: number };
  /**
   * A flattened section (shaft-section.ts, fitEllipseSection): outer and cavity ellipses about
   * `point`. Radial directions are then the normals of the family of ellipses between them
   * (takes the place of `medial`). Absent: a round section.
   */
  section?: EllipseSection;
}

/**
 * Offset of a point from the shaft axis across it: from the nearest point of the axis line,
 * or of the medial segment when the axis has one. Writes into `out` and returns it.
 */
export function offsetFromAxis(axis: ShaftAxis, x: number, y: number, z: number, out: [number, number, number]): [number, number, number] {
  const [ax, ay, az] = axis.direction;
  const rx = x - axis.point[0], ry = y - axis.point[1], rz = z - axis.point[2];
  const t = rx * ax + ry * ay + rz * az;
  let qx = rx - t * ax, qy = ry - t * ay, qz = rz - t * az;
  const e = axis.section;
  if (e) {
    const mj = e.major;
    return ellipseOffset(e, [ay * mj[2] - az * mj[1], az * mj[0] - ax * mj[2], ax * mj[1] - ay * mj[0]], qx, qy, qz, out);
  }
  const m = axis.medial;
  if (m) {
    const s = Math.min(m.length, Math.max(0, qx * m.direction[0] + qy * m.direction[1] + qz * m.direction[2]));
    qx -= s * m.direction[0]; qy -= s * m.direction[1]; qz -= s * m.direction[2];
  }
  out[0] = qx; out[1] = qy; out[2] = qz;
  return out;
}

/** Area of the triangles within 20 degrees of perpendicular to the axis facing squarely (|radial| > 0.8) away from or towards it. */
function squareArea(centroids: Float32Array, normals: Float32Array, areas: Float64Array, axis: ShaftAxis): number {
  const [ax, ay, az] = axis.direction;
  const q: [number, number, number] = [0, 0, 0];
  let area = 0;
  for (let f = 0; f < areas.length; f++) {
    const nx = normals[3 * f], ny = normals[3 * f + 1], nz = normals[3 * f + 2];
    if (Math.abs(nx * ax + ny * ay + nz * az) > 0.342) continue;
    offsetFromAxis(axis, centroids[3 * f], centroids[3 * f + 1], centroids[3 * f + 2], q);
    if (Math.abs(q[0] * nx + q[1] * ny + q[2] * nz) > 0.8 * hypot(q[0], q[1], q[2])) area += areas[f];
  }
  return area;
}

/**
 * The medial segment of a flattened shaft (an elliptic section of semi-axes a > b): the normal
 * lines of an ellipse cross its major axis within a - b²/a of the centre (the evolute's cusps),
 * so no single centre is met by all of them, and on a splinter from the narrow edge the fitted
 * centre is that edge's centre of curvature while the flat outer and medullary faces, whose
 * normals are parallel, face it obliquely. Radial directions taken from the nearest point of a
 * segment running from the fitted centre away from the fragment (w: from the area centroid to
 * the centre) make the flat faces face squarely again and leave a break across the wall facing
 * neither way. The length is the one of `lengths` (multiples of the fitted radius) that makes
 * the most surface face squarely, and is kept only when it adds at least `gain` of the area a
 * point centre gives (a round shaft gains nothing: its wall faces face the centre already).
 */
export function fitMedialSegment(
  axis: ShaftAxis, centroids: Float32Array, normals: Float32Array, areas: Float64Array, lengths: number[], gain: number, supportMin = 0.5,
): ShaftAxis {
  if (!(axis.support >= supportMin) || !(axis.radius > 0) || lengths.length === 0) return axis;
  let mx = 0, my = 0, mz = 0, total = 0;
  for (let f = 0; f < areas.length; f++) {
    mx += areas[f] * centroids[3 * f]; my += areas[f] * centroids[3 * f + 1]; mz += areas[f] * centroids[3 * f + 2]; total += areas[f];
  }
  if (!(total > 0)) return axis;
  const w = offsetFromAxis({ ...axis, medial: undefined }, mx / total, my / total, mz / total, [0, 0, 0]);
  const wl = hypot(w[0], w[1], w[2]);
  if (!(wl > 1e-9)) return axis;
  const direction: [number, number, number] = [-w[0] / wl, -w[1] / wl, -w[2] / wl];
  const base = squareArea(centroids, normals, areas, axis);
  let best = axis, bestArea = base * (1 + gain);
  for (const k of lengths) {
    const trial: ShaftAxis = { ...axis, medial: { direction, length: k * axis.radius } };
    const a = squareArea(centroids, normals, areas, trial);
    if (a > bestArea) { best = trial; bestArea = a; }
  }
  return best;
}

/**
 * `centreTolerance`: a normal line passes close enough to a candidate axis centre when it
 * misses it by at most this share of its distance (settings.ts, shaftCentreTolerance).
 * Without it the centre is the plain reweighted least-squares fit (no consensus start).
 */
export function fitShaftAxis(
  centroids: Float32Array, normals: Float32Array, areas: Float64Array, centreTolerance?: number, directionSearch?: { gain: number; count: number; supportMin: number },
  wall?: ShaftWallCheck,
): ShaftAxis {
  const nt = areas.length;
  let dir = refineDirection(normals, areas, smallestEigen(normals, areas, () => true));
  if (directionSearch) dir = searchShaftDirection(normals, areas, dir, directionSearch.gain, directionSearch.count, directionSearch.supportMin);
  // Axis point: minimise sum w ((c - q) . m_perp)^2 in the plane across the axis.
  const [ax, ay, az] = dir;
  const [[ux, uy, uz], [vx, vy, vz]] = acrossAxisBasis(dir);
  // Iteratively reweighted: normals of break faces along the shaft are tangential and miss
  // the axis, so lines far from the current centre count less in the next pass.
  let cu = 0, cv = 0, total = 0, supported = 0;
  // Medians are taken over a regular sample of at most about 4000 triangles.
  const stride = Math.max(1, Math.floor(nt / 4000));
  let scale = Infinity;
  // Start from the best-supported meeting point of pairs of normal lines (consensus, as in
  // RANSAC, Fischler & Bolles 1981): on a splinter the break faces along the shaft can
  // outweigh the bone surface, and a plain least-squares start lands between the walls.
  // Candidate centres inside the wall (wall-crossing.ts) are refused where the wall rays are
  // given and the piece is a shaft piece (`supportMin` of its area along the axis): the axis
  // of a piece holding a bone end runs through the end's solid bone.
  // On a clear shaft piece (strictSupportMin of its area along the axis: no bone end, whose
  // solid bone the axis would run through) the stricter strictShareMax applies.
  const across = wall ? acrossShare(normals, areas, dir) : 0;
  const shareMax = wall ? wallShareMax(wall, across) : 0;
  const segments = wall && shareMax > 0 && across >= wall.supportMin
    ? wallSegments(wall.rays, centroids, normals, areas, dir, [ux, uy, uz], [vx, vy, vz]) : undefined;
  const refuse = segments && wall ? (cu: number, cv: number): boolean => wallCrossingShare(segments, cu, cv, wall.tolerance) > shareMax : undefined;
  const start = centreTolerance ? consensusCentre(centroids, normals, areas, dir, [ux, uy, uz], [vx, vy, vz], centreTolerance, refuse) : undefined;
  let first = 0;
  if (start) {
    [cu, cv, scale] = start;
    first = 1;
  }
  for (let pass = first; pass < 6; pass++) {
    let s11 = 0, s12 = 0, s22 = 0, b1 = 0, b2 = 0;
    total = 0; supported = 0;
    for (let f = 0; f < nt; f++) {
      const nx = normals[3 * f], ny = normals[3 * f + 1], nz = normals[3 * f + 2];
      const along = Math.abs(nx * ax + ny * ay + nz * az);
      total += areas[f];
      if (along > 0.342) continue; // 20 degrees from perpendicular
      supported += areas[f];
      const mu = nx * ux + ny * uy + nz * uz, mv = nx * vx + ny * vy + nz * vz;
      const ml = hypot(mu, mv) || 1;
      const pu = -mv / ml, pv = mu / ml; // perpendicular of the projected normal
      const qu = centroids[3 * f] * ux + centroids[3 * f + 1] * uy + centroids[3 * f + 2] * uz;
      const qv = centroids[3 * f] * vx + centroids[3 * f + 1] * vy + centroids[3 * f + 2] * vz;
      const r = qu * pu + qv * pv;
      const miss = Math.abs(cu * pu + cv * pv - r);
      let w: number;
      if (start) {
        // From a consensus start: Tukey's biweight of the miss against centreTolerance times
        // the distance, the same test the consensus used, so the break faces cannot pull it off.
        const x = miss / (centreTolerance! * hypot(qu - cu, qv - cv) + 1e-9);
        w = x < 1 ? areas[f] * (1 - x * x) ** 2 : 0;
      } else {
        w = areas[f] / (1 + (pass === 0 ? 0 : (miss / scale) ** 2));
      }
      s11 += w * pu * pu; s12 += w * pu * pv; s22 += w * pv * pv;
      b1 += w * pu * r; b2 += w * pv * r;
    }
    const det = s11 * s22 - s12 * s12;
    if (Math.abs(det) <= 1e-12) break;
    const nu = (b1 * s22 - b2 * s12) / det, nv = (s11 * b2 - s12 * b1) / det;
    // The reweighting can walk a centre from the cavity into the wall (break faces that face a
    // point in it squarely): it stops at the last centre outside the wall.
    if (refuse && refuse(nu, nv)) break;
    cu = nu; cv = nv;
    // Scale for the next pass: a fifth of the median distance of the surface from the centre.
    const d: Array<[number, number]> = [];
    for (let f = 0; f < nt; f += stride) {
      const qu = centroids[3 * f] * ux + centroids[3 * f + 1] * uy + centroids[3 * f + 2] * uz - cu;
      const qv = centroids[3 * f] * vx + centroids[3 * f + 1] * vy + centroids[3 * f + 2] * vz - cv;
      d.push([hypot(qu, qv), areas[f]]);
    }
    scale = Math.max(1e-6, weightedMedian(d) / 5);
  }
  // Put the point at the middle of the fragment along the axis.
  let mid = 0;
  for (let f = 0; f < nt; f++) mid += areas[f] * (centroids[3 * f] * ax + centroids[3 * f + 1] * ay + centroids[3 * f + 2] * az);
  mid /= total || 1;
  const point: [number, number, number] = [cu * ux + cv * vx + mid * ax, cu * uy + cv * vy + mid * ay, cu * uz + cv * vz + mid * az];
  const radius = outerRadius(centroids, normals, areas, dir, point);
  return { direction: dir, point, radius, support: total ? supported / total : 0 };
}

/** The wall-crossing share above which a candidate centre is refused, for a piece with `across` of its area along the axis. */
function wallShareMax(wall: { shareMax: number; strictShareMax?: number; strictSupportMin?: number }, across: number): number {
  const strict = wall.strictShareMax ?? 0;
  return strict > 0 && across >= (wall.strictSupportMin ?? Infinity) && (wall.shareMax <= 0 || strict < wall.shareMax) ? strict : wall.shareMax;
}

/** Share of the area whose normal runs within 20 degrees of perpendicular to `d` (the axis support of that direction). */
function acrossShare(normals: Float32Array, areas: Float64Array, d: readonly number[]): number {
  let s = 0, all = 0;
  for (let f = 0; f < areas.length; f++) {
    all += areas[f];
    if (Math.abs(normals[3 * f] * d[0] + normals[3 * f + 1] * d[1] + normals[3 * f + 2] * d[2]) <= 0.342) s += areas[f];
  }
  return all > 0 ? s / all : 0;
}

/** Three passes of the smallest eigenvector on the triangles within about 20 degrees of perpendicular to the last estimate. */
function refineDirection(normals: Float32Array, areas: Float64Array, start: [number, number, number]): [number, number, number] {
  let dir = start;
  for (let pass = 0; pass < 3; pass++) {
    const d = dir;
    dir = smallestEigen(normals, areas, (f) => Math.abs(normals[3 * f] * d[0] + normals[3 * f + 1] * d[1] + normals[3 * f + 2] * d[2]) < 0.35);
  }
  return dir;
}

/**
 * Area whose normal runs within 20 degrees of perpendicular to `d`, each triangle weighted by
 * Tukey's biweight of |n . d| / sin 20° (an even sample of at most about 4000 triangles).
 */
function acrossSupport(normals: Float32Array, areas: Float64Array, d: readonly number[], stride: number): number {
  let s = 0;
  for (let f = 0; f < areas.length; f += stride) {
    const x = Math.abs(normals[3 * f] * d[0] + normals[3 * f + 1] * d[1] + normals[3 * f + 2] * d[2]) / 0.342;
    if (x < 1) s += areas[f] * (1 - x * x) ** 2;
  }
  return s;
}

/**
 * A global check of the shaft direction. The eigenvector iteration (refineDirection) starts
 * from the smallest eigenvector of all normals' scatter; on a short or chunky piece (a ring
 * section a few mm long, a piece of a metaphysis) the transverse ends' normals, which run along
 * the axis, outweigh the narrow in-plane spread of a wall arc, that start lies across the
 * piece, and the iteration stays there although the true axis has more surface perpendicular
 * to it (a 90-degree arc of a 12/7 mm tube 6 mm long: 0.62 of the area against 0.57).
 * `count` directions spread evenly over the half sphere (golden-angle spiral) are scored by
 * acrossSupport; when the best beats the fitted direction by `gain` (a share), the iteration
 * restarts from it, and its result is kept if it still scores more than the fitted one. Only
 * where the fitted direction has `supportMin` of the area within 20 degrees of perpendicular.
 */
export function searchShaftDirection(
  normals: Float32Array, areas: Float64Array, fitted: [number, number, number], gain: number, count: number, supportMin = 0.5,
): [number, number, number] {
  if (!(gain > 0) || count < 1) return fitted;
  const stride = Math.max(1, Math.floor(areas.length / 4000));
  let across = 0, total = 0;
  for (let f = 0; f < areas.length; f += stride) {
    total += areas[f];
    if (Math.abs(normals[3 * f] * fitted[0] + normals[3 * f + 1] * fitted[1] + normals[3 * f + 2] * fitted[2]) <= 0.342) across += areas[f];
  }
  if (!(across >= supportMin * total)) return fitted;
  const here = acrossSupport(normals, areas, fitted, stride);
  let best = -1;
  const bd: [number, number, number] = [0, 0, 1];
  for (let i = 0; i < count; i++) {
    const z = (i + 0.5) / count, r = Math.sqrt(1 - z * z), phi = i * 2.399963229728653;
    const d = [r * Math.cos(phi), r * Math.sin(phi), z];
    const s = acrossSupport(normals, areas, d, stride);
    if (s > best) { best = s; bd[0] = d[0]; bd[1] = d[1]; bd[2] = d[2]; }
  }
  if (!(best > here * (1 + gain))) return fitted;
  const restarted = refineDirection(normals, areas, bd);
  return acrossSupport(normals, areas, restarted, stride) > here ? restarted : fitted;
}

/** Area-weighted median distance from the axis of the triangles facing away from it (radial > 0.8). */
export function outerRadius(centroids: Float32Array, normals: Float32Array, areas: Float64Array, dir: [number, number, number], point: [number, number, number]): number {
  const nt = areas.length;
  const [ax, ay, az] = dir;
  const stride = Math.max(1, Math.floor(nt / 4000));
  const dists: Array<[number, number]> = [];
  for (let f = 0; f < nt; f += stride) {
    const rx = centroids[3 * f] - point[0], ry = centroids[3 * f + 1] - point[1], rz = centroids[3 * f + 2] - point[2];
    const t = rx * ax + ry * ay + rz * az;
    const px = rx - t * ax, py = ry - t * ay, pz = rz - t * az;
    const d = hypot(px, py, pz);
    const outward = (px * normals[3 * f] + py * normals[3 * f + 1] + pz * normals[3 * f + 2]) / (d || 1);
    if (outward > 0.8) dists.push([d, areas[f]]);
  }
  return dists.length ? weightedMedian(dists) : 0;
}

/**
 * Surface facing squarely across the axis: area of the triangles within 20 degrees of
 * perpendicular to the axis whose normal faces away from a centre by radial > 0.8 or
 * towards it by radial < -0.8. A centre far off to one side of the wall leaves much of it out.
 */
function facingArea(
  centroids: Float32Array, normals: Float32Array, areas: Float64Array, dir: [number, number, number], point: [number, number, number],
): number {
  const [ax, ay, az] = dir;
  let area = 0;
  for (let f = 0; f < areas.length; f++) {
    const nx = normals[3 * f], ny = normals[3 * f + 1], nz = normals[3 * f + 2];
    if (Math.abs(nx * ax + ny * ay + nz * az) > 0.342) continue;
    const rx = centroids[3 * f] - point[0], ry = centroids[3 * f + 1] - point[1], rz = centroids[3 * f + 2] - point[2];
    const t = rx * ax + ry * ay + rz * az;
    const px = rx - t * ax, py = ry - t * ay, pz = rz - t * az;
    if (Math.abs(px * nx + py * ny + pz * nz) > 0.8 * hypot(px, py, pz)) area += areas[f];
  }
  return area;
}

/** Cut-offs of settleAxisSide (settings.ts: axisSideAreaRatio, axisSideFacingShare; defaults there). */
/**
 * The wall check of a candidate axis centre (wall-crossing.ts): the inward wall rays, the
 * wall-crossing share above which a centre lies in the wall (settings shaftCentreWall*), the
 * tolerance of aiming, the least axis support for the check, and the stricter share on clear
 * shaft pieces (support at least strictSupportMin).
 */
export interface ShaftWallCheck {
  rays: { triangles: Uint32Array; distance: Float32Array };
  shareMax: number; tolerance: number; supportMin: number; strictShareMax?: number; strictSupportMin?: number;
}

export interface AxisSideCutoffs { areaRatio: number; facingShare: number }

function defaultAxisSideCutoffs(): AxisSideCutoffs {
  const s = analysisSettings();
  return { areaRatio: s.axisSideAreaRatio, facingShare: s.axisSideFacingShare };
}

/**
 * The normal lines of a nearly flat wall (a splinter from a flat or lobed shaft) meet on
 * either side of it about equally well, so the fitted centre can land on the outer side, and
 * outer and medullary surface then swap their facing. The two faces of the wall are told
 * apart without the centre: across a shaft wall (a tube of outer radius R and inner radius r)
 * the outer face is the longer arc (arc lengths in ratio R/r) and the more convex one (mean
 * curvature +1/2R outside, -1/2r inside; do Carmo 1976, section 3-3). Taking w, the direction
 * from the fragment's area centroid to the fitted centre across the axis, the surface facing
 * w (normal . w > 0.8) should be the medullary face and the one facing -w the outer. When the
 * surface facing w is the more convex (area-weighted median of the mean curvature) and not
 * clearly the smaller (at least `areaRatio` of the other), the centre is on the wrong side and is replaced by its mirror image through the area centroid,
 * provided at least `facingShare` as much surface faces the mirror squarely. Break faces
 * of a splinter run roughly along w and drop out of both sets. Unchanged without shaft support.
 */
export function settleAxisSide(
  axis: ShaftAxis, centroids: Float32Array, normals: Float32Array, areas: Float64Array, meanCurvature: ArrayLike<number>,
  cutoffs: AxisSideCutoffs = defaultAxisSideCutoffs(), supportMin = 0.5,
): ShaftAxis {
  if (!(axis.support >= supportMin)) return axis;
  let mx = 0, my = 0, mz = 0, total = 0;
  for (let f = 0; f < areas.length; f++) {
    mx += areas[f] * centroids[3 * f]; my += areas[f] * centroids[3 * f + 1]; mz += areas[f] * centroids[3 * f + 2]; total += areas[f];
  }
  if (!(total > 0)) return axis;
  const [ax, ay, az] = axis.direction;
  // w: from the area centroid to the centre, across the axis.
  let wx = axis.point[0] - mx / total, wy = axis.point[1] - my / total, wz = axis.point[2] - mz / total;
  const along = wx * ax + wy * ay + wz * az;
  wx -= along * ax; wy -= along * ay; wz -= along * az;
  const wl = hypot(wx, wy, wz);
  if (!(wl > 1e-9)) return axis;
  wx /= wl; wy /= wl; wz /= wl;
  // Medians, not means: the creases where each face meets the break faces are strongly convex
  // and make up more of the narrower face.
  let aTowards = 0, aAway = 0;
  const towards: Array<[number, number]> = [], away: Array<[number, number]> = [];
  for (let f = 0; f < areas.length; f++) {
    // Only the wall on the centroid's side of the centre (the far wall of a wide piece faces the other way round).
    const side = (centroids[3 * f] - axis.point[0]) * wx + (centroids[3 * f + 1] - axis.point[1]) * wy + (centroids[3 * f + 2] - axis.point[2]) * wz;
    if (side >= 0) continue;
    const c = normals[3 * f] * wx + normals[3 * f + 1] * wy + normals[3 * f + 2] * wz;
    if (c > 0.8) { aTowards += areas[f]; towards.push([meanCurvature[f], areas[f]]); }
    else if (c < -0.8) { aAway += areas[f]; away.push([meanCurvature[f], areas[f]]); }
  }
  if (!(aTowards > 0 && aAway > 0)) return axis;
  const hTowards = weightedMedian(towards), hAway = weightedMedian(away);
  if (!(hTowards > hAway && aTowards >= cutoffs.areaRatio * aAway)) return axis;
  const mirror: [number, number, number] = [axis.point[0] - 2 * wl * wx, axis.point[1] - 2 * wl * wy, axis.point[2] - 2 * wl * wz];
  const here = facingArea(centroids, normals, areas, axis.direction, axis.point);
  const there = facingArea(centroids, normals, areas, axis.direction, mirror);
  if (!(there >= cutoffs.facingShare * here)) return axis;
  return { ...axis, point: mirror, radius: outerRadius(centroids, normals, areas, axis.direction, mirror) };
}

/**
 * Area of the normal lines (through (qu, qv) along the unit (pu, pv), in the section plane)
 * that pass the point (cu, cv) within `tolerance` times their distance from it, each weighted
 * 1 - x^2 by its miss x in those units; lines farther than `reach` or through the point itself
 * count nothing. The score of a candidate axis centre (consensusCentre, fitSectionSegment).
 */
function normalLineSupport(
  cu: number, cv: number, qu: number[], qv: number[], pu: number[], pv: number[], w: number[], tolerance: number, reach: number,
): number {
  let score = 0;
  for (let k = 0; k < w.length; k++) {
    const ru = cu - qu[k], rv = cv - qv[k];
    const d = hypot(ru, rv);
    if (d > reach || d < 1e-6) continue;
    const x = Math.abs(ru * pv[k] - rv * pu[k]) / (tolerance * d);
    if (x < 1) score += w[k] * (1 - x * x);
  }
  return score;
}

/**
 * Candidate centres (u, v across the axis) where the normal lines of two random wall
 * triangles meet; each is scored by the area of triangles whose normal line passes within
 * `tolerance` times their distance of it (biweight) (at most twice the fragment's width away); the best is
 * returned with a fifth of its median distance (the reweighting scale). Undefined if no
 * candidate has support.
 */
function consensusCentre(
  centroids: Float32Array, normals: Float32Array, areas: Float64Array,
  a: [number, number, number], u: [number, number, number], v: [number, number, number], tolerance: number,
  refuse?: (cu: number, cv: number) => boolean,
): [number, number, number] | undefined {
  const nt = areas.length;
  const stride = Math.max(1, Math.floor(nt / 1500));
  const qu: number[] = [], qv: number[] = [], pu: number[] = [], pv: number[] = [], w: number[] = [];
  let uMin = Infinity, uMax = -Infinity, vMin = Infinity, vMax = -Infinity;
  for (let f = 0; f < nt; f += stride) {
    const nx = normals[3 * f], ny = normals[3 * f + 1], nz = normals[3 * f + 2];
    const x = centroids[3 * f] * u[0] + centroids[3 * f + 1] * u[1] + centroids[3 * f + 2] * u[2];
    const y = centroids[3 * f] * v[0] + centroids[3 * f + 1] * v[1] + centroids[3 * f + 2] * v[2];
    uMin = Math.min(uMin, x); uMax = Math.max(uMax, x); vMin = Math.min(vMin, y); vMax = Math.max(vMax, y);
    if (Math.abs(nx * a[0] + ny * a[1] + nz * a[2]) > 0.342) continue;
    const mu = nx * u[0] + ny * u[1] + nz * u[2], mv = nx * v[0] + ny * v[1] + nz * v[2];
    const ml = hypot(mu, mv) || 1;
    qu.push(x); qv.push(y); pu.push(mu / ml); pv.push(mv / ml); w.push(areas[f]);
  }
  const n = w.length;
  if (n < 10) return undefined;
  const reach = 2 * Math.max(uMax - uMin, vMax - vMin);
  const random = mulberry32(0x5eed);
  let best = -1, bu = 0, bv = 0;
  for (let trial = 0; trial < 200; trial++) {
    const i = Math.floor(random() * n), j = Math.floor(random() * n);
    // Meeting point of the lines q_i + s p_i and q_j + t p_j.
    const det = pu[i] * -pv[j] + pv[i] * pu[j];
    if (Math.abs(det) < 0.17) continue; // nearly parallel (under ~10 degrees)
    const du = qu[j] - qu[i], dv = qv[j] - qv[i];
    const s = (du * -pv[j] + dv * pu[j]) / det;
    const cu = qu[i] + s * pu[i], cv = qv[i] + s * pv[i];
    const score = normalLineSupport(cu, cv, qu, qv, pu, pv, w, tolerance, reach);
    if (score > best && !(refuse && refuse(cu, cv))) { best = score; bu = cu; bv = cv; }
  }
  if (best <= 0) return undefined;
  const d: Array<[number, number]> = [];
  for (let k = 0; k < n; k++) d.push([hypot(bu - qu[k], bv - qv[k]), w[k]]);
  return [bu, bv, Math.max(1e-6, weightedMedian(d) / 5)];
}

function smallestEigen(normals: Float32Array, areas: Float64Array, use: (f: number) => boolean): [number, number, number] {
  const m = [0, 0, 0, 0, 0, 0, 0, 0, 0];
  for (let f = 0; f < areas.length; f++) {
    if (!use(f)) continue;
    const w = areas[f];
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) m[3 * i + j] += w * normals[3 * f + i] * normals[3 * f + j];
  }
  const e = new EigenvalueDecomposition(new Matrix([m.slice(0, 3), m.slice(3, 6), m.slice(6, 9)]), { assumeSymmetric: true });
  const vals = e.realEigenvalues;
  let k = 0;
  for (let i = 1; i < 3; i++) if (vals[i] < vals[k]) k = i;
  const V = e.eigenvectorMatrix;
  const v: [number, number, number] = [V.get(0, k), V.get(1, k), V.get(2, k)];
  const l = hypot(...v) || 1;
  return [v[0] / l, v[1] / l, v[2] / l];
}

/**
 * Which way each triangle faces relative to the shaft axis: 1 outward (radial component of
 * its normal at least radialMin), 2 inward (at most -radialMin), 0 neither. All 0 when the
 * fragment has no clear shaft axis (support below one half).
 */
export function facingGroups(centroids: Float32Array, normals: Float32Array, axis: ShaftAxis, radialMin: number): Uint8Array {
  const nt = centroids.length / 3;
  const out = new Uint8Array(nt);
  if (axis.support < 0.5) return out;
  const q: [number, number, number] = [0, 0, 0];
  for (let f = 0; f < nt; f++) {
    const [qx, qy, qz] = offsetFromAxis(axis, centroids[3 * f], centroids[3 * f + 1], centroids[3 * f + 2], q);
    const ql = hypot(qx, qy, qz) || 1;
    const radial = (normals[3 * f] * qx + normals[3 * f + 1] * qy + normals[3 * f + 2] * qz) / ql;
    out[f] = radial >= radialMin ? 1 : radial <= -radialMin ? 2 : 0;
  }
  return out;
}

/** What fitSectionSegment reads of the inward wall rays (wall-rays.ts). */
export interface SectionRays { triangles: Uint32Array; exitCosine: Float32Array; exitTriangle: Int32Array }

/**
 * The medial segment of a flattened shaft fitted in direction and extent together (compare
 * fitMedialSegment, which only tries lengths along the line from the area centroid to the
 * centre). The wall rays say which surface is wall: an inward ray that leaves through the
 * other face of the wall head-on joins two triangles of which one must face out from the
 * shaft and the other in; a segment inside the wall makes both face out, a centre beside the
 * fragment makes them face obliquely. Rays that do not cross a wall head-on come mostly from
 * break faces, which should face neither way. Score of a model: area of wall pairs facing
 * squarely (|radial| >= 0.8) and oppositely plus area of the other rays' triangles facing
 * neither way. Candidates: segments through the point centre or the area centroid, in
 * `directions` directions across the axis, reaching each way by `reaches` times the
 * fragment's width across the axis, then refined by coordinate search. Kept only when it
 * scores at least `gain` more than the point centre. Where no segment is kept, the best point
 * centre of the same search (points only, from the consensus centre and the area centroid)
 * replaces the consensus centre when it scores at least `pointGain` more (and the support is
 * at least `pointSupportMin`) and keeps `pointLineShareMin` of its normal-line support: on a lobed section (a tibia's, r = ρ (1 + e cos 3θ)) the wall
 * normals lean up to atan(3e) from radial and their meeting point lands beside the axis, or,
 * where bevelled break faces outweigh the wall, inside the wall itself.
 */
export function fitSectionSegment(
  axis: ShaftAxis, centroids: Float32Array, normals: Float32Array, areas: Float64Array, rays: SectionRays,
  options: { reaches: number[]; directions: number; gain: number; headOnCosineMin: number; neitherWeight: number; neitherLossMax: number; supportMin: number; maxRows: number; pointGain?: number; pointSupportMin?: number; pointLineShareMin?: number; centreTolerance?: number },
  wall?: ShaftWallCheck,
): ShaftAxis {
  const segmentAllowed = axis.support >= options.supportMin;
  const pointAllowed = options.pointGain !== undefined && axis.support >= (options.pointSupportMin ?? options.supportMin);
  if (!(segmentAllowed || pointAllowed) || options.reaches.length === 0 || options.directions < 1) return axis;
  const [ax, ay, az] = axis.direction;
  const [[ux, uy, uz], [vx, vy, vz]] = acrossAxisBasis(axis.direction);
  // 2D rows: position and unit normal across the axis of the shooter (and of the exit for a wall pair).
  const px: number[] = [], py: number[] = [], mx: number[] = [], my: number[] = [], w: number[] = [];
  const ex: number[] = [], ey: number[] = [], enx: number[] = [], eny: number[] = [];
  let uMin = Infinity, uMax = -Infinity, vMin = Infinity, vMax = -Infinity, cu = 0, cv = 0, total = 0;
  const project = (f: number): [number, number, number, number, boolean] => {
    const nx = normals[3 * f], ny = normals[3 * f + 1], nz = normals[3 * f + 2];
    const mu = nx * ux + ny * uy + nz * uz, mv = nx * vx + ny * vy + nz * vz;
    const ml = hypot(mu, mv) || 1;
    return [
      centroids[3 * f] * ux + centroids[3 * f + 1] * uy + centroids[3 * f + 2] * uz,
      centroids[3 * f] * vx + centroids[3 * f + 1] * vy + centroids[3 * f + 2] * vz,
      mu / ml, mv / ml, Math.abs(nx * ax + ny * ay + nz * az) <= 0.342,
    ];
  };
  // An even sample of at most `maxRows` rays.
  const stride = Math.max(1, Math.ceil(rays.triangles.length / options.maxRows));
  for (let k = 0; k < rays.triangles.length; k += stride) {
    const f = rays.triangles[k];
    const [x, y, nu, nv, across] = project(f);
    uMin = Math.min(uMin, x); uMax = Math.max(uMax, x); vMin = Math.min(vMin, y); vMax = Math.max(vMax, y);
    cu += areas[f] * x; cv += areas[f] * y; total += areas[f];
    if (!across) continue;
    const g = rays.exitTriangle[k];
    px.push(x); py.push(y); mx.push(nu); my.push(nv); w.push(areas[f]);
    if (g >= 0 && rays.exitCosine[k] >= options.headOnCosineMin) {
      const [gx, gy, gu, gv] = project(g);
      ex.push(gx); ey.push(gy); enx.push(gu); eny.push(gv);
    } else {
      ex.push(NaN); ey.push(0); enx.push(0); eny.push(0);
    }
  }
  const n = w.length;
  if (n < 10 || !(total > 0)) return axis;
  cu /= total; cv /= total;
  const width = Math.max(uMax - uMin, vMax - vMin);
  const c0u = axis.point[0] * ux + axis.point[1] * uy + axis.point[2] * uz;
  const c0v = axis.point[0] * vx + axis.point[1] * vy + axis.point[2] * vz;
  // As in fitShaftAxis, on a clear shaft piece only (strictSupportMin): a point or segment inside
  // the wall (wall-crossing.ts, above strictShareMax) is refused; a segment is checked at its two
  // ends and its middle.
  const strict = strictWallCheck(wall, axis.support, axis.direction, centroids, normals, areas);
  const inWall = (su: number, sv: number): boolean => strict !== undefined && strict(su, sv);
  // Radial component of a 2D normal at (x, y) against the segment from (su, sv) along (du, dv), lengths h1 forward, h2 back.
  const radial = (x: number, y: number, nu: number, nv: number, su: number, sv: number, du: number, dv: number, h1: number, h2: number): number => {
    const rx = x - su, ry = y - sv;
    const s = Math.min(h1, Math.max(-h2, rx * du + ry * dv));
    const qx = rx - s * du, qy = ry - s * dv;
    return (qx * nu + qy * nv) / (hypot(qx, qy) || 1e-9);
  };
  const score = (su: number, sv: number, theta: number, h1: number, h2: number): number => {
    const du = Math.cos(theta), dv = Math.sin(theta);
    let s = 0;
    for (let k = 0; k < n; k++) {
      const r = radial(px[k], py[k], mx[k], my[k], su, sv, du, dv, h1, h2);
      if (Number.isNaN(ex[k])) {
        if (Math.abs(r) < 0.8) s += options.neitherWeight * w[k];
      } else {
        const re = radial(ex[k], ey[k], enx[k], eny[k], su, sv, du, dv, h1, h2);
        if (Math.abs(r) >= 0.8 && Math.abs(re) >= 0.8 && r * re < 0) s += w[k];
      }
    }
    return s;
  };
  type Model = { su: number; sv: number; theta: number; h1: number; h2: number; s: number };
  // Grid over starts, directions and reaches (points only when `reaches` is [0]), then coordinate search.
  const search = (reaches: number[]): Model => {
    let best: Model = { su: c0u, sv: c0v, theta: 0, h1: 0, h2: 0, s: score(c0u, c0v, 0, 0, 0) };
    for (const [su, sv] of [[c0u, c0v], [cu, cv]]) {
      for (let i = 0; i < (reaches.length > 1 ? options.directions : 1); i++) {
        const theta = (Math.PI * i) / options.directions;
        for (const k1 of reaches) for (const k2 of reaches) {
          const s = score(su, sv, theta, k1 * width, k2 * width);
          if (s > best.s) best = { su, sv, theta, h1: k1 * width, h2: k2 * width, s };
        }
      }
    }
    let step = 0.1 * width, turn = Math.PI / (2 * options.directions);
    const lengths = reaches.length > 1;
    for (let round = 0; round < 40 && step > 0.01 * width; round++) {
      let moved = false;
      const tries: Array<[number, number, number, number, number]> = [[step, 0, 0, 0, 0], [-step, 0, 0, 0, 0], [0, step, 0, 0, 0], [0, -step, 0, 0, 0]];
      if (lengths) tries.push([0, 0, turn, 0, 0], [0, 0, -turn, 0, 0], [0, 0, 0, step, 0], [0, 0, 0, -step, 0], [0, 0, 0, 0, step], [0, 0, 0, 0, -step]);
      for (const [a, b, t, c, d] of tries) {
        const h1 = best.h1 + c, h2 = best.h2 + d;
        if (h1 < 0 || h2 < 0) continue;
        const s = score(best.su + a, best.sv + b, best.theta + t, h1, h2);
        if (s > best.s) { best = { su: best.su + a, sv: best.sv + b, theta: best.theta + t, h1, h2, s }; moved = true; }
      }
      if (!moved) { step /= 2; turn /= 2; }
    }
    return best;
  };
  // A segment must beat the best point centre under the same score, not only the consensus one.
  const bestPoint = search([0]);
  const best = segmentAllowed ? search([0, ...options.reaches]) : bestPoint;
  const t0 = axis.point[0] * ax + axis.point[1] * ay + axis.point[2] * az;
  const at = (su: number, sv: number): [number, number, number] => [su * ux + sv * vx + t0 * ax, su * uy + sv * vy + t0 * ay, su * uz + sv * vz + t0 * az];
  if (!segmentAllowed || !(best.s > bestPoint.s * (1 + options.gain))) {
    const consensus = score(c0u, c0v, 0, 0, 0);
    // Normal lines passing the point within centreTolerance times their distance (weight 1 - x², as
    // consensusCentre scores): the searched point must keep pointLineShareMin of the consensus
    // centre's, or a round wall whose normals meet at the consensus centre is given up for
    // surface (a lens-shaped cavity's flat faces) that faces another point more squarely.
    const lines = (cu0: number, cv0: number): number => normalLineSupport(cu0, cv0, px, py, mx, my, w, options.centreTolerance ?? 0.45, Infinity);
    if (pointAllowed && bestPoint.s > consensus * (1 + options.pointGain!)
      && lines(bestPoint.su, bestPoint.sv) >= (options.pointLineShareMin ?? 0) * lines(c0u, c0v) && !inWall(bestPoint.su, bestPoint.sv)) {
      const point = at(bestPoint.su, bestPoint.sv);
      return { ...axis, point, radius: outerRadius(centroids, normals, areas, axis.direction, point) };
    }
    return axis;
  }
  // Veto: the segment may not turn the rays that cross no wall head-on (mostly break faces)
  // to face out or in more than the point centre did.
  const neither = (su: number, sv: number, theta: number, h1: number, h2: number): number => {
    const du = Math.cos(theta), dv = Math.sin(theta);
    let s = 0;
    for (let k = 0; k < n; k++) if (Number.isNaN(ex[k]) && Math.abs(radial(px[k], py[k], mx[k], my[k], su, sv, du, dv, h1, h2)) < 0.8) s += w[k];
    return s;
  };
  let loose = 0;
  for (let k = 0; k < n; k++) if (Number.isNaN(ex[k])) loose += w[k];
  if (neither(best.su, best.sv, best.theta, best.h1, best.h2) < neither(c0u, c0v, 0, 0, 0) - options.neitherLossMax * loose) return axis;
  const du = Math.cos(best.theta), dv = Math.sin(best.theta);
  if (inWall(best.su + best.h1 * du, best.sv + best.h1 * dv) || inWall(best.su - best.h2 * du, best.sv - best.h2 * dv)
    || inWall(best.su + 0.5 * (best.h1 - best.h2) * du, best.sv + 0.5 * (best.h1 - best.h2) * dv)) return axis;
  const d3: [number, number, number] = [du * ux + dv * vx, du * uy + dv * vy, du * uz + dv * vz];
  const t = axis.point[0] * ax + axis.point[1] * ay + axis.point[2] * az;
  const su = best.su - best.h2 * du, sv = best.sv - best.h2 * dv;
  const point: [number, number, number] = [su * ux + sv * vx + t * ax, su * uy + sv * vy + t * ay, su * uz + sv * vz + t * az];
  const length = best.h1 + best.h2;
  return { ...axis, point, medial: length > 0 ? { direction: d3, length } : undefined };
}

/** Two unit vectors across a unit axis direction a, u and v = a x u (u, v, a right-handed): the section plane's frame. */
export function acrossAxisBasis(a: [number, number, number]): [[number, number, number], [number, number, number]] {
  const [ax, ay, az] = a;
  let ux: number, uy: number, uz: number;
  if (Math.abs(ax) < 0.9) { ux = 0; uy = az; uz = -ay; } else { ux = -az; uy = 0; uz = ax; }
  const ul = hypot(ux, uy, uz);
  ux /= ul; uy /= ul; uz /= ul;
  return [[ux, uy, uz], [ay * uz - az * uy, az * ux - ax * uz, ax * uy - ay * ux]];
}
