import { beforeAll, describe, expect, it } from 'vitest';
import type { FragmentAnalysis } from '../../../core/geometry/analyse-fragment';
import { shallowOuterRegions } from '../../../core/geometry/shallow-outer-regions';
import type { WallRays } from '../../../core/geometry/wall-rays';
import { analysedSplinter, cutReadAsBreak, fractureAgreement, type BrokenTube } from './broken-tube';

/**
 * Breaks read as outer surface because they face out like it (shallow-outer-regions.ts,
 * `shallowOuterDepthRatio`), checked on pieces with analytic truth (broken-tube.ts: a triangle
 * is a break triangle exactly when its corners lay on a cut plane) of a tube 12/8 mm (a wall of
 * 4 mm). The axis is imposed (the tube's own, the z axis) so that only the classes are under test.
 * - The bevelled splinter: a 150-degree splinter 60 mm long (two planes through the axis at
 *   +-75 degrees from x) whose outer side is cut flat by the plane x = 9: the flat face runs
 *   where the outer circle is beyond x = 9, |y| < sqrt(12² - 9²) = 7.94 mm (+-41 degrees), and
 *   faces +x, out from the axis (radial component x / sqrt(x² + y²), 0.75-1), as squarely as the
 *   outer surface. Its inward rays (-x) meet the cavity circle at x = sqrt(64 - y²) head-on
 *   (cosine sqrt(64 - y²) / 8 at least 0.9) only for |y| < 8 sqrt(1 - 0.81) = 3.49 mm, after
 *   9 - sqrt(64 - y²) = 1.0-1.8 mm, against the 4 mm the outer surface's radial rays cross (the
 *   whole wall): 0.25-0.45 of it. The thin-crossing term (under 0.1 of the distance from the
 *   axis, 0.9 mm) does not reach it.
 * - The control: the same splinter without the flat cut, which must read the same with the rule
 *   and without (every crossing from its outer surface is the whole 4 mm wall).
 */
const SIDE = (75 * Math.PI) / 180;
const OFF = { shallowOuterDepthRatio: 0 };
const ON = { shallowOuterDepthRatio: 0.5 };
type Piece = { tube: BrokenTube; off: FragmentAnalysis; on: FragmentAnalysis; areas: Float64Array };
let bevelled: Piece;
let plain: Piece;

function piece(bevel: boolean): Promise<Piece> {
  return analysedSplinter(SIDE, bevel ? [{ normal: [-1, 0, 0], offset: -9 }] : [], { off: OFF, on: ON });
}

describe('a flat break along the outer side of the wall (analytic truth)', () => {
  beforeAll(async () => {
    bevelled = await piece(true);
    plain = await piece(false);
  }, 300_000);

  it('reads the flat face as break', () => {
    const { tube, off, on, areas } = bevelled;
    const flat = 4;
    console.log('flat face read as break', cutReadAsBreak(off, tube.cutOf, areas, flat), cutReadAsBreak(on, tube.cutOf, areas, flat),
      'agreement', fractureAgreement(off, tube.truth, areas), fractureAgreement(on, tube.truth, areas));
    expect(cutReadAsBreak(off, tube.cutOf, areas, flat)).toBeLessThan(0.2);
    expect(cutReadAsBreak(on, tube.cutOf, areas, flat)).toBeGreaterThan(0.8);
    expect(fractureAgreement(on, tube.truth, areas)).toBeGreaterThan(fractureAgreement(off, tube.truth, areas) + 0.1);
  });

  it('leaves a splinter without the flat cut as it was', () => {
    const { tube, off, on, areas } = plain;
    console.log('plain agreement', fractureAgreement(off, tube.truth, areas), fractureAgreement(on, tube.truth, areas));
    expect(Array.from(on.triangleClass)).toEqual(Array.from(off.triangleClass));
    expect(fractureAgreement(on, tube.truth, areas)).toBeGreaterThan(0.9);
  });
});

describe('shallowOuterRegions', () => {
  // Worked by hand from the definition. Regions: 0 and 1 read outer, 2 medullary, 3 a break.
  // Head-on crossings outer -> medullary: region 0 eleven at 4 mm, region 1 ten at 1.5 mm and
  // one at 4 mm; the fragment's reference is the median of those 22 depths (sorted, index 11:
  // the twelfth, 4 mm). Region 1's median (index 5 of its 11) is 1.5 mm, under 0.5 x 4 = 2:
  // a break. Region 0's is 4 mm. Rays that leave obliquely (cosine 0.5) or through the break
  // region 3 do not count, nor do rays from region 2.
  const rows: Array<[number, number, number, number]> = []; // [from triangle, exit triangle, depth, exit cosine]
  for (let i = 0; i < 11; i++) rows.push([0, 2, 4, 1]);
  for (let i = 0; i < 10; i++) rows.push([1, 2, 1.5, 0.95]);
  rows.push([1, 2, 4, 1]);
  for (let i = 0; i < 30; i++) rows.push([0, 2, 0.5, 0.5], [0, 3, 0.5, 1], [2, 0, 0.5, 1]);
  const rays: WallRays = {
    triangles: Uint32Array.from(rows.map((r) => r[0])),
    exitTriangle: Int32Array.from(rows.map((r) => r[1])),
    distance: Float32Array.from(rows.map((r) => r[2])),
    exitCosine: Float32Array.from(rows.map((r) => r[3])),
    outwardCosine: new Float32Array(rows.length).fill(-2),
  };
  const region = Uint32Array.from([0, 1, 2, 3]); // triangle i lies in region i
  const outer = (r: number): boolean => r <= 1, medullary = (r: number): boolean => r === 2;
  const options = { depthRatio: 0.5, headOnCosineMin: 0.9, minRays: 10 };

  it('takes the region whose crossings are shallow for the piece', () => {
    expect(shallowOuterRegions(region, 4, outer, medullary, rays, options)).toEqual([false, true, false, false]);
  });

  it('needs minRays crossings per region, and takes none when off', () => {
    expect(shallowOuterRegions(region, 4, outer, medullary, rays, { ...options, minRays: 12 })).toEqual([false, false, false, false]);
    expect(shallowOuterRegions(region, 4, outer, medullary, rays, { ...options, depthRatio: 0 })).toEqual([false, false, false, false]);
  });

  it('compares with the median, not a mean: a ratio of 0.3 leaves 1.5 mm against 4 mm alone', () => {
    expect(shallowOuterRegions(region, 4, outer, medullary, rays, { ...options, depthRatio: 0.3 })).toEqual([false, false, false, false]);
  });
});
