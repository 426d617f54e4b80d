import type { BoneShape } from './bone-shape';
import { Roughness, type RoughnessSpec } from './noise';
import type { Random } from './random';
import type { RingBreakGeometry } from './fracture-bodies';

/** Break age as the catalogue records it (design.md section 4); "fresh" is a green break. */
export type BreakAge = 'fresh' | 'dry' | 'modern';
export type BreakPattern = 'spiral' | 'oblique' | 'v-shaped' | 'transverse' | 'longitudinal';

export interface PlannedRingBreak {
  kind: 'ring';
  id: number;
  age: BreakAge;
  pattern: BreakPattern;
  geometry: RingBreakGeometry;
}

/** Splintering of a hollow shaft segment into sectors along its length. */
export interface PlannedSplintering {
  /** Number of sectors around the shaft. */
  sectors: number;
  /** How many sectors are cut free (sectors - 1 cuts it completely). */
  cuts: number;
  startAngle: number;
  widths: number[];
  twist: number;
  bevels: number[];
  roughness: Roughness[];
  age: BreakAge;
}

export interface BreakPlan {
  boneAge: 'fresh' | 'dry';
  rings: PlannedRingBreak[];
  /** Applied to each segment of shaft between ring breaks that is wholly hollow, when present. */
  splintering: (segmentIndex: number) => PlannedSplintering | undefined;
  modern?: PlannedRingBreak;
}

/** Roughness of fracture faces, multi-scale, 0.1-1 mm (issue text; the octaves are our choice). */
export const ROUGHNESS: Record<BreakAge, RoughnessSpec> = {
  fresh: { octaves: [{ wavelength: 9, amplitude: 0.55 }, { wavelength: 4, amplitude: 0.28 }, { wavelength: 2, amplitude: 0.14 }, { wavelength: 1, amplitude: 0.07 }] },
  dry: { ridged: true, throughWall: 0.25, octaves: [{ wavelength: 7, amplitude: 0.32 }, { wavelength: 3, amplitude: 0.22 }, { wavelength: 1.5, amplitude: 0.12 }, { wavelength: 0.8, amplitude: 0.06 }] },
  modern: { octaves: [{ wavelength: 5, amplitude: 0.15 }, { wavelength: 2, amplitude: 0.07 }, { wavelength: 1, amplitude: 0.04 }] },
};

/**
 * How a bone breaks. Fresh (green) bone: spiral, oblique and V-shaped fronts whose faces meet
 * the cortex at oblique angles, and long splinters; dry bone: transverse, jagged fronts at near
 * right angles. A modern break (clean, transverse, right-angled) is sometimes added on top.
 */
export function planBreaks(shape: BoneShape, random: Random): BreakPlan {
  const boneAge = random.chance(0.6) ? 'fresh' : 'dry';
  const L = shape.length;
  const diam = 2 * shape.shaftRadius(L / 2);
  const rings: PlannedRingBreak[] = [];
  const taken: Array<[number, number]> = [];
  const nRings = boneAge === 'fresh' ? random.weighted([[1, 1], [2, 3], [3, 4], [4, 3]] as const) : random.weighted([[1, 1], [2, 3], [3, 3], [4, 2]] as const);
  let id = 0;
  const hollowLo = shape.cavityStart + 6;
  const hollowHi = shape.cavityEnd - 6;
  for (let n = 0; n < nRings; n++) {
    for (let attempt = 0; attempt < 40; attempt++) {
      const z = random.uniform(L * 0.1, L * 0.9);
      const ring = ringBreak(shape, random, boneAge, id, z, diam, hollowLo, hollowHi);
      const lo = z + ring.geometry.outlineMin - 10;
      const hi = z + ring.geometry.outlineMax + 10;
      if (lo < 4 || hi > L - 4) continue;
      if (taken.some(([a, b]) => lo < b && hi > a)) continue;
      taken.push([lo, hi]);
      rings.push(ring);
      id++;
      break;
    }
  }
  rings.sort((a, b) => a.geometry.z - b.geometry.z);
  rings.forEach((r, i) => (r.id = i));
  id = rings.length;

  const splinterRandom = random.fork('splinters');
  const splinterings = new Map<number, PlannedSplintering | undefined>();
  const splintering = (segmentIndex: number): PlannedSplintering | undefined => {
    if (splinterings.has(segmentIndex)) return splinterings.get(segmentIndex);
    const r = splinterRandom.fork(segmentIndex);
    let plan: PlannedSplintering | undefined;
    if (r.chance(boneAge === 'fresh' ? 0.85 : 0.35)) {
      const sectors = r.int(2, boneAge === 'fresh' ? 5 : 3);
      const cuts = r.chance(0.7) ? sectors - 1 : 1;
      const raw = Array.from({ length: sectors }, () => r.uniform(0.6, 1.4));
      const sum = raw.reduce((a, b) => a + b, 0);
      const widths = raw.map((w) => (w / sum) * 2 * Math.PI);
      const fresh = boneAge === 'fresh';
      plan = {
        sectors,
        cuts,
        startAngle: r.uniform(0, 2 * Math.PI),
        widths,
        twist: fresh ? r.uniform(0.25, 0.9) * (r.chance(0.5) ? 1 : -1) : r.uniform(-0.08, 0.08),
        bevels: widths.map(() => (fresh ? r.uniform(0.5, 1.0) * (r.chance(0.5) ? 1 : -1) : r.uniform(-0.06, 0.06))),
        roughness: widths.map(() => new Roughness(r, ROUGHNESS[boneAge])),
        age: boneAge,
      };
    }
    splinterings.set(segmentIndex, plan);
    return plan;
  };

  let modern: PlannedRingBreak | undefined;
  if (random.chance(0.2)) {
    for (let attempt = 0; attempt < 20 && !modern; attempt++) {
      const z = random.uniform(L * 0.2, L * 0.8);
      const g = transverse(shape, random, z, 'modern');
      const lo = z + g.outlineMin - 10;
      const hi = z + g.outlineMax + 10;
      if (taken.some(([a, b]) => lo < b && hi > a)) continue;
      modern = { kind: 'ring', id: id++, age: 'modern', pattern: 'transverse', geometry: g };
    }
  }
  return { boneAge, rings, splintering, modern };
}

function ringBreak(
  shape: BoneShape,
  random: Random,
  age: 'fresh' | 'dry',
  id: number,
  z: number,
  diam: number,
  hollowLo: number,
  hollowHi: number,
): PlannedRingBreak {
  if (age === 'dry') return { kind: 'ring', id, age, pattern: 'transverse', geometry: transverse(shape, random, z, 'dry') };
  const pattern = random.weighted([['spiral', 4], ['v-shaped', 3], ['oblique', 3]] as const);
  const rMean = shape.shaftRadius(z) - shape.cortical(z) / 2;
  const roughness = new Roughness(random, ROUGHNESS.fresh);
  const bevel = random.uniform(0.45, 0.9) * (random.chance(0.5) ? 1 : -1);
  const twistBevel = random.uniform(0.3, 0.7) * (random.chance(0.5) ? 1 : -1);
  const phase = random.uniform(0, 2 * Math.PI);
  if (pattern === 'spiral') {
    const pitch = random.uniform(1.4, 2.6) * diam;
    const ramp = random.uniform(0.35, 0.6);
    const outline = smoothedOutline((th) => {
      const psi = wrap(th - phase);
      return psi < 2 * Math.PI - ramp ? pitch * (psi / (2 * Math.PI - ramp) - 0.5) : pitch * (0.5 - (psi - (2 * Math.PI - ramp)) / ramp);
    }, 0.12);
    const g = { z, outline, planar: false, bevel, twistBevel, rimBevel: Math.atan(bevel), roughness, outlineMin: -pitch / 2, outlineMax: pitch / 2 };
    if (z + g.outlineMin > hollowLo && z + g.outlineMax < hollowHi) return { kind: 'ring', id, age, pattern, geometry: g };
  } else if (pattern === 'v-shaped') {
    const depth = random.uniform(0.7, 1.6) * diam;
    const outline = smoothedOutline((th) => {
      const psi = wrap(th - phase);
      return depth * (Math.abs(psi - Math.PI) / Math.PI - 0.5);
    }, 0.25);
    const g = { z, outline, planar: false, bevel, twistBevel, rimBevel: Math.atan(bevel), roughness, outlineMin: -depth / 2, outlineMax: depth / 2 };
    if (z + g.outlineMin > hollowLo && z + g.outlineMax < hollowHi) return { kind: 'ring', id, age, pattern, geometry: g };
  }
  // oblique: a tilted, coned face that also works through the solid ends
  const tilt = (random.uniform(35, 60) * Math.PI) / 180;
  const a = rMean * Math.tan(tilt);
  const coneBevel = random.uniform(0.35, 0.7) * (random.chance(0.5) ? 1 : -1);
  const outline = (th: number) => a * Math.cos(th - phase);
  const rc = shape.maxOuterRadius(Math.max(0, z - a * 2), Math.min(shape.length, z + a * 2)) + 3;
  const reach = (a * rc) / rMean + Math.abs(coneBevel) * rc;
  return {
    kind: 'ring',
    id,
    age,
    pattern: 'oblique',
    geometry: { z, outline, planar: true, bevel: coneBevel, twistBevel: 0, rimBevel: Math.atan(coneBevel), roughness, outlineMin: -reach, outlineMax: reach },
  };
}

function transverse(shape: BoneShape, random: Random, z: number, age: 'dry' | 'modern'): RingBreakGeometry {
  const rMean = shape.shaftRadius(z) - shape.cortical(z) / 2;
  const tilt = (random.uniform(0, age === 'modern' ? 4 : 10) * Math.PI) / 180;
  const a = rMean * Math.tan(tilt);
  const phase = random.uniform(0, 2 * Math.PI);
  const roughness = new Roughness(random, ROUGHNESS[age]);
  // dry fronts are stepped: a few millimetre steps along the outline
  const steps = age === 'dry' ? Array.from({ length: 5 }, () => [random.uniform(0, 2 * Math.PI), random.uniform(-1.5, 1.5)] as const) : [];
  // the tilt is a plane through the axis (so it scales with radius); the steps run straight through the wall
  const outline = (th: number) => a * Math.cos(th - phase);
  const stepFront = steps.length
    ? smoothedOutline((th) => {
        let h = 0;
        for (const [at, size] of steps) h += wrap(th - at) < Math.PI ? size / 2 : -size / 2;
        return h;
      }, 0.06)
    : undefined;
  const bevel = age === 'modern' ? 0 : random.uniform(-0.05, 0.05);
  const rc = shape.maxOuterRadius(Math.max(0, z - 15), Math.min(shape.length, z + 15)) + 3;
  const reach = (a * rc) / rMean + 4 + Math.abs(bevel) * rc;
  // right-angled against the real bone surface, also where the shaft flares into its ends
  return { z, outline, planar: true, bevel, twistBevel: 0, rimBevel: Math.atan(bevel), roughness, outlineMin: -reach, outlineMax: reach, ...(stepFront ? { steps: stepFront } : {}) };
}

export function wrap(a: number): number {
  const t = a % (2 * Math.PI);
  return t < 0 ? t + 2 * Math.PI : t;
}

/** A periodic outline smoothed by a moving average over `width` radians, tabulated. */
function smoothedOutline(raw: (theta: number) => number, width: number): (theta: number) => number {
  const n = 2048;
  const table = new Float64Array(n);
  for (let i = 0; i < n; i++) table[i] = raw((2 * Math.PI * i) / n);
  const half = Math.max(1, Math.round((width / (2 * Math.PI)) * n / 2));
  const smooth = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let s = 0;
    for (let k = -half; k <= half; k++) s += table[(i + k + n) % n];
    smooth[i] = s / (2 * half + 1);
  }
  return (theta: number) => {
    const x = (wrap(theta) / (2 * Math.PI)) * n;
    const i = Math.floor(x);
    const f = x - i;
    return smooth[i % n] * (1 - f) + smooth[(i + 1) % n] * f;
  };
}
