/** A triangle mesh as flat typed arrays: xyz per vertex (mm), three vertex indices per triangle. */
export interface TriangleMesh {
  positions: Float32Array;
  triangles: Uint32Array;
}

/** Signed volume by the divergence theorem (positive for outward-facing triangles). */
export function signedVolume(positions: ArrayLike<number>, triangles: ArrayLike<number>): number {
  let v = 0;
  for (let t = 0; t < triangles.length; t += 3) {
    const a = triangles[t] * 3;
    const b = triangles[t + 1] * 3;
    const c = triangles[t + 2] * 3;
    const ax = positions[a], ay = positions[a + 1], az = positions[a + 2];
    const bx = positions[b], by = positions[b + 1], bz = positions[b + 2];
    const cx = positions[c], cy = positions[c + 1], cz = positions[c + 2];
    v += ax * (by * cz - bz * cy) - ay * (bx * cz - bz * cx) + az * (bx * cy - by * cx);
  }
  return v / 6;
}

/**
 * Volume (mm³) of the part of a closed, outward-facing mesh between the planes z = lo and
 * z = hi. Divergence theorem with the field F = (x, 0, 0): div F = 1, and F is parallel to
 * the cutting planes, so the caps where the planes cut the solid add nothing; the volume is
 * the integral of x n_x over the surface clipped to the slab, exact for a triangle mesh.
 */
export function slabVolume(positions: ArrayLike<number>, triangles: ArrayLike<number>, lo: number, hi: number): number {
  let v = 0;
  const poly: number[] = [];
  const next: number[] = [];
  for (let t = 0; t < triangles.length; t += 3) {
    const a = triangles[t] * 3, b = triangles[t + 1] * 3, c = triangles[t + 2] * 3;
    const za = positions[a + 2], zb = positions[b + 2], zc = positions[c + 2];
    const zmin = Math.min(za, zb, zc), zmax = Math.max(za, zb, zc);
    if (zmax <= lo || zmin >= hi) continue;
    if (zmin >= lo && zmax <= hi) {
      v += triangleXFlux(positions[a], positions[a + 1], za, positions[b], positions[b + 1], zb, positions[c], positions[c + 1], zc);
      continue;
    }
    poly.length = 0;
    for (const o of [a, b, c]) poly.push(positions[o], positions[o + 1], positions[o + 2]);
    clipByZ(poly, next, lo, 1);
    clipByZ(next, poly, hi, -1);
    for (let k = 3; k + 5 < poly.length; k += 3) {
      v += triangleXFlux(poly[0], poly[1], poly[2], poly[k], poly[k + 1], poly[k + 2], poly[k + 3], poly[k + 4], poly[k + 5]);
    }
  }
  return v;
}

/** Integral of x n_x over one triangle: (area-weighted normal)_x times the mean x. */
function triangleXFlux(ax: number, ay: number, az: number, bx: number, by: number, bz: number, cx: number, cy: number, cz: number): number {
  const nx = (by - ay) * (cz - az) - (bz - az) * (cy - ay);
  return (nx / 2) * ((ax + bx + cx) / 3);
}

/** Keep the part of a polygon (flat xyz list) with sign * (z - plane) >= 0 (Sutherland-Hodgman). */
function clipByZ(input: number[], out: number[], plane: number, sign: number): void {
  out.length = 0;
  const n = input.length / 3;
  for (let i = 0; i < n; i++) {
    const j = (i + 1) % n;
    const di = sign * (input[i * 3 + 2] - plane);
    const dj = sign * (input[j * 3 + 2] - plane);
    if (di >= 0) out.push(input[i * 3], input[i * 3 + 1], input[i * 3 + 2]);
    if ((di >= 0) !== (dj >= 0)) {
      const f = di / (di - dj);
      out.push(
        input[i * 3] + f * (input[j * 3] - input[i * 3]),
        input[i * 3 + 1] + f * (input[j * 3 + 1] - input[i * 3 + 1]),
        plane,
      );
    }
  }
}

/** Reverse every triangle in place. */
export function flipTriangles(triangles: Uint32Array): void {
  for (let t = 0; t < triangles.length; t += 3) {
    const b = triangles[t + 1];
    triangles[t + 1] = triangles[t + 2];
    triangles[t + 2] = b;
  }
}

/** Make the triangles face outwards (positive volume). */
export function orientOutwards(mesh: TriangleMesh): TriangleMesh {
  if (signedVolume(mesh.positions, mesh.triangles) < 0) flipTriangles(mesh.triangles);
  return mesh;
}

/**
 * Every edge of a closed, consistently oriented mesh is used exactly twice, once in each
 * direction. Returns the number of edges that break this rule (0 for a closed 2-manifold).
 */
export function openEdgeCount(triangles: Uint32Array, vertexCount: number): number {
  const counts = new Map<number, number>();
  const key = (a: number, b: number) => a * vertexCount + b;
  for (let t = 0; t < triangles.length; t += 3) {
    for (let e = 0; e < 3; e++) {
      const a = triangles[t + e];
      const b = triangles[t + ((e + 1) % 3)];
      const k = key(a, b);
      counts.set(k, (counts.get(k) ?? 0) + 1);
    }
  }
  let bad = 0;
  for (const [k, n] of counts) {
    const a = Math.floor(k / vertexCount);
    const b = k - a * vertexCount;
    if (n !== 1 || counts.get(key(b, a)) !== 1) bad++;
  }
  return bad;
}
