/**
 * Align two fragments through their break faces: for a pair of faces, coarse motions from
 * FPFH correspondences and RANSAC, each refined by trimmed point-to-plane ICP against the other
 * fragment's surface, then scored. Faces are matched in part as well as in whole (RANSAC and
 * the trimmed ICP only need the shared patch), so one break face may meet several partners.
 */
import { icpPointToPlane } from '../registration/icp-point-to-plane';
import { ransacAlignFaces } from '../registration/ransac-alignment';
import { SampledSurface } from '../registration/target-surface';
import { rotationErrorDegrees, type RigidTransform } from '../registration/rigid-transform';
import { scoreJoin, type JoinScore, type ScoredSide } from '../registration/score';
import type { PreparedFace, PreparedFragment } from './prepared-fragment';

export const METHOD_VERSION = 'fpfh-ransac-icp/1';

export interface MatchParameters {
  ransacIterations: number;
  hypothesesPerPair: number;
  /** Share of ICP pairs kept each round. */
  icpTrim: number;
  /** Contact tolerance in sample spacings. */
  contactToleranceSpacings: number;
  seed: number;
}

export const DEFAULT_MATCH_PARAMETERS: MatchParameters = {
  ransacIterations: 5000,
  hypothesesPerPair: 5,
  icpTrim: 0.7,
  contactToleranceSpacings: 0.4,
  seed: 1,
};

export interface FaceMatch extends JoinScore {
  transform: RigidTransform;
  faceA: number;
  faceB: number;
}

function side(f: PreparedFragment, face: PreparedFace): ScoredSide {
  return { surface: f.surface, facePoints: face.points, faceNormals: face.normals, surfacePoints: f.surfacePoints, surfaceNormals: f.surfaceNormals, surfaceTree: f.surfaceTree, outline: face.outline };
}

/** Refined, scored motions carrying B's face fb onto A's face fa, best first. */
export function matchFacePair(a: PreparedFragment, fa: number, b: PreparedFragment, fb: number, params: MatchParameters = DEFAULT_MATCH_PARAMETERS): FaceMatch[] {
  const FA = a.faces[fa], FB = b.faces[fb];
  const spacing = Math.max(a.spacing, b.spacing);
  const hyps = ransacAlignFaces(
    { points: FB.points, normals: FB.normals, fpfh: FB.fpfh, tree: FB.tree },
    { points: FA.points, normals: FA.normals, fpfh: FA.fpfh, tree: FA.tree },
    { inlierDistance: 1.5 * spacing, iterations: params.ransacIterations, keep: params.hypothesesPerPair, seed: params.seed + 7919 * fa + 104729 * fb },
  );
  const out: FaceMatch[] = [];
  const tol = params.contactToleranceSpacings * spacing;
  const coarse = subsample(FB.points, FB.normals, 150);
  for (const h of hyps) {
    // coarse rounds on a subsample, then a few on every sample
    const first = icpPointToPlane(coarse.points, coarse.normals, new SampledSurface(FA.points, FA.normals, FA.tree), h.transform, {
      maxDistance: 3 * spacing,
      trim: params.icpTrim,
      maxIterations: 30,
      tolerance: 1e-3 * spacing,
    });
    const icp = icpPointToPlane(FB.points, FB.normals, a.surface, first.transform, {
      maxDistance: 1.5 * spacing,
      trim: params.icpTrim,
      maxIterations: 25,
      tolerance: 1e-4 * spacing,
    });
    const s = scoreJoin(side(a, FA), side(b, FB), icp.transform, { contactTolerance: tol });
    out.push({ ...s, transform: icp.transform, faceA: FA.parent, faceB: FB.parent });
  }
  return distinctBest(out, 2 * spacing);
}

/** At most `max` samples, evenly strided. */
function subsample(points: Float32Array, normals: Float32Array, max: number): { points: Float32Array; normals: Float32Array } {
  const n = points.length / 3;
  if (n <= max) return { points, normals };
  const step = n / max;
  const P = new Float32Array(3 * max), N = new Float32Array(3 * max);
  for (let k = 0; k < max; k++) {
    const i = Math.floor(k * step);
    P.set(points.subarray(3 * i, 3 * i + 3), 3 * k);
    N.set(normals.subarray(3 * i, 3 * i + 3), 3 * k);
  }
  return { points: P, normals: N };
}

/** Every face pair (or the given ones) of A and B, merged, best first. */
export function matchFragments(
  a: PreparedFragment,
  b: PreparedFragment,
  params: MatchParameters = DEFAULT_MATCH_PARAMETERS,
  facePairs?: Array<[number, number]>,
): FaceMatch[] {
  const pairs: Array<[number, number]> = facePairs ?? [];
  if (!facePairs) for (let i = 0; i < a.faces.length; i++) for (let j = 0; j < b.faces.length; j++) pairs.push([i, j]);
  const all: FaceMatch[] = [];
  for (const [i, j] of pairs) all.push(...matchFacePair(a, i, b, j, params));
  return distinctBest(all, 2 * Math.max(a.spacing, b.spacing));
}

/** Sort by score and drop motions that repeat a better one (within 3 degrees and `shift` mm). */
export function distinctBest(list: FaceMatch[], shift: number): FaceMatch[] {
  const sorted = [...list].sort((p, q) => q.score - p.score || q.contactFraction - p.contactFraction);
  const kept: FaceMatch[] = [];
  for (const m of sorted) {
    const dup = kept.some(
      (k) =>
        rotationErrorDegrees(k.transform, m.transform) < 3 &&
        Math.hypot(k.transform[3] - m.transform[3], k.transform[7] - m.transform[7], k.transform[11] - m.transform[11]) < shift,
    );
    if (!dup) kept.push(m);
  }
  return kept;
}
