/**
 * Test fixture from open data: the Stanford bunny cut in two (bunny-cut.ts), each half prepared
 * for matching with its cut as its one break face and, as a piece of that face, the cut's
 * triangles with x below the cut's mean x before any motion: the same stretch of the break on both
 * halves, so the true motion lays each piece on the other (and a piece on only part of the other
 * half's whole cut). The upper half is moved by a known motion; `truth` (B onto A) is its inverse,
 * analytic by construction. Shared by the part-pair tests (part-cover, part-searches).
 */
import { cutBunny, type CutPiece } from './bunny-cut';
import { breakFaceFromLabels } from './break-face-from-labels';
import { DEFAULT_FPFH_RADIUS_SPACINGS, prepareFragment, type PreparedFragment } from '../../core/geometry/proposals/prepared-fragment';
import { applyToPoints, invert, rotationAboutAxis, transformFrom, type RigidTransform } from '../../core/geometry/registration/rigid-transform';

/** One half with its cut as a break face and the cut's triangles below mean x as a piece of it. */
function prepare(piece: CutPiece, motion: RigidTransform, meanX: number, spacing: number): PreparedFragment {
  const positions = applyToPoints(motion, piece.positions) as Float32Array;
  const cut: number[] = [], low: number[] = [];
  const nt = piece.triangles.length / 3;
  for (let t = 0; t < nt; t++) {
    if (!piece.onCut[t]) continue;
    cut.push(t);
    const x = [0, 1, 2].reduce((s, k) => s + piece.positions[3 * piece.triangles[3 * t + k]], 0) / 3;
    if (x < meanX) low.push(t);
  }
  const face = { ...breakFaceFromLabels(positions, piece.triangles, piece.onCut, spacing), triangleIds: Uint32Array.from(cut), pieces: [Uint32Array.from(low)] };
  return { ...prepareFragment({ positions, triangles: piece.triangles, faces: [face] }, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS, patches: true }), axis: null };
}

/** Mean x of the cut triangles' corners (before any motion). */
function cutMeanX(piece: CutPiece): number {
  let s = 0, n = 0;
  for (let t = 0; t < piece.triangles.length / 3; t++) {
    if (!piece.onCut[t]) continue;
    for (let k = 0; k < 3; k++) { s += piece.positions[3 * piece.triangles[3 * t + k]]; n++; }
  }
  return s / n;
}

/** The two halves (A the lower, unmoved; B the upper, moved) and the true motion of B onto A. */
export async function bunnyCutPieces(spacing: number): Promise<{ A: PreparedFragment; B: PreparedFragment; truth: RigidTransform }> {
  const cut = await cutBunny({ amplitude: 2, seed: 5 });
  const meanX = cutMeanX(cut.lower);
  const A = prepare(cut.lower, transformFrom([1, 0, 0, 0, 1, 0, 0, 0, 1], [0, 0, 0]), meanX, spacing);
  const M = transformFrom(rotationAboutAxis([2, -1, 1], 1.9), [25, -40, 10]);
  const B = prepare(cut.upper, M, meanX, spacing);
  return { A, B, truth: invert(M) };
}
