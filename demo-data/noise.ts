import type { Random } from './random';

/**
 * Seeded 2D gradient noise (Perlin's improved noise, evaluated in 2D) and a multi-scale sum
 * of it, used to roughen fracture surfaces. Coordinates and wavelengths are in millimetres.
 */
export class GradientNoise2D {
  private readonly perm: Uint8Array;

  constructor(random: Random) {
    const p = random.permutation(256);
    this.perm = new Uint8Array(512);
    for (let i = 0; i < 512; i++) this.perm[i] = p[i & 255];
  }

  /** Noise in about [-1, 1], zero at integer lattice points. */
  at(x: number, y: number): number {
    const xi = Math.floor(x);
    const yi = Math.floor(y);
    const xf = x - xi;
    const yf = y - yi;
    const X = xi & 255;
    const Y = yi & 255;
    const p = this.perm;
    const aa = p[p[X] + Y];
    const ab = p[p[X] + Y + 1];
    const ba = p[p[X + 1] + Y];
    const bb = p[p[X + 1] + Y + 1];
    const u = fade(xf);
    const v = fade(yf);
    const x1 = lerp(grad(aa, xf, yf), grad(ba, xf - 1, yf), u);
    const x2 = lerp(grad(ab, xf, yf - 1), grad(bb, xf - 1, yf - 1), u);
    return lerp(x1, x2, v) * 1.4;
  }
}

export interface RoughnessSpec {
  /** Wavelengths in mm, coarse to fine, with amplitudes in mm (peak, roughly). */
  octaves: ReadonlyArray<{ wavelength: number; amplitude: number }>;
  /** Ridged octaves (1 - |n|) give jagged, stepped relief, as on a dry break. */
  ridged?: boolean;
  /**
   * How much slower the relief varies through the cortical wall than along the front (1: the
   * same; 0.25: four times slower). A dry break is jagged along its front but runs about
   * straight through the wall, so its face meets the bone surface near a right angle, the
   * mark Villa & Mahieu (1991) read a dry break by.
   */
  throughWall?: number;
}

/** A rough surface height field h(x, y) in mm: the sum of several noise octaves. */
export class Roughness {
  private readonly layers: GradientNoise2D[];
  private readonly offsets: number[];

  constructor(
    random: Random,
    readonly spec: RoughnessSpec,
  ) {
    this.layers = spec.octaves.map(() => new GradientNoise2D(random));
    this.offsets = spec.octaves.map(() => random.uniform(0, 200));
  }

  /** The radius at which to read the relief for a point at `radius` through a wall of mid-radius `rMean` (see throughWall). */
  acrossWall(radius: number, rMean: number): number {
    return rMean + (radius - rMean) * (this.spec.throughWall ?? 1);
  }

  at(x: number, y: number): number {
    let h = 0;
    const oct = this.spec.octaves;
    for (let i = 0; i < oct.length; i++) {
      const f = 1 / oct[i].wavelength;
      let n = this.layers[i].at(x * f + this.offsets[i], y * f - this.offsets[i]);
      if (this.spec.ridged) n = 1 - 2 * Math.abs(n);
      h += oct[i].amplitude * n;
    }
    return h;
  }
}

function fade(t: number): number {
  return t * t * t * (t * (t * 6 - 15) + 10);
}
function lerp(a: number, b: number, t: number): number {
  return a + t * (b - a);
}
function grad(hash: number, x: number, y: number): number {
  switch (hash & 7) {
    case 0: return x + y;
    case 1: return -x + y;
    case 2: return x - y;
    case 3: return -x - y;
    case 4: return x;
    case 5: return -x;
    case 6: return y;
    default: return -y;
  }
}
