/**
 * Even resampling of surface samples on a voxel grid: one sample per occupied cell (mean
 * position, mean normal), so matching costs depend on area, not on scanner resolution.
 */
export interface OrientedSamples {
  points: Float32Array;
  normals: Float32Array;
}

export function voxelResample(points: ArrayLike<number>, normals: ArrayLike<number>, cell: number): OrientedSamples {
  const n = points.length / 3;
  const cells = new Map<string, number>();
  const acc: number[] = [];
  for (let i = 0; i < n; i++) {
    const x = points[3 * i], y = points[3 * i + 1], z = points[3 * i + 2];
    const key = `${Math.floor(x / cell)},${Math.floor(y / cell)},${Math.floor(z / cell)}`;
    let k = cells.get(key);
    if (k === undefined) {
      k = acc.length / 7;
      cells.set(key, k);
      acc.push(0, 0, 0, 0, 0, 0, 0);
    }
    const o = 7 * k;
    acc[o] += x; acc[o + 1] += y; acc[o + 2] += z;
    acc[o + 3] += normals[3 * i]; acc[o + 4] += normals[3 * i + 1]; acc[o + 5] += normals[3 * i + 2];
    acc[o + 6] += 1;
  }
  const m = acc.length / 7;
  const P = new Float32Array(3 * m), N = new Float32Array(3 * m);
  let w = 0;
  for (let k = 0; k < m; k++) {
    const o = 7 * k, c = acc[o + 6];
    const len = Math.hypot(acc[o + 3], acc[o + 4], acc[o + 5]);
    if (len < 1e-9) continue;
    P[3 * w] = acc[o] / c; P[3 * w + 1] = acc[o + 1] / c; P[3 * w + 2] = acc[o + 2] / c;
    N[3 * w] = acc[o + 3] / len; N[3 * w + 1] = acc[o + 4] / len; N[3 * w + 2] = acc[o + 5] / len;
    w++;
  }
  return { points: P.slice(0, 3 * w), normals: N.slice(0, 3 * w) };
}

/** Points on a triangle mesh about `spacing` apart, with the triangles' normals (area-weighted). */
export function sampleTriangles(positions: Float32Array, triangles: Uint32Array, spacing: number, pick?: (t: number) => boolean): OrientedSamples {
  const pts: number[] = [];
  const nrm: number[] = [];
  const nt = triangles.length / 3;
  const cellArea = spacing * spacing;
  for (let t = 0; t < nt; t++) {
    if (pick && !pick(t)) continue;
    const a = triangles[3 * t] * 3, b = triangles[3 * t + 1] * 3, c = triangles[3 * t + 2] * 3;
    const ux = positions[b] - positions[a], uy = positions[b + 1] - positions[a + 1], uz = positions[b + 2] - positions[a + 2];
    const vx = positions[c] - positions[a], vy = positions[c + 1] - positions[a + 1], vz = positions[c + 2] - positions[a + 2];
    const cx = uy * vz - uz * vy, cy = uz * vx - ux * vz, cz = ux * vy - uy * vx;
    const len = Math.hypot(cx, cy, cz);
    if (len <= 0) continue;
    const area = len / 2;
    // stratified: k x k barycentric grid with k from the triangle's size
    const k = Math.max(1, Math.ceil(Math.sqrt((4 * area) / cellArea)));
    for (let i = 0; i < k; i++) {
      for (let j = 0; j < k - i; j++) {
        const u = (i + 1 / 3) / k, v = (j + 1 / 3) / k;
        pts.push(positions[a] + u * ux + v * vx, positions[a + 1] + u * uy + v * vy, positions[a + 2] + u * uz + v * vz);
        nrm.push(cx / len, cy / len, cz / len);
      }
    }
  }
  return voxelResample(pts, nrm, spacing);
}
