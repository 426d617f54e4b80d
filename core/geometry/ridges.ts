import type { VertexRings } from './adjacency';
import type { TriangleMesh } from './mesh';
import { hypot } from './hypot';
import { MinHeap } from './min-heap';

/**
 * Ridges: mesh edges where the filtered normals of the two triangles differ by more than a
 * threshold angle (the crease where a break meets the bone surface). Worn or chipped edges
 * leave gaps in them; each open end of a ridge is joined to the nearest vertex of another
 * ridge within a search radius by the cheapest path over mesh edges, where an edge costs
 * its length divided by (1 + weight x |largest principal curvature| x mean edge length):
 * paths prefer to run along sharp, strongly bent parts of the surface (the minimal-path
 * closing of feature lines, cf. Kimmel & Sethian 1998 geodesics with a curvature metric).
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
  // Dijkstra from each open end.
  // The larger principal curvature's magnitude at each vertex: a path is cheaper where the surface bends.
  const vertexBend = new Float64Array(nv);
  for (let v = 0; v < nv; v++) vertexBend[v] = Math.max(Math.abs(k1[v]), Math.abs(k2[v]));
  const dist = new Float64Array(nv).fill(Infinity);
  const prev = new Int32Array(nv).fill(-1);
  const touched: number[] = [];
  let closingPaths = 0;
  const heap = new MinHeap();
  for (let s = 0; s < nv; s++) {
    if (degree[s] !== 1) continue;
    const own = find(s);
    for (const v of touched) { dist[v] = Infinity; prev[v] = -1; }
    touched.length = 0;
    heap.clear();
    dist[s] = 0;
    touched.push(s);
    heap.push(s, 0);
    let target = -1;
    while (heap.size > 0) {
      const v = heap.pop(), d = heap.lastKey;
      if (d > dist[v]) continue;
      if (v !== s && degree[v] > 0 && find(v) !== own) { target = v; break; }
      for (let i = rings.start[v]; i < rings.start[v + 1]; i++) {
        const w = rings.list[i];
        // Euclidean reach limit keeps the search local.
        const reach = hypot(p[3 * s] - p[3 * w], p[3 * s + 1] - p[3 * w + 1], p[3 * s + 2] - p[3 * w + 2]);
        if (reach > settings.ridgeGapMm) continue;
        const len = hypot(p[3 * v] - p[3 * w], p[3 * v + 1] - p[3 * w + 1], p[3 * v + 2] - p[3 * w + 2]);
        const bend = Math.max(vertexBend[v], vertexBend[w]);
        const nd = d + len / (1 + settings.ridgeCurvatureWeight * bend * meanEdge);
        if (nd < dist[w]) {
          if (dist[w] === Infinity) touched.push(w);
          dist[w] = nd;
          prev[w] = v;
          heap.push(w, nd);
        }
      }
    }
    if (target < 0) continue;
    closingPaths++;
    for (let v = target; prev[v] >= 0; v = prev[v]) markEdge(prev[v], v);
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
