/**
 * Distances and directions between two points on the site grid (analytic geometry).
 * x is easting, y is northing, z is elevation; all in metres.
 */

export interface GridPoint {
  x: number;
  y: number;
  z: number;
}

/** Distance in plan, ignoring elevation: sqrt(dx^2 + dy^2). */
export function horizontalDistance(a: GridPoint, b: GridPoint): number {
  return Math.hypot(b.x - a.x, b.y - a.y);
}

/** Vertical displacement: the absolute difference in elevation. */
export function verticalDisplacement(a: GridPoint, b: GridPoint): number {
  return Math.abs(b.z - a.z);
}

/** Straight-line distance in space: sqrt(dx^2 + dy^2 + dz^2). */
export function distance3d(a: GridPoint, b: GridPoint): number {
  return Math.hypot(b.x - a.x, b.y - a.y, b.z - a.z);
}

/**
 * Bearing from A to B, in degrees clockwise from grid north (+y), in [0, 360).
 * atan2 takes the east component first because bearings run from north towards east.
 * Null when A and B have the same x and y: a vertical join has no direction in plan.
 */
export function bearingDeg(a: GridPoint, b: GridPoint): number | null {
  const dx = b.x - a.x;
  const dy = b.y - a.y;
  if (dx === 0 && dy === 0) return null;
  const deg = (Math.atan2(dx, dy) * 180) / Math.PI;
  const normalised = deg < 0 ? deg + 360 : deg;
  return normalised >= 360 ? 0 : normalised;
}

/** Fold a bearing onto [0, 180): a join has no preferred end, so 30 and 210 degrees are one axis. */
export function axialBearing(bearing: number): number {
  const folded = bearing % 180;
  return folded < 0 ? folded + 180 : folded;
}
