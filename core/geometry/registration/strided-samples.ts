/**
 * At most `max` oriented samples taken at an even stride through the list (the first sample is
 * always kept). Returns the input itself when it is already small enough.
 */
export function stridedSamples(points: Float32Array, normals: Float32Array, max: number): { points: Float32Array; normals: Float32Array } {
  const n = points.length / 3;
  if (n <= max) return { points, normals };
  const step = n / max;
  const P = new Float32Array(3 * max), N = new Float32Array(3 * max);
  for (let k = 0; k < max; k++) {
    const i = Math.floor(k * step);
    P.set(points.subarray(3 * i, 3 * i + 3), 3 * k);
    N.set(normals.subarray(3 * i, 3 * i + 3), 3 * k);
  }
  return { points: P, normals: N };
}
