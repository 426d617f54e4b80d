import type { RegionFigures } from './classify-regions';
import type { RegionBorder } from './region-borders';
import type { AnalysisSettings } from './settings';
import type { ShaftAxis } from './shaft-axis';

/**
 * The neighbourhood pass of region classification. A break face meets the original bone
 * surface at a crease (the rim of the break), while two pieces of original surface meet
 * smoothly: region growing stops between them only where the surface bends a little more
 * than it may within one region, or where it turns from facing out to facing the shaft axis.
 * A crease next to a break face says little (two breaks also meet at a crease, and a break
 * face is cut into several regions along its own bends), so what tells a break face from
 * bone surface is the kind of border it has with the regions that are bone surface. The
 * first pass (classify-regions.ts, `fractureEvidence`) judges each region by itself and so
 * counts every crease alike; this pass takes its classes, measures for each region
 * - the share of its border with original-surface regions that is a crease, and
 * - that crease length as a share of its whole border,
 * and weighs them with the region's own cues (between the walls, roughness, head-on wall
 * rays, curvedness: the relief of a break bends the surface more than the shaft does; facing
 * squarely out from or into the fitted shaft axis: a wall face, where a break crosses the
 * wall) into a second evidence. Regions are judged one after another, largest first, each
 * with the classes its neighbours have at that moment (so two regions cannot keep swapping
 * classes as they would if all were judged at once), over and over until nothing changes or
 * `contextPasses` rounds have run. Weights and cut-off are settings (settings.ts).
 * Returns whether each region is a fracture face; fills the two border figures in `figures`.
 */
export function settleFractureRegions(
  figures: RegionFigures[],
  borders: RegionBorder[],
  firstPass: boolean[],
  axis: ShaftAxis,
  settings: AnalysisSettings,
): boolean[] {
  const fracture = [...firstPass];
  const order = figures.map((_, id) => id).sort((a, b) => figures[b].area - figures[a].area || a - b);
  const shaft = axis.support >= 0.5;
  for (let pass = 0; pass < settings.contextPasses; pass++) {
    let changed = 0;
    for (const id of order) {
      measureOriginalBorder(figures[id], borders[id], fracture);
      const f = contextEvidence(figures[id], shaft, settings) > settings.contextEvidenceMin;
      if (f !== fracture[id]) { fracture[id] = f; changed++; }
    }
    if (!changed) break;
  }
  if (settings.contextPasses > 0) figures.forEach((r, id) => measureOriginalBorder(r, borders[id], fracture));
  return fracture;
}

/** Crease share of the border with original-surface neighbours, and crease-with-original length over the whole border. */
function measureOriginalBorder(r: RegionFigures, border: RegionBorder, fracture: boolean[]): void {
  let crease = 0, smooth = 0;
  for (const n of border.neighbours) {
    if (fracture[n.region]) continue;
    crease += n.crease;
    smooth += n.smooth;
  }
  // With no original-surface neighbour (a region inside a break face split along its bends,
  // or bone surface ringed by breaks) the share stands in as the crease share of the whole border.
  r.originalCreaseShare = crease + smooth > 0 ? crease / (crease + smooth) : r.sharpBorderShare;
  r.originalCreaseBorderShare = border.length > 0 ? crease / border.length : 0;
}

/**
 * The second evidence (see settleFractureRegions); the border figures must be measured.
 * `shaft`: the fragment's shaft axis fit holds (support at least 0.5), so the region's
 * radial figure means something.
 */
export function contextEvidence(r: RegionFigures, shaft: boolean, settings: AnalysisSettings): number {
  const headOn = Number.isFinite(r.headOnShare) ? r.headOnShare : 0.5;
  const min = settings.corticalRadialMin;
  const facing = shaft && min < 1 ? Math.max(0, Math.abs(r.radial) - min) / (1 - min) : 0;
  return settings.contextBetweenWallsWeight * Math.min(r.outwardBorderShare, r.inwardBorderShare)
    + settings.contextRoughnessWeight * (r.roughnessRatio - 1)
    - settings.contextHeadOnWeight * headOn
    + settings.contextCurvednessWeight * r.curvedness
    - settings.contextFacingWeight * facing
    + settings.contextOriginalCreaseWeight * r.originalCreaseShare
    + settings.contextOriginalCreaseBorderWeight * r.originalCreaseBorderShare;
}
