/**
 * Samples spread evenly by area over an annulus (outer radius R, inner r) in the plane z = 0, or
 * over the half of it whose x has the given sign, with normals +z (or -z when `flip`), and the
 * part's exact area (pi (R^2 - r^2), or half of it): the ring-shaped break face of a piece broken
 * straight across a shaft, for the candidate-index tests. Radii are drawn by the inverse of the
 * radial CDF of uniform area, (rho^2 - r^2) / (R^2 - r^2); seeded, so the same call gives the same
 * samples.
 */
import { mulberry32 } from '../../core/geometry/seeded-random';

export interface SampledRing { points: Float32Array; normals: Float32Array; area: number }

export function sampledRing(R: number, r: number, n: number, seed: number, half: -1 | 0 | 1, flip: boolean): SampledRing {
  const rand = mulberry32(seed);
  const points = new Float32Array(3 * n), normals = new Float32Array(3 * n);
  for (let i = 0; i < n; i++) {
    const rho = Math.sqrt(r * r + rand() * (R * R - r * r));
    const phi = half === 0 ? rand() * 2 * Math.PI : (half > 0 ? -Math.PI / 2 : Math.PI / 2) + rand() * Math.PI;
    points.set([rho * Math.cos(phi), rho * Math.sin(phi), 0], 3 * i);
    normals.set([0, 0, flip ? -1 : 1], 3 * i);
  }
  return { points, normals, area: (half === 0 ? 1 : 0.5) * Math.PI * (R * R - r * r) };
}
