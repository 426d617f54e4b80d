/**
 * Bilateral filtering of triangle normals (Zheng, Fu, Au & Tai 2011, "Bilateral normal
 * filtering for mesh denoising"): each triangle's normal becomes the area-weighted average of
 * its edge neighbours' normals, weighted down with distance (spatial Gaussian) and with
 * difference in normal (range Gaussian). Scanner noise and the fine roughness of a break are
 * smoothed while the crease where a break meets the bone surface stays sharp.
 */
import { hypot } from './hypot';
export function bilateralNormalFilter(
  normals: Float32Array,
  areas: Float64Array,
  centroids: Float32Array,
  neighbours: Int32Array,
  iterations: number,
  rangeWidth: number,
): Float32Array {
  const nt = areas.length;
  let cur = Float32Array.from(normals);
  let next = new Float32Array(cur.length);
  // Spatial width: the mean distance between neighbouring centroids.
  let dsum = 0, dn = 0;
  for (let f = 0; f < nt; f++) {
    for (let j = 0; j < 3; j++) {
      const g = neighbours[3 * f + j];
      if (g < 0) continue;
      dsum += hypot(centroids[3 * f] - centroids[3 * g], centroids[3 * f + 1] - centroids[3 * g + 1], centroids[3 * f + 2] - centroids[3 * g + 2]);
      dn++;
    }
  }
  const sigmaS = dn ? dsum / dn : 1;
  const inv2s = 1 / (2 * sigmaS * sigmaS);
  const inv2r = 1 / (2 * rangeWidth * rangeWidth);
  // The spatial exponent of each edge neighbour, the same in every iteration.
  const spatial = new Float64Array(3 * nt);
  for (let f = 0; f < nt; f++) {
    for (let j = 0; j < 3; j++) {
      const g = neighbours[3 * f + j];
      if (g < 0) continue;
      const dx = centroids[3 * f] - centroids[3 * g], dy = centroids[3 * f + 1] - centroids[3 * g + 1], dz = centroids[3 * f + 2] - centroids[3 * g + 2];
      spatial[3 * f + j] = -(dx * dx + dy * dy + dz * dz) * inv2s;
    }
  }
  for (let it = 0; it < iterations; it++) {
    for (let f = 0; f < nt; f++) {
      const nx = cur[3 * f], ny = cur[3 * f + 1], nz = cur[3 * f + 2];
      let sx = nx * areas[f], sy = ny * areas[f], sz = nz * areas[f];
      for (let j = 0; j < 3; j++) {
        const g = neighbours[3 * f + j];
        if (g < 0) continue;
        const ex = nx - cur[3 * g], ey = ny - cur[3 * g + 1], ez = nz - cur[3 * g + 2];
        const w = areas[g] * Math.exp(spatial[3 * f + j] - (ex * ex + ey * ey + ez * ez) * inv2r);
        sx += w * cur[3 * g];
        sy += w * cur[3 * g + 1];
        sz += w * cur[3 * g + 2];
      }
      const len = hypot(sx, sy, sz) || 1;
      next[3 * f] = sx / len;
      next[3 * f + 1] = sy / len;
      next[3 * f + 2] = sz / len;
    }
    const tmp = cur;
    cur = next;
    next = tmp;
  }
  return cur;
}

export function triangleCentroids(positions: Float32Array, triangles: Uint32Array): Float32Array {
  const nt = triangles.length / 3;
  const c = new Float32Array(nt * 3);
  for (let f = 0; f < nt; f++) {
    const a = 3 * triangles[3 * f], b = 3 * triangles[3 * f + 1], d = 3 * triangles[3 * f + 2];
    c[3 * f] = (positions[a] + positions[b] + positions[d]) / 3;
    c[3 * f + 1] = (positions[a + 1] + positions[b + 1] + positions[d + 1]) / 3;
    c[3 * f + 2] = (positions[a + 2] + positions[b + 2] + positions[d + 2]) / 3;
  }
  return c;
}
