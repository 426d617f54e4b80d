/**
 * The shaft centre of splinters from a three-lobed shaft whose cavity is the outer outline
 * scaled about the axis (r_in(θ) = k r_out(θ)), on pieces whose truth comes from their
 * construction (broken-tube.ts, manifold-3d): a round tube (outer radius 13 mm, cavity
 * 8.5 mm, k = 0.654) cut along two planes through its axis and across at both ends, then
 * scaled by 1 + 0.13 cos 3θ across the axis after labelling (a smooth map keeps the labels and
 * the tube's axis, the z axis); the scaling multiplies both radii at each θ by the same
 * factor, so the cavity stays the outer outline scaled by k about the axis.
 * Analytic geometry: on r(θ) = ρ (1 + e cos 3θ) the normal leans from radial by
 * atan(3e sin 3θ / (1 + e cos 3θ)), up to 21 degrees for e = 0.13, so the normal lines of
 * outer and cavity faces miss the axis and their consensus meeting point (fitShaftAxis) lands
 * beside it (measured 5.2 mm off on this piece; the homothety centre 0.9 mm). A homothety with centre c and ratio k
 * maps each outer point to the cavity point with the parallel normal, p_in = c + k (p_out - c),
 * so the line through such a pair passes through the axis whatever the lobes
 * (section-homothety.ts, homothetyCentre; settings sectionHomothety*, off by default).
 */
import { describe, expect, it } from 'vitest';
import { analyseFragment } from '../../../core/geometry/analyse-fragment';
import { lobedTubePiece, offAxis, type BrokenTube } from './broken-tube';

/** The homothety centre is off by default (settings.ts); the gain the dev study measured. */
const on = { sectionHomothetyGain: 0.03 };

function piece(lobe: number): Promise<BrokenTube> {
  return lobedTubePiece({ lobe, twist: 0, fromDeg: 40, toDeg: 160 });
}

describe('splinters of a three-lobed shaft with a scaled cavity', () => {
  it('puts the centre on the axis for the piece from 40 to 160 degrees', async () => {
    const lobed = await piece(0.13);
    const without = analyseFragment(lobed.mesh).axis;
    const axis = analyseFragment(lobed.mesh, on).axis;
    // Truth: the z axis (construction).
    expect(offAxis(without.point, without.direction)).toBeGreaterThan(3);
    expect(offAxis(axis.point, axis.direction)).toBeLessThan(1.5);
  }, 60_000);

  it('leaves the centre of the same piece of a round tube within a millimetre of the axis', async () => {
    const round = await piece(0);
    const axis = analyseFragment(round.mesh, on).axis;
    expect(offAxis(axis.point, axis.direction)).toBeLessThan(1);
  }, 60_000);
});
