/**
 * Distinct whole faces in the candidate index (candidate-index.ts `distinctWholeFaces`), checked
 * on analytic geometry. A piece broken straight across the shaft has a ring-shaped break face
 * (an annulus about the axis); cut at two corners of its rim, its two halves are congruent (a
 * half turn about the axis carries one onto the other) and each holds half the annulus's area,
 * pi (R^2 - r^2) / 2, so the whole face and its halves have alike pose-invariant figures. A look-
 * alike piece indexed as its whole ring and both halves therefore takes the first three places of
 * a face's list, and at k = 2 the plain rule spends places on several faces of one whole face.
 */
import { describe, expect, it } from 'vitest';
import { candidateFacePairs, DISTINCT_WHOLE_FACES, type FacePairCandidate, type IndexedFace } from '../../../../core/geometry/proposals/candidate-index';
import { distinctWholeFacesFirst } from '../../../../core/geometry/proposals/distinct-whole-faces-first';
import { faceTraits } from '../../../../core/geometry/proposals/face-traits';
import { computeFpfh } from '../../../../core/geometry/registration/fpfh';
import { sampledRing, type SampledRing } from '../../../support/sampled-ring';

const zAxis = { direction: [0, 0, 1] as [number, number, number], point: [0, 0, 0] as [number, number, number], support: 1 };


function indexed(fragment: number, face: number, s: SampledRing, whole: number): IndexedFace {
  return { fragment, face, whole, traits: faceTraits(s.points, s.normals, s.area, computeFpfh(s.points, s.normals, 3), zAxis) };
}

/** A piece indexed as its whole ring (face 0) and both halves (faces 1 and 2, parts of face 0). */
function ringAndHalves(fragment: number, R: number, r: number, seed: number, flip: boolean): IndexedFace[] {
  return [indexed(fragment, 0, sampledRing(R, r, 1500, seed, 0, flip), 0), indexed(fragment, 1, sampledRing(R, r, 750, seed + 1, 1, flip), 0), indexed(fragment, 2, sampledRing(R, r, 750, seed + 2, -1, flip), 0)];
}

describe('distinct whole faces in the candidate index', () => {
  // X (fragment 0): one ring; D (1): its look-alike, whole and halves; T (2): another ring, wider
  // in the wall; E (3): T's look-alike, whole and halves, so that T's own places go to E.
  const faces = [indexed(0, 0, sampledRing(12, 8, 1500, 1, 0, false), 0), ...ringAndHalves(1, 12, 8, 10, true), indexed(2, 0, sampledRing(13.5, 8, 1500, 20, 0, true), 0), ...ringAndHalves(3, 13.5, 8, 30, false)];
  const piecesOfX = (pairs: FacePairCandidate[]): Set<number> => new Set(pairs.filter((p) => p.a === 0).map((p) => p.b));
  // each piece here has one whole face, so a fragment pair is a pair of whole faces

  it('a ring\'s halves are congruent and the plain rule fills a list with them (analytic)', () => {
    const [whole, h1, h2] = ringAndHalves(1, 12, 8, 10, true);
    // the second moment of a uniform annulus about a diameter: E[x^2] = (R^2 + r^2) / 4 (standard
    // result, from E[rho^2] = (R^2 + r^2) / 2 and the symmetry in angle), so both in-plane spreads are sqrt(52)
    expect(whole.traits.extents[0] / Math.sqrt(52)).toBeCloseTo(1, 1);
    expect(whole.traits.extents[1] / Math.sqrt(52)).toBeCloseTo(1, 1);
    // each half: along the cut the same sqrt(52); across it E[x^2] - E[x]^2 with the centroid of a
    // half annulus at 4 (R^3 - r^3) / (3 pi (R^2 - r^2)) (standard centroid formula): both halves
    // the same figures within the sampling noise of 750 samples (6%)
    const across = Math.sqrt(52 - (4 * (12 ** 3 - 8 ** 3) / (3 * Math.PI * (12 ** 2 - 8 ** 2))) ** 2);
    for (const h of [h1, h2]) {
      expect(Math.abs(h.traits.extents[0] / Math.sqrt(52) - 1)).toBeLessThan(0.06);
      expect(Math.abs(h.traits.extents[1] / across - 1)).toBeLessThan(0.06);
    }
    // the plain rule at k = 2: the halves of the two look-alike pieces D and E take each other's
    // places, four face pairs (and the wholes a fifth) of the same two whole faces
    const plain = candidateFacePairs(faces, { k: 2, distinctWholeFaces: null, rerank: null });
    expect(plain.filter((p) => p.a === 1 && p.b === 3).length).toBeGreaterThanOrEqual(4);
  });

  it('one face pair per two whole faces: fewer face pairs, and the places go to other pieces', () => {
    const fragmentPairs = (pairs: FacePairCandidate[]): string[] => pairs.map((p) => `${p.a}:${p.b}`);
    const plain = candidateFacePairs(faces, { k: 2, distinctWholeFaces: null, rerank: null });
    for (const rerank of [null, undefined]) {
      const pairs = candidateFacePairs(faces, { k: 2, distinctWholeFaces: 'face pairs', ...(rerank === null ? { rerank } : {}) });
      // never two face pairs of the same two whole faces (each piece here has one whole face)
      expect(new Set(fragmentPairs(pairs)).size).toBe(pairs.length);
      expect(pairs.length).toBeLessThan(plain.length);
      // every pair of pieces the plain rule reaches is still reached, and X meets T besides
      for (const fp of fragmentPairs(plain)) expect(fragmentPairs(pairs)).toContain(fp);
      expect(fragmentPairs(plain)).not.toContain('0:2');
      expect(fragmentPairs(pairs)).toContain('0:2');
      // the cheapest partner is kept: X's best is its look-alike D's whole face
      expect(pairs.some((p) => p.a === 0 && p.b === 1 && p.faceB === 0)).toBe(true);
    }
  });

  it('each list: a second face of one whole face moves behind other whole faces', () => {
    const fragmentPairs = (pairs: FacePairCandidate[]): string[] => pairs.map((p) => `${p.a}:${p.b}`);
    const plain = candidateFacePairs(faces, { k: 2, distinctWholeFaces: null, rerank: null });
    const pairs = candidateFacePairs(faces, { k: 2, distinctWholeFaces: 'each list', rerank: null });
    // D's halves no longer spend both places on E's halves, and every pair of pieces stays reached
    expect(pairs.filter((p) => p.a === 1 && p.b === 3).length).toBeLessThan(plain.filter((p) => p.a === 1 && p.b === 3).length);
    for (const fp of fragmentPairs(plain)) expect(fragmentPairs(pairs)).toContain(fp);
    expect(piecesOfX(pairs).size).toBeGreaterThanOrEqual(2);
    // the helper keeps the order within the first of each group and within the rest
    expect(distinctWholeFacesFirst(['a1', 'a2', 'b1', 'a3', 'c1', 'b2'], (s) => s[0])).toEqual(['a1', 'b1', 'c1', 'a2', 'a3', 'b2']);
  });

  it('the default rule is DISTINCT_WHOLE_FACES', () => {
    const key = (pairs: FacePairCandidate[]): string[] => pairs.map((p) => `${p.a}.${p.faceA}-${p.b}.${p.faceB}`).sort();
    expect(key(candidateFacePairs(faces, { k: 2 }))).toEqual(key(candidateFacePairs(faces, { k: 2, distinctWholeFaces: DISTINCT_WHOLE_FACES })));
    expect(key(candidateFacePairs(faces, { k: 2 }))).not.toEqual(key(candidateFacePairs(faces, { k: 2, distinctWholeFaces: null })));
  });
});
