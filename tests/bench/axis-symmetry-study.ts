/**
 * `npx tsx tests/bench/axis-symmetry-study.ts`: the axis-direction search (axis-direction-search.ts)
 * run both ways round on the analytic cut tube of tests/unit/geometry/proposals/off-axis-screen.test.ts
 * (outer radius 12 mm, inner 7 mm, manifold-3d; the truth is the known motion), printing each peak's
 * support and its error against the truth (degrees, mm at B's face centroid), then the screen's
 * motions with each screenWays for the four 6 mm offsets of B's fitted axis point.
 * PEAKS=n asks the search for n peaks.
 */
import { cutTube, type CutPiece } from '../support/bunny-cut';
import { breakFaceFromLabels } from '../support/break-face-from-labels';
import { DEFAULT_FPFH_RADIUS_SPACINGS, prepareFragment, type PreparedFragment } from '../../core/geometry/proposals/prepared-fragment';
import { screenFacePair, DEFAULT_MATCH_PARAMETERS } from '../../core/geometry/proposals/pairwise-match';
import { searchAlongAxisDirections } from '../../core/geometry/registration/axis-direction-search';
import { applyToPoints, displacementAt, invert, rotationAboutAxis, rotationErrorDegrees, transformFrom } from '../../core/geometry/registration/rigid-transform';
const spacing = 1;
function prepare(piece: CutPiece, motion: number[]): PreparedFragment {
  const positions = applyToPoints(motion, piece.positions) as Float32Array;
  const face = breakFaceFromLabels(positions, piece.triangles, piece.onCut, spacing);
  return prepareFragment({ positions, triangles: piece.triangles, faces: [face] }, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS, patches: false });
}
const cut = await cutTube({ amplitude: 2, seed: 3 });
const A = prepare(cut.lower, transformFrom([1, 0, 0, 0, 1, 0, 0, 0, 1], [0, 0, 0]));
const M = transformFrom(rotationAboutAxis([-1, 2, 1], 2.4), [-35, 15, 20]);
const B = prepare(cut.upper, M);
const truth = invert(M);
const FA = A.faces[0], FB = B.faces[0];
console.log('samples', FA.points.length / 3, FB.points.length / 3, 'axes', A.axis!.direction, B.axis!.direction);
const peaks = Number(process.env.PEAKS ?? 3);
const fw = searchAlongAxisDirections(A.axis!.direction, FA.points, FA.normals, B.axis!.direction, FB.points, FB.normals, { spacing, peaks, maxSamples: 150, tiltsDeg: [0] });
for (const h of fw) console.log('fw', h.votes, h.flip, rotationErrorDegrees(h.transform, truth).toFixed(1), displacementAt(h.transform, truth, FB.centroid).toFixed(1));
const bw = searchAlongAxisDirections(B.axis!.direction, FB.points, FB.normals, A.axis!.direction, FA.points, FA.normals, { spacing, peaks, maxSamples: 150, tiltsDeg: [0] });
for (const h of bw) { const T = invert(h.transform); console.log('bw', h.votes, h.flip, rotationErrorDegrees(T, truth).toFixed(1), displacementAt(T, truth, FB.centroid).toFixed(1)); }
for (const ways of ['given', 'smaller', 'both'] as const) {
  for (const q of [0, 1, 2, 3]) {
    const d = B.axis!.direction; const l = Math.hypot(d[1], d[0]); const u = [d[1] / l, -d[0] / l, 0];
    const v = [d[1] * u[2] - d[2] * u[1], d[2] * u[0] - d[0] * u[2], d[0] * u[1] - d[1] * u[0]];
    const a = (q * Math.PI) / 2; const off = u.map((x, k) => 6 * (Math.cos(a) * x + Math.sin(a) * v[k]));
    const moved: PreparedFragment = { ...B, axis: { ...B.axis!, point: [B.axis!.point[0] + off[0], B.axis!.point[1] + off[1], B.axis!.point[2] + off[2]] } };
    const s = screenFacePair(A, 0, moved, 0, { ...DEFAULT_MATCH_PARAMETERS, screenWays: ways });
    console.log(ways, q, s.map((m) => `${rotationErrorDegrees(m.transform, truth).toFixed(1)}/${displacementAt(m.transform, truth, FB.centroid).toFixed(1)}/${m.overlap.toFixed(2)}`).join(' '));
  }
}
