import type { TriangleMesh } from './mesh';

/** Vertex neighbours (the 1-ring) as compressed rows: neighbours of v are list[start[v] .. start[v+1]). */
export interface VertexRings {
  start: Uint32Array;
  list: Uint32Array;
}

export function vertexRings(mesh: TriangleMesh): VertexRings {
  const t = mesh.triangles;
  const nv = mesh.positions.length / 3;
  const deg = new Uint32Array(nv + 1);
  for (let i = 0; i < t.length; i++) deg[t[i] + 1] += 2;
  for (let v = 0; v < nv; v++) deg[v + 1] += deg[v];
  const raw = new Uint32Array(deg[nv]);
  const fill = deg.slice(0, nv);
  for (let f = 0; f < t.length; f += 3) {
    for (let j = 0; j < 3; j++) {
      const a = t[f + j], b = t[f + ((j + 1) % 3)];
      raw[fill[a]++] = b;
      raw[fill[b]++] = a;
    }
  }
  // Deduplicate each row (every interior edge was added twice).
  const start = new Uint32Array(nv + 1);
  const list = new Uint32Array(raw.length);
  let k = 0;
  for (let v = 0; v < nv; v++) {
    start[v] = k;
    const row = raw.subarray(deg[v], deg[v + 1]).sort();
    for (let i = 0; i < row.length; i++) if (i === 0 || row[i] !== row[i - 1]) list[k++] = row[i];
  }
  start[nv] = k;
  return { start, list: list.slice(0, k) };
}

/** Triangles around each vertex, compressed rows. */
export function vertexTriangles(mesh: TriangleMesh): VertexRings {
  const t = mesh.triangles;
  const nv = mesh.positions.length / 3;
  const start = new Uint32Array(nv + 1);
  for (let i = 0; i < t.length; i++) start[t[i] + 1]++;
  for (let v = 0; v < nv; v++) start[v + 1] += start[v];
  const fill = start.slice(0, nv);
  const list = new Uint32Array(t.length);
  for (let i = 0; i < t.length; i++) list[fill[t[i]]++] = Math.floor(i / 3);
  return { start, list };
}
