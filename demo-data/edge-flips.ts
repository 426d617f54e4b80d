import type { Random } from './random';

/**
 * Re-triangulate a closed mesh here and there, at random: an edge between two nearly coplanar
 * triangles of the same surface label is swapped for the other diagonal of their quad. Done
 * independently on every fragment, the two sides of a break no longer share a triangulation
 * (they come from one boolean split), as two scans of the two pieces would not. The surface
 * barely moves: only quads whose triangles bend less than `maxBendDeg` are flipped, and label
 * boundaries (fracture face outlines) are kept. Works in place; returns the number of flips.
 */
export function flipEdges(
  positions: Float32Array,
  triangles: Uint32Array,
  labels: Uint8Array,
  random: Random,
  share = 0.4,
  maxBendDeg = 6,
): number {
  const nv = positions.length / 3;
  const nt = triangles.length / 3;
  // directed edge a -> b: the triangle holding it
  const owner = new Map<number, number>();
  for (let f = 0; f < nt; f++) for (let e = 0; e < 3; e++) owner.set(triangles[f * 3 + e] * nv + triangles[f * 3 + ((e + 1) % 3)], f);
  const used = new Uint8Array(nt);
  const cosBend = Math.cos((maxBendDeg * Math.PI) / 180);
  const n1 = [0, 0, 0], n2 = [0, 0, 0], m1 = [0, 0, 0], m2 = [0, 0, 0];
  let flips = 0;
  for (let f = 0; f < nt; f++) {
    for (let e = 0; e < 3 && !used[f]; e++) {
      const a = triangles[f * 3 + e];
      const b = triangles[f * 3 + ((e + 1) % 3)];
      const c = triangles[f * 3 + ((e + 2) % 3)];
      if (a > b) continue; // each edge once, from the triangle that holds a -> b with a < b
      const g = owner.get(b * nv + a);
      if (g === undefined || used[g] || labels[g] !== labels[f]) continue;
      let d = -1;
      for (let k = 0; k < 3; k++) {
        const v = triangles[g * 3 + k];
        if (v !== a && v !== b) d = v;
      }
      if (d < 0 || d === c || owner.has(c * nv + d) || owner.has(d * nv + c)) continue;
      if (random.next() >= share) continue;
      // f = (a, b, c) and g = (b, a, d) become (a, d, c) and (d, b, c)
      normal(positions, a, b, c, n1);
      normal(positions, b, a, d, n2);
      if (!closeTo(n1, n2, cosBend)) continue;
      normal(positions, a, d, c, m1);
      normal(positions, d, b, c, m2);
      // the new pair must face the same way, bend as little, and not be slivers
      if (!closeTo(m1, n1, cosBend) || !closeTo(m2, n1, cosBend) || !closeTo(m1, m2, cosBend)) continue;
      const before = len(n1) + len(n2);
      if (len(m1) < 0.1 * before || len(m2) < 0.1 * before) continue;
      triangles[f * 3] = a; triangles[f * 3 + 1] = d; triangles[f * 3 + 2] = c;
      triangles[g * 3] = d; triangles[g * 3 + 1] = b; triangles[g * 3 + 2] = c;
      owner.delete(a * nv + b);
      owner.delete(b * nv + a);
      owner.set(c * nv + d, g);
      owner.set(d * nv + c, f);
      used[f] = 1;
      used[g] = 1;
      flips++;
    }
  }
  return flips;
}

function normal(p: Float32Array, a: number, b: number, c: number, out: number[]): void {
  const ux = p[b * 3] - p[a * 3], uy = p[b * 3 + 1] - p[a * 3 + 1], uz = p[b * 3 + 2] - p[a * 3 + 2];
  const vx = p[c * 3] - p[a * 3], vy = p[c * 3 + 1] - p[a * 3 + 1], vz = p[c * 3 + 2] - p[a * 3 + 2];
  out[0] = uy * vz - uz * vy;
  out[1] = uz * vx - ux * vz;
  out[2] = ux * vy - uy * vx;
}

const len = (v: number[]) => Math.hypot(v[0], v[1], v[2]);

function closeTo(u: number[], v: number[], cos: number): boolean {
  const l = len(u) * len(v);
  return l > 0 && (u[0] * v[0] + u[1] * v[1] + u[2] * v[2]) / l >= cos;
}
