/**
 * The Stanford bunny (npm package `bunny`) cut in two by a rough surface (bunny-cut.ts), each half
 * prepared for matching with its cut as its one break face and no shaft axis (so the axis searches
 * stay out), the upper half moved by a known rigid motion: `truth` carries it back onto the lower
 * half (analytic by construction). Used by the screen's tests of single coarse stages.
 */
import { cutBunny, type CutPiece } from './bunny-cut';
import { breakFaceFromLabels } from './break-face-from-labels';
import { DEFAULT_FPFH_RADIUS_SPACINGS, prepareFragment, type PreparedFragment } from '../../core/geometry/proposals/prepared-fragment';
import { applyToPoints, invert, rotationAboutAxis, transformFrom, type RigidTransform } from '../../core/geometry/registration/rigid-transform';

function prepare(piece: CutPiece, motion: RigidTransform, spacing: number): PreparedFragment {
  const positions = applyToPoints(motion, piece.positions) as Float32Array;
  const face = breakFaceFromLabels(positions, piece.triangles, piece.onCut, spacing);
  return { ...prepareFragment({ positions, triangles: piece.triangles, faces: [face] }, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS, patches: false }), axis: null };
}

export async function preparedBunnyHalves(spacing = 1.2): Promise<{ A: PreparedFragment; B: PreparedFragment; truth: RigidTransform }> {
  const cut = await cutBunny({ amplitude: 2, seed: 5 });
  const A = prepare(cut.lower, transformFrom([1, 0, 0, 0, 1, 0, 0, 0, 1], [0, 0, 0]), spacing);
  const M = transformFrom(rotationAboutAxis([2, -1, 1], 1.9), [25, -40, 10]);
  return { A, B: prepare(cut.upper, M, spacing), truth: invert(M) };
}
