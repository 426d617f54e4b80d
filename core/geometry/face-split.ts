import type { TriangleMesh } from './mesh';
import { hypot } from './hypot';

/**
 * Which fracture regions make one fracture face. A fragment's fracture triangles often form
 * one connected patch holding several breaks: two break surfaces meeting at a crease, or a
 * splinter face running into a transverse one. Region growing has already cut that patch into
 * regions (and cut single rough breaks along gentle bends), so faces are groups of fracture
 * regions: two neighbouring fracture regions are one face unless the border they share is a
 * crease, either along the border (at least creaseShareMin of its length has filtered normals
 * differing by more than creaseAngleDeg, the ridge test of ridges.ts) or across it (their
 * area-weighted mean normals differ by more than meanAngleDeg: a worn crease rounds the edge
 * itself but not the two faces' orientations). Groups under minFaceArea (mm²) join the
 * neighbouring group they share most border with, so that a break is not split into pieces
 * too small to measure a fracture angle on or to match (the same reasoning as small-faces.ts);
 * so do groups whose border with the outer bone surface is shorter than minOuterEdge (mm),
 * since the fracture angle is read along that border (Villa & Mahieu 1991: the angle between
 * the break and the cortical surface), and a piece without it could not be classed.
 * Returns the face group of each region (-1 for regions that are not fracture).
 */
export interface FaceSplitSettings {
  creaseAngleDeg: number;
  creaseShareMin: number;
  meanAngleDeg: number;
  minFaceArea: number;
  /** A group whose border with outer bone surface is shorter than this (mm) also rejoins (when the fragment has outer surface). */
  minOuterEdge: number;
}

export function fractureFaceGroups(
  mesh: TriangleMesh,
  neighbours: Int32Array,
  normals: Float32Array,
  areas: Float64Array,
  region: Uint32Array,
  isFracture: ArrayLike<boolean>,
  isOuter: ArrayLike<boolean>,
  settings: FaceSplitSettings,
): Int32Array {
  const n = isFracture.length;
  const t = mesh.triangles, p = mesh.positions;
  const cosCrease = Math.cos((settings.creaseAngleDeg * Math.PI) / 180);
  const cosMean = Math.cos((settings.meanAngleDeg * Math.PI) / 180);
  const regionArea = new Float64Array(n);
  const mean = new Float64Array(3 * n);
  // Shared border (length, crease length) of each pair of neighbouring fracture regions.
  const pairs = new Map<number, { length: number; crease: number }>();
  const outerEdge = new Float64Array(n);
  let anyOuter = false;
  for (let r = 0; r < n; r++) if (isOuter[r]) anyOuter = true;
  for (let f = 0; f < region.length; f++) {
    const r = region[f];
    if (!isFracture[r]) continue;
    regionArea[r] += areas[f];
    for (let i = 0; i < 3; i++) mean[3 * r + i] += areas[f] * normals[3 * f + i];
    for (let j = 0; j < 3; j++) {
      const g = neighbours[3 * f + j];
      if (g < 0) continue;
      const s = region[g];
      const a = t[3 * f + j], b = t[3 * f + ((j + 1) % 3)];
      if (isOuter[s]) {
        outerEdge[r] += hypot(p[3 * a] - p[3 * b], p[3 * a + 1] - p[3 * b + 1], p[3 * a + 2] - p[3 * b + 2]);
        continue;
      }
      if (s <= r || !isFracture[s]) continue; // each edge once, from the lower region id
      const len = hypot(p[3 * a] - p[3 * b], p[3 * a + 1] - p[3 * b + 1], p[3 * a + 2] - p[3 * b + 2]);
      const key = r * n + s;
      let e = pairs.get(key);
      if (!e) pairs.set(key, (e = { length: 0, crease: 0 }));
      e.length += len;
      const dot = normals[3 * f] * normals[3 * g] + normals[3 * f + 1] * normals[3 * g + 1] + normals[3 * f + 2] * normals[3 * g + 2];
      if (dot < cosCrease) e.crease += len;
    }
  }
  for (let r = 0; r < n; r++) {
    const l = hypot(mean[3 * r], mean[3 * r + 1], mean[3 * r + 2]) || 1;
    for (let i = 0; i < 3; i++) mean[3 * r + i] /= l;
  }
  const parent = Int32Array.from({ length: n }, (_, i) => i);
  const find = (x: number): number => {
    while (parent[x] !== x) { parent[x] = parent[parent[x]]; x = parent[x]; }
    return x;
  };
  for (const [key, e] of pairs) {
    const a = Math.floor(key / n), b = key % n;
    const dot = mean[3 * a] * mean[3 * b] + mean[3 * a + 1] * mean[3 * b + 1] + mean[3 * a + 2] * mean[3 * b + 2];
    if (e.crease >= settings.creaseShareMin * e.length || dot < cosMean) continue;
    parent[find(a)] = find(b);
  }
  // Small groups join the neighbouring group they share most border with, smallest first.
  for (let pass = 0; pass < 8; pass++) {
    const groupArea = new Float64Array(n), groupOuter = new Float64Array(n);
    for (let r = 0; r < n; r++) if (isFracture[r]) { groupArea[find(r)] += regionArea[r]; groupOuter[find(r)] += outerEdge[r]; }
    const small = (x: number): boolean => groupArea[x] < settings.minFaceArea || (anyOuter && groupOuter[x] < settings.minOuterEdge);
    const border = new Map<number, Map<number, number>>();
    for (const [key, e] of pairs) {
      const a = find(Math.floor(key / n)), b = find(key % n);
      if (a === b) continue;
      for (const [x, y] of [[a, b], [b, a]]) {
        if (!small(x)) continue;
        let m = border.get(x);
        if (!m) border.set(x, (m = new Map()));
        m.set(y, (m.get(y) ?? 0) + e.length);
      }
    }
    if (border.size === 0) break;
    const order = [...border.keys()].sort((x, y) => groupArea[x] - groupArea[y]);
    let merged = 0;
    for (const x of order) {
      if (find(x) !== x) continue;
      let best = -1, bestLength = 0;
      for (const [y, len] of border.get(x)!) {
        const ry = find(y);
        if (ry !== x && len > bestLength) { best = ry; bestLength = len; }
      }
      if (best >= 0) { parent[x] = best; merged++; }
    }
    if (!merged) break;
  }
  return Int32Array.from({ length: n }, (_, r) => (isFracture[r] ? find(r) : -1));
}
