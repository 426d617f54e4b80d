/**
 * The lean figure compared on a scale widened by each piece's reading variance
 * (lean-reading-variance.ts, face-descriptor.ts `partnerCost`). Checks are arithmetic worked by
 * hand in the comments: the variance of a difference of two independent readings is the sum of
 * their variances (a standard result of probability, e.g. any first course: Var(X - Y) = Var X +
 * Var Y for independent X and Y), and the lean's loss is the Lorentzian log(1 + z^2) (Black &
 * Rangarajan 1996, capped-cauchy-loss.ts).
 */
import { describe, expect, it } from 'vitest';
import { DESCRIPTOR_FIGURES, LEAN_FIGURE, partnerCost, type FaceDescriptor } from '../../../../core/geometry/proposals/face-descriptor';
import { leanReadingVariance, MIN_SHARE } from '../../../../core/geometry/proposals/lean-reading-variance';
import { candidateFacePairs, type IndexedFace } from '../../../../core/geometry/proposals/candidate-index';
import type { FaceTraits } from '../../../../core/geometry/proposals/face-traits';

/** Traits with only what the model and the cost read (a shaft piece's face of the given share and lean). */
function traits(arcShare: number | undefined, radialLean = 0): FaceTraits {
  return {
    area: 100, extents: [5, 3, 0.5], normalSpread: [0.2, 0.1], meanFpfh: new Float32Array(33), rimThickness: 5,
    ...(arcShare === undefined ? {} : { tube: { outerRadius: 12, innerRadius: 7, axialSpan: 10, arcShare, axisCosine: 0.3, radialLean } }),
  } as unknown as FaceTraits;
}

/** A descriptor whose figures are all 0 but the lean, so only the lean term costs anything. */
function leanOnly(lean: number): FaceDescriptor {
  const figures = new Float64Array(DESCRIPTOR_FIGURES.length);
  figures[LEAN_FIGURE] = lean;
  return { figures, fpfh: new Float32Array(33), mirrored: new Float32Array(33) };
}

describe('the lean reading variance of a piece', () => {
  it('is (error / widest share)^2 for every face of a piece, with the share floored at MIN_SHARE', () => {
    const faces = [
      { fragment: 0, traits: traits(0.1) },
      { fragment: 0, traits: traits(0.25) }, // piece 0's widest face: a quarter of the circumference
      { fragment: 1, traits: traits(1) },
      { fragment: 2, traits: traits(0.01) },
      { fragment: 3, traits: traits(undefined) },
    ];
    const v = leanReadingVariance(faces, 0.03);
    // (0.03 / 0.25)^2 = 0.0144 on both faces of piece 0; (0.03 / 1)^2 = 0.0009
    expect(v[0]).toBeCloseTo(0.0144, 12);
    expect(v[1]).toBeCloseTo(0.0144, 12);
    expect(v[2]).toBeCloseTo(0.0009, 12);
    // a share under the floor, and a piece with no tube reading, read as MIN_SHARE: (0.03 / 0.05)^2 = 0.36
    expect(MIN_SHARE).toBe(0.05);
    expect(v[3]).toBeCloseTo(0.36, 12);
    expect(v[4]).toBeCloseTo(0.36, 12);
    expect([...leanReadingVariance(faces, 0)]).toEqual([0, 0, 0, 0, 0]);
  });

  it("widens the lean's scale in the partner cost by the sum of the two variances", () => {
    const a = leanOnly(0.15), b = leanOnly(0.05); // partners show opposite leans, so the lean is compared as the sum 0.2
    const { scale, weight } = DESCRIPTOR_FIGURES[LEAN_FIGURE];
    expect(scale).toBe(0.1);
    expect(weight).toBe(2);
    // plain: z = 0.2 / 0.1 = 2, cost 2 log(1 + 4) = 3.21888
    expect(partnerCost(a, b)).toBeCloseTo(2 * Math.log(5), 10);
    expect(partnerCost(a, b, 0)).toBe(partnerCost(a, b));
    // the worked example of lean-reading-variance.ts: 0.0144 + 0.0009 added to 0.1^2: scale
    // sqrt(0.0253) = 0.159060, z = 0.2 / 0.159060 = 1.257389, cost 2 log(1 + 1.581028) = 1.896375
    expect(partnerCost(a, b, 0.0153)).toBeCloseTo(1.896375, 5);
  });

  it("lets a narrow splinter's true partner into a face's list ahead of a look-alike when the splinter's lean is off", () => {
    // face 0 (a piece spanning the whole circumference, lean 0.3) and two candidates differing only in
    // lean: a splinter (share 0.1) whose reading is off by 0.15 (lean -0.15: sum 0.15), and a whole
    // ring (share 1) leaning -0.2 (sum 0.1). Plain scale: the ring costs less (z 1 against 1.5).
    // With error 0.03: the splinter's variance (0.03 / 0.1)^2 = 0.09 and the face's 0.0009
    // widen its scale to sqrt(0.1009) = 0.3177 (z 0.47, cost 2 log 1.223 = 0.402), while the
    // ring's is sqrt(0.0118) = 0.1086 (z 0.92, cost 2 log 1.848 = 1.228): the splinter comes first.
    const faces: IndexedFace[] = [
      { fragment: 0, face: 0, traits: traits(1, 0.3) },
      { fragment: 1, face: 0, traits: traits(0.1, -0.15) },
      { fragment: 2, face: 0, traits: traits(1, -0.2) },
    ];
    const first = (leanPieceError: number): number => {
      const pairs = candidateFacePairs(faces, { k: 1, leanPieceError, rerank: null, distinctWholeFaces: null });
      return pairs.filter((p) => p.a === 0).sort((x, y) => x.distance - y.distance)[0].b;
    };
    expect(first(0)).toBe(2);
    expect(first(0.03)).toBe(1);
  });
});
