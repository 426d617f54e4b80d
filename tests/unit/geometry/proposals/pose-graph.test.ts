import { describe, expect, it } from 'vitest';
import { cycleAgreement, solvePoses, type PoseEdge } from '../../../../core/geometry/proposals/pose-graph';
import { mulberry32 } from '../../../../core/geometry/seeded-random';
import {
  compose,
  displacementAt,
  invert,
  rotationAboutAxis,
  rotationErrorDegrees,
  transformFrom,
  type RigidTransform,
} from '../../../../core/geometry/registration/rigid-transform';

// Reference: composition of rigid motions (analytic geometry): if member v sits at pose P_v in a
// common frame, the join b -> a is P_a^-1 P_b, and poses solved from joins must agree with the
// true poses up to the root's pose.
function truthPoses(n: number, seed: number): RigidTransform[] {
  const r = mulberry32(seed);
  return Array.from({ length: n }, () =>
    transformFrom(rotationAboutAxis([r() - 0.5, r() - 0.5, r() - 0.5], r() * Math.PI), [r() * 200 - 100, r() * 200 - 100, r() * 200 - 100]),
  );
}

function joins(P: RigidTransform[], pairs: Array<[number, number]>, noiseDeg = 0, seed = 3): PoseEdge[] {
  const r = mulberry32(seed);
  return pairs.map(([a, b]) => {
    let T = compose(invert(P[a]), P[b]);
    if (noiseDeg > 0) T = compose(transformFrom(rotationAboutAxis([r() - 0.5, r() - 0.5, r() - 0.5], (noiseDeg * Math.PI) / 180), [r() - 0.5, r() - 0.5, r() - 0.5]), T);
    return { a: `s${a}`, b: `s${b}`, transform: T };
  });
}

describe('refit-set poses from accepted joins', () => {
  const pairs: Array<[number, number]> = [[0, 1], [1, 2], [2, 3], [3, 0], [0, 2], [3, 4]];

  it('puts every member where the true poses put it, relative to the root (exact joins)', () => {
    const P = truthPoses(5, 11);
    const sol = solvePoses(joins(P, pairs), { root: 's0' });
    expect(sol.poses.size).toBe(5);
    for (let v = 0; v < 5; v++) {
      const want = compose(invert(P[0]), P[v]);
      const got = sol.poses.get(`s${v}`)!;
      expect(rotationErrorDegrees(got, want)).toBeLessThan(1e-4);
      expect(displacementAt(got, want, [0, 0, 0])).toBeLessThan(1e-4);
    }
    for (const r of sol.residuals) expect(r.rotationDeg).toBeLessThan(1e-4);
  });

  it('relaxation spreads noise over cycles: poses end closer to the truth than the spanning tree alone', () => {
    const P = truthPoses(5, 21);
    const edges = joins(P, pairs, 2, 5);
    const tree = solvePoses(edges, { root: 's0', iterations: 0 });
    const relaxed = solvePoses(edges, { root: 's0' });
    const err = (sol: typeof tree): number => {
      let s = 0;
      for (let v = 1; v < 5; v++) s += rotationErrorDegrees(sol.poses.get(`s${v}`)!, compose(invert(P[0]), P[v]));
      return s;
    };
    expect(err(relaxed)).toBeLessThan(err(tree));
  });

  it('a proposal that closes a consistent cycle agrees with the accepted poses; a wrong one does not', () => {
    const P = truthPoses(4, 31);
    const sol = solvePoses(joins(P, [[0, 1], [1, 2], [2, 3]]));
    const right = compose(invert(P[0]), P[3]);
    const wrong = compose(transformFrom(rotationAboutAxis([0, 0, 1], 0.5), [10, 0, 0]), right);
    expect(cycleAgreement(sol, 's0', 's3', right)!.rotationDeg).toBeLessThan(1e-4);
    expect(cycleAgreement(sol, 's0', 's3', wrong)!.rotationDeg).toBeGreaterThan(28);
    expect(cycleAgreement(sol, 's0', 'elsewhere', right)).toBeNull();
  });
});
