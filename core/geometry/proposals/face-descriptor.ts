/**
 * How unlike two break faces are, for the candidate index, from their pose-invariant traits
 * (face-traits.ts). Each figure is compared on a scale equal to the median difference measured
 * between the two sides of one true break on a generated assemblage (seed 11, 200 fragments,
 * 235 face pairs; `npm run bench -- proposals` prints the candidate recall these give on other
 * seeds), through a robust loss log(1 + z^2), so one figure that disagrees (a chipped edge, an
 * axis fitted badly on a splinter) costs little more than a moderate disagreement:
 *   size:   log area, log principal extents (3),
 *   bend:   the two largest eigenvalues of the face normals' scatter,
 *   tube:   log outer and inner radius and log cortical thickness about the shaft axis, log span
 *           along the axis, share of the circumference (shaft pieces only; a figure missing on
 *           either side costs as much as a difference of one scale),
 *   texture: distance between the mean FPFH of one face and the mirrored mean FPFH of the other
 *           (a partner's normals point the other way).
 */
import { FPFH_DIM } from '../registration/fpfh';
import { mirrorFpfh } from '../registration/ransac-alignment';
import { principalSpread, type FaceTraits } from './face-traits';

/** Name and scale of each figure of `descriptorFigures` (median |difference| across true breaks). */
export const DESCRIPTOR_FIGURES: ReadonlyArray<{ name: string; scale: number }> = [
  { name: 'log area', scale: 0.51 },
  { name: 'log extent 1', scale: 0.31 },
  { name: 'log extent 2', scale: 0.35 },
  { name: 'log extent 3', scale: 0.63 },
  { name: 'normal scatter 1', scale: 0.077 },
  { name: 'normal scatter 2', scale: 0.055 },
  { name: 'log outer radius', scale: 0.17 },
  { name: 'log inner radius', scale: 0.19 },
  { name: 'log cortical thickness', scale: 0.19 },
  { name: 'log span along axis', scale: 0.28 },
  { name: 'share of circumference', scale: 0.14 },
];
/** Weight of the mean-FPFH distance (per unit of FPFH histogram mass). */
export const TEXTURE_WEIGHT = 0.25;
const MISSING_COST = Math.log(2);

/** The figures compared, in DESCRIPTOR_FIGURES order; NaN where a figure does not apply. */
export function descriptorFigures(t: FaceTraits): Float64Array {
  const tube = t.tube;
  return Float64Array.of(
    Math.log(Math.max(t.area, 1e-6)),
    Math.log(Math.max(t.extents[0], 1e-6)),
    Math.log(Math.max(t.extents[1], 1e-6)),
    Math.log(t.extents[2] + 1e-3),
    t.normalSpread[0],
    t.normalSpread[1],
    tube ? Math.log(Math.max(tube.outerRadius, 0.1)) : NaN,
    tube ? Math.log(Math.max(0.5, tube.innerRadius)) : NaN,
    tube ? Math.log(Math.max(0, tube.outerRadius - tube.innerRadius) + 0.3) : NaN,
    tube ? Math.log(tube.axialSpan + 1) : NaN,
    tube ? tube.arcShare : NaN,
  );
}

/** A face ready for comparison: its figures, its mean FPFH and the mean FPFH its partner would show. */
export interface FaceDescriptor {
  figures: Float64Array;
  fpfh: Float32Array;
  mirrored: Float32Array;
}

export function describeFace(t: FaceTraits): FaceDescriptor {
  return { figures: descriptorFigures(t), fpfh: t.meanFpfh, mirrored: mirrorFpfh(t.meanFpfh) };
}

/** Dissimilarity of two faces as partners (symmetric; 0 for a face and its perfect mirror image). */
export function partnerCost(a: FaceDescriptor, b: FaceDescriptor): number {
  let s = 0;
  for (let c = 0; c < DESCRIPTOR_FIGURES.length; c++) {
    const x = a.figures[c], y = b.figures[c];
    if (Number.isNaN(x) || Number.isNaN(y)) {
      s += MISSING_COST;
      continue;
    }
    const z = (x - y) / DESCRIPTOR_FIGURES[c].scale;
    s += Math.log1p(z * z);
  }
  let d = 0;
  const n = Math.min(a.mirrored.length, b.fpfh.length);
  for (let k = 0; k < n; k++) d += (a.mirrored[k] - b.fpfh[k]) ** 2;
  return s + TEXTURE_WEIGHT * Math.sqrt(d);
}

export const SIZE_DIMS = 3;
export const DESCRIPTOR_DIM = SIZE_DIMS + FPFH_DIM;
const SIZE_WEIGHT = 2.5;
const SHAPE_WEIGHT = 0.1;

/** One vector per face: log area, log extents and the mean FPFH (older single-view descriptor). */
export function faceDescriptor(points: Float32Array, _normals: Float32Array, _outline: Float32Array, area: number, fpfh?: Float32Array): Float32Array {
  const d = new Float32Array(DESCRIPTOR_DIM);
  const ext = principalSpread(points, true);
  d[0] = SIZE_WEIGHT * Math.log(Math.max(area, 1e-9));
  d[1] = SIZE_WEIGHT * Math.log(Math.max(ext[0], 1e-9));
  d[2] = SIZE_WEIGHT * Math.log(Math.max(ext[1], 1e-9));
  if (fpfh && fpfh.length >= FPFH_DIM) {
    const n = fpfh.length / FPFH_DIM;
    for (let i = 0; i < n; i++) for (let k = 0; k < FPFH_DIM; k++) d[SIZE_DIMS + k] += fpfh[i * FPFH_DIM + k];
    for (let k = 0; k < FPFH_DIM; k++) d[SIZE_DIMS + k] *= SHAPE_WEIGHT / n;
  }
  return d;
}

/** The older descriptor's partner: same size, mirrored FPFH. */
export function partnerDescriptor(d: Float32Array): Float32Array {
  const out = new Float32Array(d.length);
  out.set(d.subarray(0, SIZE_DIMS));
  out.set(mirrorFpfh(d.slice(SIZE_DIMS, SIZE_DIMS + FPFH_DIM)), SIZE_DIMS);
  return out;
}

/** Standard deviations of the points along their principal directions, largest first. */
export function principalExtents(points: Float32Array): [number, number, number] {
  return principalSpread(points, true);
}
