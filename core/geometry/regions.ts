/**
 * Region growing over triangle adjacency: neighbouring triangles whose (filtered) normals
 * differ by less than a threshold angle belong to one region, so regions end at creases such
 * as the edge where a break meets the bone surface. Tiny regions (noise islands) are then
 * merged into the neighbour they share most edges with. When `group` is given, growth also
 * stays inside one group, and never crosses an edge flagged as a ridge (ridges.ts) (e.g. triangles facing out from the shaft axis, facing in, or
 * neither), which keeps a region from leaking across a worn or chipped break edge.
 */
export function growRegions(neighbours: Int32Array, normals: Float32Array, growAngleDeg: number, group?: Uint8Array, ridge?: Uint8Array): Uint32Array {
  const nt = neighbours.length / 3;
  const region = new Uint32Array(nt).fill(0xffffffff);
  const cosMax = Math.cos((growAngleDeg * Math.PI) / 180);
  const stack = new Uint32Array(nt);
  let next = 0;
  for (let s = 0; s < nt; s++) {
    if (region[s] !== 0xffffffff) continue;
    const id = next++;
    region[s] = id;
    let top = 0;
    stack[top++] = s;
    while (top > 0) {
      const f = stack[--top];
      for (let j = 0; j < 3; j++) {
        const g = neighbours[3 * f + j];
        if (g < 0 || region[g] !== 0xffffffff) continue;
        if (group && group[g] !== group[f]) continue;
        if (ridge && ridge[3 * f + j]) continue;
        const dot = normals[3 * f] * normals[3 * g] + normals[3 * f + 1] * normals[3 * g + 1] + normals[3 * f + 2] * normals[3 * g + 2];
        if (dot < cosMax) continue;
        region[g] = id;
        stack[top++] = g;
      }
    }
  }
  return region;
}

/** Merge regions smaller than minArea into the neighbouring region they share most edges with. */
export function mergeSmallRegions(region: Uint32Array, neighbours: Int32Array, areas: Float64Array, minArea: number): Uint32Array {
  const nt = region.length;
  let count = 0;
  for (let f = 0; f < nt; f++) if (region[f] + 1 > count) count = region[f] + 1;
  const parent = new Int32Array(count);
  for (let i = 0; i < count; i++) parent[i] = i;
  const find = (x: number): number => {
    while (parent[x] !== x) { parent[x] = parent[parent[x]]; x = parent[x]; }
    return x;
  };
  for (let pass = 0; pass < 4; pass++) {
    const area = new Float64Array(count);
    for (let f = 0; f < nt; f++) area[find(region[f])] += areas[f];
    // Shared edge counts between small regions and their neighbours.
    const shared = new Map<number, Map<number, number>>();
    for (let f = 0; f < nt; f++) {
      const a = find(region[f]);
      if (area[a] >= minArea) continue;
      for (let j = 0; j < 3; j++) {
        const g = neighbours[3 * f + j];
        if (g < 0) continue;
        const b = find(region[g]);
        if (b === a) continue;
        let m = shared.get(a);
        if (!m) shared.set(a, (m = new Map()));
        m.set(b, (m.get(b) ?? 0) + 1);
      }
    }
    if (shared.size === 0) break;
    const small = [...shared.keys()].sort((x, y) => area[x] - area[y]);
    let merged = 0;
    for (const a of small) {
      if (find(a) !== a) continue;
      let best = -1, bestCount = 0;
      for (const [b, c] of shared.get(a)!) {
        const rb = find(b);
        if (rb === a) continue;
        if (c > bestCount || (c === bestCount && area[rb] > area[best])) { best = rb; bestCount = c; }
      }
      if (best >= 0) { parent[a] = best; area[best] += area[a]; merged++; }
    }
    if (merged === 0) break;
  }
  // Renumber densely.
  const ids = new Map<number, number>();
  const out = new Uint32Array(nt);
  for (let f = 0; f < nt; f++) {
    const r = find(region[f]);
    let id = ids.get(r);
    if (id === undefined) { id = ids.size; ids.set(r, id); }
    out[f] = id;
  }
  return out;
}
