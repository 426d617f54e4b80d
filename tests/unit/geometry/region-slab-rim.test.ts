import { beforeAll, describe, expect, it } from 'vitest';
import type { FragmentAnalysis } from '../../../core/geometry/analyse-fragment';
import type { ShaftAxis } from '../../../core/geometry/shaft-axis';
import { analysedTube, cutReadAsBreak, fractureAgreement, tubeAxis, type BrokenTube, type Cut } from './broken-tube';

/**
 * The slab-rim term of the neighbourhood pass (region-context.ts, `contextSlabRimWeight`),
 * checked on pieces with analytic truth (broken-tube.ts: a triangle is a break triangle exactly
 * when its corners lay on a cut plane) of a thick-walled tube 18/7.5 mm (the wall of a cattle
 * tibia shaft).
 * - Slabs cut out of the wall by two parallel planes x = c and x = c + t (c = 13, t = 1 and
 *   c = 12, t = 0.8: the pieces of region-thin-crossing.test.ts) and two planes across the
 *   tube 60 mm apart: both large faces are breaks; the slab's bone surface is two strips of the
 *   tube's outer surface, about t / cos(bearing) wide, along its long rims (where the planes
 *   leave the circle x² + y² = 18²), and its ends are breaks across the axis. The axis is
 *   fitted here (the planes' normal lines do not meet; for c = 12 the fit puts the centre at
 *   x = -15.6, 28 mm behind the face x = c, radius 29.3 mm, as on generated slabs such as dev
 *   s398 QS-10286, R 30.8 on a tibia of about 19):
 *   the thin-crossing and thin-partner terms then read both large faces as break, and the
 *   strips, narrow and curved, read as break too. A strip lying between two slab faces and
 *   facing out from or into the axis is where the slab meets the bone's outer or cavity
 *   surface, so it is bone surface; a rim facing along the axis (the ends) is a break.
 * - Controls whose breaks border no slab face, with the axis fitted and imposed (the tube's
 *   own, the z axis): an 80-degree splinter (two planes through the axis), a crescent of cavity
 *   wall cut again 0.4 mm outside the cavity (the thin bevel of region-thin-partner.test.ts),
 *   and a flake of outer surface cut off by the plane x = 17.4: their agreement must not move.
 */
const imposed = tubeAxis(18);
const SIDE = (40 * Math.PI) / 180;
const OFF = { contextSlabRimWeight: 0 };
const ON = { contextSlabRimWeight: 60 };
const ENDS: Cut[] = [{ normal: [0, 0, 1], offset: -30 }, { normal: [0, 0, -1], offset: -30 }];
type Piece = { tube: BrokenTube; off: FragmentAnalysis; on: FragmentAnalysis; areas: Float64Array };

function piece(cuts: Cut[], edgeLength: number | undefined, axis: ((fitted: ShaftAxis) => ShaftAxis) | undefined): Promise<Piece> {
  return analysedTube({ outerRadius: 18, innerRadius: 7.5, length: 90, roughness: 0.25, ...(edgeLength ? { edgeLength } : {}), cuts }, { off: OFF, on: ON }, axis);
}

const slabs: Piece[] = [];
const controls: Array<[string, Piece]> = [];

describe('the bone strips along the rims of a slab between two near-parallel breaks (analytic truth)', () => {
  beforeAll(async () => {
    for (const [c, t] of [[13, 1], [12, 0.8]]) {
      slabs.push(await piece([{ normal: [1, 0, 0], offset: c }, { normal: [-1, 0, 0], offset: -(c + t) }, ...ENDS], 0.7, undefined));
    }
    const splinter: Cut[] = [{ normal: [Math.sin(SIDE), Math.cos(SIDE), 0], offset: 0 }, { normal: [Math.sin(SIDE), -Math.cos(SIDE), 0], offset: 0 }, ...ENDS];
    for (const axis of [undefined, imposed]) {
      const how = axis ? 'axis imposed' : 'axis fitted';
      controls.push([`splinter, ${how}`, await piece(splinter, undefined, axis)]);
      controls.push([`crescent, ${how}`, await piece([...splinter, { normal: [-1, 0, 0], offset: -7.9 }], undefined, axis)]);
      controls.push([`outer flake, ${how}`, await piece([{ normal: [-1, 0, 0], offset: -17.4 }, ...ENDS], 0.7, axis)]);
    }
  }, 600_000);

  it('reads the slab strips as bone surface and keeps its faces as break', () => {
    // Measured (0.7 mm tube edges, fitted axis; the strips face out from it): bone surface read as break 0.99 -> 0.66 (c = 13, t = 1) and
    // 1.00 -> 0.39 (c = 12, t = 0.8); agreement 0.882 -> 0.910 and 0.934 -> 0.974.
    for (const { tube, off, on, areas } of slabs) {
      for (const cut of [0, 1]) expect(cutReadAsBreak(on, tube.cutOf, areas, cut)).toBeGreaterThan(0.9);
      const stripsOff = cutReadAsBreak(off, tube.cutOf, areas, -1), stripsOn = cutReadAsBreak(on, tube.cutOf, areas, -1);
      expect(stripsOff).toBeGreaterThan(0.95);
      expect(stripsOn).toBeLessThan(stripsOff - 0.25);
      expect(fractureAgreement(on, tube.truth, areas)).toBeGreaterThan(fractureAgreement(off, tube.truth, areas) + 0.02);
    }
  });

  it('leaves pieces whose breaks border no slab face as they were', () => {
    for (const [, { tube, off, on, areas }] of controls) {
      expect(fractureAgreement(on, tube.truth, areas)).toBeCloseTo(fractureAgreement(off, tube.truth, areas), 3);
    }
  });
});
