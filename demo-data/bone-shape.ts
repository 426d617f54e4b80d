import type { ElementSpec } from './skeleton';

/**
 * A long bone as functions of the bone frame: the shaft axis runs along +z from the proximal
 * tip (z = 0) to the distal tip (z = length), with a gentle bow in x and y. Radii are measured
 * in planes z = const from the axis point centre(z), at angle θ.
 */
export class BoneShape {
  readonly length: number;
  /** The medullary cavity runs from cavityStart to cavityEnd (its straight part). */
  readonly cavityStart: number;
  readonly cavityEnd: number;
  /** Length of the rounded closing caps of the cavity. */
  readonly cavityCap: number;
  /** The part of the shaft between the swollen ends. */
  readonly diaphysisStart: number;
  readonly diaphysisEnd: number;

  /** A left bone is the mirror image (x -> -x) of the right one described by the spec. */
  constructor(
    readonly spec: ElementSpec,
    readonly side: 'left' | 'right' = 'right',
  ) {
    this.length = spec.length;
    this.diaphysisStart = spec.proximal.length;
    this.diaphysisEnd = spec.length - spec.distal.length;
    this.cavityStart = spec.proximal.length * 0.85;
    this.cavityEnd = spec.length - spec.distal.length * 0.85;
    this.cavityCap = Math.min(spec.proximal.length, spec.distal.length) * 0.45;
  }

  /** Mean outer radius of the shaft (mm), without the swollen ends. */
  shaftRadius(z: number): number {
    return quadratic(this.spec.shaft, z / this.length);
  }

  cortical(z: number): number {
    return quadratic(this.spec.cortical, z / this.length);
  }

  /**
   * Cross-section multiplier of the shaft at angle θ: an ellipse of semi-axes 1 + oval and
   * 1 - oval (a flattened shaft stays convex; the polar form 1 + oval cos 2θ pinches into a
   * waist once oval > 0.2), plus the triangular term and the slow wobble along the shaft.
   */
  section(theta: number, z: number): number {
    const s = this.spec;
    return ellipseRadius(1 + s.oval, 1 - s.oval, theta) + this.sectionDetail(theta, z);
  }

  /** The cos(3θ) and wobble terms of the section (a multiplier of the mean radius). */
  private sectionDetail(theta: number, z: number): number {
    const s = this.spec;
    const t = z / this.length;
    return s.tri * Math.cos(3 * theta + 0.6) + (s.wobble ?? 0.03) * Math.sin(2 * theta + 5 * t);
  }

  /** Weights (0..1) of the proximal and distal swellings at z. */
  endWeights(z: number): [number, number] {
    const p = this.spec.proximal;
    const d = this.spec.distal;
    const wp = smoothstep(clamp01((p.length - z) / p.length));
    const wd = smoothstep(clamp01((z - (this.length - d.length)) / d.length));
    return [Math.sqrt(wp), Math.sqrt(wd)];
  }

  center(z: number): [number, number] {
    const c = this.centerRight(z);
    return this.side === 'left' ? [-c[0], c[1]] : c;
  }

  private centerRight(z: number): [number, number] {
    const s = this.spec;
    const b = Math.sin((Math.PI * clamp(z, 0, this.length)) / this.length) * s.bow;
    const [wp, wd] = this.endWeights(z);
    return [b + wp * s.proximal.offset[0] + wd * s.distal.offset[0], 0.35 * b + wp * s.proximal.offset[1] + wd * s.distal.offset[1]];
  }

  /** Outer radius at z in [0, length] and angle θ. */
  outerRadius(z: number, angle: number): number {
    const theta = this.side === 'left' ? Math.PI - angle : angle;
    const s = this.spec;
    const zc = clamp(z, 0, this.length);
    const shaft = this.shaftRadius(zc) * this.section(theta, zc);
    const [wp, wd] = this.endWeights(zc);
    const lobes = (e: typeof s.proximal) =>
      e.radius * (1 + e.lobe2 * Math.cos(2 * (theta - e.phase)) + e.lobe4 * Math.cos(4 * (theta - e.phase)));
    return shaft * (1 - wp - wd) + lobes(s.proximal) * wp + lobes(s.distal) * wd;
  }

  /** Radius of the medullary cavity (straight part) at z and θ. */
  innerRadius(z: number, angle: number): number {
    const theta = this.side === 'left' ? Math.PI - angle : angle;
    const zc = clamp(z, this.cavityStart, this.cavityEnd);
    // The cavity's ellipse has the outer semi-axes less the wall, so the wall keeps its
    // thickness around a flattened shaft instead of thinning the cavity into a waist.
    const a = this.shaftRadius(zc), c = this.cortical(zc), e = this.spec.oval;
    const cavity = ellipseRadius(a * (1 + e) - c, a * (1 - e) - c, theta) * (1 + this.sectionDetail(theta, zc));
    return Math.max(0.8, cavity);
  }

  /** The largest outer radius between z0 and z1 (sampled). */
  maxOuterRadius(z0: number, z1: number): number {
    let m = 0;
    for (let i = 0; i <= 24; i++) {
      const z = z0 + ((z1 - z0) * i) / 24;
      for (let j = 0; j < 24; j++) m = Math.max(m, this.outerRadius(z, (j / 24) * 2 * Math.PI));
    }
    return m;
  }

  minInnerRadius(z0: number, z1: number): number {
    let m = Infinity;
    for (let i = 0; i <= 24; i++) {
      const z = z0 + ((z1 - z0) * i) / 24;
      for (let j = 0; j < 24; j++) m = Math.min(m, this.innerRadius(z, (j / 24) * 2 * Math.PI));
    }
    return m;
  }

  /** Unit tangent of the axis at z. */
  tangent(z: number): [number, number, number] {
    const h = 0.5;
    const a = this.center(z - h);
    const b = this.center(z + h);
    const t: [number, number, number] = [(b[0] - a[0]) / (2 * h), (b[1] - a[1]) / (2 * h), 1];
    const n = Math.hypot(t[0], t[1], t[2]);
    return [t[0] / n, t[1] / n, t[2] / n];
  }
}

/** Quadratic through values at t = 0.2, 0.5, 0.8, held flat outside [0.1, 0.9]. */
function quadratic(v: readonly [number, number, number], t: number): number {
  const x = clamp(t, 0.1, 0.9);
  const [a, b, c] = v;
  const l0 = ((x - 0.5) * (x - 0.8)) / ((0.2 - 0.5) * (0.2 - 0.8));
  const l1 = ((x - 0.2) * (x - 0.8)) / ((0.5 - 0.2) * (0.5 - 0.8));
  const l2 = ((x - 0.2) * (x - 0.5)) / ((0.8 - 0.2) * (0.8 - 0.5));
  return a * l0 + b * l1 + c * l2;
}

export function clamp(x: number, lo: number, hi: number): number {
  return x < lo ? lo : x > hi ? hi : x;
}
export function clamp01(x: number): number {
  return clamp(x, 0, 1);
}
export function smoothstep(x: number): number {
  return x * x * (3 - 2 * x);
}

/** Distance from the centre to an ellipse of semi-axes a (along θ = 0) and b, at polar angle θ. */
function ellipseRadius(a: number, b: number, theta: number): number {
  return (a * b) / Math.hypot(b * Math.cos(theta), a * Math.sin(theta));
}
