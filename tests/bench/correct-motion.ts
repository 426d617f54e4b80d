/**
 * When the benches and studies count a motion as the true join's: within 5 degrees (geodesic
 * rotation angle) and 5 mm (displacement at the moved fragment's centroid) of the generator's
 * motion. One definition for proposals.bench.ts, pairwise.bench.ts and the studies.
 */
import { displacementAt, rotationErrorDegrees, type RigidTransform } from '../../core/geometry/registration/rigid-transform';

export const CORRECT_ROTATION_DEG = 5;
export const CORRECT_TRANSLATION_MM = 5;

/** Whether errors (degrees, mm) are within the bench's tolerance. */
export function withinCorrectTolerance(rotationDeg: number, translationMm: number): boolean {
  return rotationDeg < CORRECT_ROTATION_DEG && translationMm < CORRECT_TRANSLATION_MM;
}

/** Whether motion T puts the fragment whose centroid is c within the bench's tolerance of `want`. */
export function isCorrectMotion(T: RigidTransform, want: RigidTransform, c: ArrayLike<number>): boolean {
  return withinCorrectTolerance(rotationErrorDegrees(T, want), displacementAt(T, want, c));
}
