import { cutBunny } from './tests/support/bunny-cut';
import { breakFaceFromLabels } from './tests/support/break-face-from-labels';
import { prepareFragment, defaultSpacing, DEFAULT_FPFH_RADIUS_SPACINGS } from './core/geometry/proposals/prepared-fragment';
import { matchFragments } from './core/geometry/proposals/pairwise-match';
import { applyToPoints, transformFrom, rotationAboutAxis, invert, rotationErrorDegrees, displacementAt } from './core/geometry/registration/rigid-transform';
const { lower, upper, diagonal } = await cutBunny();
const M = transformFrom(rotationAboutAxis([1, 2, -1], 130 * Math.PI / 180), [60, -30, 90]);
const movedUpper = applyToPoints(M, upper.positions) as Float32Array;
const spacing = defaultSpacing([diagonal]);
console.log('spacing', spacing);
let t0 = Date.now();
const fa = breakFaceFromLabels(lower.positions, lower.triangles, lower.onCut, spacing);
const fb = breakFaceFromLabels(movedUpper, upper.triangles, upper.onCut, spacing);
const A = prepareFragment({ positions: lower.positions, triangles: lower.triangles, faces: [fa] }, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS });
const B = prepareFragment({ positions: movedUpper, triangles: upper.triangles, faces: [fb] }, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS });
console.log('prep ms', Date.now() - t0, 'face samples', A.faces[0].points.length / 3, B.faces[0].points.length / 3, 'surface samples', A.surfacePoints.length/3);
t0 = Date.now();
const res = matchFragments(A, B);
console.log('match ms', Date.now() - t0);
const truth = invert(M);
for (const r of res.slice(0, 5)) {
  const { transform, ...rest } = r;
  console.log(JSON.stringify(rest), 'rotErr', rotationErrorDegrees(transform, truth).toFixed(3), 'transErr', displacementAt(transform, truth, B.centroid).toFixed(3));
}
