/**
 * Test helper: a break face given by per-triangle labels (the test's truth), as samples with
 * outward normals plus the outline (boundary edges of the labelled triangles).
 */
import type { BreakFaceInput } from '../../core/geometry/proposals/prepared-fragment';
import { sampleTriangles } from '../../core/geometry/registration/voxel-sampling';

export function breakFaceFromLabels(positions: Float32Array, triangles: Uint32Array, label: Uint8Array, spacing: number): BreakFaceInput {
  const s = sampleTriangles(positions, triangles, spacing * 0.5, (t) => label[t] === 1);
  const count = new Map<string, number>();
  const nt = triangles.length / 3;
  for (let t = 0; t < nt; t++) {
    if (!label[t]) continue;
    for (let e = 0; e < 3; e++) {
      const a = triangles[3 * t + e], b = triangles[3 * t + ((e + 1) % 3)];
      const key = a < b ? `${a},${b}` : `${b},${a}`;
      count.set(key, (count.get(key) ?? 0) + 1);
    }
  }
  const outline: number[] = [];
  for (const [key, c] of count) {
    if (c !== 1) continue;
    const [a, b] = key.split(',').map(Number);
    for (const f of [0, 0.5]) {
      for (let k = 0; k < 3; k++) outline.push(positions[3 * a + k] * (1 - f) + positions[3 * b + k] * f);
    }
  }
  let area = 0;
  for (let t = 0; t < nt; t++) {
    if (!label[t]) continue;
    const a = triangles[3 * t] * 3, b = triangles[3 * t + 1] * 3, c = triangles[3 * t + 2] * 3;
    const ux = positions[b] - positions[a], uy = positions[b + 1] - positions[a + 1], uz = positions[b + 2] - positions[a + 2];
    const vx = positions[c] - positions[a], vy = positions[c + 1] - positions[a + 1], vz = positions[c + 2] - positions[a + 2];
    area += Math.hypot(uy * vz - uz * vy, uz * vx - ux * vz, ux * vy - uy * vx) / 2;
  }
  return { points: s.points, normals: s.normals, outline: Float32Array.from(outline), area };
}
