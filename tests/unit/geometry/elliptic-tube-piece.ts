import type { EllipseRays } from '../../../core/geometry/shaft-section';

const deg = Math.PI / 180;

/** A surface point of the piece: centroid and unit normal in the section plane. */
export interface PiecePoint { x: number; y: number; nx: number; ny: number }

/**
 * Wall pairs of a piece of a flattened tube with outer ellipse (A, B) and a cavity ellipse
 * (Ai, Bi) about the z axis, major axes along x, from `fromDeg` to `toDeg` of the parameter t:
 * each outer point (A cos t, B sin t) paired with the cavity point (Ai cos t, Bi sin t) as one
 * head-on wall ray each way (exit cosine set to 1), on 10 sections 3 mm apart; areas are arc
 * lengths, normals the ellipses' gradients (outwards on the outer surface, towards the axis on
 * the cavity). With `rayLengths` each pair's two rays (outer one first) get the lengths it
 * returns, as `rays.distance`.
 */
export function ellipticTubePiece(
  A: number, B: number, Ai: number, Bi: number, fromDeg: number, toDeg: number, steps = 120,
  rayLengths?: (outer: PiecePoint, cavity: PiecePoint) => [number, number],
): { centroids: Float32Array; normals: Float32Array; areas: Float64Array; rays: EllipseRays & { distance?: Float32Array } } {
  const cen: number[] = [], nor: number[] = [], ar: number[] = [], shooter: number[] = [], exit: number[] = [], dist: number[] = [];
  const add = (x: number, y: number, z: number, nx: number, ny: number, a: number): number => {
    cen.push(x, y, z); nor.push(nx, ny, 0); ar.push(a);
    return ar.length - 1;
  };
  const dt = ((toDeg - fromDeg) * deg) / steps;
  for (let layer = 0; layer < 10; layer++) {
    for (let i = 0; i <= steps; i++) {
      const t = (fromDeg + ((toDeg - fromDeg) * i) / steps) * deg;
      const point = (a: number, b: number, sign: number): number => {
        const gx = Math.cos(t) / a, gy = Math.sin(t) / b, gl = Math.hypot(gx, gy);
        return add(a * Math.cos(t), b * Math.sin(t), 3 * layer, (sign * gx) / gl, (sign * gy) / gl, Math.hypot(a * Math.sin(t), b * Math.cos(t)) * dt);
      };
      const o = point(A, B, 1), m = point(Ai, Bi, -1);
      shooter.push(o, m); exit.push(m, o);
      if (rayLengths) {
        const at = (k: number): PiecePoint => ({ x: cen[3 * k], y: cen[3 * k + 1], nx: nor[3 * k], ny: nor[3 * k + 1] });
        dist.push(...rayLengths(at(o), at(m)));
      }
    }
  }
  return {
    centroids: Float32Array.from(cen), normals: Float32Array.from(nor), areas: Float64Array.from(ar),
    rays: {
      triangles: Uint32Array.from(shooter), exitCosine: new Float32Array(shooter.length).fill(1), exitTriangle: Int32Array.from(exit),
      ...(rayLengths ? { distance: Float32Array.from(dist) } : {}),
    },
  };
}
