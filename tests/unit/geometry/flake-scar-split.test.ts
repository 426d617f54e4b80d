import { beforeAll, describe, expect, it } from 'vitest';
import type { FragmentAnalysis } from '../../../core/geometry/analyse-fragment';
import { analysedSplinter, cutReadAsBreak, fractureAgreement, type BrokenTube } from './broken-tube';

/**
 * Flake scars along the cavity (flake-scar-split.ts, `flakeScarDepthRatio`), checked on pieces
 * with analytic truth (broken-tube.ts: a triangle is a break triangle exactly when its corners
 * lay on a cut surface) of a tube 12/8 mm (a wall of 4 mm). The axis is imposed (the tube's
 * own, the z axis) so that only the regions and their classes are under test.
 * - The scarred splinter: a 120-degree splinter 60 mm long whose inner wall is taken off by a
 *   cone about the axis (half angle 6 degrees, radius 11.2 mm at z = -32 shrinking by tan 6° per
 *   mm): the scar meets the cavity at z = -32 + 3.2 / tan 6° = -1.6 mm and runs 2.99 mm deep
 *   into the 4 mm wall at the end z = -30 (depth 3.2 - (z + 32) tan 6°). The scar's normal is 6
 *   degrees off the cavity's (the cone's generator against the cylinder's), under the growth
 *   angle (10 degrees), so region growing joins scar and cavity; the wall behind the scar is
 *   4 mm less that depth, so its inward rays leave through the outer surface head-on after less
 *   than 0.6 of the cavity's 4 mm where the depth exceeds 1.6 mm, i.e. for z < -32 + 1.6 /
 *   tan 6° = -16.8 mm: about 46% of the scar's length.
 * - The control: the same splinter without the scar, which must read the same with the rule
 *   and without (no region there has a shallow part beside a deep one).
 */
const SIDE = (60 * Math.PI) / 180;
const OFF = { flakeScarDepthRatio: 0 };
const ON = { flakeScarDepthRatio: 0.6 };
type Piece = { tube: BrokenTube; off: FragmentAnalysis; on: FragmentAnalysis; areas: Float64Array };
let scarred: Piece;
let plain: Piece;

function piece(scar: boolean): Promise<Piece> {
  return analysedSplinter(SIDE, scar ? [{ baseZ: -32, baseRadius: 11.2, halfAngleDeg: 6, keepOutside: true }] : [], { off: OFF, on: ON });
}

describe('a flake scar along the cavity (analytic truth)', () => {
  beforeAll(async () => {
    scarred = await piece(true);
    plain = await piece(false);
  }, 300_000);

  it('reads the deep part of the scar as break', () => {
    const { tube, off, on, areas } = scarred;
    const scar = 4;
    console.log('scar read as break', cutReadAsBreak(off, tube.cutOf, areas, scar), cutReadAsBreak(on, tube.cutOf, areas, scar),
      'agreement', fractureAgreement(off, tube.truth, areas), fractureAgreement(on, tube.truth, areas));
    expect(cutReadAsBreak(off, tube.cutOf, areas, scar)).toBeLessThan(0.2);
    expect(cutReadAsBreak(on, tube.cutOf, areas, scar)).toBeGreaterThan(0.35);
    expect(fractureAgreement(on, tube.truth, areas)).toBeGreaterThan(fractureAgreement(off, tube.truth, areas) + 0.03);
  });

  it('leaves a splinter without a scar as it was', () => {
    const { tube, off, on, areas } = plain;
    console.log('plain agreement', fractureAgreement(off, tube.truth, areas), fractureAgreement(on, tube.truth, areas));
    expect(Array.from(on.triangleClass)).toEqual(Array.from(off.triangleClass));
    expect(fractureAgreement(on, tube.truth, areas)).toBeGreaterThan(0.9);
  });
});
