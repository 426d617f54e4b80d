import type { AnalysisSettings } from './settings';
import type { ShaftAxis } from './shaft-axis';
import type { SurfaceClass } from './surface-classes';

/** Measured figures of one region that decide its class. */
export interface RegionFigures {
  area: number;
  triangleCount: number;
  /** Area-weighted mean of (filtered normal . outward radial direction about the shaft axis). */
  radial: number;
  /** Area-weighted mean |filtered normal . shaft axis|. */
  axial: number;
  /** Region roughness divided by the fragment's median roughness. */
  roughnessRatio: number;
  /** Area-weighted mean curvature (k1 + k2) / 2, 1/mm. */
  meanCurvature: number;
}

export function regionFigures(
  region: Uint32Array,
  regionCount: number,
  normals: Float32Array,
  centroids: Float32Array,
  areas: Float64Array,
  triRoughness: Float32Array,
  triMeanCurvature: Float32Array,
  axis: ShaftAxis,
): RegionFigures[] {
  const out: RegionFigures[] = Array.from({ length: regionCount }, () => ({
    area: 0, triangleCount: 0, radial: 0, axial: 0, roughnessRatio: 0, meanCurvature: 0,
  }));
  const [ax, ay, az] = axis.direction;
  const [px, py, pz] = axis.point;
  const roughSorted = Float32Array.from(triRoughness).sort();
  const medianRough = roughSorted[Math.floor(roughSorted.length / 2)] || 1e-9;
  for (let f = 0; f < region.length; f++) {
    const r = out[region[f]];
    const w = areas[f];
    const rx = centroids[3 * f] - px, ry = centroids[3 * f + 1] - py, rz = centroids[3 * f + 2] - pz;
    const t = rx * ax + ry * ay + rz * az;
    const qx = rx - t * ax, qy = ry - t * ay, qz = rz - t * az;
    const ql = Math.hypot(qx, qy, qz) || 1;
    const nx = normals[3 * f], ny = normals[3 * f + 1], nz = normals[3 * f + 2];
    r.area += w;
    r.triangleCount++;
    r.radial += w * ((nx * qx + ny * qy + nz * qz) / ql);
    r.axial += w * Math.abs(nx * ax + ny * ay + nz * az);
    r.roughnessRatio += w * triRoughness[f];
    r.meanCurvature += w * triMeanCurvature[f];
  }
  for (const r of out) {
    if (r.area > 0) {
      r.radial /= r.area;
      r.axial /= r.area;
      r.roughnessRatio = r.roughnessRatio / r.area / medianRough;
      r.meanCurvature /= r.area;
    }
  }
  return out;
}

/**
 * Class of a region. On a shaft (most of the surface turned about one axis) original
 * surface faces straight out from the axis (outer cortical) or straight in (medullary);
 * a break surface runs through the wall, so its normal leans away from the radial
 * direction. Off the shaft, a smooth convex region is an articular end and a rough one a
 * break. The cut-offs are settings (settings.ts).
 */
export function classifyRegion(r: RegionFigures, axis: ShaftAxis, settings: AnalysisSettings): SurfaceClass {
  const isShaft = axis.support >= 0.5;
  if (isShaft && Math.abs(r.radial) >= settings.corticalRadialMin) {
    return r.radial > 0 ? 'outer-cortical' : 'medullary';
  }
  const smooth = r.roughnessRatio < settings.roughnessRatioFracture;
  const convex = r.meanCurvature > 0.5 / Math.max(axis.radius, 1);
  if (smooth && convex && !isShaft) return 'articular';
  if (smooth && convex && r.axial > 0.5 && r.radial > 0.3) return 'articular';
  return 'fracture';
}
