import { acrossAxisBasis, type ShaftWallCheck } from './shaft-axis';
import { wallCrossingShare, wallSegments } from './wall-crossing';

/**
 * The strict wall check of a candidate axis centre on a clear shaft piece: where the piece's
 * axis support is at least the check's strictSupportMin (no bone end, so the axis runs through
 * the cavity or the air about the piece all along it), a predicate telling whether a centre
 * (cu, cv), in the plane across `direction` of acrossAxisBasis, lies inside the wall: its
 * wall-crossing share (wall-crossing.ts) is above strictShareMax. Undefined where the strict
 * check does not apply (no check given, strictShareMax 0, or lower support). Used by the
 * section segment / point search (shaft-axis.ts fitSectionSegment) and the elliptic section
 * (shaft-section.ts fitEllipseSection), which both may move the centre the consensus checked;
 * `shareMax` replaces the check's strictShareMax (the elliptic section's own share).
 */
export function strictWallCheck(
  wall: ShaftWallCheck | undefined, support: number, direction: [number, number, number],
  centroids: Float32Array, normals: Float32Array, areas: Float64Array, shareMax = wall?.strictShareMax ?? 0,
): ((cu: number, cv: number) => boolean) | undefined {
  if (!wall || !(shareMax > 0) || !(support >= (wall.strictSupportMin ?? Infinity))) return undefined;
  const [u, v] = acrossAxisBasis(direction);
  const segments = wallSegments(wall.rays, centroids, normals, areas, direction, u, v);
  return (cu, cv) => wallCrossingShare(segments, cu, cv, wall.tolerance) > shareMax;
}
