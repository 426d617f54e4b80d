/**
 * ICP against face samples passes each moved sample's last closest sample as a guess to the k-d
 * tree (nearest-neighbours.ts, nearestOneNear), which then skips most searches. The guess may
 * only save time: run against the same samples through plain searches (nearestOne, the search
 * checked against brute force in nearest-neighbours.test.ts), every motion must come out the
 * same to the last bit. Data: the Stanford bunny (npm package `bunny`, Stanford 3D Scanning
 * Repository), its vertices with area-weighted vertex normals as the target samples, and a
 * strided subset moved off by small motions as the source.
 * The ICP loop also reads the motion's entries from locals and asks a sampled target's k-d tree
 * directly (nearestOneNear3, whose search starts from the best of the guess's list), for speed
 * only: every run must end at the same motion, RMS, pair count and round count, to the last bit,
 * as the loop as it stood (tests/support/icp-point-to-plane-reference.ts, kept verbatim) against
 * the same samples answered by the plain search, or against the same triangle BVH (checked
 * against three-mesh-bvh in triangle-bvh.test.ts; the bunny's triangles as the target surface),
 * with the options of the screen's short ICP (fixed trim) and of the fine step (the
 * fractional-RMSD trim).
 */
import { createRequire } from 'node:module';
import { describe, expect, it, vi } from 'vitest';
import { KdTree } from '../../../../core/geometry/registration/nearest-neighbours';
import { icpPointToPlane, type IcpOptions, type IcpResult } from '../../../../core/geometry/registration/icp-point-to-plane';
import { SampledSurface, TargetSurface, type ClosestPoint, type ClosestPointSource } from '../../../../core/geometry/registration/target-surface';
import { applyToPoints, applyToDirections, transformFrom, rotationAboutAxis } from '../../../../core/geometry/registration/rigid-transform';
import { mulberry32 } from '../../../../core/geometry/seeded-random';
import { referenceIcpPointToPlane } from '../../../support/icp-point-to-plane-reference';

const bunny = createRequire(import.meta.url)('bunny') as { positions: number[][]; cells: number[][] };
const points = Float32Array.from(bunny.positions.flat().map((v) => v * 10));
const triangles = Uint32Array.from(bunny.cells.flat());
const normals = (() => {
  const n = new Float64Array(points.length);
  for (const [a, b, c] of bunny.cells) {
    const u = [0, 1, 2].map((k) => points[3 * b + k] - points[3 * a + k]), v = [0, 1, 2].map((k) => points[3 * c + k] - points[3 * a + k]);
    const w = [u[1] * v[2] - u[2] * v[1], u[2] * v[0] - u[0] * v[2], u[0] * v[1] - u[1] * v[0]];
    for (const i of [a, b, c]) for (let k = 0; k < 3; k++) n[3 * i + k] += w[k];
  }
  const out = new Float32Array(points.length);
  for (let i = 0; i < points.length; i += 3) {
    const l = Math.hypot(n[i], n[i + 1], n[i + 2]) || 1;
    for (let k = 0; k < 3; k++) out[i + k] = n[i + k] / l;
  }
  return out;
})();

/** The same samples answered by the plain search, the guess ignored. */
class Searched implements ClosestPointSource {
  private readonly q = [0, 0, 0];
  constructor(private readonly tree: KdTree) {}
  closest(x: number, y: number, z: number, maxDistance = Infinity, out?: ClosestPoint): ClosestPoint | null {
    this.q[0] = x; this.q[1] = y; this.q[2] = z;
    const hit = this.tree.nearestOne(this.q, maxDistance * maxDistance);
    if (hit.index < 0) return null;
    const i = hit.index, res = out ?? ({} as ClosestPoint);
    res.x = points[3 * i]; res.y = points[3 * i + 1]; res.z = points[3 * i + 2];
    res.nx = normals[3 * i]; res.ny = normals[3 * i + 1]; res.nz = normals[3 * i + 2];
    res.distance = Math.sqrt(hit.dist2);
    res.triangle = -1;
    return res;
  }
}

describe('ICP with guessed closest samples', () => {
  it('ends at the same motion to the last bit as with plain searches, and searches the tree far less', () => {
    const tree = new KdTree(points, 3);
    const guessed = new SampledSurface(points, normals, tree);
    const plain = new Searched(new KdTree(points, 3));
    // the tree's own search, which the guess spares when it settles the answer
    const searched = vi.spyOn(tree as unknown as { searchOne3: () => number }, 'searchOne3');
    const n = points.length / 3;
    const take = Uint32Array.from({ length: 400 }, (_, k) => Math.floor((k * n) / 400));
    const src = Float32Array.from([...take].flatMap((i) => [points[3 * i], points[3 * i + 1], points[3 * i + 2]]));
    const srcN = Float32Array.from([...take].flatMap((i) => [normals[3 * i], normals[3 * i + 1], normals[3 * i + 2]]));
    const rnd = mulberry32(7);
    let queries = 0;
    for (let k = 0; k < 12; k++) {
      // the source moved off by up to 4 degrees and 1.5 mm; ICP is started from the identity
      const axis: [number, number, number] = [rnd() - 0.5, rnd() - 0.5, rnd() - 0.5];
      const M = transformFrom(rotationAboutAxis(axis, ((rnd() - 0.5) * 8 * Math.PI) / 180), [(rnd() - 0.5) * 3, (rnd() - 0.5) * 3, (rnd() - 0.5) * 3]);
      const P = Float32Array.from(applyToPoints(M, src)), N = Float32Array.from(applyToDirections(M, srcN));
      const options = { maxDistance: 4, trim: 0.7, maxIterations: 20, tolerance: 1e-5, opposedNormals: false };
      const a = icpPointToPlane(P, N, guessed, [1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1], options);
      const b = icpPointToPlane(P, N, plain, [1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1], options);
      expect(a.iterations).toBe(b.iterations);
      expect(a.inliers).toBe(b.inliers);
      expect(Object.is(a.rms, b.rms)).toBe(true);
      a.transform.forEach((v, i) => expect(Object.is(v, b.transform[i])).toBe(true));
      queries += a.iterations * take.length;
    }
    // the first round of each run searches every sample; most later rounds keep their closest sample
    expect(searched.mock.calls.length).toBeLessThan(0.5 * queries);
    expect(searched.mock.calls.length).toBeGreaterThan(0);
  });
});

const IDENTITY = [1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1];

function expectSame(a: IcpResult, b: IcpResult): void {
  expect(a.iterations).toBe(b.iterations);
  expect(a.inliers).toBe(b.inliers);
  expect(Object.is(a.rms, b.rms)).toBe(true);
  expect(a.transform.length).toBe(b.transform.length);
  a.transform.forEach((v, i) => expect(Object.is(v, b.transform[i])).toBe(true));
}

/** 400 strided vertices moved off by `runs` random motions (up to `deg` degrees and `mm` mm): [points, normals] per motion. */
function movedSources(seed: number, runs: number, deg: number, mm: number): Array<[Float32Array, Float32Array]> {
  const n = points.length / 3;
  const take = Uint32Array.from({ length: 400 }, (_, k) => Math.floor((k * n) / 400));
  const src = Float32Array.from([...take].flatMap((i) => [points[3 * i], points[3 * i + 1], points[3 * i + 2]]));
  const srcN = Float32Array.from([...take].flatMap((i) => [normals[3 * i], normals[3 * i + 1], normals[3 * i + 2]]));
  const rnd = mulberry32(seed);
  return Array.from({ length: runs }, () => {
    const axis: [number, number, number] = [rnd() - 0.5, rnd() - 0.5, rnd() - 0.5];
    const M = transformFrom(rotationAboutAxis(axis, ((rnd() - 0.5) * 2 * deg * Math.PI) / 180), [(rnd() - 0.5) * 2 * mm, (rnd() - 0.5) * 2 * mm, (rnd() - 0.5) * 2 * mm]);
    return [Float32Array.from(applyToPoints(M, src)), Float32Array.from(applyToDirections(M, srcN))];
  });
}

const SCREEN: IcpOptions = { maxDistance: 3, trim: 0.7, maxIterations: 15, tolerance: 1e-3, opposedNormals: false };
const FINE: IcpOptions = { maxDistance: 2, trim: 0.7, autoTrimLambda: 2, autoTrimMin: 0.5, maxIterations: 20, tolerance: 1e-4, opposedNormals: false };

describe('the ICP loop against the loop as it stood', () => {
  it('ends at the same motions to the last bit on oriented samples (k-d tree with guesses against the plain search)', () => {
    const sampled = new SampledSurface(points, normals, new KdTree(points, 3));
    const plain = new Searched(new KdTree(points, 3));
    let rounds = 0;
    for (const options of [SCREEN, FINE]) {
      for (const [P, N] of movedSources(options === SCREEN ? 5 : 6, 10, 6, 2)) {
        const a = icpPointToPlane(P, N, sampled, IDENTITY, options);
        const b = referenceIcpPointToPlane(P, N, plain, IDENTITY, options);
        expectSame(a, b);
        rounds += a.iterations;
      }
    }
    // the runs go on for several rounds each (the guesses and the list-bounded search are used)
    expect(rounds).toBeGreaterThan(60);
  });

  it('ends at the same motions to the last bit on the triangle surface (BVH)', () => {
    const surface = new TargetSurface(points, triangles);
    for (const options of [SCREEN, FINE]) {
      for (const [P, N] of movedSources(options === SCREEN ? 7 : 8, 6, 4, 1.5)) {
        expectSame(icpPointToPlane(P, N, surface, IDENTITY, options), referenceIcpPointToPlane(P, N, surface, IDENTITY, options));
      }
    }
  });
});
