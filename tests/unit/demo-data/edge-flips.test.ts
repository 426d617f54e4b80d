import { describe, expect, it } from 'vitest';
import { flipEdges } from '../../../demo-data/edge-flips';
import { manifoldKernel } from '../../../demo-data/manifold-kernel';
import { openEdgeCount, signedVolume } from '../../../demo-data/mesh';
import { Random } from '../../../demo-data/random';

const edgesOf = (t: Uint32Array) => {
  const s = new Set<string>();
  for (let i = 0; i < t.length; i += 3) for (let e = 0; e < 3; e++) {
    const [a, b] = [t[i + e], t[i + ((e + 1) % 3)]];
    s.add(a < b ? `${a},${b}` : `${b},${a}`);
  }
  return s;
};

describe('random edge flips (independent triangulations)', () => {
  it('re-triangulate the flat faces of a cube differently per stream, keep it closed and keep its volume', async () => {
    const wasm = await manifoldKernel();
    const cube = wasm.Manifold.cube([10, 10, 10]);
    const fine = cube.refineToLength(0.7);
    const m = fine.getMesh();
    cube.delete();
    fine.delete();
    const positions = new Float32Array(m.vertProperties);
    const copies = ['one', 'two'].map((seed) => {
      const t = new Uint32Array(m.triVerts);
      const flips = flipEdges(positions, t, new Uint8Array(t.length / 3), new Random(seed));
      return { t, flips };
    });
    for (const { t, flips } of copies) {
      expect(flips).toBeGreaterThan(t.length / 3 / 10);
      // closed 2-manifold: every directed edge once, with its reverse (definition)
      expect(openEdgeCount(t, positions.length / 3)).toBe(0);
      // analytic geometry: a 10 mm cube holds 1000 mm³; flips within its flat faces keep it
      expect(signedVolume(positions, t)).toBeCloseTo(1000, 6);
    }
    const [e1, e2] = copies.map((c) => edgesOf(c.t));
    const shared = [...e1].filter((e) => e2.has(e)).length;
    expect(shared / e1.size).toBeLessThan(0.95);
    // the cube's own edges (bends of 90 degrees) are never flipped: both keep every edge there
    const onCubeEdge = (key: string) => {
      const [a, b] = key.split(',').map(Number);
      const at = (v: number, k: number) => positions[v * 3 + k];
      return [0, 1, 2].filter((k) => [0, 10].some((w) => Math.abs(at(a, k) - w) < 1e-6 && Math.abs(at(b, k) - w) < 1e-6)).length >= 2;
    };
    const original = [...edgesOf(new Uint32Array(m.triVerts))].filter(onCubeEdge);
    for (const e of original) expect(e1.has(e) && e2.has(e)).toBe(true);
  });
});
