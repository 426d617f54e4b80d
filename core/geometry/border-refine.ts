/**
 * Refinement of the border between break faces and bone surface, triangle by triangle.
 *
 * Regions are classed whole (classify-regions.ts, region-context.ts), but where a region ends
 * is decided earlier by region growing, which stops at creases of the bilaterally filtered
 * normals (ridges.ts). Filtering smears a crease over a triangle or two and the ridge lines
 * need not follow the rim exactly, so a strip of one or two triangles along the rim ends up
 * on the wrong side (dev seeds: 0.3-0.9 % of all area within two triangles of the predicted
 * border, read fracture for original more often than the reverse). Across the rim the
 * surface turns by the angle between break and bone surface (a crease), while on each side
 * it turns only as the relief of the break or the bone's curvature does, so a triangle at the
 * border belongs with the side whose nearby normals it shares: the classic region-boundary
 * refinement by normal similarity (compare the boundary optimisation of variational shape
 * approximation, Cohen-Steiner, Alliez & Desbrun 2004, where each triangle joins the proxy
 * normal it is closest to).
 *
 * Each pass: for every triangle with an edge neighbour of the other kind, the area-weighted
 * mean normal of each kind over the triangles within `rings` edge steps that lie at least
 * `referenceRing` steps inside their own kind's side (so the border strip itself does not
 * vote); the triangle changes side when its normal is closer to the other kind's mean. A
 * moved triangle joins the region of a neighbour of the other kind. `passes` passes let the
 * border move that many triangles. The caller passes the program's classes, not the analyst's
 * corrections, so a region stays the same set of triangles when it is corrected.
 */
import { hypot } from './hypot';
export interface BorderRefineOptions {
  rings: number;
  referenceRing: number;
  passes: number;
  /** Patches (edge-connected, one kind) under this area (mm²) that the moves left or made are undone (see revertSpecks). */
  minPatchArea: number;
}

/**
 * Returns the refined region of every triangle (a new array; `region` is left as it was).
 * `fractureRegion[r]`: region r is a break face. `normals`: unit triangle normals (filtered).
 */
export function refineFractureBorder(
  neighbours: Int32Array,
  normals: Float32Array,
  areas: Float64Array,
  region: Uint32Array,
  fractureRegion: ArrayLike<boolean>,
  options: BorderRefineOptions,
): Uint32Array {
  const nt = areas.length;
  const out = region.slice();
  if (options.passes < 1 || options.rings < 1) return out;
  const kind = new Uint8Array(nt);
  for (let f = 0; f < nt; f++) kind[f] = fractureRegion[out[f]] ? 1 : 0;
  const depth = new Int32Array(nt);
  const stamp = new Int32Array(nt).fill(-1);
  const dirty = new Int32Array(nt).fill(-1);
  const sum = new Float64Array(6);
  let front = new Int32Array(nt), next = new Int32Array(nt);
  const border: number[] = [];
  const maxDepth = options.referenceRing;
  for (let pass = 0; pass < options.passes; pass++) {
    // Steps from the border within each side, counted up to the reference ring.
    depth.fill(maxDepth);
    border.length = 0;
    let n = 0;
    for (let f = 0; f < nt; f++) {
      for (let j = 0; j < 3; j++) {
        const g = neighbours[3 * f + j];
        if (g >= 0 && kind[g] !== kind[f]) { depth[f] = 0; border.push(f); front[n++] = f; break; }
      }
    }
    if (border.length === 0) break;
    for (let d = 1; d < maxDepth && n > 0; d++) {
      let m = 0;
      for (let i = 0; i < n; i++) {
        const f = front[i];
        for (let j = 0; j < 3; j++) {
          const g = neighbours[3 * f + j];
          if (g >= 0 && kind[g] === kind[f] && depth[g] === maxDepth) { depth[g] = d; next[m++] = g; }
        }
      }
      [front, next] = [next, front];
      n = m;
    }
    const moves: Array<[number, number]> = [];
    for (const f of border) {
      // After the first pass only where the last moves can have changed what the triangle sees.
      if (pass > 0 && dirty[f] !== pass) continue;
      sum.fill(0);
      stamp[f] = pass * nt + f;
      front[0] = f;
      n = 1;
      for (let d = 1; d <= options.rings && n > 0; d++) {
        let m = 0;
        for (let i = 0; i < n; i++) {
          const a = front[i];
          for (let j = 0; j < 3; j++) {
            const g = neighbours[3 * a + j];
            if (g < 0 || stamp[g] === pass * nt + f) continue;
            stamp[g] = pass * nt + f;
            next[m++] = g;
            if (depth[g] >= maxDepth) {
              const k = 3 * kind[g], w = areas[g];
              sum[k] += w * normals[3 * g]; sum[k + 1] += w * normals[3 * g + 1]; sum[k + 2] += w * normals[3 * g + 2];
            }
          }
        }
        [front, next] = [next, front];
        n = m;
      }
      const own = kind[f], other = 1 - own;
      const lo = hypot(sum[3 * own], sum[3 * own + 1], sum[3 * own + 2]);
      const lt = hypot(sum[3 * other], sum[3 * other + 1], sum[3 * other + 2]);
      if (!(lo > 0 && lt > 0)) continue;
      const nx = normals[3 * f], ny = normals[3 * f + 1], nz = normals[3 * f + 2];
      const cOwn = (nx * sum[3 * own] + ny * sum[3 * own + 1] + nz * sum[3 * own + 2]) / lo;
      const cOther = (nx * sum[3 * other] + ny * sum[3 * other + 1] + nz * sum[3 * other + 2]) / lt;
      if (!(cOther > cOwn)) continue;
      // Join the region of a neighbour across the border (the first one found).
      for (let j = 0; j < 3; j++) {
        const g = neighbours[3 * f + j];
        if (g >= 0 && kind[g] === other) { moves.push([f, out[g]]); break; }
      }
    }
    if (moves.length === 0) break;
    // All moves of a pass at once, from the classes at its start.
    for (const [f, r] of moves) { out[f] = r; kind[f] = fractureRegion[r] ? 1 : 0; }
    // A triangle's choice depends on the kinds within rings + referenceRing steps of it: mark those around the moves.
    n = 0;
    for (const [f] of moves) { if (dirty[f] !== pass + 1) { dirty[f] = pass + 1; front[n++] = f; } }
    for (let d = 1; d <= options.rings + maxDepth && n > 0; d++) {
      let m = 0;
      for (let i = 0; i < n; i++) {
        const a = front[i];
        for (let j = 0; j < 3; j++) { const g = neighbours[3 * a + j]; if (g >= 0 && dirty[g] !== pass + 1) { dirty[g] = pass + 1; next[m++] = g; } }
      }
      [front, next] = [next, front];
      n = m;
    }
  }
  revertSpecks(neighbours, areas, region, out, kind, fractureRegion, options.minPatchArea);
  return out;
}

/**
 * Moves made at the same time can leave a speck behind: a triangle that joined a region whose
 * neighbour left it in the same pass, a narrow neck of a face cut through, a region all but
 * emptied. Patches of one region (edge-connected) smaller than `minArea` that hold or touch
 * a moved triangle take those triangles back to their first region, a few times over.
 */
function revertSpecks(
  neighbours: Int32Array, areas: Float64Array, first: Uint32Array, out: Uint32Array, kind: Uint8Array, fractureRegion: ArrayLike<boolean>, minArea: number,
): void {
  const nt = areas.length;
  // Flood of each triangle (numbered over all rounds), and whether that flood found a large patch.
  const flood = new Int32Array(nt).fill(-1);
  const large: boolean[] = [];
  const stack: number[] = [], members: number[] = [];
  // Triangles moved, in order; reverting only ever takes triangles off this list.
  let moved: number[] = [];
  for (let f = 0; f < nt; f++) if (out[f] !== first[f]) moved.push(f);
  for (let round = 0; round < 20; round++) {
    const roundStart = large.length;
    // Seeds: the moved triangles and their neighbours (every patch that holds or touches a move).
    const seeds: number[] = [];
    moved = moved.filter((f) => out[f] !== first[f]);
    for (const f of moved) {
      seeds.push(f);
      for (let j = 0; j < 3; j++) { const g = neighbours[3 * f + j]; if (g >= 0) seeds.push(g); }
    }
    const revert: number[] = [];
    for (const s of seeds) {
      if (flood[s] >= roundStart) continue;
      const id = large.length;
      large.push(false);
      flood[s] = id;
      stack.length = 0; members.length = 0;
      stack.push(s);
      let area = 0, big = false;
      // Flood the seed's patch of its region, stopping once it is large enough (or meets a
      // flood of this round that was: the same patch, left unfinished).
      while (stack.length && !big) {
        const f = stack.pop()!;
        members.push(f);
        area += areas[f];
        if (area >= minArea) big = true;
        for (let j = 0; j < 3; j++) {
          const g = neighbours[3 * f + j];
          if (g < 0 || out[g] !== out[f]) continue;
          if (flood[g] < roundStart) { flood[g] = id; stack.push(g); } else if (flood[g] !== id) big = true;
        }
      }
      large[id] = big;
      if (big) continue;
      for (const f of members) {
        if (out[f] !== first[f]) revert.push(f);
        for (let j = 0; j < 3; j++) { const g = neighbours[3 * f + j]; if (g >= 0 && out[g] !== out[f] && out[g] !== first[g]) revert.push(g); }
      }
    }
    if (revert.length === 0) return;
    for (const f of revert) { out[f] = first[f]; kind[f] = fractureRegion[out[f]] ? 1 : 0; }
  }
}
