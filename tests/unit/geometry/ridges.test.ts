import { beforeAll, describe, expect, it } from 'vitest';
import { vertexRings } from '../../../core/geometry/adjacency';
import { principalCurvatures } from '../../../core/geometry/curvature';
import { triangleNormalsAndAreas, vertexNormals, type TriangleMesh } from '../../../core/geometry/mesh';
import { bilateralNormalFilter, triangleCentroids } from '../../../core/geometry/normal-filter';
import { detectAndCloseRidges } from '../../../core/geometry/ridges';
import { buildTopology } from '../../../core/geometry/topology';
import { brokenTube } from './broken-tube';

/**
 * A tube (outer radius 12, inner 7, ends at z = +-40) cut square at z = -30: the outer and
 * inner rims of both ends are creases of 90 degrees (analytic). In one sector the outer rim is worn round (Laplacian smoothing of
 * the vertices near it), which leaves a gap in the detected ridge that the closing must bridge.
 */
function ridgesOf(mesh: TriangleMesh, gap: number) {
  const topo = buildTopology(mesh);
  const { normals, areas } = triangleNormalsAndAreas(mesh);
  const c = triangleCentroids(mesh.positions, mesh.triangles);
  const filtered = bilateralNormalFilter(normals, areas, c, topo.neighbours, 6, 0.45);
  const rings = vertexRings(mesh);
  const curv = principalCurvatures(mesh, vertexNormals(mesh), rings);
  return detectAndCloseRidges(mesh, topo.neighbours, filtered, rings, curv.k1, curv.k2, { ridgeAngleDeg: 35, ridgeGapMm: gap, ridgeCurvatureWeight: 4 });
}

function edgeMid(mesh: TriangleMesh, h: number): [number, number, number] {
  const f = Math.floor(h / 3), j = h % 3;
  const a = mesh.triangles[3 * f + j], b = mesh.triangles[3 * f + ((j + 1) % 3)];
  const p = mesh.positions;
  return [(p[3 * a] + p[3 * b]) / 2, (p[3 * a + 1] + p[3 * b + 1]) / 2, (p[3 * a + 2] + p[3 * b + 2]) / 2];
}

describe('ridges and their closing', () => {
  let worn: TriangleMesh;
  beforeAll(async () => {
    const tube = await brokenTube({ cuts: [{ normal: [0, 0, 1], offset: -30 }], roughness: 0, edgeLength: 0.8 });
    worn = tube.mesh;
    const rings = vertexRings(worn);
    const p = worn.positions;
    const near = (v: number): boolean => {
      const r = Math.hypot(p[3 * v], p[3 * v + 1]);
      const az = Math.atan2(p[3 * v + 1], p[3 * v]);
      return Math.abs(r - 12) < 1.6 && Math.abs(p[3 * v + 2] + 30) < 1.6 && az > 0 && az < 0.5;
    };
    for (let it = 0; it < 8; it++) {
      const next = Float32Array.from(p);
      for (let v = 0; v < p.length / 3; v++) {
        if (!near(v)) continue;
        let x = 0, y = 0, z = 0, n = 0;
        for (let i = rings.start[v]; i < rings.start[v + 1]; i++) {
          const w = rings.list[i];
          x += p[3 * w]; y += p[3 * w + 1]; z += p[3 * w + 2]; n++;
        }
        next[3 * v] = x / n; next[3 * v + 1] = y / n; next[3 * v + 2] = z / n;
      }
      p.set(next);
    }
  });

  it('finds the square rims as ridges and nothing on the smooth walls', () => {
    const r = ridgesOf(worn, 0);
    expect(r.ridgeEdges).toBeGreaterThan(100);
    for (let h = 0; h < r.ridge.length; h++) {
      if (!r.ridge[h]) continue;
      const [x, y, z] = edgeMid(worn, h);
      // every ridge edge lies on a rim (radius 12 or 7) of the cut (z = -30) or of the tube's end (z = 40)
      expect(Math.min(Math.abs(z + 30), Math.abs(z - 40))).toBeLessThan(1.5);
      const rad = Math.hypot(x, y);
      expect(Math.min(Math.abs(rad - 12), Math.abs(rad - 7))).toBeLessThan(1.5);
    }
  });

  it('bridges the worn gap with a path along the rim, found without seed points', () => {
    const open = ridgesOf(worn, 0);
    const closed = ridgesOf(worn, 6);
    expect(closed.closingPaths).toBeGreaterThan(0);
    let inWornSector = 0;
    for (let h = 0; h < closed.ridge.length; h++) {
      if (!closed.ridge[h] || open.ridge[h]) continue;
      const [x, y, z] = edgeMid(worn, h);
      // closing edges run along the (worn) rims, never out across the smooth walls
      const rad = Math.hypot(x, y);
      expect(Math.min(Math.abs(rad - 12), Math.abs(rad - 7))).toBeLessThan(3);
      expect(Math.min(Math.abs(z + 30), Math.abs(z - 40))).toBeLessThan(3);
      const az = Math.atan2(y, x);
      if (Math.abs(z + 30) < 2 && Math.abs(rad - 12) < 2 && az > -0.1 && az < 0.6) inWornSector++;
    }
    expect(inWornSector).toBeGreaterThan(0);
  });
});
