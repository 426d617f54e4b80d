import type { TriangleMesh } from './mesh';
import { hypot } from './hypot';

/**
 * What lies along each region's border, by length of shared mesh edge:
 * - sharp: the share of the border where the (filtered) normals either side differ by more
 *   than the ridge angle. A break face ends at creases all round (where it meets the outer
 *   and the medullary surface, or another break); an original surface region mostly ends
 *   where the bone surface bends gently or where growth stopped in a smooth stretch.
 * - outward / inward: the share of the border shared with regions facing away from the
 *   shaft axis and facing it. On a shaft a break face runs across the wall, so it lies
 *   between the outer and the medullary surface and touches both; an outer or medullary
 *   region touches break faces, never the other wall face directly.
 */
export interface RegionBorder {
  length: number;
  sharpShare: number;
  outwardShare: number;
  inwardShare: number;
  /** Each neighbouring region with the length (mm) of shared border that is a crease and that is not. */
  neighbours: Array<{ region: number; crease: number; smooth: number }>;
}

export function regionBorders(
  mesh: TriangleMesh,
  neighbours: Int32Array,
  normals: Float32Array,
  region: Uint32Array,
  regionCount: number,
  /** +1 facing away from the shaft axis, -1 facing it, 0 neither, per region. */
  regionFacing: Int8Array,
  sharpAngleDeg: number,
): RegionBorder[] {
  const t = mesh.triangles, p = mesh.positions;
  const length = new Float64Array(regionCount), sharp = new Float64Array(regionCount);
  const outward = new Float64Array(regionCount), inward = new Float64Array(regionCount);
  const pairs: Array<Map<number, { region: number; crease: number; smooth: number }>> = Array.from({ length: regionCount }, () => new Map());
  const cosMax = Math.cos((sharpAngleDeg * Math.PI) / 180);
  const nt = region.length;
  for (let f = 0; f < nt; f++) {
    const r = region[f];
    for (let j = 0; j < 3; j++) {
      const g = neighbours[3 * f + j];
      if (g < 0) continue;
      const s = region[g];
      if (s === r) continue;
      const a = t[3 * f + j], b = t[3 * f + ((j + 1) % 3)];
      const len = hypot(p[3 * a] - p[3 * b], p[3 * a + 1] - p[3 * b + 1], p[3 * a + 2] - p[3 * b + 2]);
      length[r] += len;
      const dot = normals[3 * f] * normals[3 * g] + normals[3 * f + 1] * normals[3 * g + 1] + normals[3 * f + 2] * normals[3 * g + 2];
      let pair = pairs[r].get(s);
      if (!pair) pairs[r].set(s, (pair = { region: s, crease: 0, smooth: 0 }));
      if (dot < cosMax) { sharp[r] += len; pair.crease += len; } else pair.smooth += len;
      if (regionFacing[s] > 0) outward[r] += len;
      else if (regionFacing[s] < 0) inward[r] += len;
    }
  }
  return Array.from({ length: regionCount }, (_, r) => {
    const L = length[r];
    const neighbours = [...pairs[r].values()];
    return L > 0
      ? { length: L, sharpShare: sharp[r] / L, outwardShare: outward[r] / L, inwardShare: inward[r] / L, neighbours }
      : { length: 0, sharpShare: 0, outwardShare: 0, inwardShare: 0, neighbours };
  });
}
