import { hypot } from './hypot';

/**
 * The inside of the wall as the inward wall rays (wall-rays.ts) saw it, seen along a shaft
 * direction: each ray that left the fragment again ran from its shooter's centroid to its exit
 * point through the material, so its segment, projected onto the plane across the axis, lies
 * in the section's wall. A shaft's axis runs through the medullary cavity (or, for a splinter,
 * through the air that was the cavity), never through the cortex: a candidate axis centre that
 * the rays aimed at it reach before they leave the material lies inside the wall
 * (wallCrossingShare).
 * Rows of five numbers per ray: start (u, v), end (u, v), shooter's area.
 */
export function wallSegments(
  rays: { triangles: Uint32Array; distance: Float32Array },
  centroids: Float32Array, normals: Float32Array, areas: Float64Array,
  direction: readonly number[], u: readonly number[], v: readonly number[],
): Float64Array {
  const out: number[] = [];
  for (let k = 0; k < rays.triangles.length; k++) {
    const d = rays.distance[k];
    if (!Number.isFinite(d)) continue;
    const f = rays.triangles[k];
    const nx = normals[3 * f], ny = normals[3 * f + 1], nz = normals[3 * f + 2];
    // Rays along the axis (end faces) cross the whole wall in projection as a point: left out.
    if (Math.abs(nx * direction[0] + ny * direction[1] + nz * direction[2]) > 0.342) continue;
    const x = centroids[3 * f], y = centroids[3 * f + 1], z = centroids[3 * f + 2];
    const ex = x - d * nx, ey = y - d * ny, ez = z - d * nz;
    out.push(x * u[0] + y * u[1] + z * u[2], x * v[0] + y * v[1] + z * v[2], ex * u[0] + ey * u[1] + ez * u[2], ex * v[0] + ey * v[1] + ez * v[2], areas[f]);
  }
  return Float64Array.from(out);
}

/**
 * Of the wall rays (wallSegments rows) whose line, seen along the axis, passes within
 * `tolerance` mm of the point (cu, cv) ahead of its shooter, the area share whose segment
 * reaches the point before the ray leaves the material: the point then lies inside the wall.
 * About a point in the cavity (or in the air about a splinter) the rays aimed at it from the
 * outer surface stop at the cavity surface first: 0. About a point inside the wall of a tube
 * with outer radius R and cavity radius r, the radial rays aimed through it are those of its
 * own bearing from outside (area share R) and from the cavity (r), which cross it, and those
 * of the opposite bearing from outside (R), which stop short: (R + r) / (2R + r).
 */
export function wallCrossingShare(segments: Float64Array, cu: number, cv: number, tolerance: number): number {
  let hit = 0, aimed = 0;
  for (let k = 0; k < segments.length; k += 5) {
    const ax = segments[k], ay = segments[k + 1], bx = segments[k + 2] - ax, by = segments[k + 3] - ay;
    const len = hypot(bx, by);
    if (!(len > 0)) continue;
    const px = cu - ax, py = cv - ay;
    const along = (px * bx + py * by) / len;
    if (!(along > 0) || Math.abs(px * by - py * bx) / len > tolerance) continue;
    aimed += segments[k + 4];
    if (along <= len + tolerance) hit += segments[k + 4];
  }
  return aimed > 0 ? hit / aimed : 0;
}
