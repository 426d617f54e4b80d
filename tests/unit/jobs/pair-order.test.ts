/**
 * Band order of fragment pairs (core/jobs/pair-order.ts) against what the reverse
 * Cuthill-McKee ordering is known to achieve (Cuthill & McKee 1969; George 1971): a path
 * numbered at random gets bandwidth 1 (neighbours on the path get consecutive numbers); a
 * grid graph w wide gets bandwidth at most 2w (the search starts at a corner, the lowest
 * degree; its breadth-first levels are anti-diagonals of at most w nodes and an edge joins
 * the same or the next level, so it spans at most two levels). Bandwidth: the largest
 * difference of numbers across an edge.
 */
import { describe, expect, it } from 'vitest';
import { bandOrder, reverseCuthillMcKee } from '../../../core/jobs/pair-order';
import { mulberry32 } from '../../../core/geometry/seeded-random';

function bandwidth(position: Int32Array, edges: Array<[number, number]>): number {
  return Math.max(...edges.map(([a, b]) => Math.abs(position[a] - position[b])));
}

function shuffled(n: number, seed: number): number[] {
  const r = mulberry32(seed);
  const p = Array.from({ length: n }, (_, i) => i);
  for (let i = n - 1; i > 0; i--) {
    const j = Math.floor(r() * (i + 1));
    [p[i], p[j]] = [p[j], p[i]];
  }
  return p;
}

describe('reverse Cuthill-McKee order of fragment pairs', () => {
  it('numbers a randomly labelled path with bandwidth 1', () => {
    const label = shuffled(200, 3);
    const edges: Array<[number, number]> = [];
    for (let i = 0; i + 1 < 200; i++) edges.push([label[i], label[i + 1]]);
    const position = reverseCuthillMcKee(200, edges);
    expect(new Set(position).size).toBe(200);
    expect(bandwidth(position, edges)).toBe(1);
  });

  it('numbers a randomly labelled 8 x 40 grid with bandwidth at most 2 x 8 (random labels give about 300)', () => {
    const w = 8, h = 40, n = w * h;
    const label = shuffled(n, 5);
    const edges: Array<[number, number]> = [];
    for (let y = 0; y < h; y++) for (let x = 0; x < w; x++) {
      if (x + 1 < w) edges.push([label[y * w + x], label[y * w + x + 1]]);
      if (y + 1 < h) edges.push([label[y * w + x], label[(y + 1) * w + x]]);
    }
    const position = reverseCuthillMcKee(n, edges);
    expect(bandwidth(position, edges)).toBeLessThanOrEqual(2 * w);
    expect(bandwidth(Int32Array.from({ length: n }, (_, i) => i), edges)).toBeGreaterThan(100);
  });

  it('keeps every pair, once, sorted along the band', () => {
    const edges: Array<[number, number]> = [[0, 5], [5, 2], [2, 7], [7, 1], [3, 4], [6, 6]];
    const out = bandOrder(edges, (e) => e, 8);
    expect(out.length).toBe(edges.length);
    expect(new Set(out)).toEqual(new Set(edges));
    const position = reverseCuthillMcKee(8, edges);
    const firsts = out.map(([a, b]) => Math.min(position[a], position[b]));
    for (let i = 1; i < firsts.length; i++) expect(firsts[i]).toBeGreaterThanOrEqual(firsts[i - 1]);
  });
});
