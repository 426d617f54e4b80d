import { beforeAll, describe, expect, it } from 'vitest';
import { analyseFragment, type FragmentAnalysis } from '../../../core/geometry/analyse-fragment';
import { triangleNormalsAndAreas } from '../../../core/geometry/mesh';
import type { ShaftAxis } from '../../../core/geometry/shaft-axis';
import { brokenTube, cutReadAsBreak as cutShareReadAsBreak, fractureAgreement, type BrokenTube } from './broken-tube';

/**
 * The inward-convexity term of the neighbourhood pass (region-context.ts,
 * `contextInwardConvexWeight`), checked on a splinter with analytic truth (broken-tube.ts: a
 * triangle is a break triangle exactly when its corners lay on a cut plane). A tube 18/8 mm is
 * cut into a plate along one radius: two parallel cuts 3 mm apart (y = +-1.5), one through the
 * axis (x > 0) and two across it, 40 mm apart; the plate is then bent in the section by the
 * warp y -> y + 0.08 (x - 13)², so both long break faces curve with 0.16/mm (mean curvature
 * 0.08/mm, do Carmo 1976, section 3-3: half the normal curvature across a cylinder) about a
 * centre of curvature on the +y side, while the strips of outer and cavity surface stay on
 * their circles. The two long break faces outweigh the 3 mm strips, so an axis on the convex
 * side (here imposed: 10 mm off along -y, where a dev splinter's fitted centre lay) makes
 * them face squarely out and in like a wall. The medullary surface is concave about the axis
 * (mean curvature -1/2r), so the face that faces the axis while convex is a break face.
 * The break-exit term (`contextBreakExitWeight`) then takes the other long face (cut 1, facing
 * out): a wall face's inward rays cross the wall and leave through the other wall face; those
 * of cut 1 cross the 3 mm plate squarely into cut 0, a convex break face facing the axis, so
 * cut 1 is the other face of the same sliver (both cuts are parallel planes before the bend,
 * which keeps them parallel).
 */
const BEND = 0.08;
let tube: BrokenTube;
let areas: Float64Array;
const runs: Record<string, FragmentAnalysis> = {};
/** Share of the area of cut `cut` (by construction) that the analysis classes fracture. */
const cutReadAsBreak = (a: FragmentAnalysis, cut: number): number => cutShareReadAsBreak(a, tube.cutOf, areas, cut);

describe('a break face that faces the axis but is convex (bent radial plate, analytic truth)', () => {
  beforeAll(async () => {
    tube = await brokenTube({
      outerRadius: 18, innerRadius: 8, length: 90, roughness: 0.25,
      cuts: [
        { normal: [0, 1, 0], offset: -1.5 }, { normal: [0, -1, 0], offset: -1.5 }, { normal: [1, 0, 0], offset: 0 },
        { normal: [0, 0, 1], offset: -20 }, { normal: [0, 0, -1], offset: -20 },
      ],
      warp: (x, y, z) => [x, y + BEND * (x - 13) ** 2, z],
    });
    areas = triangleNormalsAndAreas(tube.mesh).areas;
    // The axis on the convex side of the plate, square to the section: the y = -1.5 face (cut 0) faces it.
    const imposed = (fitted: ShaftAxis): ShaftAxis => ({ direction: [0, 0, 1], point: [13, -10, 0], radius: 11.5, support: fitted.support });
    runs.off = analyseFragment(tube.mesh, { contextInwardConvexWeight: 0 }, new Map(), imposed);
    runs.exitOff = analyseFragment(tube.mesh, { contextBreakExitWeight: 0 }, new Map(), imposed);
    runs.on = analyseFragment(tube.mesh, {}, new Map(), imposed);
  }, 120_000);

  it('reads the convex face facing the axis as break face', () => {
    // Without the term (weight 0) none of that face is read as break; with it 0.39 of it (the
    // regions near the plate's edges face the axis less squarely or curve less), and the
    // agreement with the construction goes from 0.19 to 0.43 with the break-exit term (0.33
    // without; measured, 1 mm tube edges).
    expect(cutReadAsBreak(runs.off, 0)).toBeLessThan(0.05);
    expect(cutReadAsBreak(runs.on, 0)).toBeGreaterThan(0.3);
    expect(fractureAgreement(runs.on, tube.truth, areas)).toBeGreaterThan(fractureAgreement(runs.off, tube.truth, areas) + 0.1);
  });

  it('reads the face whose rays cross squarely into that break face as break face too', () => {
    // Without the break-exit term (weight 0) none of cut 1 is read as break; with it 0.30 (its
    // middle region, which faces out squarely; the regions at the plate's edges take in some
    // of the outer strip and face out less squarely), and the agreement goes from 0.33 to 0.43
    // (measured). That face crosses the plate head-on everywhere (first evidence -4.9), so
    // weights under about 55 leave it as outer surface.
    expect(cutReadAsBreak(runs.exitOff, 1)).toBeLessThan(0.05);
    expect(cutReadAsBreak(runs.on, 1)).toBeGreaterThan(0.25);
    expect(fractureAgreement(runs.on, tube.truth, areas)).toBeGreaterThan(fractureAgreement(runs.exitOff, tube.truth, areas) + 0.07);
  });
});
