import type { AnalysisSettings } from './settings';
import { kthSmallest } from './kth-smallest';
import { weightedMedian } from './weighted-median';
import { offsetFromAxis, type ShaftAxis } from './shaft-axis';
import type { SurfaceClass } from './surface-classes';
import type { WallRays } from './wall-rays';
import { hypot } from './hypot';

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

/** Measured figures of one region that decide its class. */
export interface RegionFigures {
  area: number;
  triangleCount: number;
  /** Area-weighted mean of (filtered normal . outward radial direction about the shaft axis). */
  radial: number;
  /** Area-weighted mean |filtered normal . shaft axis|. */
  axial: number;
  /** Area-weighted mean of triangle roughness / the fragment's median roughness (each capped at 4). */
  roughnessRatio: number;
  /** Area-weighted mean curvature (k1 + k2) / 2, 1/mm. */
  meanCurvature: number;
  /**
   * Area-weighted mean curvedness sqrt((k1² + k2²) / 2), 1/mm (Koenderink & van Doorn 1992):
   * how strongly the surface bends whatever the sign. The relief of a break (bumps a few mm
   * across) keeps it high where the bone surface bends only as gently as the shaft.
   */
  curvedness: number;
  /** Median depth (mm) of the inward rays from this region to where they leave the bone (wall-rays.ts). */
  rayDepth: number;
  /** Median cosine between those rays and the surface they leave by (1 = straight across a wall). */
  rayExitCosine: number;
  /** Rays from this region. */
  rays: number;
  /**
   * Share of this region's rays whose twin shot outward (into the air) meets the fragment
   * again on a surface facing back at least `outwardFacingCosineMin` squarely (wall-rays.ts
   * outwardCosine): a surface looking across a hollow at the other side of it.
   */
  outwardHitShare: number;
  /** Share of those rays that leave head-on (exit cosine at least headOnCosineMin): they crossed a wall. */
  headOnShare: number;
  /** Share of the region's border that is a crease (region-borders.ts). */
  sharpBorderShare: number;
  /** Shares of the border shared with regions facing away from / towards the shaft axis. */
  outwardBorderShare: number;
  inwardBorderShare: number;
  /**
   * Set by the neighbourhood pass (region-context.ts), from the classes at its end: the crease
   * length shared with original-surface regions as a share of the whole border.
   */
  originalCreaseBorderShare: number;
  /**
   * Set by the neighbourhood pass (region-context.ts), from the classes at its end: the share of
   * the region's inward rays that leave the bone head-on (headOnCosineMin) through regions taken
   * for fracture (0 where none are counted).
   */
  breakExitShare: number;
  /**
   * Share of the region's inward rays that cross head-on to surface facing the shaft axis after
   * a wall thinner than contextThinCrossingRatioMax times their start distance from the axis
   * (thin-wall-crossing.ts; 0 where the axis support is under contextThinCrossingSupportMin).
   */
  thinCrossingShare: number;
  /**
   * Set by the neighbourhood pass (region-context.ts), from the classes at its end: the share of
   * the region's inward rays that leave the bone head-on through regions taken for fracture that
   * face out from the shaft axis and are themselves read as thin (thinCrossingShare beyond
   * contextThinCrossingShareMin): the region's wall partner is the other face of a slab.
   */
  thinPartnerShare: number;
  /**
   * Set by the neighbourhood pass (region-context.ts), from the classes of the moment: for a
   * region facing across the shaft axis (neither squarely out nor in, axial component at most
   * contextSlabRimAxialMax), the share of its border length shared with slab faces, regions
   * taken for fracture that the thin-crossing or thin-partner term reads (0 otherwise).
   */
  slabRimShare: number;
}

export function regionFigures(
  region: Uint32Array,
  regionCount: number,
  normals: Float32Array,
  centroids: Float32Array,
  areas: Float64Array,
  triRoughness: Float32Array,
  triMeanCurvature: Float32Array,
  triCurvedness: Float32Array,
  axis: ShaftAxis,
  rays: WallRays,
  headOnCosineMin: number,
  outwardFacingCosineMin = 2,
  outwardAxialMax = 1,
  outwardRadialMax = 1,
): RegionFigures[] {
  const out: RegionFigures[] = Array.from({ length: regionCount }, () => ({
    area: 0, triangleCount: 0, radial: 0, axial: 0, roughnessRatio: 0, meanCurvature: 0, curvedness: 0, rayDepth: NaN, rayExitCosine: NaN, rays: 0, outwardHitShare: 0,
    headOnShare: NaN, sharpBorderShare: 0, outwardBorderShare: 0, inwardBorderShare: 0,
    originalCreaseBorderShare: NaN, breakExitShare: 0, thinCrossingShare: 0, thinPartnerShare: 0, slabRimShare: 0,
  }));
  const medianRough = kthSmallest(triRoughness, Math.floor(triRoughness.length / 2)) || 1e-9;
  // Region roughness: area-weighted mean of each triangle's roughness relative to the
  // fragment's median, each capped at 4 so that a few slivers cannot dominate a region.
  const roughSum = new Float64Array(regionCount);
  for (let f = 0; f < region.length; f++) roughSum[region[f]] += areas[f] * Math.min(4, triRoughness[f] / medianRough);
  const [ax, ay, az] = axis.direction;
  const q: [number, number, number] = [0, 0, 0];
  const depths: number[][] = Array.from({ length: regionCount }, () => []);
  const cosines: number[][] = Array.from({ length: regionCount }, () => []);
  const outwardHits = new Float64Array(regionCount);
  for (let k = 0; k < rays.triangles.length; k++) {
    const r = region[rays.triangles[k]];
    depths[r].push(rays.distance[k]);
    cosines[r].push(rays.exitCosine[k]);
    // Outward rays meeting the fragment count only across the axis: the medullary surface runs along the shaft, while break
    // faces that look at each other across a notch in the end of a shaft lean along it.
    // Nor from surface facing clearly away from the axis: the medullary surface does not, even
    // where a poorly fitted centre leaves it facing neither in nor out.
    const f = rays.triangles[k];
    if (!(rays.outwardCosine[k] >= outwardFacingCosineMin)) continue;
    if (axis.support >= 0.5) {
      const nx = normals[3 * f], ny = normals[3 * f + 1], nz = normals[3 * f + 2];
      const along = nx * ax + ny * ay + nz * az;
      if (Math.abs(along) > outwardAxialMax) continue;
      const [qx, qy, qz] = offsetFromAxis(axis, centroids[3 * f], centroids[3 * f + 1], centroids[3 * f + 2], q);
      if ((nx * qx + ny * qy + nz * qz) > outwardRadialMax * (hypot(qx, qy, qz) || 1)) continue;
    }
    outwardHits[r]++;
  }
  depths.forEach((d, r) => {
    out[r].rays = d.length;
    if (d.length) {
      out[r].rayDepth = median(d);
      out[r].rayExitCosine = median(cosines[r]);
      out[r].outwardHitShare = outwardHits[r] / d.length;
      out[r].headOnShare = cosines[r].filter((c) => c >= headOnCosineMin).length / d.length;
    }
  });
  for (let f = 0; f < region.length; f++) {
    const r = out[region[f]];
    const w = areas[f];
    const [qx, qy, qz] = offsetFromAxis(axis, centroids[3 * f], centroids[3 * f + 1], centroids[3 * f + 2], q);
    const ql = hypot(qx, qy, qz) || 1;
    const nx = normals[3 * f], ny = normals[3 * f + 1], nz = normals[3 * f + 2];
    r.area += w;
    r.triangleCount++;
    r.radial += w * ((nx * qx + ny * qy + nz * qz) / ql);
    r.axial += w * Math.abs(nx * ax + ny * ay + nz * az);
    r.meanCurvature += w * triMeanCurvature[f];
    r.curvedness += w * triCurvedness[f];
  }
  out.forEach((r, i) => {
    if (r.area > 0) {
      r.radial /= r.area;
      r.axial /= r.area;
      r.meanCurvature /= r.area;
      r.curvedness /= r.area;
      r.roughnessRatio = roughSum[i] / r.area;
    }
  });
  return out;
}

/**
 * Class of a region, from physical cues that hold for any scan of broken bone:
 * - wall test: an inward ray from bone surface crosses the cortex and leaves through the
 *   other wall face head-on; from a break face it runs along inside the wall and leaves
 *   obliquely (the shape diameter idea, Shapira et al. 2008; a break surface cuts through
 *   the wall, design.md section 7 notes for long bones). Cue: the share of head-on rays.
 * - creases: a break face is bounded by creases where it meets the bone surface (or another
 *   break) nearly all round; original surface is not (region-borders.ts).
 * - position in the wall: on a shaft a break face lies between the outer and the medullary
 *   surface and borders both; original surface borders only break faces.
 * - roughness: break surfaces are rougher than the fragment's typical surface.
 * - looking across a hollow: a ray shot outward (into the air) from the medullary surface
 *   crosses the cavity and meets its other side squarely where the fragment holds it; from
 *   outer surface and from the break faces of a splinter it meets nothing (wall-rays.ts).
 * Evidence = sharpBorderWeight x crease share + betweenWallsWeight x min(outward, inward
 * border share) + roughnessWeight x (roughness ratio - 1) - headOnWeight x head-on share
 * - outwardHitWeight x share of outward rays meeting the fragment (regions not clearly convex);
 * above fractureEvidenceMin the region is a fracture face. Original regions facing away
 * from the shaft axis (or convex where there is no axis) are outer cortical, facing it (or
 * concave) medullary; smooth regions whose rays run much deeper than the wall is thick are
 * articular ends. The weights and cut-off are settings (settings.ts), fitted on generated
 * development assemblages and checked on others (tests/bench/segmentation.bench.ts).
 */
export function fractureEvidence(r: RegionFigures, settings: AnalysisSettings): number {
  const headOn = Number.isFinite(r.headOnShare) ? r.headOnShare : 0.5;
  return settings.sharpBorderWeight * r.sharpBorderShare
    + settings.betweenWallsWeight * Math.min(r.outwardBorderShare, r.inwardBorderShare)
    + settings.roughnessWeight * (r.roughnessRatio - 1)
    - settings.headOnWeight * headOn
    - (r.meanCurvature <= settings.outwardMeanCurvatureMax ? settings.outwardHitWeight * r.outwardHitShare : 0);
}

export function classifyRegion(r: RegionFigures, axis: ShaftAxis, settings: AnalysisSettings, wallDepth: number): SurfaceClass {
  if (fractureEvidence(r, settings) > settings.fractureEvidenceMin) return 'fracture';
  return originalClass(r, axis, settings, wallDepth);
}

/** Which original surface a region not taken for a break is: articular end, outer cortical or medullary. */
export function originalClass(r: RegionFigures, axis: ShaftAxis, settings: AnalysisSettings, wallDepth: number): SurfaceClass {
  if (Number.isFinite(wallDepth) && r.rayDepth > settings.articularDepthRatio * wallDepth && r.meanCurvature >= 0) return 'articular';
  if (axis.support >= 0.5 && Math.abs(r.radial) >= 0.5) return r.radial > 0 ? 'outer-cortical' : 'medullary';
  return r.meanCurvature >= 0 ? 'outer-cortical' : 'medullary';
}

/** Typical wall thickness: area-weighted median ray depth of regions whose rays cross head-on. */
export function typicalWallDepth(figures: RegionFigures[]): number {
  const rows = figures.filter((r) => r.rays > 0 && r.rayExitCosine >= 0.9).map((r) => [r.rayDepth, r.area] as [number, number]);
  return rows.length ? weightedMedian(rows) : NaN;
}

/**
 * Per region, how many of its inward rays (wall-rays.ts) leave the bone head-on (exit cosine at
 * least `headOnCosineMin`) through each other region: region -> exit region -> rays.
 */
export function headOnExits(region: Uint32Array, regionCount: number, rays: WallRays, headOnCosineMin: number): Array<Map<number, number>> {
  const out: Array<Map<number, number>> = Array.from({ length: regionCount }, () => new Map());
  for (let k = 0; k < rays.triangles.length; k++) {
    const g = rays.exitTriangle[k];
    if (g < 0 || rays.exitCosine[k] < headOnCosineMin) continue;
    const from = region[rays.triangles[k]], to = region[g];
    if (from === to) continue;
    out[from].set(to, (out[from].get(to) ?? 0) + 1);
  }
  return out;
}
