import { describe, expect, it } from 'vitest';
import { Matrix, SingularValueDecomposition, determinant } from 'ml-matrix';
import { absoluteOrientation } from '../../../../core/geometry/registration/absolute-orientation';
import { applyToPoints, isRigid, rotationAboutAxis, rotationErrorDegrees, rotationOf, transformFrom } from '../../../../core/geometry/registration/rigid-transform';
import { mulberry32 } from '../../../../core/geometry/seeded-random';

describe('absolute orientation (Horn 1987, unit quaternions)', () => {
  it('recovers the 120 degree turn about (1,1,1), which cycles the axes x -> y -> z (analytic geometry)', () => {
    // A turn of 120 degrees about the diagonal (1,1,1) maps e_x to e_y, e_y to e_z, e_z to e_x,
    // so its matrix is the cyclic permutation [[0,0,1],[1,0,0],[0,1,0]].
    const from = Float64Array.from([0, 0, 0, 1, 0, 0, 0, 1, 0, 0, 0, 1, 1, 1, 0, 2, -1, 3]);
    const to = new Float64Array(from.length);
    for (let i = 0; i < from.length; i += 3) {
      // (x, y, z) -> (z, x, y), then shift by (5, -2, 7)
      to[i] = from[i + 2] + 5;
      to[i + 1] = from[i] - 2;
      to[i + 2] = from[i + 1] + 7;
    }
    const { transform, rms } = absoluteOrientation(from, to);
    const R = rotationOf(transform);
    const expected = [0, 0, 1, 1, 0, 0, 0, 1, 0];
    R.forEach((v, i) => expect(v).toBeCloseTo(expected[i], 10));
    expect([transform[3], transform[7], transform[11]].map((v) => Number(v.toFixed(9)))).toEqual([5, -2, 7]);
    expect(rms).toBeLessThan(1e-9);
  });

  it('agrees with the SVD solution of Arun, Huang & Blostein 1987 (computed with ml-matrix) on noisy pairs', () => {
    const rand = mulberry32(42);
    for (let trial = 0; trial < 20; trial++) {
      const n = 30;
      const from = new Float64Array(3 * n);
      for (let i = 0; i < 3 * n; i++) from[i] = (rand() - 0.5) * 100;
      const truth = transformFrom(rotationAboutAxis([rand() - 0.5, rand() - 0.5, rand() - 0.5], rand() * Math.PI), [rand() * 50, rand() * 50, rand() * 50]);
      const to = applyToPoints(truth, from, new Float64Array(3 * n)) as Float64Array;
      for (let i = 0; i < 3 * n; i++) to[i] += (rand() - 0.5) * 2;
      const horn = absoluteOrientation(from, to);
      expect(isRigid(horn.transform, 1e-9)).toBe(true);
      // Arun et al.: H = sum (p - p0)(q - q0)^T = U S V^T, R = V diag(1,1,det(VU^T)) U^T
      const c = (a: Float64Array): number[] => [0, 1, 2].map((k) => a.filter((_, i) => i % 3 === k).reduce((s, v) => s + v, 0) / n);
      const cf = c(from), ct = c(to);
      const H = Matrix.zeros(3, 3);
      for (let i = 0; i < n; i++) for (let a = 0; a < 3; a++) for (let b = 0; b < 3; b++) H.set(a, b, H.get(a, b) + (from[3 * i + a] - cf[a]) * (to[3 * i + b] - ct[b]));
      const svd = new SingularValueDecomposition(H);
      const V = svd.rightSingularVectors, U = svd.leftSingularVectors;
      const d = Math.sign(determinant(V.mmul(U.transpose())));
      const Rsvd = V.mmul(Matrix.diag([1, 1, d])).mmul(U.transpose());
      const svdT = transformFrom(Rsvd.to1DArray(), [0, 0, 0]);
      expect(rotationErrorDegrees(horn.transform, svdT)).toBeLessThan(1e-5);
      // Horn 1987 section 2.C: the best translation carries the rotated source centroid onto the target centroid
      const R = rotationOf(horn.transform);
      for (let k = 0; k < 3; k++) {
        const rc = R[3 * k] * cf[0] + R[3 * k + 1] * cf[1] + R[3 * k + 2] * cf[2];
        expect(horn.transform[4 * k + 3]).toBeCloseTo(ct[k] - rc, 8);
      }
    }
  });

  it('returns a proper rotation (determinant +1) even for mirrored points (Horn 1987: quaternions cannot reflect)', () => {
    const from = Float64Array.from([1, 0, 0, 0, 1, 0, 0, 0, 1, 1, 1, 1]);
    const to = Float64Array.from(from);
    for (let i = 0; i < to.length; i += 3) to[i] = -to[i];
    expect(isRigid(absoluteOrientation(from, to).transform, 1e-9)).toBe(true);
  });

  it('refuses fewer than three pairs', () => {
    expect(() => absoluteOrientation([0, 0, 0, 1, 1, 1], [0, 0, 0, 1, 1, 1])).toThrow(/three/);
  });
});
