/**
 * Where to lay the shared shaft axis when two pieces' fitted radii disagree (design.md section 7,
 * notes for long bones: the outer surfaces of two joined shaft pieces continue one another).
 * A fit on a partial arc of a flattened or lobed section reads the local curvature, not the bone's:
 * the splinter from the flat side of an elliptic shaft fits a far centre and a large radius, its
 * partner from the tight end a near one and a small radius. Laying the two axes on one line then
 * puts the two outer surfaces apart at the join by the difference of the radii, and the search
 * about the shared axis, which pairs samples at about the same radius, finds nothing there.
 * What both pieces agree on is the join itself: there the outer surface lies at the face's outer
 * radius from each piece's own axis. So A's axis is moved across itself, towards A's face, by the
 * difference of the two faces' outer radii, which makes B's outer circle touch A's at A's face; the
 * search then runs about the moved axis. Each face's outer radius is a high quantile of its
 * samples' distances from its own axis (the face spans the wall from the medullary to the outer
 * edge). A face whose centroid lies near A's axis (a break across the whole shaft, whose centroid
 * is the ring's centre; SIDE_MIN_OFF_AXIS of the outer radius) gives no direction to move in, and
 * A's axis is kept.
 */
import type { ShaftFrame } from './shaft-axis-search';
import { kthSmallest } from '../kth-smallest';
import { SIDE_MIN_OFF_AXIS } from './score-model';

/**
 * A's frame moved so that B's outer surface (radius about its own axis) meets A's at A's face;
 * `quantile` reads each face's outer radius. `move`: how far it moved (A's face outer radius
 * minus B's; 0 when kept).
 */
export function axisMeetingOuterSurface(
  axisA: ShaftFrame,
  faceAPoints: ArrayLike<number>,
  axisB: ShaftFrame,
  faceBPoints: ArrayLike<number>,
  quantile: number,
): { frame: ShaftFrame; move: number } {
  const na = faceAPoints.length / 3, nb = faceBPoints.length / 3;
  if (na < 3 || nb < 3) return { frame: axisA, move: 0 };
  const across = (axis: ShaftFrame, p: ArrayLike<number>, i: number, out: number[]): number[] => {
    const d = axis.direction, o = axis.point;
    const x = p[3 * i] - o[0], y = p[3 * i + 1] - o[1], z = p[3 * i + 2] - o[2];
    const t = x * d[0] + y * d[1] + z * d[2];
    out[0] = x - t * d[0]; out[1] = y - t * d[1]; out[2] = z - t * d[2];
    return out;
  };
  const w = [0, 0, 0], c = [0, 0, 0];
  const outer = (axis: ShaftFrame, p: ArrayLike<number>, n: number, sum?: number[]): number => {
    const r = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      across(axis, p, i, w);
      r[i] = Math.hypot(w[0], w[1], w[2]);
      if (sum) { sum[0] += w[0] / n; sum[1] += w[1] / n; sum[2] += w[2] / n; }
    }
    return kthSmallest(r, Math.min(n - 1, Math.max(0, Math.floor(quantile * n))));
  };
  const ra = outer(axisA, faceAPoints, na, c), rb = outer(axisB, faceBPoints, nb);
  const off = Math.hypot(c[0], c[1], c[2]);
  if (!(off >= SIDE_MIN_OFF_AXIS * ra) || !(rb > 0)) return { frame: axisA, move: 0 };
  const m = (ra - rb) / off, o = axisA.point;
  return { frame: { direction: axisA.direction, point: [o[0] + m * c[0], o[1] + m * c[1], o[2] + m * c[2]], radius: rb }, move: ra - rb };
}
