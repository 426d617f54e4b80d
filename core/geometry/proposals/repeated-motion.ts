/**
 * Screened motions of one fragment pair that repeat one another across face pairs (the fine
 * shortlist, pairwise-match.ts fineShortlist): a whole break face is matched besides its pieces
 * and patches (prepared-fragment.ts; each carries its face's index as `parent`), so a motion found
 * on a piece often lies where its whole face's lies.
 */
import { displacementAt, rotationErrorDegrees } from '../registration/rigid-transform';
import type { PreparedFragment } from './prepared-fragment';
import type { CoarseMotion } from './pairwise-match';

/**
 * Whether screened motion `s` repeats `o`: both from face pairs of the same two faces of A and B
 * (a whole face and its pieces and patches share their parent), within `deg` degrees and `shift`
 * mm of each other at the centroid of s's face of B.
 */
export function repeatsMotion(a: PreparedFragment, b: PreparedFragment, o: { i: number; j: number; motion: CoarseMotion }, s: { i: number; j: number; motion: CoarseMotion }, deg: number, shift: number): boolean {
  return a.faces[o.i].parent === a.faces[s.i].parent && b.faces[o.j].parent === b.faces[s.j].parent
    && rotationErrorDegrees(o.motion.transform, s.motion.transform) < deg && displacementAt(o.motion.transform, s.motion.transform, b.faces[s.j].centroid) < shift;
}
