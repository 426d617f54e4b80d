/**
 * FPFH words and their containment cost (fpfh-word-counts.ts, word-containment-cost.ts), the
 * candidate index's second stage. Open data: the Stanford bunny (npm package `bunny`, Stanford 3D
 * Scanning Repository) cut in two by a rough surface (tests/support/bunny-cut.ts), each half
 * prepared as a propose run prepares a fragment (bunny-halves.ts); the upper half is moved by a
 * known rigid motion. Checks: (1) the word counts of a face do not change under a rigid motion
 * (FPFH are pose-invariant: Rusu, Blodow & Beetz 2009, section III); (2) the two sides of the cut
 * are each other's best partner among faces of the same bunny cut as rough or smoother / rougher
 * (amplitude 0.5 and 5 mm instead of 2); (3) half of one side, its FPFH measured on its own
 * samples, is still contained in the whole other side: it costs about what the whole does and
 * still ranks ahead of the decoys, which the normalised histogram intersection would not promise.
 * (4) the cost's analytic values on small histograms. (The bunny's cut is smooth at the FPFH
 * radius, 6 mm, so there its words barely change when mirrored: 0.045 against 0.060 unmirrored;
 * the mirror is not checked here.)
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { cutBunny, type CutPiece } from '../../../support/bunny-cut';
import { breakFaceFromLabels } from '../../../support/break-face-from-labels';
import { preparedBunnyHalves } from '../../../support/bunny-halves';
import { DEFAULT_FPFH_RADIUS_SPACINGS, prepareFragment, type PreparedFragment } from '../../../../core/geometry/proposals/prepared-fragment';
import { fpfhWordCounts } from '../../../../core/geometry/proposals/fpfh-word-counts';
import { wordContainmentCost } from '../../../../core/geometry/proposals/word-containment-cost';
import { computeFpfh } from '../../../../core/geometry/registration/fpfh';
import { applyToPoints, rotationAboutAxis, transformFrom } from '../../../../core/geometry/registration/rigid-transform';

const spacing = 1.2;
let A: PreparedFragment, B: PreparedFragment;
const decoys: PreparedFragment[] = [];

function prepare(piece: CutPiece): PreparedFragment {
  const face = breakFaceFromLabels(piece.positions, piece.triangles, piece.onCut, spacing);
  return prepareFragment({ positions: piece.positions, triangles: piece.triangles, faces: [face] }, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS, patches: false });
}
const wordsOf = (f: PreparedFragment): { words: number[]; mirrored: number[] } => fpfhWordCounts(f.faces[0].fpfh);

beforeAll(async () => {
  ({ A, B } = await preparedBunnyHalves(spacing));
  for (const amplitude of [0.5, 5]) {
    const cut = await cutBunny({ amplitude, seed: 7 });
    decoys.push(prepare(cut.upper), prepare(cut.lower));
  }
}, 120_000);

describe('FPFH words of a break face', () => {
  it('count the same samples after a rigid motion of the face', () => {
    const face = A.faces[0];
    const rotation = rotationAboutAxis([1, 3, -2], 2.3);
    const M = transformFrom(rotation, [40, -15, 70]);
    const R = transformFrom(rotation, [0, 0, 0]);
    const moved = computeFpfh(applyToPoints(M, face.points), applyToPoints(R, face.normals), spacing * DEFAULT_FPFH_RADIUS_SPACINGS);
    const before = fpfhWordCounts(face.fpfh), after = fpfhWordCounts(moved);
    const n = face.points.length / 3;
    // the same FPFH up to rounding: at most 1% of the samples may change word at a tie
    let changed = 0;
    for (let w = 0; w < before.words.length; w++) changed += Math.abs(before.words[w] - after.words[w]);
    expect(before.words.reduce((a, b) => a + b, 0)).toBe(n);
    expect(changed / 2).toBeLessThanOrEqual(0.01 * n);
    expect(wordContainmentCost(before.mirrored, after.mirrored)).toBeLessThan(0.02);
  });

  it('rank the other side of the cut first', () => {
    const a = wordsOf(A), b = wordsOf(B);
    const partner = wordContainmentCost(a.mirrored, b.words);
    for (const d of decoys) {
      expect(partner).toBeLessThan(wordContainmentCost(a.mirrored, wordsOf(d).words));
      expect(wordContainmentCost(b.mirrored, a.words)).toBeLessThan(wordContainmentCost(b.mirrored, wordsOf(d).words));
    }
  });

  it('hold half of one side inside the whole other side', () => {
    const face = B.faces[0];
    const n = face.points.length / 3;
    // the half of B's face on one side of its centroid along its longest spread
    const c = face.centroid;
    let best = [1, 0, 0], spread = -1;
    for (const dir of [[1, 0, 0], [0, 1, 0], [0, 0, 1]]) {
      let s = 0;
      for (let i = 0; i < n; i++) s += ((face.points[3 * i] - c[0]) * dir[0] + (face.points[3 * i + 1] - c[1]) * dir[1] + (face.points[3 * i + 2] - c[2]) * dir[2]) ** 2;
      if (s > spread) { spread = s; best = dir; }
    }
    const keep: number[] = [];
    for (let i = 0; i < n; i++) if ((face.points[3 * i] - c[0]) * best[0] + (face.points[3 * i + 1] - c[1]) * best[1] + (face.points[3 * i + 2] - c[2]) * best[2] < 0) keep.push(i);
    const pick = (src: Float32Array): Float32Array => Float32Array.from(keep.flatMap((i) => [src[3 * i], src[3 * i + 1], src[3 * i + 2]]));
    const points = pick(face.points), normals = pick(face.normals);
    const half = fpfhWordCounts(computeFpfh(points, normals, spacing * DEFAULT_FPFH_RADIUS_SPACINGS));
    expect(keep.length).toBeGreaterThan(0.3 * n);
    expect(keep.length).toBeLessThan(0.7 * n);
    const a = wordsOf(A);
    const whole = wordContainmentCost(a.mirrored, wordsOf(B).words);
    const part = wordContainmentCost(a.mirrored, half.words);
    expect(part).toBeLessThan(whole + 0.15);
    for (const d of decoys) expect(part).toBeLessThan(wordContainmentCost(wordsOf(d).mirrored, half.words));
  });
});

describe('wordContainmentCost', () => {
  it('is 0 for a part of a histogram, -log of the shared share otherwise (analytic)', () => {
    // B holds 2 of word 0 and 1 of word 1; A (mirrored) 4, 4, 0: all of B's 3 are in A
    expect(wordContainmentCost([4, 4, 0], [2, 1, 0])).toBeCloseTo(0, 12);
    // shared min(2,1) + min(2,3) = 3 of the smaller mass 4
    expect(wordContainmentCost([2, 2, 0], [1, 3, 2])).toBeCloseTo(-Math.log(3 / 4), 12);
    // nothing shared: the floor
    expect(wordContainmentCost([5, 0], [0, 5])).toBeCloseTo(-Math.log(0.02), 12);
    expect(wordContainmentCost([5, 0], [0, 5], 0.1)).toBeCloseTo(-Math.log(0.1), 12);
  });
});
