import type { Random } from './random';

/** A 4x4 row-major rigid transform (mm), as in design.md section 7. */
export type Matrix4 = number[];

/** A uniformly random rotation (Shoemake's method) and a translation. */
export function randomPose(random: Random, centroid: readonly number[], spread: number): Matrix4 {
  const u1 = random.next(), u2 = random.next(), u3 = random.next();
  const a = Math.sqrt(1 - u1), b = Math.sqrt(u1);
  const qx = a * Math.sin(2 * Math.PI * u2), qy = a * Math.cos(2 * Math.PI * u2);
  const qz = b * Math.sin(2 * Math.PI * u3), qw = b * Math.cos(2 * Math.PI * u3);
  const r = [
    1 - 2 * (qy * qy + qz * qz), 2 * (qx * qy - qz * qw), 2 * (qx * qz + qy * qw),
    2 * (qx * qy + qz * qw), 1 - 2 * (qx * qx + qz * qz), 2 * (qy * qz - qx * qw),
    2 * (qx * qz - qy * qw), 2 * (qy * qz + qx * qw), 1 - 2 * (qx * qx + qy * qy),
  ];
  const off = [random.uniform(-spread, spread), random.uniform(-spread, spread), random.uniform(-spread, spread)];
  const t = [0, 1, 2].map((i) => off[i] - (r[i * 3] * centroid[0] + r[i * 3 + 1] * centroid[1] + r[i * 3 + 2] * centroid[2]));
  return [r[0], r[1], r[2], t[0], r[3], r[4], r[5], t[1], r[6], r[7], r[8], t[2], 0, 0, 0, 1];
}

export function multiply(a: Matrix4, b: Matrix4): Matrix4 {
  const out = new Array<number>(16).fill(0);
  for (let i = 0; i < 4; i++) for (let j = 0; j < 4; j++) for (let k = 0; k < 4; k++) out[i * 4 + j] += a[i * 4 + k] * b[k * 4 + j];
  return out;
}

/** Inverse of a rigid transform. */
export function invertRigid(m: Matrix4): Matrix4 {
  const r = [m[0], m[4], m[8], m[1], m[5], m[9], m[2], m[6], m[10]]; // transposed rotation
  const t = [m[3], m[7], m[11]];
  const ti = [0, 1, 2].map((i) => -(r[i * 3] * t[0] + r[i * 3 + 1] * t[1] + r[i * 3 + 2] * t[2]));
  return [r[0], r[1], r[2], ti[0], r[3], r[4], r[5], ti[1], r[6], r[7], r[8], ti[2], 0, 0, 0, 1];
}

export function applyToPoint(m: Matrix4, x: number, y: number, z: number): [number, number, number] {
  return [m[0] * x + m[1] * y + m[2] * z + m[3], m[4] * x + m[5] * y + m[6] * z + m[7], m[8] * x + m[9] * y + m[10] * z + m[11]];
}
