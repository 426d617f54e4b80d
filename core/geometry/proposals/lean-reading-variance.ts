/**
 * How uncertain a face's lean reading is because of its piece's fitted shaft centre, as a
 * variance per face for `partnerCost` (face-descriptor.ts). The lean (the mean lean of a face's
 * normals out from the shaft axis) is read about the axis the piece's own analysis fitted; on a
 * narrow splinter that axis's centre is poorly held (it slides along the arc the piece keeps),
 * and the lean's error grows as the piece spans less of the circumference: against the
 * generator's axis, by the piece's widest face's share of the circumference, median |error|
 * 0.23 under 0.2, 0.10 at 0.2-0.3, 0.075 at 0.3-0.4, 0.05 at 0.4-0.6, 0.041 above 0.6 (dev seed
 * 340 at 200 fragments; DEVELOPERS.md, pruning section, sessions 26-27). The model: a reading's
 * error is `error / max(widestShare, MIN_SHARE)` for the piece's widest share, and two readings
 * with independent errors differ by the sum of their variances, so a face pair's lean scale is
 * widened by varianceA + varianceB.
 *
 * Worked example: error 0.03, a piece whose widest face spans a quarter of the shaft: each of its
 * faces' variance (0.03 / 0.25)^2 = 0.0144; paired with a face of a piece spanning the whole
 * circumference (0.0009), the lean's scale 0.1 becomes sqrt(0.01 + 0.0153) = 0.159.
 */
import type { FaceTraits } from './face-traits';

/** The least share of the circumference the model divides by (a piece with no tube reading has no lean either). */
export const MIN_SHARE = 0.05;

/**
 * Per face, (error / max(widest share of its piece, MIN_SHARE))^2, where a piece's widest share
 * is the largest `tube.arcShare` over its faces (0 for every face when `error` is 0).
 */
export function leanReadingVariance(faces: ReadonlyArray<{ fragment: number; traits: FaceTraits }>, error: number): Float64Array {
  const out = new Float64Array(faces.length);
  if (!(error > 0)) return out;
  const widest = new Map<number, number>();
  for (const f of faces) {
    const share = f.traits.tube?.arcShare;
    if (share !== undefined && Number.isFinite(share)) widest.set(f.fragment, Math.max(widest.get(f.fragment) ?? 0, share));
  }
  faces.forEach((f, i) => {
    const share = Math.max(widest.get(f.fragment) ?? 0, MIN_SHARE);
    out[i] = (error / share) ** 2;
  });
  return out;
}
