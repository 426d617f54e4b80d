import { describe, expect, it } from 'vitest';
import { refinePartition } from '../../../core/geometry/refine-partition';

// The common refinement (meet) of two partitions of one set: blocks are the non-empty
// intersections of a block of each (the standard lattice-of-partitions definition, e.g.
// Davey & Priestley, Introduction to Lattices and Order, 2nd ed., on the partition lattice;
// recalled from memory). Checked by that definition, not by stored outputs.
describe('refinePartition', () => {
  it('gives the worked example of its header', () => {
    expect([...refinePartition(Int32Array.from([0, 0, 0, 1, -1]), Int32Array.from([5, 6, 6]), Uint32Array.from([0, 0, 1, 1, 2]))]).toEqual([0, 0, 1, 2, -1]);
  });
  it('puts two triangles together exactly when both labellings do (random labellings)', () => {
    let seed = 7;
    const rand = (n: number): number => { seed = (seed * 1103515245 + 12345) % 2147483648; return seed % n; };
    for (let trial = 0; trial < 20; trial++) {
      const nt = 60, nr = 12;
      const region = Uint32Array.from({ length: nt }, () => rand(nr));
      const byRegion = Int32Array.from({ length: nr }, () => rand(4) - 1);
      const byTriangle = Int32Array.from({ length: nt }, () => rand(5) - 1);
      const out = refinePartition(byTriangle, byRegion, region);
      for (let i = 0; i < nt; i++) {
        expect(out[i] < 0).toBe(byTriangle[i] < 0);
        for (let j = 0; j < nt; j++) {
          if (byTriangle[i] < 0 || byTriangle[j] < 0) continue;
          const same = byTriangle[i] === byTriangle[j] && byRegion[region[i]] === byRegion[region[j]];
          expect(out[i] === out[j]).toBe(same);
        }
      }
    }
  });
  it('leaves a labelling alone when the other is coarser', () => {
    const byTriangle = Int32Array.from([0, 0, 1, 1, 2]);
    expect([...refinePartition(byTriangle, Int32Array.from([3, 3]), Uint32Array.from([0, 1, 0, 1, 0]))]).toEqual([0, 0, 1, 1, 2]);
  });
});
