import { describe, expect, it } from 'vitest';
import { enclosedVolume, surfaceArea } from '../../../core/geometry/measure';
import { buildTopology, triangleComponents } from '../../../core/geometry/topology';
import { weldVertices } from '../../../core/geometry/weld';
import { box, closedCylinder, sphere } from './shapes';

describe('area and volume', () => {
  it('a 2 x 3 x 4 box: area 52, volume 24 (analytic)', () => {
    const m = box(2, 3, 4);
    expect(surfaceArea(m)).toBeCloseTo(52, 4);
    expect(enclosedVolume(m)).toBeCloseTo(24, 4);
    expect(buildTopology(m).closed).toBe(true);
  });

  it('a closed N-gon prism matches the exact polygon formulas', () => {
    // Analytic: base polygon area = N/2 r^2 sin(2 pi / N); side = 2 r sin(pi / N).
    const N = 96, r = 4, h = 30;
    const m = closedCylinder(r, h, N, 8);
    const base = (N / 2) * r * r * Math.sin((2 * Math.PI) / N);
    const side = 2 * r * Math.sin(Math.PI / N);
    expect(surfaceArea(m)).toBeCloseTo(N * side * h + 2 * base, 2);
    expect(enclosedVolume(m)).toBeCloseTo(base * h, 2);
    // and converges to the cylinder's 2 pi r h + 2 pi r^2 and pi r^2 h within 0.1 %
    expect(Math.abs(surfaceArea(m) / (2 * Math.PI * r * h + 2 * Math.PI * r * r) - 1)).toBeLessThan(0.001);
    expect(Math.abs(enclosedVolume(m) / (Math.PI * r * r * h) - 1)).toBeLessThan(0.001);
  });

  it('a fine sphere approaches 4 pi r^2 and 4/3 pi r^3', () => {
    const m = sphere(10, 40);
    expect(Math.abs(surfaceArea(m) / (4 * Math.PI * 100) - 1)).toBeLessThan(0.002);
    expect(Math.abs(enclosedVolume(m) / ((4 / 3) * Math.PI * 1000) - 1)).toBeLessThan(0.003);
  });

  it('flipping every triangle flips the sign of the volume; an open mesh is not closed', () => {
    const m = box(1, 1, 1);
    const flipped = Uint32Array.from(m.triangles);
    for (let f = 0; f < flipped.length; f += 3) [flipped[f + 1], flipped[f + 2]] = [flipped[f + 2], flipped[f + 1]];
    expect(enclosedVolume({ positions: m.positions, triangles: flipped })).toBeCloseTo(-1, 5);
    const open = { positions: m.positions, triangles: m.triangles.slice(3) };
    const topo = buildTopology(open);
    expect(topo.closed).toBe(false);
    expect(topo.boundaryEdges).toBe(3);
  });

  it('welding a triangle soup restores shared vertices; separate pieces are separate components', () => {
    const m = box(1, 1, 1);
    const soup = new Float32Array(m.triangles.length * 3);
    for (let i = 0; i < m.triangles.length; i++) soup.set(m.positions.subarray(3 * m.triangles[i], 3 * m.triangles[i] + 3), 3 * i);
    const soupTris = Uint32Array.from({ length: m.triangles.length }, (_, i) => i);
    const welded = weldVertices({ positions: soup, triangles: soupTris }, 1e-6);
    expect(welded.mesh.positions.length / 3).toBe(8);
    expect(buildTopology(welded.mesh).closed).toBe(true);
    // two boxes apart
    const two = new Float32Array(soup.length * 2);
    two.set(soup);
    for (let i = 0; i < soup.length; i++) two[soup.length + i] = soup[i] + (i % 3 === 0 ? 5 : 0);
    const twoTris = Uint32Array.from({ length: soupTris.length * 2 }, (_, i) => i);
    const w2 = weldVertices({ positions: two, triangles: twoTris }, 1e-6);
    const comps = triangleComponents(w2.mesh);
    expect(comps.sizes).toEqual([12, 12]);
  });
});
