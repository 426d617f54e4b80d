/**
 * The faces a motion puts in contact, and motions refined again on them (contact-face-pairs.ts;
 * pairwise-match.ts matchFragments with `contactPairMotions`). The Stanford bunny (open data in the
 * npm package `bunny`) cut in two by a rough surface (tests/support/bunny-halves.ts), the upper
 * half moved by a known motion, so the truth is analytic by construction. A's break face is offered
 * beside a decoy: the same face's samples shifted 300 mm along x (several times the bunny's size; a
 * rigid shift, so under the truth the decoy lies far from B's face and touches nothing), or a part of
 * the face (the samples beyond a plane 4 mm past its centroid), as a piece of a merged break face is
 * offered.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { bunnyHalvesWithFaceCopies, turnedAbout } from '../../../support/shortlist-entries';
import type { PreparedFace, PreparedFragment } from '../../../../core/geometry/proposals/prepared-fragment';
import { bestContactPair, contactFacePairs, contactPairStarts } from '../../../../core/geometry/proposals/contact-face-pairs';
import { DEFAULT_MATCH_PARAMETERS, matchFragments, refineFacePair } from '../../../../core/geometry/proposals/pairwise-match';
import { KdTree } from '../../../../core/geometry/registration/nearest-neighbours';
import { displacementAt, rotationErrorDegrees, type RigidTransform } from '../../../../core/geometry/registration/rigid-transform';

/** A face made of the samples `keep` selects (moved by `shift`), with its own k-d tree and centroid. */
function faceFrom(f: PreparedFace, index: number, parent: number, keep: (x: number, y: number, z: number) => boolean, shift: [number, number, number] = [0, 0, 0]): PreparedFace {
  const P: number[] = [], N: number[] = [], F: number[] = [];
  const dim = f.fpfh.length / (f.points.length / 3);
  for (let k = 0; k < f.points.length / 3; k++) {
    const x = f.points[3 * k], y = f.points[3 * k + 1], z = f.points[3 * k + 2];
    if (!keep(x, y, z)) continue;
    P.push(x + shift[0], y + shift[1], z + shift[2]);
    N.push(f.normals[3 * k], f.normals[3 * k + 1], f.normals[3 * k + 2]);
    for (let d = 0; d < dim; d++) F.push(f.fpfh[dim * k + d]);
  }
  const points = Float32Array.from(P), n = P.length / 3;
  const centroid: [number, number, number] = [0, 1, 2].map((c) => P.filter((_, k) => k % 3 === c).reduce((s, v) => s + v, 0) / n) as [number, number, number];
  const fpfh = Float32Array.from(F);
  return { ...f, index, parent, points, normals: Float32Array.from(N), fpfh, tree: new KdTree(points, 3), featureIndex: undefined, featureFpfh: fpfh, centroid };
}

let truth: RigidTransform, c: number[];
let decoyA: PreparedFragment, partA: PreparedFragment, B: PreparedFragment, spacing: number;

beforeAll(async () => {
  // faces [decoy, real]: the decoy first, so a motion found on it has a lower face index
  ({ A: decoyA, B, truth, c } = await bunnyHalvesWithFaceCopies((f) => [faceFrom(f, 0, 1, () => true, [300, 0, 0]), { ...f, index: 1 }]));
  spacing = Math.max(decoyA.spacing, B.spacing);
  // faces [part, whole]: the part is the samples of A's face beyond a plane through its centroid
  const h = await bunnyHalvesWithFaceCopies((f) => {
    const [cx] = f.centroid;
    return [faceFrom(f, 0, 1, (x) => x > cx + 4), { ...f, index: 1 }];
  });
  partA = h.A;
});

const near = (T: RigidTransform, deg: number, mm: number): boolean => rotationErrorDegrees(T, truth) < deg && displacementAt(T, truth, Float64Array.from(c)) < mm;

describe('faces a motion puts in contact', () => {
  it('under the truth the real face meets B all over and the shifted decoy not at all', () => {
    const pairs = contactFacePairs(decoyA, B, truth, 60, spacing);
    expect(pairs.some((p) => p.i === 0)).toBe(false);
    const real = pairs.find((p) => p.i === 1 && p.j === 0);
    expect(real).toBeDefined();
    // a cut surface closed onto itself: nearly every sample of either side touches (0.8: the rough cut's rim samples may miss)
    expect(real!.shareA).toBeGreaterThan(0.8);
    expect(real!.shareB).toBeGreaterThan(0.8);
    // the decoy shifted back onto the real face is in contact exactly where the real face would be
    const back = contactFacePairs(decoyA, B, [truth[0], truth[1], truth[2], truth[3] + 300, truth[4], truth[5], truth[6], truth[7], truth[8], truth[9], truth[10], truth[11], 0, 0, 0, 1], 60, spacing);
    expect(back.find((p) => p.i === 0)?.shareB).toBeCloseTo(real!.shareB, 5);
  });

  it('a part beats the whole it belongs to by the smaller share, and a minimum share rules pairs out', () => {
    const pairs = contactFacePairs(partA, B, truth, 60, spacing);
    const part = pairs.find((p) => p.i === 0)!, whole = pairs.find((p) => p.i === 1)!;
    // the part lies wholly in the contact (its share near 1), B's face only partly on it
    expect(part.shareA).toBeGreaterThan(0.8);
    expect(part.shareB).toBeLessThan(whole.shareB);
    expect(bestContactPair(pairs, 0)).toEqual(Math.min(part.shareA, part.shareB) > Math.min(whole.shareA, whole.shareB) ? part : whole);
    expect(bestContactPair(pairs, 1.01)).toBeUndefined();
  });

  it('a motion near the truth found on the decoy is sent to the real face, where it scores; none for its own best pair or no contact', () => {
    const starts = contactPairStarts(decoyA, B, [{ transform: truth, i: 0, j: 0 }], 60, 0.3, spacing);
    expect(starts).toEqual([{ transform: truth, i: 1, j: 0 }]);
    expect(contactPairStarts(decoyA, B, [{ transform: truth, i: 1, j: 0 }], 60, 0.3, spacing)).toEqual([]);
    // nor when the real pair was screened on its own already
    expect(contactPairStarts(decoyA, B, [{ transform: truth, i: 0, j: 0 }], 60, 0.3, spacing, [[0, 0], [1, 0]])).toEqual([]);
    // turned 90 degrees about B's face centroid: the faces cross, too little in opposed contact
    expect(contactPairStarts(decoyA, B, [{ transform: turnedAbout(truth, c, 90), i: 0, j: 0 }], 60, 0.3, spacing)).toEqual([]);
    // scored on the decoy the truth reads nothing; refined and scored on the real face it is a join
    // (the fine step gives the decoy up after its k-d rounds; without that cut it scores under 0.05)
    expect(refineFacePair(decoyA, 0, B, 0, [{ transform: truth, overlap: 1 }], DEFAULT_MATCH_PARAMETERS)).toEqual([]);
    const onDecoy = refineFacePair(decoyA, 0, B, 0, [{ transform: truth, overlap: 1 }], { ...DEFAULT_MATCH_PARAMETERS, fineKdMaxRmsSpacings: 0 })[0];
    expect(onDecoy.score).toBeLessThan(0.05);
    const onReal = refineFacePair(decoyA, 1, B, 0, [{ transform: truth, overlap: 1 }], DEFAULT_MATCH_PARAMETERS)[0];
    expect(onReal.score).toBeGreaterThan(0.5);
    expect(near(onReal.transform, 1, 1)).toBe(true);
  });

  it('matchFragments offered only the part pair finds the whole face pair with the setting, and not without it', () => {
    const base = { ...DEFAULT_MATCH_PARAMETERS, contactPairMotions: 0 };
    const withIt = { ...DEFAULT_MATCH_PARAMETERS, contactPairMotions: 12, contactPairMinShare: 0.3 };
    for (const keep of [undefined, 3]) {
      const without = matchFragments(partA, B, base, [[0, 0]], keep);
      const got = matchFragments(partA, B, withIt, [[0, 0]], keep);
      // without: only the part's face (parent 1) is ever scored
      expect(without.every((m) => m.faceA === 1)).toBe(true);
      // with: the near-truth motion found on the part is scored on the whole face too (parent 0) and lands on the truth
      const whole = got.filter((m) => m.faceA === 0);
      expect(whole.length).toBeGreaterThan(0);
      expect(near(whole[0].transform, 1, 1)).toBe(true);
    }
  });
});
