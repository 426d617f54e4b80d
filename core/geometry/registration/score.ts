/**
 * How well a proposed motion joins two break faces, measured the way a person would check a
 * refit: how much of the break is in contact, how wide the gaps are, whether one piece runs
 * into the other, and whether the faces' outlines meet. The components are combined by a
 * logistic model so the score reads as the probability that the join is real (calibrated on
 * generated assemblages with known truth; see score-model.ts).
 */
import { hypot } from '../hypot';
import { applyToDirections, applyToPoints, invert, type RigidTransform } from './rigid-transform';
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { KdTree } from './nearest-neighbours';
import { scoreProbability, SIDE_MIN_OFF_AXIS, type ScoreComponents } from './score-model';
import type { ClosestPoint, TargetSurface } from './target-surface';
import { stridedSamples } from './strided-samples';
import type { ShaftFrame } from './shaft-axis-search';

export interface ScoredSide {
  surface: TargetSurface;
  /** The break face's samples (points, outward normals). */
  facePoints: Float32Array;
  faceNormals: Float32Array;
  /** Samples of the whole fragment surface with outward normals (for interpenetration). */
  surfacePoints: Float32Array;
  surfaceNormals: Float32Array;
  /** k-d tree over surfacePoints. */
  surfaceTree: KdTree;
  /** Points along the face's outline(s), packed xyz (may be empty). */
  outline: Float32Array;
  /** The piece's fitted shaft axis; null or absent when the piece is not a shaft. */
  axis?: ShaftFrame | null;
}

/** The score and the measured components it is computed from (see ScoreComponents). */
export interface JoinScore extends ScoreComponents {
  /** 0..1, reads as a probability that the join is real. */
  score: number;
}

export interface ScoreOptions {
  /** Distance that counts as contact (mm). */
  contactTolerance: number;
  /** Distance between face samples (mm), for contact areas; default contactTolerance / 0.4. */
  spacing?: number;
}

/** Face samples judged per side at most (evenly strided): shares need no more. */
const MAX_FACE_SAMPLES = 400;

export function scoreJoin(a: ScoredSide, b: ScoredSide, transform: RigidTransform, options: ScoreOptions): JoinScore {
  return deferredScore(a, b, transform, options).complete();
}

/**
 * A join's score with its costliest component, the interpenetration, left for later: `upper` is
 * the highest score any interpenetration could give (the score with none, as the model's slope
 * for it is negative), so a caller that needs only the best few motions can leave out the motions whose
 * upper bound cannot reach them (pairwise-match.ts, bestDistinct). `complete()` gives exactly
 * what scoreJoin gives.
 */
export interface DeferredScore {
  upper: number;
  contactFraction: number;
  complete(): JoinScore;
}

export function deferredScore(a: ScoredSide, b: ScoredSide, transform: RigidTransform, options: ScoreOptions): DeferredScore {
  const tol = options.contactTolerance;
  const inv = invert(transform);
  const fb = stridedSamples(b.facePoints, b.faceNormals, MAX_FACE_SAMPLES), fa = stridedSamples(a.facePoints, a.faceNormals, MAX_FACE_SAMPLES);
  const bFaceInA = applyToPoints(transform, fb.points);
  const bFaceNormalsInA = applyToDirections(transform, fb.normals);
  const aFaceInB = applyToPoints(inv, fa.points);
  const aFaceNormalsInB = applyToDirections(inv, fa.normals);
  const cb = contactShare(bFaceInA, bFaceNormalsInA, a.surface, tol);
  const ca = contactShare(aFaceInB, aFaceNormalsInB, b.surface, tol);
  const interlock = Math.min(interlockOf(bFaceInA, bFaceNormalsInA, cb.touching), interlockOf(aFaceInB, aFaceNormalsInB, ca.touching));
  const contactFraction = Math.max(ca.share, cb.share);
  const contactFractionOther = Math.min(ca.share, cb.share);
  const gapSum = ca.gapSum + cb.gapSum, gapN = ca.gapN + cb.gapN;
  const gapRmsMm = gapN > 0 ? Math.sqrt(gapSum / gapN) : 3 * tol;
  const contactN = ca.contactN + cb.contactN;
  const contactGapRmsMm = contactN > 0 ? Math.sqrt((ca.contactSum + cb.contactSum) / contactN) : tol;
  const outlineAgreement = outlineMeeting(a.outline, applyToPoints(transform, b.outline), 2 * tol);
  const spacing = options.spacing ?? tol / 0.4;
  const contactAreaMm2 = Math.min(ca.share * (a.facePoints.length / 3), cb.share * (b.facePoints.length / 3)) * spacing * spacing;
  const axes = axisAgreement(a.axis, b.axis, transform, bFaceInA);
  const withPenetration = (penetrationMm: number): ScoreComponents => ({ contactFraction, contactFractionOther, contactAreaMm2, gapRmsMm, contactGapRmsMm, penetrationMm, outlineAgreement, interlock, ...axes });
  return {
    // the model is linear in the capped interpenetration (0 to 3 mm, score-model.ts): its best is at an end
    upper: Math.max(scoreProbability(withPenetration(0)), scoreProbability(withPenetration(3))),
    contactFraction,
    complete: (): JoinScore => {
      // only surface samples near the other piece's face can be inside it within a wall's depth
      const penetrationMm = Math.max(
        penetration(near(applyToPoints(transform, b.surfacePoints), a.facePoints, MAX_DEPTH_MM), a),
        penetration(near(applyToPoints(inv, a.surfacePoints), b.facePoints, MAX_DEPTH_MM), b),
      );
      const components = withPenetration(penetrationMm);
      return { score: scoreProbability(components), ...components };
    },
  };
}

/**
 * Whether the two pieces' shaft axes lie on one line under the motion (the outer surfaces of
 * two joined shaft pieces continue one another, medullary into medullary): the distance
 * between the two axis lines where they pass the join (at B's face centroid, measured across
 * A's axis), over the larger fitted radius, and the angle between the lines. A piece turned end
 * over end about a direction in a longitudinal break face keeps the face in contact but puts
 * its axis on the far side of the wall (offset about twice the wall's mean radius, and the
 * directions from the join across to the two axes opposed: axisSide about -1). Also the ratio
 * of the two fitted radii (pieces of one shaft have about the same).
 */
export function axisAgreement(axisA: ShaftFrame | null | undefined, axisB: ShaftFrame | null | undefined, transform: RigidTransform, bFaceInA: Float64Array | Float32Array): { axesCompared: number; axisOffset: number; axisAngleDeg: number; axisSide: number; radiusRatio: number } {
  if (!axisA || !axisB || !(axisA.radius > 0) || !(axisB.radius > 0) || bFaceInA.length < 3) return { axesCompared: 0, axisOffset: 0, axisAngleDeg: 0, axisSide: 1, radiusRatio: 1 };
  const n = bFaceInA.length / 3;
  const c = [0, 0, 0];
  for (let i = 0; i < n; i++) for (let k = 0; k < 3; k++) c[k] += bFaceInA[3 * i + k] / n;
  const dA = axisA.direction, pA = axisA.point;
  const dB = applyToDirections(transform, Float64Array.from(axisB.direction));
  const pB = applyToPoints(transform, Float64Array.from(axisB.point));
  const cos = Math.min(1, Math.abs(dA[0] * dB[0] + dA[1] * dB[1] + dA[2] * dB[2]));
  // the points of both lines in the plane through c across A's axis
  const onLine = (p: ArrayLike<number>, d: ArrayLike<number>): number[] => {
    const den = d[0] * dA[0] + d[1] * dA[1] + d[2] * dA[2];
    const t = Math.abs(den) > 0.2 ? ((c[0] - p[0]) * dA[0] + (c[1] - p[1]) * dA[1] + (c[2] - p[2]) * dA[2]) / den : 0;
    return [p[0] + t * d[0], p[1] + t * d[1], p[2] + t * d[2]];
  };
  const qa = onLine(pA, dA), qb = onLine(pB, dB);
  const offset = hypot(qa[0] - qb[0], qa[1] - qb[1], qa[2] - qb[2]) / Math.max(axisA.radius, axisB.radius);
  // which side of the wall each axis lies on, seen from the join: from c across to each line
  const across = (q: number[], d: ArrayLike<number>): number[] => {
    const v = [q[0] - c[0], q[1] - c[1], q[2] - c[2]];
    const t = v[0] * d[0] + v[1] * d[1] + v[2] * d[2];
    const w = [v[0] - t * d[0], v[1] - t * d[1], v[2] - t * d[2]];
    const l = hypot(w[0], w[1], w[2]) || 1;
    return [w[0] / l, w[1] / l, w[2] / l];
  };
  const ua = across(qa, dA), ub = across(qb, dB);
  // the side is only defined seen from a join off A's axis (SIDE_MIN_OFF_AXIS): c - qa lies across A's axis
  const fromAxis = hypot(qa[0] - c[0], qa[1] - c[1], qa[2] - c[2]);
  return {
    axesCompared: 1,
    axisOffset: offset,
    axisAngleDeg: (Math.acos(cos) * 180) / Math.PI,
    axisSide: fromAxis < SIDE_MIN_OFF_AXIS * axisA.radius ? 1 : ua[0] * ub[0] + ua[1] * ub[1] + ua[2] * ub[2],
    radiusRatio: Math.max(axisA.radius, axisB.radius) / Math.min(axisA.radius, axisB.radius),
  };
}

/**
 * Interlock of the face samples that touch the other surface, with the samples' own (voxel
 * averaged, so less noisy) normals; the smaller of the two sides is what counts, since a flat
 * face against a rough one can still slide.
 */
/** Samples farther than this from the other surface are not judged inside it (about a cortical wall's thickness; common practice). */
const MAX_DEPTH_MM = 6;

function interlockOf(points: ArrayLike<number>, normals: ArrayLike<number>, kept: number[]): number {
  if (kept.length < 12) return 0;
  let cx = 0, cy = 0, cz = 0;
  for (const i of kept) {
    cx += points[3 * i]; cy += points[3 * i + 1]; cz += points[3 * i + 2];
  }
  cx /= kept.length; cy /= kept.length; cz /= kept.length;
  let rg = 0;
  for (const i of kept) rg += (points[3 * i] - cx) ** 2 + (points[3 * i + 1] - cy) ** 2 + (points[3 * i + 2] - cz) ** 2;
  rg = Math.sqrt(rg / kept.length) || 1;
  const M = Array.from({ length: 6 }, () => new Array<number>(6).fill(0));
  for (const i of kept) {
    const x = points[3 * i] - cx, y = points[3 * i + 1] - cy, z = points[3 * i + 2] - cz;
    const nx = normals[3 * i], ny = normals[3 * i + 1], nz = normals[3 * i + 2];
    const r = [(y * nz - z * ny) / rg, (z * nx - x * nz) / rg, (x * ny - y * nx) / rg, nx, ny, nz];
    for (let a = 0; a < 6; a++) for (let b = 0; b < 6; b++) M[a][b] += r[a] * r[b];
  }
  const e = new EigenvalueDecomposition(new Matrix(M), { assumeSymmetric: true }).realEigenvalues;
  const lo = Math.max(0, Math.min(...e)), hi = Math.max(...e);
  return hi > 0 ? Math.sqrt(lo / hi) : 0;
}

/**
 * Share of face samples within `tol` of the other surface with opposed normals, the squared gaps
 * of those within 3 tol and of those in contact, and (for the interlock) every sample within
 * `tol` whatever its normal.
 */
function contactShare(points: ArrayLike<number>, normals: ArrayLike<number>, surface: TargetSurface, tol: number): { share: number; gapSum: number; gapN: number; contactSum: number; contactN: number; touching: number[] } {
  const n = points.length / 3;
  const touching: number[] = [];
  if (n === 0) return { share: 0, gapSum: 0, gapN: 0, contactSum: 0, contactN: 0, touching };
  let inContact = 0, gapSum = 0, gapN = 0, contactSum = 0;
  const cp = {} as ClosestPoint;
  for (let i = 0; i < n; i++) {
    const hit = surface.closest(points[3 * i], points[3 * i + 1], points[3 * i + 2], 3 * tol, cp);
    if (!hit) continue;
    if (hit.distance <= tol) touching.push(i);
    const c = normals[3 * i] * hit.nx + normals[3 * i + 1] * hit.ny + normals[3 * i + 2] * hit.nz;
    if (c > -0.5) continue;
    gapSum += hit.distance * hit.distance;
    gapN++;
    if (hit.distance <= tol) {
      inContact++;
      contactSum += hit.distance * hit.distance;
    }
  }
  return { share: inContact / n, gapSum, gapN, contactSum, contactN: inContact, touching };
}

/**
 * 98th percentile of how deep samples sit inside the other piece (0 when outside). Depth is
 * the distance to the closest surface point (BVH); a sample is inside when both the vote of the
 * nearest surface samples' normals (which a single sliver triangle with a flipped normal, common
 * in scans, cannot swing) and the closest triangle's own normal say so (at a thin wall the
 * nearest samples may belong to its far side).
 */
function penetration(points: ArrayLike<number>, other: ScoredSide): number {
  const n = points.length / 3;
  if (n === 0) return 0;
  // depth of each sample (0 when outside), sorted numerically below (typed-array sort: same order, no comparator calls)
  const depths = new Float64Array(n);
  const cp = {} as ClosestPoint;
  const q = [0, 0, 0];
  const P = other.surfacePoints, N = other.surfaceNormals;
  for (let i = 0; i < n; i++) {
    const x = points[3 * i], y = points[3 * i + 1], z = points[3 * i + 2];
    const hit = other.surface.closest(x, y, z, MAX_DEPTH_MM, cp);
    if (!hit) continue;
    // direction from the surface to the sample against the mean normal of the samples around
    // the closest point (same side of a thin wall as the hit); rims, where that direction is
    // ambiguous, and samples farther than a cortical wall is thick are not counted
    if (hit.distance > MAX_DEPTH_MM || hit.distance < 1e-9) continue;
    q[0] = hit.x; q[1] = hit.y; q[2] = hit.z;
    const near = other.surfaceTree.nearest(q, 4);
    let mx = 0, my = 0, mz = 0;
    for (let m = 0; m < near.indices.length; m++) {
      const j = near.indices[m];
      const w = 1 / (Math.sqrt(near.dist2[m]) + 1e-3);
      mx += w * N[3 * j]; my += w * N[3 * j + 1]; mz += w * N[3 * j + 2];
    }
    const ml = hypot(mx, my, mz) || 1;
    const c = ((x - hit.x) * mx + (y - hit.y) * my + (z - hit.z) * mz) / (ml * hit.distance);
    // ...and the closest triangle's own normal must agree: at a thin wall or a sharp rim (the tip
    // of a v-shaped or spiral break) the nearest samples can lie on the far side, whose normals
    // point the other way, and outvote the triangle the sample actually faces (true joins read
    // 4-6 mm deep at their exact motion). A flipped sliver triangle can now only hide a sample
    // that is inside, never invent one that is not.
    const own = (x - hit.x) * hit.nx + (y - hit.y) * hit.ny + (z - hit.z) * hit.nz;
    if (c < -0.5 && own < 0) depths[i] = hit.distance;
  }
  depths.sort();
  return depths[Math.min(n - 1, Math.floor(0.98 * n))];
}

/** The points inside the bounding box of `around` grown by `margin`. */
function near(points: Float32Array | Float64Array, around: Float32Array, margin: number): Float64Array {
  const lo = [Infinity, Infinity, Infinity], hi = [-Infinity, -Infinity, -Infinity];
  for (let i = 0; i < around.length; i += 3) for (let k = 0; k < 3; k++) {
    lo[k] = Math.min(lo[k], around[i + k] - margin);
    hi[k] = Math.max(hi[k], around[i + k] + margin);
  }
  const out: number[] = [];
  for (let i = 0; i < points.length; i += 3) {
    const x = points[i], y = points[i + 1], z = points[i + 2];
    if (x >= lo[0] && x <= hi[0] && y >= lo[1] && y <= hi[1] && z >= lo[2] && z <= hi[2]) out.push(x, y, z);
  }
  return Float64Array.from(out);
}

/** Share of outline samples of either side with a sample of the other side's outline nearby (better side). */
function outlineMeeting(a: Float32Array, bMoved: Float32Array | Float64Array, within: number): number {
  if (a.length < 3 || bMoved.length < 3) return 0;
  const ta = new KdTree(a, 3), tb = new KdTree(bMoved, 3);
  const share = (pts: ArrayLike<number>, tree: KdTree): number => {
    const n = pts.length / 3;
    let k = 0;
    const q = [0, 0, 0];
    for (let i = 0; i < n; i++) {
      q[0] = pts[3 * i]; q[1] = pts[3 * i + 1]; q[2] = pts[3 * i + 2];
      if (tree.nearestOne(q, within * within).index >= 0) k++;
    }
    return k / n;
  };
  return Math.max(share(a, tb), share(bMoved, ta));
}
