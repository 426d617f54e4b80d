/**
 * Feature correspondences (feature-correspondences.ts), checked against the definition of the
 * nearest neighbour: every distance from a row to every row of the other set, sorted (ties by
 * lower index). Data: FPFH descriptors (Rusu et al. 2009, fpfh.ts) of the Stanford bunny's
 * vertices (npm package `bunny`, Stanford 3D Scanning Repository), one half matched against the
 * other with flipped normals as RANSAC does, and random descriptors on a coarse grid so that
 * many distances tie.
 */
import { createRequire } from 'node:module';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { computeFpfh, FPFH_DIM } from '../../../../core/geometry/registration/fpfh';
import { featureCorrespondences } from '../../../../core/geometry/registration/feature-correspondences';
import { mirrorFpfh } from '../../../../core/geometry/registration/ransac-alignment';

const bunny = createRequire(import.meta.url)('bunny') as { positions: number[][]; cells: number[][] };

/** Rows of `other` ordered by distance from row i of `rows` (the definition), lower index first on ties. */
function ranked(rows: Float32Array, i: number, other: Float32Array, dim: number): number[] {
  const n = other.length / dim;
  const d = Array.from({ length: n }, (_, j) => {
    let s = 0;
    for (let k = 0; k < dim; k++) s += (rows[i * dim + k] - other[j * dim + k]) ** 2;
    return { j, s };
  });
  return d.sort((p, q) => p.s - q.s || p.j - q.j).map((x) => x.j);
}

function check(S: Float32Array, T: Float32Array, dim: number): void {
  const got = featureCorrespondences(S, T, dim);
  const ns = S.length / dim, nt = T.length / dim;
  for (let i = 0; i < ns; i++) {
    const want = ranked(S, i, T, dim);
    expect(got.sourceBest[i]).toBe(want[0] ?? -1);
    expect(got.sourceSecond[i]).toBe(want[1] ?? -1);
  }
  for (let j = 0; j < nt; j++) expect(got.targetBest[j]).toBe(ranked(T, j, S, dim)[0] ?? -1);
}

describe('feature correspondences', () => {
  it('match the definition on FPFH of the Stanford bunny (two halves, one seen with flipped normals)', () => {
    // vertex normals of the bunny (area-weighted face normals), scaled to about 100 mm
    const P = Float32Array.from(bunny.positions.flat().map((v) => v * 10));
    const N = new Float64Array(P.length);
    for (const [a, b, c] of bunny.cells) {
      const u = [P[3 * b] - P[3 * a], P[3 * b + 1] - P[3 * a + 1], P[3 * b + 2] - P[3 * a + 2]];
      const v = [P[3 * c] - P[3 * a], P[3 * c + 1] - P[3 * a + 1], P[3 * c + 2] - P[3 * a + 2]];
      const n = [u[1] * v[2] - u[2] * v[1], u[2] * v[0] - u[0] * v[2], u[0] * v[1] - u[1] * v[0]];
      for (const x of [a, b, c]) for (let k = 0; k < 3; k++) N[3 * x + k] += n[k];
    }
    const Nf = new Float32Array(N.length);
    for (let i = 0; i < N.length; i += 3) {
      const l = Math.hypot(N[i], N[i + 1], N[i + 2]) || 1;
      for (let k = 0; k < 3; k++) Nf[i + k] = N[i + k] / l;
    }
    const fpfh = computeFpfh(P, Nf, 8);
    // two interleaved halves of 300 vertices each
    const pick = (offset: number): Float32Array => {
      const out = new Float32Array(300 * FPFH_DIM);
      for (let k = 0; k < 300; k++) out.set(fpfh.subarray((7 * k + offset) * FPFH_DIM, (7 * k + offset + 1) * FPFH_DIM), k * FPFH_DIM);
      return out;
    };
    check(mirrorFpfh(pick(0)), pick(3), FPFH_DIM);
  });

  it('match the definition on random descriptors with many ties, and on empty or one-row sets', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 40 }), fc.integer({ min: 0, max: 40 }), fc.constantFrom(3, 7, 33), fc.integer({ min: 0, max: 1e6 }), (ns, nt, dim, seed) => {
        let s = seed;
        const r = (): number => ((s = (s * 1103515245 + 12345) % 2147483648) / 2147483648);
        const S = Float32Array.from({ length: ns * dim }, () => Math.floor(r() * 3));
        const T = Float32Array.from({ length: nt * dim }, () => Math.floor(r() * 3));
        check(S, T, dim);
      }),
      { numRuns: 200 },
    );
  });
});
