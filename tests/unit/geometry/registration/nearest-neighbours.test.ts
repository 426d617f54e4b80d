import { describe, expect, it, vi } from 'vitest';
import fc from 'fast-check';
import { createRequire } from 'node:module';
import { KdTree } from '../../../../core/geometry/registration/nearest-neighbours';
import { mulberry32 } from '../../../../core/geometry/seeded-random';

// Reference: brute-force search over every point (the definition of the k nearest neighbours).
/**
 * n points on the integer grid 0..4 (so many points repeat and many lie at the same distance from
 * a query), drawn by a seeded linear congruential generator, and that generator (uniform on [0, 4))
 * for drawing the queries that follow.
 */
function tiedGrid(n: number, seed: number): { data: Float32Array; r: () => number } {
  let s = seed;
  const r = (): number => ((s = (s * 1103515245 + 12345) % 2147483648) / 2147483648) * 4;
  const data = Float32Array.from({ length: 3 * n }, () => Math.round(r()));
  return { data, r };
}

function bruteForce(data: number[], dim: number, q: number[], k: number): number[] {
  const n = data.length / dim;
  const d = Array.from({ length: n }, (_, i) => {
    let s = 0;
    for (let j = 0; j < dim; j++) s += (data[i * dim + j] - q[j]) ** 2;
    return s;
  });
  return d.sort((a, b) => a - b).slice(0, k);
}

describe('k-d tree (Friedman, Bentley & Finkel 1977)', () => {
  it('finds the same k nearest distances as brute force, in 3 and 8 dimensions', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(3, 8),
        fc.integer({ min: 1, max: 300 }),
        fc.integer({ min: 1, max: 6 }),
        fc.integer({ min: 0, max: 1e6 }),
        (dim, n, k, seed) => {
          let s = seed;
          const r = (): number => ((s = (s * 1103515245 + 12345) % 2147483648) / 2147483648) * 10;
          const data = Array.from({ length: n * dim }, () => Math.round(r() * 4) / 4);
          const q = Array.from({ length: dim }, () => r());
          const tree = new KdTree(Float64Array.from(data), dim);
          const got = tree.nearest(q, k).dist2;
          const want = bruteForce(data, dim, q, k);
          expect(got.length).toBe(want.length);
          got.forEach((v, i) => expect(v).toBeCloseTo(want[i], 9));
          const radius = Math.sqrt(want[want.length - 1]) + 1e-9;
          const inside = tree.within(q, radius, []);
          expect(inside.length).toBe(bruteForce(data, dim, q, n).filter((d) => d <= radius * radius).length);
        },
      ),
      { numRuns: 150 },
    );
  });
});

describe('nearest one in 3 dimensions', () => {
  it('finds the closest vertex of the Stanford bunny as brute force does (npm package `bunny`)', () => {
    const bunny = createRequire(import.meta.url)('bunny') as { positions: number[][] };
    const P = Float32Array.from(bunny.positions.flat().map((v) => v * 10));
    const tree = new KdTree(P, 3);
    const rnd = mulberry32(5);
    for (let k = 0; k < 2000; k++) {
      const v = Math.floor(rnd() * (P.length / 3));
      const q = [P[3 * v] + (rnd() - 0.5) * 10, P[3 * v + 1] + (rnd() - 0.5) * 10, P[3 * v + 2] + (rnd() - 0.5) * 10];
      const limit2 = k % 2 ? Infinity : 4;
      let bi = -1, bd = limit2;
      for (let i = 0; i < P.length / 3; i++) {
        const d = (q[0] - P[3 * i]) ** 2 + (q[1] - P[3 * i + 1]) ** 2 + (q[2] - P[3 * i + 2]) ** 2;
        if (d < bd) { bd = d; bi = i; }
      }
      const got = tree.nearestOne(q, limit2);
      if (bi < 0) expect(got.index).toBe(-1);
      else {
        expect(got.dist2).toBeCloseTo(bd, 9);
        // the bunny's vertices are distinct, so the nearest is one point unless two lie equally far
        const gd = (q[0] - P[3 * got.index]) ** 2 + (q[1] - P[3 * got.index + 1]) ** 2 + (q[2] - P[3 * got.index + 2]) ** 2;
        expect(gd).toBeCloseTo(bd, 9);
      }
    }
  });

  it('finds the nearest distance of brute force on points with many ties', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 200 }), fc.integer({ min: 0, max: 1e6 }), (n, seed) => {
        const { data, r } = tiedGrid(n, seed);
        const q = [r(), r(), r()];
        const got = new KdTree(data, 3).nearestOne(q);
        expect(got.dist2).toBeCloseTo(bruteForce([...data], 3, q, 1)[0], 9);
        expect((q[0] - data[3 * got.index]) ** 2 + (q[1] - data[3 * got.index + 1]) ** 2 + (q[2] - data[3 * got.index + 2]) ** 2).toBeCloseTo(got.dist2, 9);
      }),
      { numRuns: 150 },
    );
  });
});

describe('nearest one in 3 dimensions, queries outside the points\' box', () => {
  it('answers as brute force, a point exactly at the radius included, and nothing farther', () => {
    // integer points, so distances are exact: a query beside the box at exactly the radius
    // from the nearest point must find it (the search counts a point at the radius)
    const P = Float32Array.from([0, 0, 0, 4, 0, 0, 0, 3, 0, 4, 3, 2, 2, 1, 1]);
    const tree = new KdTree(P, 3);
    for (const [q, max2, want] of [
      [[-2, 0, 0], 4, 0], [[-2, 0, 0], 3.999, -1], [[7, 3, 2], 9, 3], [[7, 3, 2], 8, -1], [[4, 3, 6], 16, 3], [[0, -4, 0], 16, 0], [[0, -4, 0], 15.99, -1],
    ] as Array<[number[], number, number]>) {
      expect(tree.nearestOne(q, max2).index).toBe(want);
    }
    fc.assert(
      fc.property(fc.integer({ min: -12, max: 16 }), fc.integer({ min: -12, max: 15 }), fc.integer({ min: -12, max: 14 }), fc.integer({ min: 0, max: 120 }), (x, y, z, max2) => {
        const q = [x, y, z];
        const d = [0, 1, 2, 3, 4].map((i) => (x - P[3 * i]) ** 2 + (y - P[3 * i + 1]) ** 2 + (z - P[3 * i + 2]) ** 2);
        const best = Math.min(...d);
        const got = tree.nearestOne(q, max2);
        if (best > max2) expect(got.index).toBe(-1);
        else expect(got.dist2).toBe(best);
      }),
      { numRuns: 400 },
    );
  });
});

describe('nearest one from a guess (nearestOneNear)', () => {
  // Reference: nearestOne itself, which the tests above check against brute force (the
  // definition of the nearest point). The guess may only save the search, never change the answer.
  const bunnyPoints = (): Float32Array => {
    const bunny = createRequire(import.meta.url)('bunny') as { positions: number[][] };
    return Float32Array.from(bunny.positions.flat().map((v) => v * 10));
  };

  it('gives nearestOne\'s index and squared distance to the last bit, whatever the guess, on the Stanford bunny (npm package `bunny`)', () => {
    const P = bunnyPoints();
    const tree = new KdTree(P, 3);
    const n = P.length / 3;
    const rnd = mulberry32(11);
    let hint = -1;
    for (let k = 0; k < 4000; k++) {
      const v = Math.floor(rnd() * n);
      // near a vertex (as an ICP sample lies near the other surface), sometimes far from it
      const spread = k % 5 === 0 ? 8 : 0.6;
      const q = [P[3 * v] + (rnd() - 0.5) * spread, P[3 * v + 1] + (rnd() - 0.5) * spread, P[3 * v + 2] + (rnd() - 0.5) * spread];
      const max2 = k % 3 === 0 ? Infinity : k % 3 === 1 ? 0.25 : 1;
      // guesses: the last answer, a random point, the query's own vertex
      const guess = k % 4 === 0 ? Math.floor(rnd() * n) : k % 4 === 1 ? v : hint;
      const want = tree.nearestOne(q, max2);
      const got = tree.nearestOneNear(q, max2, guess);
      expect(got.index).toBe(want.index);
      expect(Object.is(got.dist2, want.dist2)).toBe(true);
      if (got.index >= 0) hint = got.index;
    }
  });

  it('keeps nearestOne\'s choice among points at the same distance (repeated points, a grid)', () => {
    onTiedPoints(2, (tree, q, max2, guess) => {
      const want = tree.nearestOne(q, max2), got = tree.nearestOneNear(q, max2, guess);
      expect(got.index).toBe(want.index);
      expect(Object.is(got.dist2, want.dist2)).toBe(true);
    });
  });

  it('answers a query that stays near its last answer without searching the tree', () => {
    const P = bunnyPoints();
    const tree = new KdTree(P, 3);
    // the tree's own search, which nearestOneNear runs when the guess does not settle the answer
    const searched = vi.spyOn(tree as unknown as { searchOne3: () => number }, 'searchOne3');
    const rnd = mulberry32(3);
    let answered = 0;
    const n = P.length / 3;
    for (let k = 0; k < 500; k++) {
      const v = Math.floor(rnd() * n);
      // a point moved by a hundredth of a millimetre from a vertex: the vertex stays its only nearest point
      const q = [P[3 * v] + 0.01, P[3 * v + 1] - 0.01, P[3 * v + 2] + 0.01];
      const got = tree.nearestOneNear(q, Infinity, v);
      if (got.index === v) answered++;
    }
    expect(answered).toBe(500);
    // the bunny's scan has some vertices closer together than 0.02 mm (x10 scale): those are searched
    expect(searched.mock.calls.length).toBeLessThan(50);
  });
});

/**
 * Points with integer coordinates (many repeat, many queries lie equally far from several), and
 * per case 20 queries on the grid or anywhere, with and without a radius, each tried with several
 * guesses: check(tree, data, query, squared radius, guess).
 */
function onTiedPoints(minPoints: number, check: (tree: KdTree, q: number[], max2: number, guess: number, data: Float32Array) => void): void {
  fc.assert(
    fc.property(fc.integer({ min: minPoints, max: 150 }), fc.integer({ min: 0, max: 1e6 }), (n, seed) => {
      let s = seed;
      const r = (): number => ((s = (s * 1103515245 + 12345) % 2147483648) / 2147483648) * 4;
      const data = Float32Array.from({ length: 3 * n }, () => Math.round(r()));
      const tree = new KdTree(data, 3);
      for (let k = 0; k < 20; k++) {
        const q = k % 2 ? [Math.round(r() * 2) / 2, Math.round(r() * 2) / 2, Math.round(r() * 2) / 2] : [r(), r(), r()];
        const max2 = k % 3 === 0 ? Infinity : Math.round(r());
        for (let guess = -1; guess < n; guess += Math.max(1, Math.floor(n / 7))) check(tree, q, max2, guess, data);
      }
    }),
    { numRuns: 150 },
  );
}

describe('some point within a radius from a guess (someWithin)', () => {
  it('answers whether a point lies within the radius as nearestOne does, whatever the guess (ties and repeated points included)', () => {
    // Reference: nearestOne (checked against brute force above): a point within the radius exists
    // exactly when it finds one; the answer given must itself lie within the radius
    onTiedPoints(1, (tree, q, max2, guess, data) => {
      const got = tree.someWithin(q, max2, guess);
      expect(got >= 0).toBe(tree.nearestOne(q, max2).index >= 0);
      if (got >= 0) expect((q[0] - data[3 * got]) ** 2 + (q[1] - data[3 * got + 1]) ** 2 + (q[2] - data[3 * got + 2]) ** 2).toBeLessThanOrEqual(max2);
    });
  });
});

describe('nearest one of a moving query (nearestOneMoving)', () => {
  // Reference: nearestOne (checked against brute force above). What the last search proved may
  // only spare searches, never change the answer: index and squared distance to the last bit.
  it('gives nearestOne\'s answers to the last bit for queries wandering over the Stanford bunny (npm package `bunny`), and mostly without searching', () => {
    const bunny = createRequire(import.meta.url)('bunny') as { positions: number[][] };
    const P = Float32Array.from(bunny.positions.flat().map((v) => v * 10));
    const tree = new KdTree(P, 3);
    const plain = new KdTree(P, 3);
    const near3 = vi.spyOn(tree, 'nearestOneNear3');
    const n = P.length / 3, walkers = 200, rounds = 15;
    const memo = KdTree.movingMemo(walkers);
    const rnd = mulberry32(17);
    // each query starts near a vertex (a fifth of them far off) and takes steps of 0.001 to 0.5 mm, as ICP's samples move
    const q = Array.from({ length: walkers }, (_, w) => {
      const v = Math.floor(rnd() * n), spread = w % 5 === 0 ? 10 : 1;
      return [P[3 * v] + (rnd() - 0.5) * spread, P[3 * v + 1] + (rnd() - 0.5) * spread, P[3 * v + 2] + (rnd() - 0.5) * spread];
    });
    let calls = 0;
    for (let r = 0; r < rounds; r++) {
      const step = [0.5, 0.1, 0.01, 0.001][Math.min(3, Math.floor(r / 4))];
      // the radius shrinks over the rounds, as ICP's pairing distance does (and once has no limit)
      const max2 = r === 0 ? Infinity : (3 - r * 0.15) ** 2;
      for (let w = 0; w < walkers; w++) {
        for (let k = 0; k < 3; k++) q[w][k] += (rnd() - 0.5) * 2 * step;
        const want = plain.nearestOne(q[w], max2);
        const got = tree.nearestOneMoving(q[w][0], q[w][1], q[w][2], max2, memo, w);
        expect(got).toBe(want.index);
        expect(Object.is(tree.lastDist2, want.dist2)).toBe(true);
        calls++;
      }
    }
    // once the steps are small, most queries are answered from what their last search proved
    expect(near3.mock.calls.length).toBeLessThan(0.5 * calls);
    expect(near3.mock.calls.length).toBeGreaterThanOrEqual(walkers);
  });

  it('keeps nearestOne\'s choice among points at the same distance (repeated points, a grid)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 2, max: 150 }), fc.integer({ min: 0, max: 1e6 }), (n, seed) => {
        const { data, r } = tiedGrid(n, seed);
        const tree = new KdTree(data, 3);
        const memo = KdTree.movingMemo(4);
        // queries on the grid, half way between grid points, or anywhere, moving by small steps or jumping between such places
        const q = Array.from({ length: 4 }, () => [Math.round(r() * 2) / 2, Math.round(r() * 2) / 2, Math.round(r() * 2) / 2]);
        for (let k = 0; k < 30; k++) {
          const max2 = k % 3 === 0 ? Infinity : Math.round(r());
          for (let w = 0; w < 4; w++) {
            if (k % 4 === 3) q[w] = [Math.round(r() * 2) / 2, Math.round(r() * 2) / 2, Math.round(r() * 2) / 2];
            else for (let d = 0; d < 3; d++) q[w][d] += k % 2 ? (r() - 2) * 1e-3 : 0;
            const want = tree.nearestOne(q[w], max2);
            expect(tree.nearestOneMoving(q[w][0], q[w][1], q[w][2], max2, memo, w)).toBe(want.index);
            expect(Object.is(tree.lastDist2, want.dist2)).toBe(true);
          }
        }
      }),
      { numRuns: 150 },
    );
  });
});

describe('nearest one without an object (nearestIndex)', () => {
  it('gives nearestOne\'s index and squared distance, in 3 and 8 dimensions', () => {
    const rnd = mulberry32(23);
    for (const dim of [3, 8]) {
      const data = Float64Array.from({ length: 200 * dim }, () => Math.round(rnd() * 8) / 2);
      const tree = new KdTree(data, dim);
      for (let k = 0; k < 300; k++) {
        const q = Array.from({ length: dim }, () => rnd() * 4);
        const max2 = k % 2 ? Infinity : 1;
        const want = tree.nearestOne(q, max2);
        expect(tree.nearestIndex(q, max2)).toBe(want.index);
        expect(Object.is(tree.lastDist2, want.dist2)).toBe(true);
      }
    }
  });
});
