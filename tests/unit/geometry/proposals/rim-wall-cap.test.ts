/**
 * The rim wall's loss in the candidate cost stops growing beyond RIM_WALL_LOSS_CAP scales
 * (capped-cauchy-loss.ts), so a wall reading that failed on one side (a ray that missed the
 * medullary surface and crossed the whole shaft) costs a true pair a bounded amount.
 * The loss: the Lorentzian log(1 + z^2) of Black & Rangarajan 1996 (IJCV 19:57-91), truncated as
 * in Blake & Zisserman 1987 ("Visual Reconstruction"); its values at chosen z are analytic.
 * Fixtures from manifold-3d (broken-tube.ts): a tube of outer radius 12 mm and inner radius 7 mm
 * (a wall of 5 mm) broken across at z = 0, the cut roughened along its normal. Truth by
 * construction: the two sides of one cut carry the same surface (normals reversed); a cut
 * tilted 50 degrees out of the cross-section is another break (its course along the shaft and
 * its span along the axis differ). A ray from the outer surface that misses the cavity leaves
 * through the far side of the tube after the outer diameter, 24 mm (analytic).
 */
import { describe, expect, it } from 'vitest';
import { firstBreakFaceTraits } from './first-break-face-traits';
import { candidateFacePairs, type IndexedFace } from '../../../../core/geometry/proposals/candidate-index';
import { cappedCauchyLoss } from '../../../../core/geometry/proposals/capped-cauchy-loss';
import { DESCRIPTOR_FIGURES, RIM_WALL_LOSS_CAP, describeFace, partnerCost } from '../../../../core/geometry/proposals/face-descriptor';
import type { FaceTraits } from '../../../../core/geometry/proposals/face-traits';

describe('the capped Lorentzian', () => {
  it('is log(1 + z^2) up to the cap and log(1 + cap^2) beyond it; uncapped without one', () => {
    // analytic values: log(1 + 3^2) = log 10, log(1 + 5^2) = log 26
    expect(cappedCauchyLoss(3, 5)).toBeCloseTo(Math.log(10), 12);
    expect(cappedCauchyLoss(-3, 5)).toBeCloseTo(Math.log(10), 12);
    expect(cappedCauchyLoss(7, 5)).toBeCloseTo(Math.log(26), 12);
    expect(cappedCauchyLoss(70, 5)).toBeCloseTo(Math.log(26), 12);
    expect(cappedCauchyLoss(7)).toBeCloseTo(Math.log(50), 12);
    expect(cappedCauchyLoss(7, Infinity)).toBeCloseTo(Math.log(50), 12);
  });
});

describe('a wall reading that failed on one side of a break', () => {
  it('costs the pair a bounded amount, so the partner still ranks ahead of a break of another course', async () => {
    const r = 0.5;
    const face = await firstBreakFaceTraits([{ normal: [0, 0, 1], offset: 0 }], r);
    const partner = await firstBreakFaceTraits([{ normal: [0, 0, -1], offset: 0 }], r);
    const tilt = (50 * Math.PI) / 180;
    const otherCourse = await firstBreakFaceTraits([{ normal: [0, -Math.sin(tilt), -Math.cos(tilt)], offset: 0 }], r);
    // both sides read the 5 mm wall (analytic: 12 - 7 mm) within 10%
    for (const t of [face, partner, otherCourse]) expect(Math.abs((t.rimThickness ?? 0) - 5)).toBeLessThan(0.5);
    // the partner's rays missed the cavity: 24 mm (the outer diameter); worse still, 60 mm
    const misread = { ...partner, rimThickness: 24 };
    const worse = { ...partner, rimThickness: 60 };
    const wall = DESCRIPTOR_FIGURES.find((x) => x.name === 'log wall thickness at the rim')!;
    expect(wall.cap).toBe(RIM_WALL_LOSS_CAP);
    const cost = (t: FaceTraits): number => partnerCost(describeFace(face), describeFace(t));
    // the misreading adds weight x log(1 + cap^2) and no more (the well-read wall terms are near 0)
    const bound = wall.weight * Math.log1p(RIM_WALL_LOSS_CAP ** 2);
    expect(cost(misread) - cost(partner)).toBeGreaterThan(0.9 * bound);
    expect(cost(misread) - cost(partner)).toBeLessThanOrEqual(bound + 1e-9);
    expect(cost(worse)).toBeCloseTo(cost(misread), 9);
    // uncapped, the misreading alone (log(24 / 5) / scale = 15.7 scales) would cost more than the other break does
    const uncapped = cost(partner) + wall.weight * Math.log1p((Math.log(24 / 5) / wall.scale) ** 2);
    expect(uncapped).toBeGreaterThan(cost(otherCourse));
    // capped, the partner with the misread wall ranks first in the face's list (the other break's own list may still
    // hold the face: the union keeps it)
    expect(cost(misread)).toBeLessThan(cost(otherCourse));
    const faces: IndexedFace[] = [face, misread, otherCourse].map((traits, fragment) => ({ fragment, face: 0, traits }));
    const pairs = candidateFacePairs(faces, { k: 1 });
    expect(pairs.some((p) => p.a === 0 && p.b === 1)).toBe(true);
  }, 120_000);
});
