import type { BoneShape } from './bone-shape';
import type { AxisFrame, Vec3 } from './fracture-bodies';

/**
 * Where a fracture surface meets the bone's outer surface (its rim), the angle between the two
 * is what Villa & Mahieu (1991) score as right or oblique. A cut surface is built as a height
 * over a frame (an angle about an axis, or a height along it) that changes linearly through the
 * wall; these helpers find the rate of change through the wall that makes the surface meet the
 * real outer surface (lobed cross-section, bowed and tapering shaft) at a chosen angle, instead
 * of meeting a circular cylinder about the frame's axis at that angle.
 */

/** Point of the frame at radius r, angle phi, height h along its axis. */
export function framePoint(f: AxisFrame, r: number, phi: number, h: number): Vec3 {
  const c = r * Math.cos(phi);
  const s = r * Math.sin(phi);
  return [
    f.origin[0] + c * f.u[0] + s * f.v[0] + h * f.t[0],
    f.origin[1] + c * f.u[1] + s * f.v[1] + h * f.t[1],
    f.origin[2] + c * f.u[2] + s * f.v[2] + h * f.t[2],
  ];
}

/** Signed distance-like value of the outer surface (bone frame): negative inside the bone. */
function outerLevel(shape: BoneShape, p: Vec3): number {
  const [cx, cy] = shape.center(p[2]);
  const dx = p[0] - cx;
  const dy = p[1] - cy;
  return Math.hypot(dx, dy) - shape.outerRadius(p[2], Math.atan2(dy, dx));
}

/** Outward unit normal of the outer bone surface at (near) p, by central differences. */
export function outerNormal(shape: BoneShape, p: Vec3): Vec3 {
  const h = 0.05;
  const g: Vec3 = [0, 0, 0];
  for (let d = 0; d < 3; d++) {
    const a: Vec3 = [p[0], p[1], p[2]];
    const b: Vec3 = [p[0], p[1], p[2]];
    a[d] += h;
    b[d] -= h;
    g[d] = (outerLevel(shape, a) - outerLevel(shape, b)) / (2 * h);
  }
  const n = Math.hypot(g[0], g[1], g[2]);
  return [g[0] / n, g[1] / n, g[2] / n];
}

/** Radius (along the frame's ray at angle phi and height h) where the ray leaves the outer bone surface. */
export function outerRadiusOnRay(shape: BoneShape, f: AxisFrame, phi: number, h: number, rMax: number): number {
  let lo = 0.2;
  let hi = rMax;
  for (let i = 0; i < 40; i++) {
    const mid = (lo + hi) / 2;
    if (outerLevel(shape, framePoint(f, mid, phi, h)) < 0) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

const cross = (a: Vec3, b: Vec3): Vec3 => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
const dot = (a: Vec3, b: Vec3): number => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
const unit = (a: Vec3): Vec3 => {
  const n = Math.hypot(a[0], a[1], a[2]) || 1;
  return [a[0] / n, a[1] / n, a[2] / n];
};

/**
 * The rate through the wall that makes a surface meet the outer surface at 90 - bevel degrees.
 * At a rim point with outward normal `n` and rim direction `along`, the wanted surface holds the
 * rim direction and the inward direction d = -n cos(bevel) + m sin(bevel), m = n x along (in the
 * outer surface, across the rim). A surface parametrised as p(r, s) with dp/dr = eR + k eAcross
 * (eR: the frame's radial direction; eAcross: the direction the parameter moves the surface) holds
 * d when dp/dr is perpendicular to the plane's normal N = along x d: k = -(eR . N) / (eAcross . N).
 * Returns k clamped to +-limit (a surface nearly along eAcross cannot be tilted that way).
 */
export function slopeForRimAngle(n: Vec3, along: Vec3, bevelRad: number, eR: Vec3, eAcross: Vec3, limit = 3): number {
  const a = unit([along[0] - dot(along, n) * n[0], along[1] - dot(along, n) * n[1], along[2] - dot(along, n) * n[2]]);
  const m = unit(cross(n, a));
  const c = Math.cos(bevelRad);
  const s = Math.sin(bevelRad);
  const d: Vec3 = [-n[0] * c + m[0] * s, -n[1] * c + m[1] * s, -n[2] * c + m[2] * s];
  const N = cross(a, d);
  const den = dot(eAcross, N);
  if (Math.abs(den) < 1e-9) return 0;
  const k = -dot(eR, N) / den;
  return Math.max(-limit, Math.min(limit, k));
}

/** The frame's radial and angular unit directions at angle phi. */
export function frameDirections(f: AxisFrame, phi: number): { eR: Vec3; ePhi: Vec3 } {
  const c = Math.cos(phi);
  const s = Math.sin(phi);
  return {
    eR: [c * f.u[0] + s * f.v[0], c * f.u[1] + s * f.v[1], c * f.u[2] + s * f.v[2]],
    ePhi: [-s * f.u[0] + c * f.v[0], -s * f.u[1] + c * f.v[1], -s * f.u[2] + c * f.v[2]],
  };
}
