/**
 * Regions split along soft creases (region-crease-split.ts). The test surface is a height field
 * over a 40 x 40 mm square, 0.8 mm grid, normals up: a flat side (z = 0, x < 0) and a side falling
 * at 40 degrees (z = -x tan 40°, x > 0), meeting along the line x = 0 in a convex rim, as a break
 * meets the bone surface of a solid (analytic geometry: the truth side
 * of a triangle is the sign of its centroid's x). Along |y| < 1.5 mm the meeting is worn round: the
 * slope eases in over a width that grows to 8 mm at y = 0 (a C1 quadratic blend), so the
 * filtered normals turn by a few degrees per edge there and region growing at 10 degrees runs
 * from one side to the other; elsewhere the meeting is a 40-degree crease (20 degrees between filtered normals), under the 35-degree
 * ridge angle. The same field mirrored (z = +x tan 40°: a concave valley, as creases inside a rough
 * break face or a lobed cavity often are) and a cylinder of radius 12 mm (no crease at all) must
 * stay one region.
 */
import { describe, expect, it } from 'vitest';
import { vertexRings } from '../../../core/geometry/adjacency';
import { principalCurvatures } from '../../../core/geometry/curvature';
import { triangleNormalsAndAreas, vertexNormals, type TriangleMesh } from '../../../core/geometry/mesh';
import { bilateralNormalFilter, triangleCentroids } from '../../../core/geometry/normal-filter';
import { splitRegionsAtCreases } from '../../../core/geometry/region-crease-split';
import { growRegions } from '../../../core/geometry/regions';
import { buildTopology } from '../../../core/geometry/topology';
import { openCylinder } from './shapes';

const slope = Math.tan((40 * Math.PI) / 180);

/** Height of the worn crease: sharp for |y| >= 1.5, blended over width w(y) = 8 (1 - |y| / 1.5) inside. */
function height(x: number, y: number, sign: number): number {
  const w = 8 * Math.max(0, 1 - Math.abs(y) / 1.5);
  if (w < 1e-9 || x >= w / 2) return sign * slope * Math.max(0, x);
  if (x <= -w / 2) return 0;
  return (sign * slope * (x + w / 2) ** 2) / (2 * w);
}

function heightField(step: number, half: number, sign: number): TriangleMesh {
  const n = Math.round((2 * half) / step) + 1;
  const positions = new Float32Array(3 * n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const x = -half + i * step, y = -half + j * step, v = i * n + j;
      positions[3 * v] = x; positions[3 * v + 1] = y; positions[3 * v + 2] = height(x, y, sign);
    }
  }
  const tris: number[] = [];
  for (let i = 0; i + 1 < n; i++) {
    for (let j = 0; j + 1 < n; j++) {
      const a = i * n + j, b = (i + 1) * n + j, c = (i + 1) * n + j + 1, d = i * n + j + 1;
      tris.push(a, b, c, a, c, d);
    }
  }
  return { positions, triangles: Uint32Array.from(tris) };
}

const options = { creaseAngleDeg: 15, gapMm: 4, curvatureWeight: 10, minPieceArea: 150, convexOnly: true };

function regionsOf(mesh: TriangleMesh): { grown: Uint32Array; split: Uint32Array; areas: Float64Array; centroids: Float32Array } {
  const topo = buildTopology(mesh);
  const { normals, areas } = triangleNormalsAndAreas(mesh);
  const centroids = triangleCentroids(mesh.positions, mesh.triangles);
  const filtered = bilateralNormalFilter(normals, areas, centroids, topo.neighbours, 6, 0.45);
  const rings = vertexRings(mesh);
  const curv = principalCurvatures(mesh, vertexNormals(mesh), rings);
  const grown = growRegions(topo.neighbours, filtered, 10);
  const split = splitRegionsAtCreases(mesh, topo.neighbours, filtered, areas, centroids, rings, curv.k1, curv.k2, grown, options);
  return { grown, split, areas, centroids };
}

/** Area share of the surface whose region's majority side (x < 0 or x > 0) is its own side. */
function sideAgreement(region: Uint32Array, areas: Float64Array, centroids: Float32Array): number {
  const pos = new Map<number, number>(), neg = new Map<number, number>();
  for (let f = 0; f < region.length; f++) {
    const m = centroids[3 * f] > 0 ? pos : neg;
    m.set(region[f], (m.get(region[f]) ?? 0) + areas[f]);
  }
  let ok = 0, total = 0;
  for (let f = 0; f < region.length; f++) {
    total += areas[f];
    const p = pos.get(region[f]) ?? 0, q = neg.get(region[f]) ?? 0;
    if ((centroids[3 * f] > 0) === (p >= q)) ok += areas[f];
  }
  return ok / total;
}

describe('regions split along soft creases', () => {
  it('splits a region that runs round a worn stretch of a 40-degree crease along the crease', () => {
    const { grown, split, areas, centroids } = regionsOf(heightField(0.8, 20, -1));
    // Growth at 10 degrees joins the two sides through the worn stretch: one region holds both.
    const before = sideAgreement(grown, areas, centroids);
    const after = sideAgreement(split, areas, centroids);
    expect(new Set(grown).size).toBe(1);
    // One region for both sides: the sloped side's area share, 1 / (1 + cos 40°) = 0.566 (analytic).
    expect(before).toBeCloseTo(1 / (1 + Math.cos((40 * Math.PI) / 180)), 2);
    expect(new Set(split).size).toBe(2);
    expect(after).toBeGreaterThan(0.98);
  });

  it('leaves the same worn crease whole where it is concave', () => {
    const { grown, split } = regionsOf(heightField(0.8, 20, 1));
    expect(new Set(grown).size).toBe(1);
    expect(new Set(split).size).toBe(1);
  });

  it('leaves a smooth cylinder (no crease) whole', () => {
    const { grown, split } = regionsOf(openCylinder(12, 40, 96, 48));
    expect(new Set(split).size).toBe(new Set(grown).size);
  });
});
