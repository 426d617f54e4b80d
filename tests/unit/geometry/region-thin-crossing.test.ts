import { beforeAll, describe, expect, it } from 'vitest';
import type { FragmentAnalysis } from '../../../core/geometry/analyse-fragment';
import type { ShaftAxis } from '../../../core/geometry/shaft-axis';
import { thinWallCrossingShare } from '../../../core/geometry/thin-wall-crossing';
import type { WallRays } from '../../../core/geometry/wall-rays';
import { analysedTube, cutReadAsBreak, fractureAgreement, tubeAxis, type BrokenTube } from './broken-tube';

/**
 * The thin-crossing term of the neighbourhood pass (region-context.ts,
 * `contextThinCrossingWeight`, thin-wall-crossing.ts), checked on pieces with analytic truth
 * (broken-tube.ts: a triangle is a break triangle exactly when its corners lay on a cut plane)
 * of a thick-walled tube 18/7.5 mm (the wall of a cattle tibia shaft, 10.5 mm, 0.58 of the
 * outer radius). A slab is cut out of the wall by two parallel planes x = c and x = c + t
 * (t = 1 and 0.8 mm, c = 13 and 12: inside the wall, clear of the cavity) and two planes
 * across the tube 60 mm apart: its two large faces are breaks, the outer face of the pair
 * (x = c + t) looks away from the axis (radial component x / sqrt(x² + y²), 0.8-1), its rays
 * cross to the other large face head-on after t, under a tenth of their distance from the axis
 * (13-18 mm); its only bone surface is the two strips of the tube's outer surface, t wide,
 * along its long edges. A splinter of the same tube (two planes through the axis 80 degrees
 * apart) is the control: its outer surface crosses the whole 10.5 mm wall. The shaft axis is
 * imposed (the tube's own, the z axis) so that only the classification is under test.
 */
const RUNS = { off: { contextThinCrossingWeight: 0 }, on: {} };
const SIDE = (40 * Math.PI) / 180;
const slabs: Array<{ tube: BrokenTube; off: FragmentAnalysis; on: FragmentAnalysis; areas: Float64Array }> = [];
let splinter: { tube: BrokenTube; off: FragmentAnalysis; on: FragmentAnalysis; areas: Float64Array };

describe('a slab cut from a thick wall by two near-parallel breaks (analytic truth)', () => {
  beforeAll(async () => {
    for (const [c, t] of [[13, 1], [12, 0.8]]) {
      slabs.push(await analysedTube({
        outerRadius: 18, innerRadius: 7.5, length: 90, roughness: 0.25, edgeLength: 0.7,
        cuts: [
          { normal: [1, 0, 0], offset: c }, { normal: [-1, 0, 0], offset: -(c + t) },
          { normal: [0, 0, 1], offset: -30 }, { normal: [0, 0, -1], offset: -30 },
        ],
      }, RUNS, tubeAxis(18)));
    }
    splinter = await analysedTube({
      outerRadius: 18, innerRadius: 7.5, length: 90, roughness: 0.25,
      cuts: [
        { normal: [Math.sin(SIDE), Math.cos(SIDE), 0], offset: 0 }, { normal: [Math.sin(SIDE), -Math.cos(SIDE), 0], offset: 0 },
        { normal: [0, 0, 1], offset: -30 }, { normal: [0, 0, -1], offset: -30 },
      ],
    }, RUNS, tubeAxis(18));
  }, 300_000);

  it('reads the slab face that looks away from the axis as break face', () => {
    // Measured (0.7 mm tube edges, default weight 20 against 0): the outer face of the pair
    // 0.00 -> 0.65 (c = 13, t = 1) and 0.00 -> 0.73 (c = 12, t = 0.8) read as break, agreement
    // 0.056 -> 0.327 and 0.040 -> 0.355 (the face towards the axis still reads medullary, the
    // strips break; weight 10 moved only the first slab). Without the term it crosses the
    // other face head-on, faces out and reads outer cortical.
    for (const { tube, off, on, areas } of slabs) {
      expect(cutReadAsBreak(off, tube.cutOf, areas, 1)).toBeLessThan(0.1);
      expect(cutReadAsBreak(on, tube.cutOf, areas, 1)).toBeGreaterThan(0.6);
      expect(fractureAgreement(on, tube.truth, areas)).toBeGreaterThan(fractureAgreement(off, tube.truth, areas) + 0.2);
    }
  });

  it('leaves the outer surface of a whole-wall splinter alone (its rays cross the 10.5 mm wall)', () => {
    const { tube, off, on, areas } = splinter;
    expect(fractureAgreement(on, tube.truth, areas)).toBeCloseTo(fractureAgreement(off, tube.truth, areas), 3);
    expect(fractureAgreement(on, tube.truth, areas)).toBeGreaterThan(0.9);
  });
});

describe('thinWallCrossingShare', () => {
  // Two rays from region 0 at 10 mm from the z axis (a triangle at x = 10 facing out) into two
  // exit triangles at x = 9.5 (0.5 mm: thin, under 0.1 x 10) and x = 7 (3 mm: not thin), both
  // facing the axis; a third ray leaves obliquely. Worked by hand from the definition.
  const centroids = Float32Array.from([10, 0, 0, 9.5, 0, 0, 7, 0, 0]);
  const normals = Float32Array.from([1, 0, 0, -1, 0, 0, -1, 0, 0]);
  const rays: WallRays = {
    triangles: Uint32Array.from([0, 0, 0]),
    distance: Float32Array.from([0.5, 3, 0.5]),
    exitCosine: Float32Array.from([1, 1, 0.5]),
    exitTriangle: Int32Array.from([1, 2, 1]),
    outwardCosine: Float32Array.from([-2, -2, -2]),
  };
  const region = Uint32Array.from([0, 1, 1]);
  const axis: ShaftAxis = { direction: [0, 0, 1], point: [0, 0, 0], radius: 10, support: 0.9 };
  const options = { headOnCosineMin: 0.9, depthRatioMax: 0.1, radialMin: 0.5, supportMin: 0.65 };
  it('counts only head-on crossings thinner than the ratio of the start distance', () => {
    const share = thinWallCrossingShare(region, 2, rays, centroids, normals, axis, options);
    expect(share[0]).toBeCloseTo(1 / 3, 9);
    expect(share[1]).toBe(0);
  });
  it('counts nothing where the axis support is under the minimum', () => {
    const share = thinWallCrossingShare(region, 2, rays, centroids, normals, { ...axis, support: 0.6 }, options);
    expect(share[0]).toBe(0);
  });
});
