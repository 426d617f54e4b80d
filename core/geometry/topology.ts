import type { TriangleMesh } from './mesh';

/**
 * Triangle adjacency across edges. neighbours[3f + i] is the triangle across edge i of f
 * (edge i runs from corner i to corner i+1), BOUNDARY when no triangle is there, and
 * NON_MANIFOLD when three or more triangles share the edge.
 */
export const BOUNDARY = -1;
export const NON_MANIFOLD = -2;

export interface Topology {
  neighbours: Int32Array;
  boundaryEdges: number;
  nonManifoldEdges: number;
  /** Edges whose two triangles run the same way along it (flipped or non-orientable). */
  inconsistentEdges: number;
  /** Closed, manifold and consistently oriented: a watertight surface. */
  closed: boolean;
}

export function buildTopology(mesh: TriangleMesh): Topology {
  const t = mesh.triangles;
  const nt = t.length / 3;
  const nv = mesh.positions.length / 3;
  // Half-edges grouped by their lower vertex (compressed rows).
  const start = new Uint32Array(nv + 1);
  for (let h = 0; h < 3 * nt; h++) {
    const a = t[h], b = t[h - (h % 3) + ((h % 3) + 1) % 3];
    start[Math.min(a, b) + 1]++;
  }
  for (let v = 0; v < nv; v++) start[v + 1] += start[v];
  const fill = start.slice(0, nv);
  const halfEdges = new Uint32Array(3 * nt);
  for (let h = 0; h < 3 * nt; h++) {
    const a = t[h], b = t[h - (h % 3) + ((h % 3) + 1) % 3];
    halfEdges[fill[Math.min(a, b)]++] = h;
  }
  const neighbours = new Int32Array(3 * nt).fill(BOUNDARY);
  let boundaryEdges = 0, nonManifoldEdges = 0, inconsistentEdges = 0;
  const seen = new Uint8Array(3 * nt);
  for (let v = 0; v < nv; v++) {
    for (let i = start[v]; i < start[v + 1]; i++) {
      const h = halfEdges[i];
      if (seen[h]) continue;
      const a = t[h], b = t[h - (h % 3) + ((h % 3) + 1) % 3];
      const other = Math.max(a, b);
      const same: number[] = [h];
      for (let j = i + 1; j < start[v + 1]; j++) {
        const g = halfEdges[j];
        if (seen[g]) continue;
        const c = t[g], d = t[g - (g % 3) + ((g % 3) + 1) % 3];
        if (Math.max(c, d) === other) same.push(g);
      }
      for (const g of same) seen[g] = 1;
      if (same.length === 1) {
        boundaryEdges++;
      } else if (same.length === 2) {
        const [g0, g1] = same;
        neighbours[g0] = Math.floor(g1 / 3);
        neighbours[g1] = Math.floor(g0 / 3);
        if (t[g0] === t[g1]) inconsistentEdges++;
      } else {
        nonManifoldEdges++;
        for (const g of same) neighbours[g] = NON_MANIFOLD;
      }
    }
  }
  return {
    neighbours,
    boundaryEdges,
    nonManifoldEdges,
    inconsistentEdges,
    closed: boundaryEdges === 0 && nonManifoldEdges === 0 && inconsistentEdges === 0,
  };
}

/** Connected components of triangles sharing a vertex; component ids ordered by size, largest 0. */
export function triangleComponents(mesh: TriangleMesh): { component: Uint32Array; sizes: number[] } {
  const t = mesh.triangles;
  const nv = mesh.positions.length / 3;
  const parent = new Int32Array(nv);
  for (let v = 0; v < nv; v++) parent[v] = v;
  const find = (x: number): number => {
    while (parent[x] !== x) {
      parent[x] = parent[parent[x]];
      x = parent[x];
    }
    return x;
  };
  for (let f = 0; f < t.length; f += 3) {
    const a = find(t[f]), b = find(t[f + 1]), c = find(t[f + 2]);
    parent[b] = a;
    parent[c] = a;
  }
  const nt = t.length / 3;
  const rootId = new Map<number, number>();
  const raw = new Uint32Array(nt);
  const counts: number[] = [];
  for (let f = 0; f < nt; f++) {
    const r = find(t[3 * f]);
    let id = rootId.get(r);
    if (id === undefined) {
      id = counts.length;
      rootId.set(r, id);
      counts.push(0);
    }
    counts[id]++;
    raw[f] = id;
  }
  const order = counts.map((_, i) => i).sort((x, y) => counts[y] - counts[x]);
  const rank = new Uint32Array(counts.length);
  order.forEach((id, r) => (rank[id] = r));
  const component = raw.map((id) => rank[id]);
  return { component, sizes: order.map((id) => counts[id]) };
}
