/**
 * Poses of a refit set's members in one frame, from its accepted conjoins (each a rigid motion
 * B -> A): a maximum-weight spanning tree of the pose graph gives a first pose per member,
 * then block relaxation (each pose re-estimated as the weighted mean of what its joins say:
 * quaternions averaged after Markley et al. 2007's sign alignment, translations averaged) lets
 * the joins that close cycles agree. The residual of every join says how well the cycle closes.
 */
import { hypot } from '../hypot';
import {
  applyToPoint,
  compose,
  identityTransform,
  invert,
  quaternionOf,
  rotationErrorDegrees,
  rotationFromQuaternion,
  transformFrom,
  type RigidTransform,
} from '../registration/rigid-transform';

export interface PoseEdge {
  /** Member ids; transform maps b's scan frame into a's. */
  a: string;
  b: string;
  transform: RigidTransform;
  /** Trust in this join (e.g. its score); higher edges go into the spanning tree first. */
  weight?: number;
}

export interface EdgeResidual {
  a: string;
  b: string;
  rotationDeg: number;
  /** Disagreement (mm) at b's centroid (or b's origin when no centroid is given). */
  translationMm: number;
  inTree: boolean;
}

export interface PoseSolution {
  /** The member whose frame the poses are in. */
  root: string;
  /** Each member's scan frame -> root's scan frame. */
  poses: Map<string, RigidTransform>;
  residuals: EdgeResidual[];
}

/**
 * Poses for one connected set of members. Members not reached from the root (another
 * component) are left out; call once per refit set.
 */
export function solvePoses(edges: PoseEdge[], options: { root?: string; centroids?: Map<string, ArrayLike<number>>; iterations?: number } = {}): PoseSolution {
  const nodes = new Set<string>();
  for (const e of edges) {
    nodes.add(e.a);
    nodes.add(e.b);
  }
  const sorted = [...edges].sort((p, q) => (q.weight ?? 1) - (p.weight ?? 1));
  const parent = new Map<string, string>();
  for (const n of nodes) parent.set(n, n);
  const find = (x: string): string => {
    let r = x;
    while (parent.get(r) !== r) r = parent.get(r)!;
    parent.set(x, r);
    return r;
  };
  const tree: PoseEdge[] = [];
  const inTree = new Set<PoseEdge>();
  for (const e of sorted) {
    const ra = find(e.a), rb = find(e.b);
    if (ra === rb) continue;
    parent.set(ra, rb);
    tree.push(e);
    inTree.add(e);
  }
  const degree = new Map<string, number>();
  for (const e of edges) {
    degree.set(e.a, (degree.get(e.a) ?? 0) + 1);
    degree.set(e.b, (degree.get(e.b) ?? 0) + 1);
  }
  const root = options.root ?? [...nodes].sort((p, q) => (degree.get(q) ?? 0) - (degree.get(p) ?? 0) || p.localeCompare(q))[0] ?? '';
  const poses = new Map<string, RigidTransform>();
  if (!root) return { root, poses, residuals: [] };
  poses.set(root, identityTransform());
  // breadth-first over the tree
  let frontier = [root];
  while (frontier.length) {
    const next: string[] = [];
    for (const v of frontier) {
      for (const e of tree) {
        if (e.a === v && !poses.has(e.b)) {
          poses.set(e.b, compose(poses.get(v)!, e.transform));
          next.push(e.b);
        } else if (e.b === v && !poses.has(e.a)) {
          poses.set(e.a, compose(poses.get(v)!, invert(e.transform)));
          next.push(e.a);
        }
      }
    }
    frontier = next;
  }
  const inComponent = edges.filter((e) => poses.has(e.a) && poses.has(e.b));
  const iterations = options.iterations ?? (inComponent.length > tree.length ? 100 : 0);
  for (let it = 0; it < iterations; it++) {
    for (const v of poses.keys()) {
      if (v === root) continue;
      const estimates: Array<{ T: RigidTransform; w: number }> = [];
      for (const e of inComponent) {
        if (e.b === v) estimates.push({ T: compose(poses.get(e.a)!, e.transform), w: e.weight ?? 1 });
        else if (e.a === v) estimates.push({ T: compose(poses.get(e.b)!, invert(e.transform)), w: e.weight ?? 1 });
      }
      if (estimates.length > 1) poses.set(v, averageTransforms(estimates));
    }
  }
  const residuals: EdgeResidual[] = inComponent.map((e) => {
    const predicted = compose(invert(poses.get(e.a)!), poses.get(e.b)!); // b -> a from the poses
    const c = options.centroids?.get(e.b) ?? [0, 0, 0];
    const p1 = applyToPoint(predicted, c[0], c[1], c[2]), p2 = applyToPoint(e.transform, c[0], c[1], c[2]);
    return {
      a: e.a,
      b: e.b,
      rotationDeg: rotationErrorDegrees(predicted, e.transform),
      translationMm: hypot(p1[0] - p2[0], p1[1] - p2[1], p1[2] - p2[2]),
      inTree: inTree.has(e),
    };
  });
  return { root, poses, residuals };
}

/** Weighted mean of rigid motions: quaternion mean (signs aligned to the first) and mean translation. */
export function averageTransforms(list: Array<{ T: RigidTransform; w: number }>): RigidTransform {
  const q0 = quaternionOf(list[0].T);
  const q = [0, 0, 0, 0];
  const t = [0, 0, 0];
  let W = 0;
  for (const { T, w } of list) {
    const qi = quaternionOf(T);
    const s = qi[0] * q0[0] + qi[1] * q0[1] + qi[2] * q0[2] + qi[3] * q0[3] < 0 ? -1 : 1;
    for (let k = 0; k < 4; k++) q[k] += w * s * qi[k];
    t[0] += w * T[3]; t[1] += w * T[7]; t[2] += w * T[11];
    W += w;
  }
  return transformFrom(rotationFromQuaternion(q[0], q[1], q[2], q[3]), [t[0] / W, t[1] / W, t[2] / W]);
}

/**
 * How well a proposed join (b -> a) agrees with the poses of accepted joins, when both pieces
 * are already in one solved set: rotation (degrees) and shift (mm at b's centroid). null when
 * the proposal does not close a cycle.
 */
export function cycleAgreement(solution: PoseSolution, a: string, b: string, transform: RigidTransform, centroidB: ArrayLike<number> = [0, 0, 0]): { rotationDeg: number; translationMm: number } | null {
  const pa = solution.poses.get(a), pb = solution.poses.get(b);
  if (!pa || !pb) return null;
  const predicted = compose(invert(pa), pb);
  const p1 = applyToPoint(predicted, centroidB[0], centroidB[1], centroidB[2]);
  const p2 = applyToPoint(transform, centroidB[0], centroidB[1], centroidB[2]);
  return { rotationDeg: rotationErrorDegrees(predicted, transform), translationMm: hypot(p1[0] - p2[0], p1[1] - p2[1], p1[2] - p2[2]) };
}
