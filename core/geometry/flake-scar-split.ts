import { growRegions, mergeSmallRegions } from './regions';
import type { WallRays } from './wall-rays';

export interface FlakeScarOptions {
  /** A ray leaving head-on after less than this share of its region's reference depth is shallow (0: off). */
  depthRatio: number;
  /** The region's reference depth: this area-weighted quantile of its head-on ray depths (the full wall). */
  referenceQuantile: number;
  /** Both the scar and the rest of its region keep at least this area (mm²); smaller pieces rejoin a neighbour piece. */
  minPieceArea: number;
  /** A scar is not more concave than this (mean curvature under -this, 1/mm): the cavity wall curves inwards. */
  concaveMin: number;
  /** Exit cosine at least this: the ray crossed the wall head-on (settings headOnCosineMin). */
  headOnCosineMin: number;
  /** Least head-on rays a region needs before its reference depth is read. */
  minRays: number;
  /** The region's reference depth is at least this share of the fragment's typical wall depth (a full wall, not a slab). */
  wallShareMin: number;
  /** The fragment's typical wall depth (classify-regions.ts typicalWallDepth; NaN: no split). */
  wallDepth: number;
}

/**
 * Flake scars along the medullary cavity: a break that runs along the cavity wall at a shallow
 * angle (a flake taken off the inner face of the cortex) meets the cavity without a crease in
 * the filtered normals, so region growing puts both in one region, and the region faces the
 * shaft axis and is read medullary as a whole. What the scar cannot hide is the wall behind it:
 * the medullary surface's inward rays cross the whole cortex to the outer surface (wall-rays.ts,
 * the shape diameter of Shapira, Shamir & Cohen-Or 2008), while the scar lies deeper in the
 * wall, so its rays leave head-on through the same outer surface after a thinner wall, down to
 * nothing where the scar reaches the outer rim. Inside each region read medullary, triangles
 * whose ray leaves head-on through the outer surface (regions read outer cortical or articular) shorter than
 * `depthRatio` times the region's reference depth (the `referenceQuantile` depth of those rays:
 * the full wall) are shallow, the others deep; a cavity patch whose wall is thin because a break
 * took off the outer side sends its rays out through that break and is not counted. Triangles
 * without such a ray take the label of the nearest labelled triangle of their region; the
 * region is flooded without crossing between labels, and pieces under `minPieceArea` rejoin
 * their neighbour piece (regions.ts). A shallow piece is a scar when the region keeps a deep
 * piece of `minPieceArea` beside it, the reference depth is at least `wallShareMin` of the
 * fragment's typical wall depth (a region of thin wall all over is a slab or a cavity patch
 * under a break on the outer side, the thin-crossing terms' kind, region-context.ts), and the
 * shallow piece faces the shaft axis over most of its area (as the cavity wall it runs along;
 * a region read medullary by its concavity alone may face neither way) and is not concave (a true cavity patch whose rays leave
 * early through a thin bevel over it curves inwards).
 *
 * Returns the region of every triangle, scars under new ids from `regionCount` on (other ids
 * unchanged), and the number of scars.
 */
export function splitFlakeScars(
  region: Uint32Array,
  regionCount: number,
  medullary: (region: number) => boolean,
  outer: (region: number) => boolean,
  /** Per triangle, whether it faces the shaft axis (shaft-axis.ts facingGroups: 2). */
  facingAxis: (triangle: number) => boolean,
  neighbours: Int32Array,
  normals: Float32Array,
  areas: Float64Array,
  triMeanCurvature: Float32Array,
  rays: WallRays,
  options: FlakeScarOptions,
): { region: Uint32Array; scars: number } {
  const nt = region.length;
  const out = Uint32Array.from(region);
  if (!(options.depthRatio > 0) || !Number.isFinite(options.wallDepth)) return { region: out, scars: 0 };
  const regionArea = new Float64Array(regionCount);
  for (let f = 0; f < nt; f++) regionArea[region[f]] += areas[f];
  const candidate = new Uint8Array(regionCount);
  for (let r = 0; r < regionCount; r++) candidate[r] = medullary(r) && regionArea[r] >= 2 * options.minPieceArea ? 1 : 0;
  // Head-on rays per candidate region: (depth, area) rows for the reference depth.
  const rows: Array<Array<[number, number]>> = Array.from({ length: regionCount }, () => []);
  const rayOf = new Int32Array(nt).fill(-1);
  for (let k = 0; k < rays.triangles.length; k++) {
    const f = rays.triangles[k];
    const g = rays.exitTriangle[k];
    if (!candidate[region[f]] || g < 0 || !(rays.exitCosine[k] >= options.headOnCosineMin) || !outer(region[g])) continue;
    rayOf[f] = k;
    rows[region[f]].push([rays.distance[k], areas[f]]);
  }
  const limit = new Float64Array(regionCount);
  let any = false;
  for (let r = 0; r < regionCount; r++) {
    if (!candidate[r] || rows[r].length < options.minRays) { candidate[r] = 0; continue; }
    const sorted = rows[r].sort((p, q) => p[0] - q[0]);
    const total = sorted.reduce((s, x) => s + x[1], 0);
    let acc = 0, ref = sorted[sorted.length - 1][0];
    for (const [d, w] of sorted) { acc += w; if (acc >= options.referenceQuantile * total) { ref = d; break; } }
    if (ref < options.wallShareMin * options.wallDepth) { candidate[r] = 0; continue; }
    limit[r] = options.depthRatio * ref;
    any = true;
  }
  if (!any) return { region: out, scars: 0 };
  // Labels: 1 shallow, 0 deep, spread to unlabelled triangles of the region (breadth first).
  const label = new Int8Array(nt).fill(-1);
  const queue = new Int32Array(nt);
  let head = 0, tail = 0, shallowAny = false;
  for (let f = 0; f < nt; f++) {
    if (!candidate[region[f]] || rayOf[f] < 0) continue;
    label[f] = rays.distance[rayOf[f]] < limit[region[f]] ? 1 : 0;
    if (label[f] === 1) shallowAny = true;
    queue[tail++] = f;
  }
  if (!shallowAny) return { region: out, scars: 0 };
  while (head < tail) {
    const f = queue[head++];
    for (let j = 0; j < 3; j++) {
      const g = neighbours[3 * f + j];
      if (g < 0 || label[g] >= 0 || region[g] !== region[f]) continue;
      label[g] = label[f];
      queue[tail++] = g;
    }
  }
  // Pieces: each region flooded without crossing between labels; small pieces rejoin a neighbour piece.
  const inner = Int32Array.from(neighbours);
  const barrier = new Uint8Array(3 * nt);
  for (let f = 0; f < nt; f++) {
    for (let j = 0; j < 3; j++) {
      const g = inner[3 * f + j];
      if (g < 0) continue;
      if (region[g] !== region[f]) inner[3 * f + j] = -1;
      else if (candidate[region[f]] && label[f] !== label[g]) barrier[3 * f + j] = 1;
    }
  }
  const piece = mergeSmallRegions(growRegions(inner, normals, 180, undefined, barrier), inner, areas, options.minPieceArea);
  let pieces = 0;
  for (let f = 0; f < nt; f++) if (piece[f] + 1 > pieces) pieces = piece[f] + 1;
  const area = new Float64Array(pieces), shallow = new Float64Array(pieces), curvature = new Float64Array(pieces), inward = new Float64Array(pieces), pieceRegion = new Int32Array(pieces);
  for (let f = 0; f < nt; f++) {
    const q = piece[f];
    area[q] += areas[f];
    curvature[q] += areas[f] * triMeanCurvature[f];
    if (label[f] === 1) shallow[q] += areas[f];
    if (facingAxis(f)) inward[q] += areas[f];
    pieceRegion[q] = region[f];
  }
  const hasDeep = new Uint8Array(regionCount);
  for (let q = 0; q < pieces; q++) if (candidate[pieceRegion[q]] && area[q] >= options.minPieceArea && shallow[q] <= 0.5 * area[q]) hasDeep[pieceRegion[q]] = 1;
  const idOf = new Int32Array(pieces).fill(-1);
  let scars = 0;
  for (let q = 0; q < pieces; q++) {
    const r = pieceRegion[q];
    if (!candidate[r] || !hasDeep[r] || area[q] < options.minPieceArea || shallow[q] <= 0.5 * area[q]) continue;
    if (curvature[q] / area[q] < -options.concaveMin || inward[q] <= 0.5 * area[q]) continue;
    idOf[q] = regionCount + scars++;
  }
  if (!scars) return { region: out, scars: 0 };
  for (let f = 0; f < nt; f++) if (idOf[piece[f]] >= 0) out[f] = idOf[piece[f]];
  return { region: out, scars };
}
