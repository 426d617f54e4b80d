/**
 * Point pair feature voting (Drost et al. 2010) on small break faces with analytic truth: the
 * Stanford bunny (open data in the npm package `bunny`) and a tube (outer radius 12 mm, inner 7,
 * built by manifold-3d) each cut in two by a rough surface (tests/support/bunny-cut.ts), one
 * piece moved by a known rigid motion, so the truth is that motion's inverse (analytic
 * geometry). Only a small patch of each side of the cut is handed to the vote (a disc of 5-6 mm
 * radius, 80-120 mm^2: the size of contact that feature histograms failed to align), sampled
 * independently on each piece (the two pieces share no vertex: bunny-cut.ts adds noise to each).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { cutBunny, cutTube, type CutPiece } from '../../../support/bunny-cut';
import { breakFaceFromLabels } from '../../../support/break-face-from-labels';
import { pointPairVoting } from '../../../../core/geometry/registration/point-pair-voting';
import { applyToPoint, applyToPoints, displacementAt, invert, rotationAboutAxis, rotationErrorDegrees, transformFrom, type RigidTransform } from '../../../../core/geometry/registration/rigid-transform';

type Face = { points: Float32Array; normals: Float32Array };

/** The samples of a face within `radius` of `centre`. */
function disc(f: Face, centre: number[], radius: number): Face {
  const P: number[] = [], N: number[] = [];
  for (let i = 0; i < f.points.length / 3; i++) {
    if (Math.hypot(f.points[3 * i] - centre[0], f.points[3 * i + 1] - centre[1], f.points[3 * i + 2] - centre[2]) >= radius) continue;
    P.push(f.points[3 * i], f.points[3 * i + 1], f.points[3 * i + 2]);
    N.push(f.normals[3 * i], f.normals[3 * i + 1], f.normals[3 * i + 2]);
  }
  return { points: Float32Array.from(P), normals: Float32Array.from(N) };
}

/** Small patches of the two sides of one cut around the same point, B's side moved by M. */
function patches(lower: CutPiece, upper: CutPiece, M: RigidTransform, spacing: number, pick: number, radius: number, radiusB = radius): { A: Face; B: Face; centreB: number[] } {
  const fa = breakFaceFromLabels(lower.positions, lower.triangles, lower.onCut, spacing);
  const fb = breakFaceFromLabels(applyToPoints(M, upper.positions) as Float32Array, upper.triangles, upper.onCut, spacing);
  const c = [fa.points[3 * pick], fa.points[3 * pick + 1], fa.points[3 * pick + 2]];
  const centreB = applyToPoint(M, c[0], c[1], c[2]);
  return { A: disc(fa, c, radius), B: disc(fb, centreB, radiusB), centreB };
}

const motions: Array<[string, RigidTransform]> = [
  ['a 120 degree turn and a 47 mm shift', transformFrom(rotationAboutAxis([1, -2, 0.5], 2.1), [40, 10, -25])],
  ['an upside-down turn', transformFrom(rotationAboutAxis([0.2, 0.1, 1], (175 * Math.PI) / 180), [-15, 60, 5])],
];

let bunny: { lower: CutPiece; upper: CutPiece }, tube: { lower: CutPiece; upper: CutPiece };
beforeAll(async () => {
  bunny = await cutBunny();
  // an oblique rough break (amplitude 2 mm) through a 90 mm tube along y
  tube = await cutTube({ amplitude: 2, seed: 3 });
});

describe('point pair feature voting on small break faces', () => {
  for (const [name, M] of motions) {
    it(`finds ${name} from 6 mm discs of the cut bunny (best hypothesis within 5 degrees and 2 mm)`, () => {
      const spacing = 1.5;
      const { A, B, centreB } = patches(bunny.lower, bunny.upper, M, spacing, 0, 6);
      expect(A.points.length / 3).toBeLessThan(150);
      const [best] = pointPairVoting(A.points, A.normals, B.points, B.normals, { spacing });
      const truth = invert(M);
      expect(rotationErrorDegrees(best.transform, truth)).toBeLessThan(5);
      expect(displacementAt(best.transform, truth, centreB)).toBeLessThan(2);
    });

    it(`finds ${name} from 5 mm discs of a cut tube's wall`, () => {
      const spacing = 1;
      const { A, B, centreB } = patches(tube.lower, tube.upper, M, spacing, 0, 5);
      const [best] = pointPairVoting(A.points, A.normals, B.points, B.normals, { spacing });
      const truth = invert(M);
      expect(rotationErrorDegrees(best.transform, truth)).toBeLessThan(5);
      expect(displacementAt(best.transform, truth, centreB)).toBeLessThan(2);
    });
  }

  for (const [ra, rb] of [[5, 10], [10, 5]]) {
    it(`finds the motion when a ${Math.min(ra, rb)} mm disc lies inside a ${Math.max(ra, rb)} mm disc of the other side (${ra < rb ? "B's" : "A's"} face the larger)`, () => {
      const spacing = 1;
      const M = motions[0][1];
      const { A, B, centreB } = patches(tube.lower, tube.upper, M, spacing, 0, ra, rb);
      const [best] = pointPairVoting(A.points, A.normals, B.points, B.normals, { spacing });
      const truth = invert(M);
      expect(rotationErrorDegrees(best.transform, truth)).toBeLessThan(5);
      expect(displacementAt(best.transform, truth, centreB)).toBeLessThan(2);
    });
  }

  it('puts the two faces normal to normal: a moved sample of B faces away from A (opposed normals)', () => {
    const spacing = 1;
    const M = motions[0][1];
    const { A, B } = patches(tube.lower, tube.upper, M, spacing, 0, 5);
    const [best] = pointPairVoting(A.points, A.normals, B.points, B.normals, { spacing });
    // mean outward normal of each face; B's, turned by the motion, points against A's
    const mean = (n: Float32Array): number[] => {
      const m = [0, 0, 0];
      for (let i = 0; i < n.length; i++) m[i % 3] += n[i];
      const l = Math.hypot(m[0], m[1], m[2]);
      return m.map((x) => x / l);
    };
    const na = mean(A.normals), nb = mean(B.normals);
    const T = best.transform;
    const turned = [0, 1, 2].map((r) => T[4 * r] * nb[0] + T[4 * r + 1] * nb[1] + T[4 * r + 2] * nb[2]);
    expect(turned[0] * na[0] + turned[1] * na[1] + turned[2] * na[2]).toBeLessThan(-0.9);
  });

  it('answers the same for a face filed once and met again by partners of other extents (the filed pairs are kept per face)', () => {
    const spacing = 1;
    const M = motions[0][1];
    const { A: small, B: large } = patches(tube.lower, tube.upper, M, spacing, 0, 5, 10);
    const { B: mid } = patches(tube.lower, tube.upper, M, spacing, 0, 5, 7);
    const copy = (f: Face): Face => ({ points: f.points.slice(), normals: f.normals.slice() });
    // the small face is filed against each partner (it is the smaller one), first against the largest
    const runs = [large, mid, large].map((partner) => pointPairVoting(small.points, small.normals, partner.points, partner.normals, { spacing }));
    // fresh copies of the arrays: filed anew, as on the first meeting
    const fresh = [large, mid].map((partner) => { const f = copy(small); return pointPairVoting(f.points, f.normals, partner.points, partner.normals, { spacing }); });
    expect(runs[0]).toEqual(fresh[0]);
    expect(runs[1]).toEqual(fresh[1]);
    expect(runs[2]).toEqual(runs[0]);
    // the same face with other normals is another face
    const flipped = Float32Array.from(small.normals, (v) => -v);
    const f = copy(small);
    expect(pointPairVoting(small.points, flipped, large.points, large.normals, { spacing })).toEqual(pointPairVoting(f.points, Float32Array.from(small.normals, (v) => -v), large.points, large.normals, { spacing }));
    expect(runs[0].length).toBeGreaterThan(0);
    expect(rotationErrorDegrees(runs[0][0].transform, invert(M))).toBeLessThan(5);
  });

  it('returns nothing for faces of fewer than four samples', () => {
    const one = Float32Array.from([0, 0, 0, 1, 0, 0, 0, 1, 0]);
    const up = Float32Array.from([0, 0, 1, 0, 0, 1, 0, 0, 1]);
    expect(pointPairVoting(one, up, one, up, { spacing: 1 })).toEqual([]);
  });
});
