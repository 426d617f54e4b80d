import type { BoneShape } from './bone-shape';
import { smoothstep } from './bone-shape';
import { orientOutwards, type TriangleMesh } from './mesh';
import type { Roughness } from './noise';
import { frameDirections, framePoint, outerNormal, outerRadiusOnRay, slopeForRimAngle } from './rim-angle';

/**
 * Cut bodies: closed meshes whose boundary, where it passes through bone, is a rough fracture
 * surface. Splitting a piece of bone with a cut body (inside and outside) gives the two sides of
 * one break, which are then the same surface seen from both sides.
 */

export type Vec3 = [number, number, number];

/** A local frame on the shaft: origin on the axis, t along the axis, u and v across it. */
export interface AxisFrame {
  origin: Vec3;
  t: Vec3;
  u: Vec3;
  v: Vec3;
}

export function axisFrame(origin: Vec3, t: Vec3): AxisFrame {
  // u: the bone frame's x direction made perpendicular to t.
  let u: Vec3 = [1 - t[0] * t[0], -t[0] * t[1], -t[0] * t[2]];
  const n = Math.hypot(u[0], u[1], u[2]);
  u = [u[0] / n, u[1] / n, u[2] / n];
  const v: Vec3 = [t[1] * u[2] - t[2] * u[1], t[2] * u[0] - t[0] * u[2], t[0] * u[1] - t[1] * u[0]];
  return { origin, t, u, v };
}

function place(f: AxisFrame, r: number, phi: number, h: number, out: Float32Array, o: number): void {
  const c = r * Math.cos(phi);
  const s = r * Math.sin(phi);
  out[o] = f.origin[0] + c * f.u[0] + s * f.v[0] + h * f.t[0];
  out[o + 1] = f.origin[1] + c * f.u[1] + s * f.v[1] + h * f.t[1];
  out[o + 2] = f.origin[2] + c * f.u[2] + s * f.v[2] + h * f.t[2];
}

/**
 * A break across the shaft. Its surface is a height field over the cross-section plane at
 * `z`: height(r, θ) along the local axis. The body is everything distal of the surface.
 */
export interface RingBreakGeometry {
  z: number;
  /** Height (mm) of the fracture front at angle θ on the mid-cortex radius. */
  outline: (theta: number) => number;
  /** Planar-like surface through the axis (usable in solid bone) or a free one (hollow shaft only). */
  planar: boolean;
  /** Axial bevel dH/dr: tilts the face against the cortical surface (0: right angle). */
  bevel: number;
  /** Angular bevel (radians across one mean radius): turns the front with depth, for oblique faces on steep parts (not used with rimBevel). */
  twistBevel: number;
  /**
   * Steps added to the front at angle θ, the same at every radius through the wall (a dry break
   * runs straight through the cortex, so its steps meet the bone surface at right angles), faded
   * out toward the axis so the surface stays one height per point of the cross-section.
   */
  steps?: (theta: number) => number;
  /**
   * When set (signed, radians), the face meets the real outer bone surface at 90 degrees minus
   * this angle all along its rim: the slope through the wall is worked out from the bone's
   * surface at each point of the front (rim-angle.ts) and replaces the bevels above. (A bevel
   * along the axis alone leaves the parts of a front that run along the shaft near a right
   * angle, and a lobed section tilts the surface the face meets.)
   */
  rimBevel?: number;
  roughness: Roughness;
  /** Range of outline(θ) values, for clearances. */
  outlineMin: number;
  outlineMax: number;
}

export function ringBreakBody(shape: BoneShape, g: RingBreakGeometry, resolution: number): TriangleMesh {
  const c = shape.center(g.z);
  const frame = axisFrame([c[0], c[1], g.z], shape.tangent(g.z));
  const zlo = g.z + g.outlineMin - 8;
  const zhi = g.z + g.outlineMax + 8;
  const rMean = shape.shaftRadius(g.z) - shape.cortical(g.z) / 2;
  const rClamp = shape.maxOuterRadius(Math.max(0, zlo), Math.min(shape.length, zhi)) + 3;
  const rBig = shape.maxOuterRadius(0, shape.length) + 40;
  const hTop = shape.length + 250;
  const hollow = !g.planar;
  const rInner = hollow ? shape.minInnerRadius(Math.max(shape.cavityStart, zlo), Math.min(shape.cavityEnd, zhi)) : 0;
  const rBlend = hollow ? rInner * 0.75 : 0;
  const outlineMean = hollow ? (g.outlineMin + g.outlineMax) / 2 : 0;
  const rSteps = Math.max(1, 0.8 * (shape.shaftRadius(g.z) - shape.cortical(g.z)));
  const rim = g.rimBevel !== undefined ? rimSlopes(shape, g, frame, rMean, rClamp) : undefined;
  // near the axis (solid bone) the slope's change around the front fades to its mean, so the
  // surface stays one height at the centre
  const rFade = 0.5 * rMean;

  const height = (r: number, theta: number): number => {
    const rc = Math.min(r, rClamp);
    let h: number;
    if (rim) {
      const w = smoothstep(Math.min(1, r / rFade));
      const k = rim.mean + (rim.at(theta) - rim.mean) * w;
      h = (g.planar ? (g.outline(theta) * rc) / rMean : g.outline(theta)) + k * (rc - rMean);
    } else {
      const th = theta + (g.twistBevel * (rc - rMean)) / rMean;
      if (g.planar) h = (g.outline(th) * rc) / rMean + g.bevel * (rc - rMean);
      else h = g.outline(th) + g.bevel * (rc - rMean);
    }
    const th = rim ? theta : theta + (g.twistBevel * (rc - rMean)) / rMean;
    if (g.steps) h += g.steps(th) * smoothstep(Math.min(1, rc / rSteps));
    const rr = g.roughness.acrossWall(rc, rMean);
    h += g.roughness.at(rr * Math.cos(theta), rr * Math.sin(theta));
    if (hollow && r < rBlend) {
      const w = smoothstep(r / rBlend);
      h = outlineMean * (1 - w) + h * w;
    }
    return h;
  };

  // Angles: spaced by arc length of the front on the mid-cortex, so steep parts get more samples.
  const fine = 4096;
  const arc = new Float64Array(fine + 1);
  const front = (th: number): number => g.outline(th) + (g.steps ? g.steps(th) : 0);
  let prev = front(0);
  for (let i = 1; i <= fine; i++) {
    const th = (2 * Math.PI * i) / fine;
    const h = front(th);
    arc[i] = arc[i - 1] + Math.hypot((rClamp * 2 * Math.PI) / fine, h - prev);
    prev = h;
  }
  const nTheta = Math.max(32, Math.ceil(arc[fine] / resolution));
  const thetas = new Float64Array(nTheta);
  for (let j = 0, i = 0; j < nTheta; j++) {
    const target = (arc[fine] * j) / nTheta;
    while (arc[i + 1] < target) i++;
    const f = (target - arc[i]) / (arc[i + 1] - arc[i] || 1);
    thetas[j] = (2 * Math.PI * (i + f)) / fine;
  }

  const radii: number[] = [];
  const rDense0 = hollow ? rBlend : resolution;
  if (hollow) radii.push(rBlend * 0.5);
  const nDense = Math.ceil((rClamp + 2 - rDense0) / resolution);
  for (let i = 0; i <= nDense; i++) radii.push(rDense0 + ((rClamp + 2 - rDense0) * i) / nDense);
  radii.push(rClamp + 8, rBig);
  const nR = radii.length;

  // vertices: centre, nR rings of nTheta (bottom), a top ring of nTheta, a top centre
  const nv = 1 + nR * nTheta + nTheta + 1;
  const positions = new Float32Array(nv * 3);
  place(frame, 0, 0, height(0, 0), positions, 0);
  for (let k = 0; k < nR; k++) {
    for (let j = 0; j < nTheta; j++) {
      place(frame, radii[k], thetas[j], height(radii[k], thetas[j]), positions, (1 + k * nTheta + j) * 3);
    }
  }
  const top0 = 1 + nR * nTheta;
  for (let j = 0; j < nTheta; j++) place(frame, rBig, thetas[j], hTop, positions, (top0 + j) * 3);
  const topC = top0 + nTheta;
  place(frame, 0, 0, hTop, positions, topC * 3);

  const tris: number[] = [];
  const ring = (k: number, j: number) => 1 + k * nTheta + (j % nTheta);
  for (let j = 0; j < nTheta; j++) tris.push(0, ring(0, j + 1), ring(0, j));
  for (let k = 0; k < nR - 1; k++) {
    for (let j = 0; j < nTheta; j++) {
      const a = ring(k, j), b = ring(k, j + 1), cc = ring(k + 1, j + 1), d = ring(k + 1, j);
      tris.push(a, b, cc, a, cc, d);
    }
  }
  for (let j = 0; j < nTheta; j++) {
    const a = ring(nR - 1, j), b = ring(nR - 1, j + 1);
    const ta = top0 + j, tb = top0 + ((j + 1) % nTheta);
    tris.push(a, b, tb, a, tb, ta);
    tris.push(topC, ta, tb);
  }
  return orientOutwards({ positions, triangles: Uint32Array.from(tris) });
}

/**
 * The slope through the wall (dH/dr, beyond the planar tilt's own outline/rMean) that makes a
 * ring break's face meet the outer bone surface at 90 - |rimBevel| along its rim, tabulated
 * over the angle; found twice, the second time at the rim the first slopes give.
 */
function rimSlopes(shape: BoneShape, g: RingBreakGeometry, frame: AxisFrame, rMean: number, rMax: number): { at: (theta: number) => number; mean: number } {
  const n = 720;
  const k = new Float64Array(n);
  const rimAt = (theta: number, slope: number) => {
    let h = g.outline(theta);
    let r = outerRadiusOnRay(shape, frame, theta, h, rMax + 10);
    for (let it = 0; it < 2; it++) {
      h = (g.planar ? (g.outline(theta) * r) / rMean : g.outline(theta)) + slope * (r - rMean);
      r = outerRadiusOnRay(shape, frame, theta, h, rMax + 10);
    }
    return framePoint(frame, r, theta, h);
  };
  const interp = (theta: number) => {
    const x = (wrapAngle(theta) / (2 * Math.PI)) * n;
    const i = Math.floor(x) % n;
    const f = x - Math.floor(x);
    return k[i] * (1 - f) + k[(i + 1) % n] * f;
  };
  for (let pass = 0; pass < 2; pass++) {
    const next = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const theta = (2 * Math.PI * i) / n;
      const d = (2 * Math.PI) / n / 2;
      const total = (th: number) => (pass === 0 ? g.bevel : interp(th));
      const p = rimAt(theta, total(theta));
      const a = rimAt(theta - d, total(theta - d));
      const b = rimAt(theta + d, total(theta + d));
      const { eR } = frameDirections(frame, theta);
      const slope = slopeForRimAngle(outerNormal(shape, p), [b[0] - a[0], b[1] - a[1], b[2] - a[2]], g.rimBevel!, eR, frame.t, 2);
      next[i] = slope - (g.planar ? g.outline(theta) / rMean : 0);
    }
    k.set(next);
  }
  let mean = 0;
  for (let i = 0; i < n; i++) mean += k[i] / n;
  return { at: interp, mean };
}

function wrapAngle(a: number): number {
  const t = a % (2 * Math.PI);
  return t < 0 ? t + 2 * Math.PI : t;
}

/**
 * A wedge along a stretch of shaft, between two surfaces given as angle(r, ζ) about the
 * segment's chord: cuts a splinter out of a hollow shaft segment. r runs from inside the
 * medullary cavity to well outside the bone, ζ past both ends of the segment.
 */
export interface WedgeGeometry {
  frame: AxisFrame;
  zetaLo: number;
  zetaHi: number;
  rInside: number;
  rBand: readonly [number, number];
  rOutside: number;
  lower: (r: number, zeta: number) => number;
  upper: (r: number, zeta: number) => number;
  /**
   * Which side is the break face (the other one stands in already freed space): where the two
   * would cross, the other side is kept just beyond the face, so the wedge never turns inside out.
   */
  face: 'lower' | 'upper';
  /** Roughens the two ends of the wedge, where they cross bone. */
  capRoughness?: { at(x: number, y: number): number };
  /** Shift along ζ of the low (0) and high (1) ends at radius r and angle φ: their slope through the wall where they cross bone. */
  capSlope?: (end: 0 | 1, r: number, phi: number) => number;
}

/** Smallest angle (radians) between a wedge's two sides. */
const MIN_WEDGE_ANGLE = 0.02;

export function wedgeBody(g: WedgeGeometry, resolution: number): TriangleMesh {
  const width = Math.abs(g.upper(g.rBand[1], 0) - g.lower(g.rBand[1], 0));
  const nA = Math.max(6, Math.ceil((width * g.rBand[1]) / resolution));
  const radii: number[] = [g.rInside];
  const nBand = Math.ceil((g.rBand[1] - g.rBand[0]) / resolution);
  for (let i = 0; i <= nBand; i++) radii.push(g.rBand[0] + ((g.rBand[1] - g.rBand[0]) * i) / nBand);
  radii.push(g.rOutside);
  const nZ = Math.ceil((g.zetaHi - g.zetaLo) / resolution);
  const K = radii.length - 1;
  // The inner and outer walls (k = 0 and k = K) lie in the cavity and outside the bone: they
  // take every eighth angle column only, joined to the full columns of the ends by fans.
  const nC = nZ >= 2 ? Math.min(nA, Math.max(6, Math.ceil(nA / 8))) : nA;
  const columns = Array.from({ length: nC + 1 }, (_, c) => Math.round((c * nA) / nC));
  const index = new Int32Array((nA + 1) * (K + 1) * (nZ + 1)).fill(-1);
  const pos: number[] = [];
  const tmp = new Float32Array(3);
  const vid = (i: number, k: number, l: number): number => {
    const key = (i * (K + 1) + k) * (nZ + 1) + l;
    let id = index[key];
    if (id < 0) {
      const r = radii[k];
      let zeta = g.zetaLo + ((g.zetaHi - g.zetaLo) * l) / nZ;
      let lo = g.lower(r, zeta);
      let hi = g.upper(r, zeta);
      if (g.face === 'upper') lo = Math.min(lo, hi - MIN_WEDGE_ANGLE);
      else hi = Math.max(hi, lo + MIN_WEDGE_ANGLE);
      const phi = lo + ((hi - lo) * i) / nA;
      if (g.capRoughness && (l === 0 || l === nZ)) zeta += g.capRoughness.at(r * Math.cos(phi) + l, r * Math.sin(phi));
      if (g.capSlope && (l === 0 || l === nZ)) zeta += g.capSlope(l === 0 ? 0 : 1, r, phi);
      place(g.frame, r, phi, zeta, tmp, 0);
      id = pos.length / 3;
      pos.push(tmp[0], tmp[1], tmp[2]);
      index[key] = id;
    }
    return id;
  };
  const tris: number[] = [];
  const quad = (p0: number, p1: number, p2: number, p3: number) => tris.push(p0, p1, p2, p0, p2, p3);
  // param box (x = i along the angle, y = k along r, z = l along ζ), outward winding per face
  for (let k = 0; k < K; k++) {
    for (let l = 0; l < nZ; l++) {
      quad(vid(0, k, l), vid(0, k, l + 1), vid(0, k + 1, l + 1), vid(0, k + 1, l));
      quad(vid(nA, k, l), vid(nA, k + 1, l), vid(nA, k + 1, l + 1), vid(nA, k, l + 1));
    }
  }
  for (let i = 0; i < nA; i++) {
    for (let k = 0; k < K; k++) {
      quad(vid(i, k, 0), vid(i, k + 1, 0), vid(i + 1, k + 1, 0), vid(i + 1, k, 0));
      quad(vid(i, k, nZ), vid(i + 1, k, nZ), vid(i + 1, k + 1, nZ), vid(i, k + 1, nZ));
    }
  }
  for (const [k, flip] of [[0, false], [K, true]] as const) {
    const tri = (a: number, b: number, c: number) => (flip ? tris.push(a, c, b) : tris.push(a, b, c));
    const v = (i: number, l: number) => vid(i, k, l);
    if (nC === nA) {
      for (let i = 0; i < nA; i++) for (let l = 0; l < nZ; l++) {
        tri(v(i, l), v(i + 1, l), v(i + 1, l + 1));
        tri(v(i, l), v(i + 1, l + 1), v(i, l + 1));
      }
      continue;
    }
    for (let c = 0; c < nC; c++) {
      const i0 = columns[c], i1 = columns[c + 1];
      // fine row l = 0 up to the coarse row l = 1: a fan from (i0, 1)
      for (let j = i0; j < i1; j++) tri(v(j, 0), v(j + 1, 0), v(i0, 1));
      tri(v(i1, 0), v(i1, 1), v(i0, 1));
      for (let l = 1; l < nZ - 1; l++) {
        tri(v(i0, l), v(i1, l), v(i1, l + 1));
        tri(v(i0, l), v(i1, l + 1), v(i0, l + 1));
      }
      // coarse row nZ - 1 up to the fine row nZ: a fan from (i0, nZ - 1)
      tri(v(i0, nZ - 1), v(i1, nZ - 1), v(i1, nZ));
      for (let j = i1; j > i0; j--) tri(v(i0, nZ - 1), v(j, nZ), v(j - 1, nZ));
    }
  }
  return orientOutwards({ positions: Float32Array.from(pos), triangles: Uint32Array.from(tris) });
}
