import { fractureEvidence, type RegionFigures } from './classify-regions';
import type { RegionBorder } from './region-borders';
import type { AnalysisSettings } from './settings';
import type { ShaftAxis } from './shaft-axis';

/**
 * The neighbourhood pass of region classification. A break face meets the original bone
 * surface at a crease (the rim of the break), while two pieces of original surface meet
 * smoothly: region growing stops between them only where the surface bends a little more
 * than it may within one region, or where it turns from facing out to facing the shaft axis.
 * A crease next to another break face says little (two breaks also meet at a crease, and a
 * break face is cut into several regions along its own bends), so the first pass
 * (classify-regions.ts), which judges each region by itself and counts every crease alike,
 * misses break faces whose border with the bone surface is creased but whose border with
 * the rest of their own break is not. This pass takes the first pass's classes and adds to
 * each region's first evidence
 * - the crease length it shares with regions taken for original surface, as a share of its
 *   whole border (contextOriginalCreaseWeight);
 * - its curvedness (Koenderink & van Doorn 1992): the relief of a break bends the surface
 *   far more than a shaft of 5-20 mm radius does (contextCurvednessWeight);
 * - against fracture, how squarely it faces out from or into the fitted shaft axis: that is
 *   what the wall faces do, while a break crosses the wall (contextFacingWeight);
 * - against fracture, how concave it is, when its inward rays cross a wall head-on often
 *   enough (contextConcaveCurvatureMin beyond flat): the medullary surface curves inwards, a break face does not as a whole; unlike
 *   the facing term this needs no shaft centre, which a splinter from the narrow edge of a
 *   flattened shaft puts 10-14 mm off (contextConcaveWeight, contextConcaveHeadOnMin);
 * - towards fracture, how convex it is when it faces into the shaft axis (beyond
 *   contextInwardConvexCurvatureMin): the only original surface facing the axis is the
 *   medullary one, which is concave about it, so a convex region facing the axis is a break face
 *   the axis fit has taken for the wall (contextInwardConvexWeight; a splinter whose two long
 *   break faces run parallel and outweigh its strips of bone surface);
 * - towards fracture, for a region facing out from or into the axis, the share of its inward
 *   rays that leave head-on through such convex break regions facing the axis beyond
 *   contextBreakExitShareMin: a wall face's rays leave through the other, concave wall face,
 *   so this one is the sliver's other break face (contextBreakExitWeight; needs `exits`);
 * - towards fracture, for a region on the medullary side of the axis (facing it), how seldom
 *   its inward rays cross the wall head-on, unless it is concave: the medullary surface is the
 *   inner face of the wall, so its rays cross the wall to the outer surface, and it curves
 *   inwards; a break face that faces the axis (a splinter's inner break, a bevel running along
 *   a thick wall) sends them along the wall (contextUncrossedInwardWeight);
 * - towards fracture, for a region facing out from the axis, the share of its inward rays
 *   that reach surface facing the axis head-on after a wall far thinner than a shaft's cortex
 *   (thin-wall-crossing.ts): the outer surface crosses the whole wall, so this face is a break
 *   running along the wall, one face of a slab between two near-parallel breaks or a bevel
 *   left along the cavity (contextThinCrossingWeight);
 * - towards fracture, for a region facing the axis and not concave, the share of its inward
 *   rays that leave head-on through break regions facing out that the thin-crossing term reads
 *   (beyond contextThinPartnerShareMin): its wall partner is the slab's outer break face, so it
 *   is the slab's inner one (contextThinPartnerWeight; needs `exits`);
 * - towards original surface, for a region that faces out from or into the axis, runs along
 *   it and is not itself a slab face, the share of its border shared with slab faces (regions
 *   taken for fracture that either thin term reads) beyond contextSlabRimShareMin: a slab
 *   between two near-parallel breaks meets the bone's outer surface or cavity along its long
 *   rims, so a strip lying between its two faces and facing out or in is that bone surface
 *   (contextSlabRimWeight);
 * and asks for more evidence than the first pass (contextEvidenceMin). Regions are judged one
 * after another, largest first, each with the classes its neighbours have at that moment (so
 * two regions cannot keep swapping classes as they would if all were judged at once), over
 * and over until nothing changes or `contextPasses` rounds have run. The weights are settings
 * (settings.ts), fitted by area-weighted logistic regression on generated development
 * assemblages with each seed left out in turn to check them (tests/bench/segmentation-regions-dump.ts
 * writes the region figures). Returns whether each region is a fracture face and fills
 * `originalCreaseBorderShare` in `figures` from the final classes.
 */
export function settleFractureRegions(
  figures: RegionFigures[],
  borders: RegionBorder[],
  axis: ShaftAxis,
  settings: AnalysisSettings,
  /** Per region, its head-on inward rays by the region they leave through (classify-regions.ts headOnExits). */
  exits: ReadonlyArray<ReadonlyMap<number, number>> = [],
): boolean[] {
  const first = figures.map((r) => fractureEvidence(r, settings));
  const fracture = first.map((e) => e > settings.fractureEvidenceMin);
  const order = figures.map((_, id) => id).sort((a, b) => figures[b].area - figures[a].area || a - b);
  const shaft = axis.support >= 0.5;
  for (let pass = 0; pass < settings.contextPasses; pass++) {
    let changed = 0;
    for (const id of order) {
      figures[id].originalCreaseBorderShare = originalCreaseBorderShare(borders[id], fracture);
      figures[id].breakExitShare = breakExitShare(figures, id, exits[id], fracture, shaft, settings);
      figures[id].thinPartnerShare = thinPartnerShare(figures, id, exits[id], fracture, shaft, settings);
      figures[id].slabRimShare = slabRimShare(figures, id, borders[id], fracture, shaft, settings);
      const f = first[id] + contextTerms(figures[id], shaft, settings) > settings.contextEvidenceMin;
      if (f !== fracture[id]) { fracture[id] = f; changed++; }
    }
    if (!changed) break;
  }
  figures.forEach((r, id) => {
    r.originalCreaseBorderShare = originalCreaseBorderShare(borders[id], fracture);
    r.breakExitShare = breakExitShare(figures, id, exits[id], fracture, shaft, settings);
    r.thinPartnerShare = thinPartnerShare(figures, id, exits[id], fracture, shaft, settings);
  });
  figures.forEach((r, id) => { r.slabRimShare = slabRimShare(figures, id, borders[id], fracture, shaft, settings); });
  return fracture;
}

/** Crease length shared with regions not taken for fracture, over the region's whole border. */
function originalCreaseBorderShare(border: RegionBorder, fracture: boolean[]): number {
  let crease = 0;
  for (const n of border.neighbours) if (!fracture[n.region]) crease += n.crease;
  return border.length > 0 ? crease / border.length : 0;
}

/**
 * Share of region `id`'s inward rays that leave head-on through regions taken for fracture
 * because they face the shaft axis while convex (inwardConvexity > 0): the wall partner a
 * bone-surface region would need is concave there, so the pair is two parallel breaks.
 * Other break regions do not count: where one face of a true wall is misread as a break
 * (a rough cavity patch), its partner must not follow it.
 */
function breakExitShare(figures: RegionFigures[], id: number, exits: ReadonlyMap<number, number> | undefined, fracture: boolean[], shaft: boolean, settings: AnalysisSettings): number {
  const r = figures[id];
  if (!exits || r.rays === 0) return 0;
  let n = 0;
  for (const [to, count] of exits) if (fracture[to] && inwardConvexity(figures[to], shaft, settings) > 0) n += count;
  return n / r.rays;
}

/**
 * Share of region `id`'s inward rays that leave head-on through regions taken for fracture that
 * face out from the shaft axis and whose own rays cross a thin wall (the thin-crossing term's
 * regions: thinCrossingShare beyond contextThinCrossingShareMin). The medullary surface's rays
 * leave through the outer surface; when the face they leave through is the outer face of a slab
 * between two near-parallel breaks, this region is the slab's inner break face.
 */
function thinPartnerShare(figures: RegionFigures[], id: number, exits: ReadonlyMap<number, number> | undefined, fracture: boolean[], shaft: boolean, settings: AnalysisSettings): number {
  const r = figures[id];
  if (!exits || r.rays === 0 || !shaft) return 0;
  let n = 0;
  for (const [to, count] of exits) {
    const p = figures[to];
    if (fracture[to] && p.radial >= settings.corticalRadialMin && p.thinCrossingShare > settings.contextThinCrossingShareMin) n += count;
  }
  return n / r.rays;
}

/** Whether a region taken for fracture is one face of a slab as the thin terms read it (thin-crossing facing out, thin-partner facing the axis). */
function slabFace(r: RegionFigures, fracture: boolean, settings: AnalysisSettings): boolean {
  if (!fracture) return false;
  const min = settings.corticalRadialMin;
  return (r.radial >= min && r.thinCrossingShare > settings.contextThinCrossingShareMin) || (r.radial <= -min && r.thinPartnerShare > settings.contextThinPartnerShareMin);
}

/**
 * Share of region `id`'s border length shared with slab faces (slabFace), for a region that
 * faces out from or into the axis (|radial| at least contextSlabRimRadialMin) and across it
 * (|axial| at most contextSlabRimAxialMax) and is not itself a slab face by its figures,
 * whatever its class (a part of a slab face whose own rays cross thin, thinCrossingShare
 * beyond contextThinCrossingShareMin, is not a rim); 0 for any other region.
 */
function slabRimShare(figures: RegionFigures[], id: number, border: RegionBorder, fracture: boolean[], shaft: boolean, settings: AnalysisSettings): number {
  const r = figures[id];
  if (!shaft || !(border.length > 0) || Math.abs(r.axial) > settings.contextSlabRimAxialMax || Math.abs(r.radial) < settings.contextSlabRimRadialMin
    || r.thinCrossingShare > settings.contextThinCrossingShareMin || slabFace(r, true, settings)) return 0;
  let n = 0;
  for (const b of border.neighbours) if (slabFace(figures[b.region], fracture[b.region], settings)) n += b.crease + b.smooth;
  return n / border.length;
}

/** How far a region facing the shaft axis is convex beyond contextInwardConvexCurvatureMin (0 when it does not face the axis or is not). */
function inwardConvexity(r: RegionFigures, shaft: boolean, settings: AnalysisSettings): number {
  return shaft && r.radial <= -settings.corticalRadialMin ? Math.max(0, r.meanCurvature - settings.contextInwardConvexCurvatureMin) : 0;
}

/**
 * What the neighbourhood pass adds to a region's first evidence (see settleFractureRegions);
 * `originalCreaseBorderShare` must be measured. `shaft`: the fragment's shaft axis fit holds
 * (support at least 0.5), so the region's radial figure means something.
 */
export function contextTerms(r: RegionFigures, shaft: boolean, settings: AnalysisSettings): number {
  const min = settings.corticalRadialMin;
  const facing = shaft && min < 1 ? Math.max(0, Math.abs(r.radial) - min) / (1 - min) : 0;
  const headOn = Number.isFinite(r.headOnShare) ? r.headOnShare : 0.5;
  const concave = headOn >= settings.contextConcaveHeadOnMin ? Math.max(0, -r.meanCurvature - settings.contextConcaveCurvatureMin) : 0;
  const inwardConvex = inwardConvexity(r, shaft, settings);
  const uncrossed = shaft && r.radial <= -settings.contextUncrossedInwardRadialMin && r.meanCurvature >= -settings.contextUncrossedInwardConcaveMin && settings.contextConcaveHeadOnMin > 0
    ? Math.max(0, 1 - headOn / settings.contextConcaveHeadOnMin) : 0;
  return settings.contextCurvednessWeight * r.curvedness
    + settings.contextUncrossedInwardWeight * uncrossed
    + settings.contextInwardConvexWeight * inwardConvex
    - settings.contextFacingWeight * facing
    - settings.contextConcaveWeight * concave
    + settings.contextOriginalCreaseWeight * r.originalCreaseBorderShare
    + (shaft && r.radial >= min ? settings.contextThinCrossingWeight * Math.max(0, r.thinCrossingShare - settings.contextThinCrossingShareMin) : 0)
    + (shaft && r.radial <= -min && r.meanCurvature >= -settings.contextThinPartnerConcaveMin ? settings.contextThinPartnerWeight * Math.max(0, r.thinPartnerShare - settings.contextThinPartnerShareMin) : 0)
    + (shaft && Math.abs(r.radial) >= min ? settings.contextBreakExitWeight * Math.max(0, r.breakExitShare - settings.contextBreakExitShareMin) : 0)
    - settings.contextSlabRimWeight * Math.max(0, r.slabRimShare - settings.contextSlabRimShareMin);
}
