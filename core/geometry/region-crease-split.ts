import type { VertexRings } from './adjacency';
import { hypot } from './hypot';
import type { TriangleMesh } from './mesh';
import { cheapestClosingPath, createClosingPathSpace, vertexBendOf } from './curvature-closing-path';
import { growRegions, mergeSmallRegions } from './regions';

export interface RegionCreaseSplitOptions {
  /** An edge inside a region whose filtered normals differ by more than this is a soft crease (degrees). */
  creaseAngleDeg: number;
  /** Open ends of soft creases are joined to another crease or to the region's border at most this far away (mm). */
  gapMm: number;
  /** Edge cost of a closing path = length / (1 + weight x bend x mean edge) (curvature-closing-path.ts). */
  curvatureWeight: number;
  /** Each piece of a split keeps at least this area (mm²); smaller pieces rejoin a neighbour piece. */
  minPieceArea: number;
  /** Count only convex edges as soft creases (the rim of a break on a solid is convex). */
  convexOnly: boolean;
}

/**
 * Splits regions along soft creases (design.md section 7, step 3: curvature-weighted shortest
 * paths close broken ridges). Region growing (regions.ts) joins triangles whose filtered normals
 * differ by under the growth angle, so where a break meets the bone surface at a shallow angle
 * (a flake scar along the cavity, a worn rim) the two are one region wherever part of their
 * meeting line bends less than that, though most of it is a crease. Inside each region, edges
 * bending more than `creaseAngleDeg` are soft creases; each open end of a soft crease is joined
 * by the cheapest path over the region's edges (cost falling as curvature rises, Kimmel &
 * Sethian 1998 geodesics with a curvature metric, as in ridges.ts) to another crease or to the
 * region's border within `gapMm`; the region's triangles are then flooded without crossing
 * creases or paths, and pieces under `minPieceArea` rejoin the piece they share most edges with.
 * A region left with two or more pieces is split; the largest keeps its id.
 *
 * Returns the new region id of every triangle (ids of unsplit regions unchanged).
 */
export function splitRegionsAtCreases(
  mesh: TriangleMesh,
  neighbours: Int32Array,
  normals: Float32Array,
  areas: Float64Array,
  centroids: Float32Array,
  rings: VertexRings,
  k1: Float32Array,
  k2: Float32Array,
  region: Uint32Array,
  options: RegionCreaseSplitOptions,
): Uint32Array {
  const t = mesh.triangles, p = mesh.positions;
  const nt = region.length, nv = p.length / 3;
  let count = 0;
  for (let f = 0; f < nt; f++) if (region[f] + 1 > count) count = region[f] + 1;
  const regionArea = new Float64Array(count);
  for (let f = 0; f < nt; f++) regionArea[region[f]] += areas[f];
  const out = Uint32Array.from(region);
  const cosMax = Math.cos((options.creaseAngleDeg * Math.PI) / 180);
  // Soft creases: half-edges inside one region bending more than the crease angle.
  const crease = new Uint8Array(3 * nt);
  let any = false;
  let lengthSum = 0;
  for (let f = 0; f < nt; f++) {
    for (let j = 0; j < 3; j++) {
      const a = t[3 * f + j], b = t[3 * f + ((j + 1) % 3)];
      lengthSum += hypot(p[3 * a] - p[3 * b], p[3 * a + 1] - p[3 * b + 1], p[3 * a + 2] - p[3 * b + 2]);
      const g = neighbours[3 * f + j];
      if (g < 0 || region[g] !== region[f] || regionArea[region[f]] < 2 * options.minPieceArea) continue;
      const dot = normals[3 * f] * normals[3 * g] + normals[3 * f + 1] * normals[3 * g + 1] + normals[3 * f + 2] * normals[3 * g + 2];
      if (dot >= cosMax) continue;
      // Convex where the normals turn away from each other along the step between the centroids.
      if (options.convexOnly && (normals[3 * g] - normals[3 * f]) * (centroids[3 * g] - centroids[3 * f]) + (normals[3 * g + 1] - normals[3 * f + 1]) * (centroids[3 * g + 1] - centroids[3 * f + 1])
        + (normals[3 * g + 2] - normals[3 * f + 2]) * (centroids[3 * g + 2] - centroids[3 * f + 2]) <= 0) continue;
      crease[3 * f + j] = 1;
      any = true;
    }
  }
  if (!any) return out;
  const meanEdge = lengthSum / Math.max(1, 3 * nt);
  // Triangles by region, for regions that hold a crease.
  const hasCrease = new Uint8Array(count);
  for (let f = 0; f < nt; f++) if (crease[3 * f] || crease[3 * f + 1] || crease[3 * f + 2]) hasCrease[region[f]] = 1;
  const start = new Int32Array(count + 1);
  for (let f = 0; f < nt; f++) if (hasCrease[region[f]]) start[region[f] + 1]++;
  for (let r = 0; r < count; r++) start[r + 1] += start[r];
  const list = new Int32Array(start[count]);
  const fill = start.slice(0, count);
  for (let f = 0; f < nt; f++) if (hasCrease[region[f]]) list[fill[region[f]]++] = f;
  // Work space, reset per region through the touched lists.
  const stamp = new Int32Array(nv).fill(-1);
  const border = new Uint8Array(nv), degree = new Uint16Array(nv), parent = new Int32Array(nv);
  const closing = { positions: p, rings, vertexBend: vertexBendOf(k1, k2), meanEdge };
  const space = createClosingPathSpace(nv);
  const find = (x: number): number => {
    while (parent[x] !== x) { parent[x] = parent[parent[x]]; x = parent[x]; }
    return x;
  };
  for (let r = 0; r < count; r++) {
    if (!hasCrease[r]) continue;
    const tris = list.subarray(start[r], start[r + 1]);
    const verts: number[] = [];
    for (const f of tris) {
      for (let j = 0; j < 3; j++) {
        const v = t[3 * f + j];
        if (stamp[v] !== r) { stamp[v] = r; border[v] = 0; degree[v] = 0; parent[v] = v; verts.push(v); }
      }
    }
    for (const f of tris) {
      for (let j = 0; j < 3; j++) {
        const g = neighbours[3 * f + j];
        const a = t[3 * f + j], b = t[3 * f + ((j + 1) % 3)];
        if (g < 0 || region[g] !== r) { border[a] = 1; border[b] = 1; continue; }
        if (crease[3 * f + j] && f < g) {
          degree[a]++;
          degree[b]++;
          const ra = find(a), rb = find(b);
          if (ra !== rb) parent[ra] = rb;
        }
      }
    }
    // Closing paths from each open end (a crease vertex of degree 1 inside the region).
    const barrier = new Set<number>();
    for (const s of verts) {
      if (degree[s] !== 1 || border[s]) continue;
      const own = find(s);
      const target = cheapestClosingPath(closing, s, options.gapMm, options.curvatureWeight,
        (v) => (border[v] === 1 || degree[v] > 0) && find(v) !== own, (w) => stamp[w] === r, space);
      if (target < 0) continue;
      for (let v = target; v !== s; v = space.prev[v]) barrier.add(Math.min(space.prev[v], v) * nv + Math.max(space.prev[v], v));
      const rt = find(target), rs = find(s);
      if (rt !== rs) parent[rs] = rt;
    }
    // Half-edges of the closing paths become creases.
    if (barrier.size) {
      for (const f of tris) {
        for (let j = 0; j < 3; j++) {
          const a = t[3 * f + j], b = t[3 * f + ((j + 1) % 3)];
          if (barrier.has(Math.min(a, b) * nv + Math.max(a, b))) crease[3 * f + j] = 1;
        }
      }
    }
  }
  // Pieces: triangles of one region flooded without crossing creases or closing paths; small
  // pieces rejoin the piece of their region they share most edges with (regions.ts).
  const inner = Int32Array.from(neighbours);
  for (let f = 0; f < nt; f++) for (let j = 0; j < 3; j++) { const g = inner[3 * f + j]; if (g >= 0 && region[g] !== region[f]) inner[3 * f + j] = -1; }
  const pieceOf = growRegions(inner, normals, 180, undefined, crease);
  const merged = mergeSmallRegions(pieceOf, inner, areas, options.minPieceArea);
  // The largest piece of each region keeps the region's id; the others take new ids.
  let pieces = 0;
  for (let f = 0; f < nt; f++) if (merged[f] + 1 > pieces) pieces = merged[f] + 1;
  const pieceArea = new Float64Array(pieces), pieceRegion = new Int32Array(pieces);
  for (let f = 0; f < nt; f++) { pieceArea[merged[f]] += areas[f]; pieceRegion[merged[f]] = region[f]; }
  const keeper = new Int32Array(count).fill(-1);
  for (let q = 0; q < pieces; q++) { const r = pieceRegion[q]; if (keeper[r] < 0 || pieceArea[q] > pieceArea[keeper[r]]) keeper[r] = q; }
  const idOf = new Int32Array(pieces);
  let nextId = count;
  for (let q = 0; q < pieces; q++) idOf[q] = keeper[pieceRegion[q]] === q ? pieceRegion[q] : nextId++;
  for (let f = 0; f < nt; f++) out[f] = idOf[merged[f]];
  return out;
}
