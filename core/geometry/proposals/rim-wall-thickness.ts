/**
 * Wall thickness along a break face's rim, for the candidate index (face-traits.ts). Both sides
 * of a break cut the same stretch of wall, so the bone wall next to either face is equally
 * thick, even where one side holds only part of the break (a piece split again on the other
 * side), where size and shape figures of the two faces disagree. Thickness is read as in the
 * shape diameter function (Shapira, Shamir & Cohen-Or 2008; wall-rays.ts): a ray from each
 * triangle of the original surface straight into the bone leaves it through the other face of
 * the wall. A ray counts only when it leaves head-on through original surface (not through a
 * break face, where it ran along the wall) and is not shorter than a scan's noise could make it.
 * A face's figure is the median over the triangles within a band next to it; rays are cast
 * only from triangles in some face's band.
 */
import type { KdTree } from '../registration/nearest-neighbours';
import { triangleNormalsAndAreas } from '../mesh';
import { triangleCentroids } from '../normal-filter';
import { castWallRays } from '../wall-rays';

export interface RimThicknessSettings {
  /** Original-surface triangles whose centroid lies within this distance of a face sample form its rim (mm). */
  bandMm: number;
  /** A ray counts when the cosine between it and the exit surface's normal is at least this (1 = head-on). */
  exitCosineMin: number;
  /** Shorter rays are noise or a sliver of surface, not a wall (mm). */
  minRayMm: number;
}

/**
 * Defaults chosen with tests/bench/candidate-recall.ts on the dev assemblage of seed 14 at 200
 * fragments (bands of 2-4 mm and cosines 0.7-0.9 gave candidate recall within 2 points of each
 * other; checked on seed 15).
 */
export const DEFAULT_RIM_THICKNESS: RimThicknessSettings = { bandMm: 3, exitCosineMin: 0.9, minRayMm: 0.5 };

/**
 * Median wall thickness along the rim of each face (its samples in a k-d tree), in the order
 * given; undefined for a face where no ray counts. `isBreak` marks the fragment's break-face
 * triangles (1).
 */
export function rimWallThicknesses(positions: Float32Array, triangles: Uint32Array, isBreak: Uint8Array, faceTrees: ReadonlyArray<KdTree>, settings: RimThicknessSettings = DEFAULT_RIM_THICKNESS): Array<number | undefined> {
  const nt = triangles.length / 3;
  const centroids = triangleCentroids(positions, triangles);
  const r2 = settings.bandMm * settings.bandMm;
  const q = [0, 0, 0];
  // each face's rim triangles, and the union to shoot rays from
  const rims: number[][] = faceTrees.map(() => []);
  const shooters: number[] = [];
  for (let t = 0; t < nt; t++) {
    if (isBreak[t]) continue;
    q[0] = centroids[3 * t]; q[1] = centroids[3 * t + 1]; q[2] = centroids[3 * t + 2];
    let near = false;
    faceTrees.forEach((tree, f) => {
      if (tree.nearestOne(q, r2).index >= 0) {
        rims[f].push(t);
        near = true;
      }
    });
    if (near) shooters.push(t);
  }
  if (!shooters.length) return faceTrees.map(() => undefined);
  const { normals } = triangleNormalsAndAreas({ positions, triangles });
  const rays = castWallRays({ positions, triangles }, normals, centroids, shooters.length, shooters);
  const thickness = new Map<number, number>();
  for (let k = 0; k < rays.triangles.length; k++) {
    const exit = rays.exitTriangle[k];
    if (exit < 0 || isBreak[exit]) continue;
    if (rays.exitCosine[k] >= settings.exitCosineMin && rays.distance[k] >= settings.minRayMm) thickness.set(rays.triangles[k], rays.distance[k]);
  }
  return rims.map((rim) => {
    const values: number[] = [];
    for (const t of rim) {
      const d = thickness.get(t);
      if (d !== undefined) values.push(d);
    }
    if (!values.length) return undefined;
    values.sort((a, b) => a - b);
    return values[Math.floor(values.length / 2)];
  });
}

/** Break-face triangles of a fragment from its faces' triangle lists (1 = on a break face). */
export function breakTriangleMask(triangleCount: number, faces: ReadonlyArray<{ triangleIds?: Uint32Array }>): Uint8Array {
  const mask = new Uint8Array(triangleCount);
  for (const f of faces) if (f.triangleIds) for (const t of f.triangleIds) if (t < triangleCount) mask[t] = 1;
  return mask;
}
