/**
 * How unlike two break faces are, for the candidate index, from their pose-invariant traits
 * (face-traits.ts). Each figure is compared on a scale equal to the median difference measured
 * between the two sides of one true break on a generated assemblage (seed 11, 200 fragments,
 * 235 face pairs; the rim thickness on seed 14), through a robust loss log(1 + z^2), so one
 * figure that disagrees (a chipped edge, an axis fitted badly on a splinter) costs little more
 * than a moderate disagreement, and weighted:
 *   size:   log area, log principal extents (3),
 *   bend:   the two largest eigenvalues of the face normals' scatter,
 *   tube:   log outer and inner radius and log cortical thickness about the shaft axis, log span
 *           along the axis, share of the circumference (shaft pieces only; a figure missing on
 *           either side costs as much as a difference of one scale),
 *   wall:   log thickness of the bone wall along the face's rim (rim-wall-thickness.ts),
 *   course: mean |cosine| of the face normals with the shaft axis, and their mean lean out from
 *           the axis, which a partner shows with the opposite sign (compared as a sum; shaft
 *           pieces only),
 *   texture: distance between the mean FPFH of one face and the mirrored mean FPFH of the other
 *           (a partner's normals point the other way).
 * The weights were chosen by a coordinate search (each weight x0, x0.5, x2 in turn, two rounds)
 * for the candidate recall at k = 15, 30 and 60 on the dev assemblage of seed 14 at 200
 * fragments (tests/bench/candidate-recall.ts), and checked on seed 15 at 200 and on seeds 12-16
 * at 30. At 200 fragments a break is often met by two or more pieces on one side, so a face
 * faces only part of its partner: figures of the face's extent (the two smaller extents; area
 * until the refit below) and the radii about each piece's own fitted axis (its centre is
 * uncertain on a narrow splinter) then mislead more than they help, and their weight is 0; the wall beside the face
 * stays the same however the break is shared, and weighs most. The two figures of the break's
 * course were added later with scales and weights from a grid (axis cosine scale 0.025-0.1,
 * lean 0.05-0.2, weights 0-2) on seed 14 at 200 fragments, where the recall varied little
 * across the grid; they raised the candidate recall at k = 30 on seeds 14 and 15 at 200 and on
 * seeds 11-16 at 30 (the commit gives the figures). Their scales are not medians: over every
 * pair of faces on one true break there (whole faces and patches), the median differences are
 * 0.10 (axis cosine) and 0.23 (lean sum); scales of those sizes did no better on the dev sets.
 * The weights were then fitted again (tests/bench/candidate-weights.ts: coordinate search,
 * three rounds, on the mean candidate recall at k = 30 and 60) on two dev assemblages of 200
 * fragments together (seeds 150 and 151), after a leave-one-out check (fitted on one seed,
 * the recall at k = 30 on the other rose 78.9 -> 81.0% and 81.0 -> 82.2%). Area returned
 * (weight 0.7 on a wide scale, 1.02), the largest extent kept a smaller weight on a narrower
 * scale, the course of the break weighs more (axis cosine 1.4, lean 2: it holds however much of
 * the break a piece keeps) and the texture less (0.0875: the mean FPFH of a face that meets
 * only part of its partner, or that holds parts of two breaks, differs from the partner's).
 * They were fitted again (same search, one round changed anything) after the segmentation
 * changed, on two fresh dev assemblages of 200 fragments (seeds 340 and 341, studied at the run
 * spacing 1.2 mm, pieces of different recorded size classes not paired): the rim wall weighs
 * more (5.6), the axis cosine is compared on a finer scale (0.025), the thickness of the face
 * across its own plane (log extent 3) and the scatter of its normals weigh more, and area, share
 * of the circumference and cortical thickness less or nothing (the rim wall says the same about
 * the wall as the cortical thickness: on seed 340 the median difference between two random faces
 * is 7.4 times that between true partners for the rim wall, 1.7 times for the cortical thickness).
 * At 1,000 fragments the lists crowd (a true partner's median best rank 21 there, 3 at 200), and
 * a partial round of the same search on the dev assemblage of seed 160 at 1,000 fragments
 * (tests/bench/candidate-weights-rows.ts, the five figures it reached before the machine time
 * ran out) compares area and the largest extent on half the scales (0.51, 0.0775), weighs the
 * relief of the face across its own plane (log extent 3) twice as much (4) and the second
 * normal scatter half as much (0.7): there the figures of size and relief tell the many
 * look-alike faces apart better than the bend of the normals (DEVELOPERS.md, pruning section).
 */
import { FPFH_DIM } from '../registration/fpfh';
import { mirrorFpfh } from '../registration/ransac-alignment';
import { cappedCauchyLoss } from './capped-cauchy-loss';
import { principalSpread, type FaceTraits } from './face-traits';

/**
 * Where the rim wall's loss stops growing (`cappedCauchyLoss`), in scales: a difference of 0.5
 * in log thickness (a ratio of 1.65) costs as much as any larger one. Of the true joins of dev
 * seed 340 at 200 fragments that the index lost at k = 30, the rim wall alone put 16 out of
 * reach, some of them through readings no wall has (0.6 or 27 mm beside 6-8 mm on the partner:
 * rays that left through the far side of the shaft or through a sliver). Chosen from caps of
 * 3-10 on dev s340 and s502 at 200 fragments and seed 160 at 1,000 (DEVELOPERS.md, pruning
 * section); no cap on the other figures (a cap on all of them lost 0.6-2 points).
 */
export const RIM_WALL_LOSS_CAP = 5;

/**
 * Name, scale (median |difference| across true breaks) and weight of each figure of
 * `descriptorFigures`; a weight of 0 leaves the figure out of the cost. A figure marked
 * `opposite` is seen by the partner with the other sign, so two faces are compared by the sum
 * of their values, not the difference. A figure with a `cap` costs no more beyond a difference
 * of that many scales (`cappedCauchyLoss`).
 */
export const DESCRIPTOR_FIGURES: ReadonlyArray<{ name: string; scale: number; weight: number; opposite?: boolean; cap?: number }> = [
  { name: 'log area', scale: 0.51, weight: 0.35 },
  { name: 'log extent 1', scale: 0.0775, weight: 0.7 },
  { name: 'log extent 2', scale: 0.35, weight: 0 },
  { name: 'log extent 3', scale: 0.63, weight: 4 },
  { name: 'normal scatter 1', scale: 0.077, weight: 1 },
  { name: 'normal scatter 2', scale: 0.055, weight: 0.7 },
  { name: 'log outer radius', scale: 0.17, weight: 0 },
  { name: 'log inner radius', scale: 0.19, weight: 0 },
  { name: 'log cortical thickness', scale: 0.19, weight: 0 },
  { name: 'log span along axis', scale: 0.28, weight: 2 },
  { name: 'share of circumference', scale: 0.14, weight: 0.175 },
  { name: 'log wall thickness at the rim', scale: 0.1, weight: 5.6, cap: RIM_WALL_LOSS_CAP },
  { name: 'normal cosine with the axis', scale: 0.025, weight: 1.4 },
  { name: 'normal lean out from the axis', scale: 0.1, weight: 2, opposite: true },
];
/** Weight of the mean-FPFH distance (per unit of FPFH histogram mass). */
export const TEXTURE_WEIGHT = 0.0875;
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
    t.rimThickness !== undefined ? Math.log(t.rimThickness) : NaN,
    tube?.axisCosine ?? NaN,
    tube?.radialLean ?? NaN,
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

/** Index of the lean figure in DESCRIPTOR_FIGURES (the one `partnerCost`'s `leanVariance` widens). */
export const LEAN_FIGURE = DESCRIPTOR_FIGURES.findIndex((f) => f.name === 'normal lean out from the axis');

/**
 * Dissimilarity of two faces as partners (symmetric; 0 for a face and its perfect mirror image).
 * `leanVariance` (default 0) is added to the square of the lean figure's scale: the variance of
 * the two faces' lean readings beyond what true partners show on pieces whose axis is well held
 * (lean-reading-variance.ts).
 */
export function partnerCost(a: FaceDescriptor, b: FaceDescriptor, leanVariance = 0): number {
  let s = 0;
  for (let c = 0; c < DESCRIPTOR_FIGURES.length; c++) s += figureCost(a, b, c, c === LEAN_FIGURE ? leanVariance : 0);
  return s + textureCost(a, b);
}

/**
 * The cost figure `c` of DESCRIPTOR_FIGURES adds to `partnerCost`: weight times the (capped)
 * robust loss of the difference in scales, the missing-figure cost when a side lacks the figure,
 * 0 for a weight of 0; `extraVariance` widens the scale to sqrt(scale^2 + extraVariance).
 * Exported for the studies that take the cost apart (candidate-term-misses.ts).
 */
export function figureCost(a: FaceDescriptor, b: FaceDescriptor, c: number, extraVariance = 0): number {
  const { scale, weight, opposite, cap } = DESCRIPTOR_FIGURES[c];
  if (weight === 0) return 0;
  const x = a.figures[c], y = b.figures[c];
  if (Number.isNaN(x) || Number.isNaN(y)) return weight * MISSING_COST;
  const s = extraVariance > 0 ? Math.sqrt(scale * scale + extraVariance) : scale;
  return weight * cappedCauchyLoss((opposite ? x + y : x - y) / s, cap);
}

/** The texture term of `partnerCost`: TEXTURE_WEIGHT times the distance between one face's mirrored mean FPFH and the other's mean FPFH. */
export function textureCost(a: FaceDescriptor, b: FaceDescriptor): number {
  let d = 0;
  const n = Math.min(a.mirrored.length, b.fpfh.length);
  for (let k = 0; k < n; k++) d += (a.mirrored[k] - b.fpfh[k]) ** 2;
  return TEXTURE_WEIGHT * Math.sqrt(d);
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
