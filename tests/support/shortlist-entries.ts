/**
 * Helpers for tests of the fine shortlist (face-pair-places, repeated-motion): a known motion
 * turned about an axis through a point, and a screened entry of face pair (i, 0).
 */
import type { CoarseMotion } from '../../core/geometry/proposals/pairwise-match';
import type { PreparedFragment } from '../../core/geometry/proposals/prepared-fragment';
import { preparedBunnyHalves } from './bunny-halves';
import { compose, rotationAboutAxis, transformFrom, type RigidTransform } from '../../core/geometry/registration/rigid-transform';

/** `truth` turned by `deg` degrees about an axis through `centre` (B's frame). */
export function turnedAbout(truth: RigidTransform, centre: readonly number[], deg: number, axis: number[] = [0.3, -0.5, 0.8]): RigidTransform {
  const R = rotationAboutAxis(axis, (deg * Math.PI) / 180);
  const t = [0, 1, 2].map((r) => centre[r] - (R[3 * r] * centre[0] + R[3 * r + 1] * centre[1] + R[3 * r + 2] * centre[2]));
  return compose(truth, transformFrom(R, t));
}

/** A screened motion of face pair (i, 0) with the given overlap, as the shortlist takes it. */
export const shortlistEntry = (i: number, transform: RigidTransform, overlap: number): { i: number; j: number; motion: CoarseMotion } => ({ i, j: 0, motion: { transform, overlap } });

/**
 * The cut bunny's halves (bunny-halves.ts) with A's break face offered as the faces `copies`
 * makes of it (pieces or other faces), the truth, and B's face centroid to turn motions about.
 */
export async function bunnyHalvesWithFaceCopies(
  copies: (face: PreparedFragment['faces'][number]) => PreparedFragment['faces'],
): Promise<{ A: PreparedFragment; B: PreparedFragment; truth: RigidTransform; c: number[] }> {
  const h = await preparedBunnyHalves();
  return { A: { ...h.A, faces: copies(h.A.faces[0]) }, B: h.B, truth: h.truth, c: [...h.B.faces[0].centroid] };
}
