import type { VertexRings } from './adjacency';
import type { TriangleMesh } from './mesh';
import { hypot } from './hypot';
import { cheapestClosingPath, createClosingPathSpace, vertexBendOf } from './curvature-closing-path';

/**
 * Ridges: mesh edges where the filtered normals of the two triangles differ by more than a
 * threshold angle (the crease where a break meets the bone surface). Worn or chipped edges
 * leave gaps in them; each open end of a ridge is joined to the nearest vertex of another
 * ridge within a search radius by the cheapest path over mesh edges, where an edge costs
 * its length divided by (1 + weight x |largest principal curvature| x mean edge length)
 * (curvature-closing-path.ts: paths prefer sharp, strongly bent parts of the surface).
 * The ends are found from the ridges themselves: no points are placed by hand.
 *
 * Returns one flag per half-edge (3 f + i, edge i of triangle f): 1 when it lies on a ridge.
 */
export interface RidgeSettings {
  ridgeAngleDeg: number;
  ridgeGapMm: number;
  ridgeCurvatureWeight: number;
}

export function detectAndCloseRidges(
  mesh: TriangleMesh,
  neighbours: Int32Array,
  normals: Float32Array,
  rings: VertexRings,
  k1: Float32Array,
  k2: Float32Array,
  settings: RidgeSettings,
): { ridge: Uint8Array; ridgeEdges: number; closingPaths: number } {
  const t = mesh.triangles, p = mesh.positions;
  const nt = t.length / 3, nv = p.length / 3;
  const ridge = new Uint8Array(3 * nt);
  const cosMax = Math.cos((settings.ridgeAngleDeg * Math.PI) / 180);
  const degree = new Uint16Array(nv);
  // Union-find of ridge vertices into ridge lines.
  const parent = new Int32Array(nv);
  for (let v = 0; v < nv; v++) parent[v] = v;
  const find = (x: number): number => {
    while (parent[x] !== x) { parent[x] = parent[parent[x]]; x = parent[x]; }
    return x;
  };
  let ridgeEdges = 0;
  let lengthSum = 0;
  for (let f = 0; f < nt; f++) {
    for (let j = 0; j < 3; j++) {
      const a = t[3 * f + j], b = t[3 * f + ((j + 1) % 3)];
      lengthSum += hypot(p[3 * a] - p[3 * b], p[3 * a + 1] - p[3 * b + 1], p[3 * a + 2] - p[3 * b + 2]);
      const g = neighbours[3 * f + j];
      if (g < 0) continue;
      const dot = normals[3 * f] * normals[3 * g] + normals[3 * f + 1] * normals[3 * g + 1] + normals[3 * f + 2] * normals[3 * g + 2];
      if (dot >= cosMax) continue;
      ridge[3 * f + j] = 1;
      if (f < g) {
        ridgeEdges++;
        degree[a]++;
        degree[b]++;
        parent[find(a)] = find(b);
      }
    }
  }
  const meanEdge = lengthSum / Math.max(1, 3 * nt);
  // Edges to mark when a path runs over them: vertex pair -> half-edges (found through triangles).
  const pending: number[] = [];
  const markEdge = (a: number, b: number): void => {
    pending.push(a, b);
  };
  // The cheapest closing path from each open end to another ridge line.
  const closing = { positions: p, rings, vertexBend: vertexBendOf(k1, k2), meanEdge };
  const space = createClosingPathSpace(nv);
  let closingPaths = 0;
  for (let s = 0; s < nv; s++) {
    if (degree[s] !== 1) continue;
    const own = find(s);
    const target = cheapestClosingPath(closing, s, settings.ridgeGapMm, settings.ridgeCurvatureWeight,
      (v) => degree[v] > 0 && find(v) !== own, null, space);
    if (target < 0) continue;
    closingPaths++;
    for (let v = target; space.prev[v] >= 0; v = space.prev[v]) markEdge(space.prev[v], v);
    parent[find(s)] = find(target);
  }
  // Mark the half-edges of the closing paths.
  if (pending.length) {
    const want = new Set<number>();
    const onPath = new Uint8Array(nv);
    for (let i = 0; i < pending.length; i += 2) {
      const a = pending[i], b = pending[i + 1];
      want.add(Math.min(a, b) * nv + Math.max(a, b));
      onPath[a] = 1;
      onPath[b] = 1;
    }
    for (let f = 0; f < nt; f++) {
      for (let j = 0; j < 3; j++) {
        const a = t[3 * f + j], b = t[3 * f + ((j + 1) % 3)];
        if (onPath[a] && onPath[b] && want.has(Math.min(a, b) * nv + Math.max(a, b))) ridge[3 * f + j] = 1;
      }
    }
  }
  return { ridge, ridgeEdges, closingPaths };
}
