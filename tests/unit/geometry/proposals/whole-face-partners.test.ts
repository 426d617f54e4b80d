/**
 * Whole faces offered beside their parts (candidate-index.ts `wholeFacePartners`), checked on
 * analytic geometry. A piece broken straight across the shaft has a ring-shaped break face (an
 * annulus about the axis); when the segmentation cuts it at a corner of its rim, the two halves
 * of the ring are congruent (a half turn about the axis carries one onto the other), so no
 * pose-invariant figure can tell which half meets a partner that broke off only half the ring.
 * The candidate index may then pair the partner with the half that does not meet it; the whole
 * ring holds the contact whichever half it is.
 */
import { describe, expect, it } from 'vitest';
import { candidateFacePairs, WHOLE_FACE_PARTNERS, type IndexedFace } from '../../../../core/geometry/proposals/candidate-index';
import { faceTraits } from '../../../../core/geometry/proposals/face-traits';
import { computeFpfh } from '../../../../core/geometry/registration/fpfh';
import { sampledRing, type SampledRing } from '../../../support/sampled-ring';

const zAxis = { direction: [0, 0, 1] as [number, number, number], point: [0, 0, 0] as [number, number, number], support: 1 };


function indexed(fragment: number, face: number, s: SampledRing, whole?: number): IndexedFace {
  return { fragment, face, ...(whole === undefined ? {} : { whole }), traits: faceTraits(s.points, s.normals, s.area, computeFpfh(s.points, s.normals, 3), zAxis) };
}

describe('whole faces offered beside their parts', () => {
  const R = 12, r = 8;
  // A (fragment 0): the whole ring (face 0) and the half with x > 0 (face 1, a part of face 0).
  // B (fragment 1): broke off the half with x < 0; in place its face lies on A's ring, normals opposed.
  // C (fragment 2): the mirror of A's whole ring, a look-alike that takes A's whole face's best place.
  const aWhole = sampledRing(R, r, 1500, 1, 0, false), aPart = sampledRing(R, r, 750, 2, 1, false);
  const b = sampledRing(R, r, 750, 3, -1, true), c = sampledRing(R, r, 1500, 4, 0, true);
  const faces = [indexed(0, 0, aWhole, 0), indexed(0, 1, aPart, 0), indexed(1, 0, b, 0), indexed(2, 0, c, 0)];
  const has = (pairs: ReturnType<typeof candidateFacePairs>, fa: number, fb: number, ib: number): boolean => pairs.some((p) => p.a === 0 && p.faceA === fa && p.b === ib && p.faceB === fb);

  it('the contact in place lies on the whole face, not on the part that looks most like the partner (analytic)', () => {
    // B's samples lie in the plane of A's ring on the half x < 0: none on A's part (x > 0)
    let onPart = 0;
    for (let i = 0; i < b.points.length; i += 3) if (b.points[i] > 0) onPart++;
    expect(onPart).toBe(0);
    // both halves of a ring have the same pose-invariant figures: the part is B's best partner at k = 1
    const pairs = candidateFacePairs(faces, { k: 1 });
    expect(has(pairs, 1, 0, 1)).toBe(true);
    // and without offers the whole face is not paired with B (its own best is C)
    expect(has(pairs, 0, 0, 1)).toBe(false);
    expect(has(pairs, 0, 0, 2)).toBe(true);
  });

  it('pair the partner of a part with the part\'s whole face, within the number of offers per face', () => {
    expect(WHOLE_FACE_PARTNERS).toBeGreaterThan(0);
    const without = candidateFacePairs(faces, { k: 1, wholeFacePartners: 0 });
    const withOffers = candidateFacePairs(faces, { k: 1, wholeFacePartners: WHOLE_FACE_PARTNERS });
    expect(has(withOffers, 0, 0, 1)).toBe(true);
    // every pair chosen without offers is still there; the offers add at most wholeFacePartners per face
    for (const p of without) expect(withOffers.some((q) => q.a === p.a && q.b === p.b && q.faceA === p.faceA && q.faceB === p.faceB)).toBe(true);
    expect(withOffers.length - without.length).toBeGreaterThan(0);
    expect(withOffers.length - without.length).toBeLessThanOrEqual(WHOLE_FACE_PARTNERS * faces.length);
    // a whole face is never offered in place of itself, and faces of one fragment never pair
    expect(withOffers.every((p) => p.a !== p.b)).toBe(true);
  });
});
