import { kthSmallest } from './kth-smallest';
import type { WallRays } from './wall-rays';

export interface ShallowOuterOptions {
  /** A region whose crossings are shallower than this share of the fragment's reference crossing is a break (0: none). */
  depthRatio: number;
  /** Exit cosine at least this: the ray crossed the wall head-on (settings headOnCosineMin). */
  headOnCosineMin: number;
  /** Least head-on crossings a region needs before its median is read. */
  minRays: number;
}

/**
 * Breaks read as outer surface because they face out from the shaft like it: a break that runs
 * along the wall at a shallow angle (a bevel, or the step left where a flake came off the outer
 * side of the cortex) faces out from the axis as squarely as the outer surface, but it lies
 * inside the wall, so what separates it from the cavity is less than the cortex. The outer
 * surface's inward rays cross the whole wall and leave head-on through the medullary surface
 * (wall-rays.ts, the shape diameter of Shapira, Shamir & Cohen-Or 2008); on one piece of shaft
 * the cortex keeps about one thickness (it changes slowly along a shaft and round it; mammal
 * shafts: a cavity of about 0.4-0.7 of the outer diameter, Currey & Alexander 1985, recalled
 * from memory). So, over every head-on crossing from a region read outer to a region read
 * medullary, the fragment's reference crossing is their median depth; a region read outer whose
 * own crossings have a median under `depthRatio` times that reference (with at least `minRays`
 * of them) is a break. Unlike the thin-crossing term (thin-wall-crossing.ts), which compares the
 * crossing with the distance from the axis and so needs a centre that holds and a wall under a
 * tenth of the radius, this compares the piece's walls with each other.
 *
 * Returns, per region, whether it is such a break (false for regions not read outer).
 */
export function shallowOuterRegions(
  region: Uint32Array,
  regionCount: number,
  outer: (region: number) => boolean,
  medullary: (region: number) => boolean,
  rays: WallRays,
  options: ShallowOuterOptions,
): boolean[] {
  const out = new Array<boolean>(regionCount).fill(false);
  if (!(options.depthRatio > 0)) return out;
  const depths: number[][] = Array.from({ length: regionCount }, () => []);
  const all: number[] = [];
  for (let k = 0; k < rays.triangles.length; k++) {
    const g = rays.exitTriangle[k];
    if (g < 0 || !(rays.exitCosine[k] >= options.headOnCosineMin)) continue;
    const r = region[rays.triangles[k]];
    if (!outer(r) || !medullary(region[g])) continue;
    depths[r].push(rays.distance[k]);
    all.push(rays.distance[k]);
  }
  if (all.length < options.minRays) return out;
  const reference = kthSmallest(all, Math.floor(all.length / 2));
  for (let r = 0; r < regionCount; r++) {
    const d = depths[r];
    if (d.length < options.minRays) continue;
    out[r] = kthSmallest(d, Math.floor(d.length / 2)) < options.depthRatio * reference;
  }
  return out;
}
