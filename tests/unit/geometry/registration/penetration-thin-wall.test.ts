/**
 * How deep one piece runs into the other (score.ts penetrationMm) beside a thin wall (issue 6,
 * item 5: true joins whose pieces have thin walls or sharp break tips read 4-6 mm of
 * interpenetration at their exact motion on dev seed 340, and scored under the run's minimum).
 * Analytic truth, solids built by manifold-3d: a cube resting on a slab shares no volume with it
 * whatever the slab's thickness, so the depth must read 0; the same cube sunk 2 mm into a thick
 * block has its bottom 2 mm inside (its lowest samples are 2 mm from the block's top, the block's
 * nearest surface), so the 98th percentile depth must read about 2 mm. Before the closest
 * triangle's own normal had to agree with the vote of the nearest surface samples, a slab thinner
 * than the sample spacing put samples of its underside among the voters of points above its top,
 * and the cube resting on it read 3.9-5.4 mm deep.
 */
import { describe, expect, it } from 'vitest';
import { kernel } from '../../../support/bunny-cut';
import { manifoldArrays } from '../../../support/manifold-arrays';
import { breakFaceFromLabels } from '../../../support/break-face-from-labels';
import { DEFAULT_FPFH_RADIUS_SPACINGS, prepareFragment, type PreparedFragment } from '../../../../core/geometry/proposals/prepared-fragment';
import { DEFAULT_MATCH_PARAMETERS, scoredSide } from '../../../../core/geometry/proposals/pairwise-match';
import { transformFrom } from '../../../../core/geometry/registration/rigid-transform';
import { scoreJoin, type JoinScore } from '../../../../core/geometry/registration/score';

const identity = transformFrom([1, 0, 0, 0, 1, 0, 0, 0, 1], [0, 0, 0]);

/** A box of `size` at corner `at` (edges refined to 1 mm), its break face the triangles `faceOf` picks by centroid. */
async function box(size: [number, number, number], at: [number, number, number], faceOf: (c: number[]) => boolean, spacing: number): Promise<PreparedFragment> {
  const { Manifold } = await kernel();
  const { positions, triangles } = manifoldArrays(Manifold.cube(size, false).translate(at).refineToLength(1).getMesh());
  const label = new Uint8Array(triangles.length / 3);
  for (let t = 0; t < label.length; t++) {
    const c = [0, 1, 2].map((k) => (positions[3 * triangles[3 * t] + k] + positions[3 * triangles[3 * t + 1] + k] + positions[3 * triangles[3 * t + 2] + k]) / 3);
    label[t] = faceOf(c) ? 1 : 0;
  }
  const face = breakFaceFromLabels(positions, triangles, label, spacing);
  return prepareFragment({ positions, triangles, faces: [face] }, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS, patches: false });
}

/** A block of thickness `t` (top face z = t, its break face) and a 10 mm cube whose bottom (its break face) lies at z = t - sunk. */
async function cubeOn(t: number, sunk: number, spacing: number): Promise<JoinScore> {
  const A = await box([40, 40, t], [0, 0, 0], (c) => c[2] > t - 1e-3, spacing);
  const B = await box([10, 10, 10], [15, 15, t - sunk], (c) => c[2] < t - sunk + 1e-3, spacing);
  return scoreJoin(scoredSide(A, A.faces[0]), scoredSide(B, B.faces[0]), identity, { contactTolerance: DEFAULT_MATCH_PARAMETERS.contactToleranceSpacings * spacing, spacing });
}

describe('interpenetration beside a thin wall', () => {
  for (const [t, spacing] of [[0.3, 1.2], [0.8, 1.2], [0.3, 1.5]] as const) {
    it(`a cube resting on a ${t} mm slab (samples ${spacing} mm apart) is not inside it`, async () => {
      const s = await cubeOn(t, 0, spacing);
      expect(s.contactFraction).toBeGreaterThan(0.9); // the cube's bottom lies on the slab (the set-up does what it claims)
      expect(s.penetrationMm).toBeLessThan(0.1);
    }, 60000);
  }
  it('a cube sunk 2 mm into a thick block reads about 2 mm deep', async () => {
    const s = await cubeOn(10, 2, 1.2);
    expect(s.penetrationMm).toBeGreaterThan(1.7);
    expect(s.penetrationMm).toBeLessThan(2.1);
  }, 60000);
});
