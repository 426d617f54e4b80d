/**
 * Rigid motions as 4x4 row-major matrices in millimetres (design.md section 7): the matrix
 * maps points of B's scan file into A's scan file frame, p_A = R p_B + t, stored as
 * [r00 r01 r02 tx, r10 r11 r12 ty, r20 r21 r22 tz, 0 0 0 1].
 */
export type RigidTransform = number[];

export function identityTransform(): RigidTransform {
  return [1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1];
}

/** From a row-major 3x3 rotation and a translation. */
export function transformFrom(rotation: ArrayLike<number>, translation: ArrayLike<number>): RigidTransform {
  const r = rotation;
  return [r[0], r[1], r[2], translation[0], r[3], r[4], r[5], translation[1], r[6], r[7], r[8], translation[2], 0, 0, 0, 1];
}

export function rotationOf(m: RigidTransform): number[] {
  return [m[0], m[1], m[2], m[4], m[5], m[6], m[8], m[9], m[10]];
}

export function translationOf(m: RigidTransform): [number, number, number] {
  return [m[3], m[7], m[11]];
}

/** a after b: (compose(a, b))(p) = a(b(p)). */
export function compose(a: RigidTransform, b: RigidTransform): RigidTransform {
  const out = new Array<number>(16).fill(0);
  for (let i = 0; i < 4; i++) {
    for (let j = 0; j < 4; j++) {
      let s = 0;
      for (let k = 0; k < 4; k++) s += a[i * 4 + k] * b[k * 4 + j];
      out[i * 4 + j] = s;
    }
  }
  return out;
}

/** The inverse of a rigid motion: R^T, -R^T t. */
export function invert(m: RigidTransform): RigidTransform {
  const [tx, ty, tz] = translationOf(m);
  return [
    m[0], m[4], m[8], -(m[0] * tx + m[4] * ty + m[8] * tz),
    m[1], m[5], m[9], -(m[1] * tx + m[5] * ty + m[9] * tz),
    m[2], m[6], m[10], -(m[2] * tx + m[6] * ty + m[10] * tz),
    0, 0, 0, 1,
  ];
}

export function applyToPoint(m: RigidTransform, x: number, y: number, z: number): [number, number, number] {
  return [
    m[0] * x + m[1] * y + m[2] * z + m[3],
    m[4] * x + m[5] * y + m[6] * z + m[7],
    m[8] * x + m[9] * y + m[10] * z + m[11],
  ];
}

/** Transform packed xyz points into a new array. */
export function applyToPoints(m: RigidTransform, points: ArrayLike<number>, out?: Float32Array | Float64Array): Float32Array | Float64Array {
  const n = points.length;
  const res = out ?? new Float32Array(n);
  for (let i = 0; i < n; i += 3) {
    const x = points[i], y = points[i + 1], z = points[i + 2];
    res[i] = m[0] * x + m[1] * y + m[2] * z + m[3];
    res[i + 1] = m[4] * x + m[5] * y + m[6] * z + m[7];
    res[i + 2] = m[8] * x + m[9] * y + m[10] * z + m[11];
  }
  return res;
}

/** Rotate packed xyz directions (normals) into a new array. */
export function applyToDirections(m: RigidTransform, dirs: ArrayLike<number>, out?: Float32Array): Float32Array {
  const n = dirs.length;
  const res = out ?? new Float32Array(n);
  for (let i = 0; i < n; i += 3) {
    const x = dirs[i], y = dirs[i + 1], z = dirs[i + 2];
    res[i] = m[0] * x + m[1] * y + m[2] * z;
    res[i + 1] = m[4] * x + m[5] * y + m[6] * z;
    res[i + 2] = m[8] * x + m[9] * y + m[10] * z;
  }
  return res;
}

/** Rotation matrix (row-major 3x3) about a unit axis by an angle in radians (Rodrigues' formula). */
export function rotationAboutAxis(axis: ArrayLike<number>, angle: number): number[] {
  const len = Math.hypot(axis[0], axis[1], axis[2]) || 1;
  const x = axis[0] / len, y = axis[1] / len, z = axis[2] / len;
  const c = Math.cos(angle), s = Math.sin(angle), C = 1 - c;
  return [
    c + x * x * C, x * y * C - z * s, x * z * C + y * s,
    y * x * C + z * s, c + y * y * C, y * z * C - x * s,
    z * x * C - y * s, z * y * C + x * s, c + z * z * C,
  ];
}

/** Rotation matrix of a unit quaternion (w, x, y, z). */
export function rotationFromQuaternion(w: number, x: number, y: number, z: number): number[] {
  const n = Math.hypot(w, x, y, z) || 1;
  w /= n; x /= n; y /= n; z /= n;
  return [
    w * w + x * x - y * y - z * z, 2 * (x * y - w * z), 2 * (x * z + w * y),
    2 * (y * x + w * z), w * w - x * x + y * y - z * z, 2 * (y * z - w * x),
    2 * (z * x - w * y), 2 * (z * y + w * x), w * w - x * x - y * y + z * z,
  ];
}

/** Geodesic angle (degrees) of the rotation that takes a's rotation to b's. */
export function rotationErrorDegrees(a: RigidTransform, b: RigidTransform): number {
  const ra = rotationOf(a), rb = rotationOf(b);
  // trace(Ra^T Rb)
  let tr = 0;
  for (let i = 0; i < 3; i++) for (let k = 0; k < 3; k++) tr += ra[k * 3 + i] * rb[k * 3 + i];
  const c = Math.min(1, Math.max(-1, (tr - 1) / 2));
  return (Math.acos(c) * 180) / Math.PI;
}

/** Distance (mm) between where a and b put the point p (e.g. a fragment's centroid). */
export function displacementAt(a: RigidTransform, b: RigidTransform, p: ArrayLike<number>): number {
  const pa = applyToPoint(a, p[0], p[1], p[2]);
  const pb = applyToPoint(b, p[0], p[1], p[2]);
  return Math.hypot(pa[0] - pb[0], pa[1] - pb[1], pa[2] - pb[2]);
}

/** True when m is a proper rigid motion (orthonormal rotation with determinant +1, last row 0 0 0 1). */
export function isRigid(m: ArrayLike<number>, tol = 1e-4): boolean {
  if (m.length !== 16) return false;
  for (let i = 0; i < 16; i++) if (!Number.isFinite(m[i])) return false;
  if (Math.abs(m[12]) > tol || Math.abs(m[13]) > tol || Math.abs(m[14]) > tol || Math.abs(m[15] - 1) > tol) return false;
  for (let i = 0; i < 3; i++) {
    for (let j = 0; j < 3; j++) {
      let s = 0;
      for (let k = 0; k < 3; k++) s += m[i * 4 + k] * m[j * 4 + k];
      if (Math.abs(s - (i === j ? 1 : 0)) > tol) return false;
    }
  }
  const det =
    m[0] * (m[5] * m[10] - m[6] * m[9]) - m[1] * (m[4] * m[10] - m[6] * m[8]) + m[2] * (m[4] * m[9] - m[5] * m[8]);
  return Math.abs(det - 1) < tol;
}

/** Small-angle update: rotation by vector omega (radians, axis * angle) then translation. */
export function transformFromTwist(omega: ArrayLike<number>, t: ArrayLike<number>): RigidTransform {
  const angle = Math.hypot(omega[0], omega[1], omega[2]);
  const r = angle < 1e-15 ? [1, 0, 0, 0, 1, 0, 0, 0, 1] : rotationAboutAxis(omega, angle);
  return transformFrom(r, t);
}

/** Unit quaternion (w, x, y, z) of a rigid motion's rotation (Shepperd's method), w >= 0. */
export function quaternionOf(m: RigidTransform): [number, number, number, number] {
  const r00 = m[0], r01 = m[1], r02 = m[2], r10 = m[4], r11 = m[5], r12 = m[6], r20 = m[8], r21 = m[9], r22 = m[10];
  const tr = r00 + r11 + r22;
  let w: number, x: number, y: number, z: number;
  if (tr > 0) {
    const s = Math.sqrt(tr + 1) * 2;
    w = s / 4; x = (r21 - r12) / s; y = (r02 - r20) / s; z = (r10 - r01) / s;
  } else if (r00 > r11 && r00 > r22) {
    const s = Math.sqrt(1 + r00 - r11 - r22) * 2;
    w = (r21 - r12) / s; x = s / 4; y = (r01 + r10) / s; z = (r02 + r20) / s;
  } else if (r11 > r22) {
    const s = Math.sqrt(1 + r11 - r00 - r22) * 2;
    w = (r02 - r20) / s; x = (r01 + r10) / s; y = s / 4; z = (r12 + r21) / s;
  } else {
    const s = Math.sqrt(1 + r22 - r00 - r11) * 2;
    w = (r10 - r01) / s; x = (r02 + r20) / s; y = (r12 + r21) / s; z = s / 4;
  }
  const n = Math.hypot(w, x, y, z);
  const sign = w < 0 ? -1 : 1;
  return [(sign * w) / n, (sign * x) / n, (sign * y) / n, (sign * z) / n];
}
