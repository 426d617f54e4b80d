import type { VertexRings } from './adjacency';
import { hypot } from './hypot';
import { MinHeap } from './min-heap';

/** Work space of `cheapestClosingPath`, allocated once per mesh and reused by every search. */
export interface ClosingPathSpace {
  /** Cost from the start vertex; Infinity where the last search did not reach. */
  dist: Float64Array;
  /** The vertex each reached vertex was reached from (-1 at the start and where not reached). */
  prev: Int32Array;
  touched: number[];
  heap: MinHeap;
}

export function createClosingPathSpace(vertexCount: number): ClosingPathSpace {
  return { dist: new Float64Array(vertexCount).fill(Infinity), prev: new Int32Array(vertexCount).fill(-1), touched: [], heap: new MinHeap() };
}

/** What a closing search needs to know about the mesh. */
export interface ClosingPathMesh {
  positions: Float32Array;
  rings: VertexRings;
  /** The larger principal curvature's magnitude at each vertex, max(|k1|, |k2|) (1/mm). */
  vertexBend: Float64Array;
  /** Mean edge length of the mesh (mm), which makes the curvature term unitless. */
  meanEdge: number;
}

/**
 * The cheapest path over mesh edges from vertex `start` to the first vertex (other than the
 * start) for which `isTarget` holds, Dijkstra's algorithm with an edge (v, w) costing its
 * length / (1 + curvatureWeight x max(bend v, bend w) x mean edge): paths prefer to run along
 * sharp, strongly bent parts of the surface (the minimal-path closing of feature lines, cf.
 * Kimmel & Sethian 1998, geodesics with a curvature metric). Vertices farther than `reachMm`
 * from the start (straight line) are not entered, nor those `inside` rejects, so the search
 * stays local. Used to close the gaps of ridges (ridges.ts) and of soft creases inside a region
 * (region-crease-split.ts).
 *
 * Returns the target vertex, or -1 when none is reached; the path is read back from it through
 * `space.prev` until -1 (the start). The space is reset at the start of the next search.
 *
 * Worked example (curvature-closing-path.test.ts): on a flat strip the path is the straight run of edges;
 * where one row of vertices bends, the path follows that row although it is longer.
 */
export function cheapestClosingPath(
  mesh: ClosingPathMesh,
  start: number,
  reachMm: number,
  curvatureWeight: number,
  isTarget: (v: number) => boolean,
  inside: ((v: number) => boolean) | null,
  space: ClosingPathSpace,
): number {
  const { dist, prev, touched, heap } = space;
  const p = mesh.positions, rings = mesh.rings, bendOf = mesh.vertexBend;
  const meanEdge = mesh.meanEdge;
  for (const v of touched) { dist[v] = Infinity; prev[v] = -1; }
  touched.length = 0;
  heap.clear();
  dist[start] = 0;
  touched.push(start);
  heap.push(start, 0);
  const sx = p[3 * start], sy = p[3 * start + 1], sz = p[3 * start + 2];
  while (heap.size > 0) {
    const v = heap.pop(), d = heap.lastKey;
    if (d > dist[v]) continue;
    if (v !== start && isTarget(v)) return v;
    const bv = bendOf[v];
    for (let i = rings.start[v]; i < rings.start[v + 1]; i++) {
      const w = rings.list[i];
      if (inside !== null && !inside(w)) continue;
      if (hypot(sx - p[3 * w], sy - p[3 * w + 1], sz - p[3 * w + 2]) > reachMm) continue;
      const len = hypot(p[3 * v] - p[3 * w], p[3 * v + 1] - p[3 * w + 1], p[3 * v + 2] - p[3 * w + 2]);
      const nd = d + len / (1 + curvatureWeight * Math.max(bv, bendOf[w]) * meanEdge);
      if (nd < dist[w]) {
        if (dist[w] === Infinity) touched.push(w);
        dist[w] = nd;
        prev[w] = v;
        heap.push(w, nd);
      }
    }
  }
  return -1;
}

/** max(|k1|, |k2|) at each vertex: the bend a closing path looks for. */
export function vertexBendOf(k1: Float32Array, k2: Float32Array): Float64Array {
  const out = new Float64Array(k1.length);
  for (let v = 0; v < k1.length; v++) out[v] = Math.max(Math.abs(k1[v]), Math.abs(k2[v]));
  return out;
}
