import { beforeAll, describe, expect, it } from 'vitest';
import type { FragmentAnalysis } from '../../../core/geometry/analyse-fragment';
import { analysedTube, cutReadAsBreak, fractureAgreement, tubeAxis, type BrokenTube } from './broken-tube';

/**
 * The uncrossed-inward term of the neighbourhood pass (region-context.ts,
 * `contextUncrossedInwardWeight`), checked on a splinter with analytic truth (broken-tube.ts: a
 * triangle is a break triangle exactly when its corners lay on a cut plane). A thick-walled
 * tube 18/7.5 mm (the wall of a cattle tibia shaft, 10.5 mm) is cut into a 80-degree splinter
 * (two planes through the axis at +-40 degrees, two across it 60 mm apart) and its inner side
 * is taken off by a plane x cos 35 + z sin 35 = c: a bevel running along the wall. Its outward
 * normal (-cos 35, 0, -sin 35) faces the axis (radial component -0.82 in the middle of the
 * splinter, below the -0.5 at which a region counts as facing the axis), the face is flat
 * (mean curvature 0, not concave), and the rays shot into the bone from it, along (cos 35, 0,
 * sin 35), reach the outer surface at cos 35 = 0.82 off its normal at best (under the head-on
 * cosine 0.9: they run along the wall, none crosses it squarely). The medullary surface, the
 * other surface facing the axis, sends its rays straight across the wall to the outer surface.
 * The shaft axis is imposed (the tube's own, the z axis) so that only the classification is
 * under test.
 */
const COS = Math.cos((35 * Math.PI) / 180), SIN = Math.sin((35 * Math.PI) / 180);
const SIDE = (40 * Math.PI) / 180;
const tubes: BrokenTube[] = [];
const runs: Array<{ off: FragmentAnalysis; on: FragmentAnalysis; areas: Float64Array }> = [];

describe('a break face that faces the axis but neither crosses the wall nor is concave (bevel along a thick wall, analytic truth)', () => {
  beforeAll(async () => {
    // Two depths of the bevel: it leaves the cavity 13 and 14 mm / cos 35 from the axis along x.
    for (const c of [13, 14]) {
      const { tube, areas, off, on } = await analysedTube({
        outerRadius: 18, innerRadius: 7.5, length: 90, roughness: 0.25,
        cuts: [
          { normal: [COS, 0, SIN], offset: c },
          { normal: [Math.sin(SIDE), Math.cos(SIDE), 0], offset: 0 }, { normal: [Math.sin(SIDE), -Math.cos(SIDE), 0], offset: 0 },
          { normal: [0, 0, 1], offset: -30 }, { normal: [0, 0, -1], offset: -30 },
        ],
      }, { off: { contextUncrossedInwardWeight: 0 }, on: {} }, tubeAxis(18));
      tubes.push(tube);
      runs.push({ off, on, areas });
    }
  }, 240_000);

  it('reads more of the bevel as break face', () => {
    // Measured (1 mm tube edges): 0.81 -> 0.91 of the bevel at c = 13, 0.80 -> 0.91 at c = 14;
    // the rest of it are narrow regions along its rims that take in some medullary surface.
    for (let i = 0; i < tubes.length; i++) {
      const { off, on, areas } = runs[i];
      expect(cutReadAsBreak(off, tubes[i].cutOf, areas, 0)).toBeLessThan(0.85);
      expect(cutReadAsBreak(on, tubes[i].cutOf, areas, 0)).toBeGreaterThan(0.88);
      expect(fractureAgreement(on, tubes[i].truth, areas)).toBeGreaterThan(fractureAgreement(off, tubes[i].truth, areas) + 0.01);
    }
  });

  it('leaves the medullary surface, whose rays cross the wall, as original surface', () => {
    for (let i = 0; i < tubes.length; i++) {
      const { on, areas } = runs[i];
      let med = 0, kept = 0;
      for (let f = 0; f < on.triangleClass.length; f++) {
        const src = on.sourceTriangle[f];
        if (tubes[i].truth[src] !== 0) continue;
        const p = tubes[i].mesh.positions, t = tubes[i].mesh.triangles;
        const x = (p[3 * t[3 * src]] + p[3 * t[3 * src + 1]] + p[3 * t[3 * src + 2]]) / 3;
        const y = (p[3 * t[3 * src] + 1] + p[3 * t[3 * src + 1] + 1] + p[3 * t[3 * src + 2] + 1]) / 3;
        if (Math.hypot(x, y) > 9) continue; // the cavity wall (radius 7.5), not the outer surface (18)
        med += areas[src];
        if (on.triangleClass[f] !== 0) kept += areas[src];
      }
      expect(med).toBeGreaterThan(100);
      expect(kept / med).toBeGreaterThan(0.9);
    }
  });
});
