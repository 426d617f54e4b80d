import { hypot } from './hypot';
import { offsetFromAxis, type ShaftAxis } from './shaft-axis';
import type { WallRays } from './wall-rays';

export interface ThinWallCrossingOptions {
  /** Exit cosine at least this: the ray crossed a wall head-on (settings headOnCosineMin). */
  headOnCosineMin: number;
  /** A crossing shallower than this share of the ray's start distance from the axis is thin. */
  depthRatioMax: number;
  /** The exit surface faces into or out from the axis (a wall face): |its normal's radial component| at least this. */
  radialMin: number;
  /** Below this axis support nothing is counted (all zeros): the distances need a shaft model that holds. */
  supportMin: number;
}

/**
 * Per region, the share of its inward rays (wall-rays.ts) that cross head-on to surface facing
 * into or out from the shaft axis after a thin wall: depth under depthRatioMax times the ray's
 * start distance from the axis (a ray from a face looking out that leaves head-on leaves
 * through surface facing the axis, and the other way round). A tube wall's outer surface
 * crosses the whole cortex to the cavity: in long-bone shafts of mammals the cavity's diameter
 * is about 0.4-0.7 of the outer one (Currey & Alexander 1985, "The thickness of the walls of
 * tubular bones", J. Zool. 206; recalled from memory), so the wall is 0.3-0.6 of the outer
 * radius, and a tenth is far below that. A face looking out from the axis whose rays reach
 * surface facing the axis much sooner is a break running along the wall (one face of a slab
 * cut by two near-parallel breaks, or a bevel left along the cavity). `normals` are the
 * (filtered) triangle normals the rays were cast along.
 */
export function thinWallCrossingShare(
  region: Uint32Array,
  regionCount: number,
  rays: WallRays,
  centroids: Float32Array,
  normals: Float32Array,
  axis: ShaftAxis,
  options: ThinWallCrossingOptions,
): Float64Array {
  const thin = new Float64Array(regionCount);
  if (!(axis.support >= options.supportMin) || !(options.depthRatioMax > 0)) return thin;
  const count = new Float64Array(regionCount);
  const q: [number, number, number] = [0, 0, 0];
  for (let k = 0; k < rays.triangles.length; k++) {
    const f = rays.triangles[k];
    const r = region[f];
    count[r]++;
    const g = rays.exitTriangle[k];
    if (g < 0 || !(rays.exitCosine[k] >= options.headOnCosineMin)) continue;
    offsetFromAxis(axis, centroids[3 * g], centroids[3 * g + 1], centroids[3 * g + 2], q);
    const ql = hypot(q[0], q[1], q[2]);
    const exitRadial = ql > 0 ? (normals[3 * g] * q[0] + normals[3 * g + 1] * q[1] + normals[3 * g + 2] * q[2]) / ql : 0;
    if (!(Math.abs(exitRadial) >= options.radialMin)) continue;
    offsetFromAxis(axis, centroids[3 * f], centroids[3 * f + 1], centroids[3 * f + 2], q);
    if (rays.distance[k] < options.depthRatioMax * hypot(q[0], q[1], q[2])) thin[r]++;
  }
  for (let r = 0; r < regionCount; r++) thin[r] = count[r] > 0 ? thin[r] / count[r] : 0;
  return thin;
}
