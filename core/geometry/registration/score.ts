/**
 * How well a proposed motion joins two break faces, measured the way a person would check a
 * refit: how much of the break is in contact, how wide the gaps are, whether one piece runs
 * into the other, and whether the faces' outlines meet. The components are combined by a
 * logistic model so the score reads as the probability that the join is real (calibrated on
 * generated assemblages with known truth; see SCORE_MODEL).
 */
import { applyToDirections, applyToPoints, invert, type RigidTransform } from './rigid-transform';
import { KdTree } from './nearest-neighbours';
import type { ClosestPoint, TargetSurface } from './target-surface';

export interface ScoredSide {
  surface: TargetSurface;
  /** The break face's samples (points, outward normals). */
  facePoints: Float32Array;
  faceNormals: Float32Array;
  /** Samples of the whole fragment surface (for interpenetration). */
  surfacePoints: Float32Array;
  /** Points along the face's outline(s), packed xyz (may be empty). */
  outline: Float32Array;
}

export interface JoinScore {
  /** 0..1, reads as a probability that the join is real. */
  score: number;
  /** Share of break-face samples within `contactTolerance` of the other piece with opposed normals (the better-covered side). */
  contactFraction: number;
  /** The same share on the less-covered side. */
  contactFractionOther: number;
  /** RMS distance (mm) between the faces where they face each other within 3 tolerances. */
  gapRmsMm: number;
  /** Depth (mm) that the deepest 2% of one piece's surface samples reach inside the other. */
  penetrationMm: number;
  /** Share of outline samples that meet the other face's outline within 2 tolerances (better side). */
  outlineAgreement: number;
}

export interface ScoreOptions {
  /** Distance that counts as contact (mm). */
  contactTolerance: number;
}

/**
 * Logistic model over the components: logit = b0 + b1 contact + b2 contactOther + b3 outline
 * - b4 gap/tol - b5 penetration/tol. Coefficients fitted on generated truth (see
 * tests/bench/proposals.bench.ts); the starting values were chosen by hand.
 */
export const SCORE_MODEL = { b0: -7, contact: 7, contactOther: 3, outline: 3, gap: 1.2, penetration: 1.0 };

export function scoreJoin(a: ScoredSide, b: ScoredSide, transform: RigidTransform, options: ScoreOptions): JoinScore {
  const tol = options.contactTolerance;
  const inv = invert(transform);
  const bFaceInA = applyToPoints(transform, b.facePoints);
  const bFaceNormalsInA = applyToDirections(transform, b.faceNormals);
  const aFaceInB = applyToPoints(inv, a.facePoints);
  const aFaceNormalsInB = applyToDirections(inv, a.faceNormals);
  const cb = contactShare(bFaceInA, bFaceNormalsInA, a.surface, tol);
  const ca = contactShare(aFaceInB, aFaceNormalsInB, b.surface, tol);
  const contactFraction = Math.max(ca.share, cb.share);
  const contactFractionOther = Math.min(ca.share, cb.share);
  const gapSum = ca.gapSum + cb.gapSum, gapN = ca.gapN + cb.gapN;
  const gapRmsMm = gapN > 0 ? Math.sqrt(gapSum / gapN) : 3 * tol;
  const penetrationMm = Math.max(
    penetration(applyToPoints(transform, b.surfacePoints), a.surface),
    penetration(applyToPoints(inv, a.surfacePoints), b.surface),
  );
  const outlineAgreement = outlineMeeting(a.outline, applyToPoints(transform, b.outline), 2 * tol);
  const m = SCORE_MODEL;
  const logit =
    m.b0 + m.contact * contactFraction + m.contactOther * contactFractionOther + m.outline * outlineAgreement -
    m.gap * (gapRmsMm / tol) - m.penetration * (penetrationMm / tol);
  const score = 1 / (1 + Math.exp(-logit));
  return { score, contactFraction, contactFractionOther, gapRmsMm, penetrationMm, outlineAgreement };
}

function contactShare(points: ArrayLike<number>, normals: ArrayLike<number>, surface: TargetSurface, tol: number): { share: number; gapSum: number; gapN: number } {
  const n = points.length / 3;
  if (n === 0) return { share: 0, gapSum: 0, gapN: 0 };
  let inContact = 0, gapSum = 0, gapN = 0;
  const cp = {} as ClosestPoint;
  for (let i = 0; i < n; i++) {
    const hit = surface.closest(points[3 * i], points[3 * i + 1], points[3 * i + 2], 3 * tol, cp);
    if (!hit) continue;
    const c = normals[3 * i] * hit.nx + normals[3 * i + 1] * hit.ny + normals[3 * i + 2] * hit.nz;
    if (c > -0.5) continue;
    gapSum += hit.distance * hit.distance;
    gapN++;
    if (hit.distance <= tol) inContact++;
  }
  return { share: inContact / n, gapSum, gapN };
}

/** 98th percentile of how deep samples sit inside the surface (0 when they are outside). */
function penetration(points: ArrayLike<number>, surface: TargetSurface): number {
  const n = points.length / 3;
  if (n === 0) return 0;
  const depths: number[] = [];
  const cp = {} as ClosestPoint;
  for (let i = 0; i < n; i++) {
    const x = points[3 * i], y = points[3 * i + 1], z = points[3 * i + 2];
    const hit = surface.closest(x, y, z, Infinity, cp);
    if (!hit) continue;
    const side = (x - hit.x) * hit.nx + (y - hit.y) * hit.ny + (z - hit.z) * hit.nz;
    // inside: behind the closest triangle, and clearly so (not a grazing touch at an edge)
    depths.push(side < 0 && -side > 0.5 * hit.distance ? hit.distance : 0);
  }
  depths.sort((p, q) => p - q);
  return depths[Math.min(depths.length - 1, Math.floor(0.98 * depths.length))] ?? 0;
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
