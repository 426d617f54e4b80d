/**
 * Which side of a flat wall the shaft axis lies on. Test piece: a 40-degree wedge of an
 * elliptic tube, the flat side of it: a round tube (outer radius 12 mm, inner 7 mm,
 * broken-tube.ts, manifold-3d) cut by two planes through its axis at +-20 degrees about the y
 * axis and across at z = +-20 mm, then stretched by 2 along x and 0.6 along y, so the outer
 * cross-section is an ellipse with semi-axes 24 and 7.2 mm and the inner one 14 and 4.2 mm. A
 * linear map keeps planes through the axis planes through the axis, so the break faces still
 * meet on the z axis and the construction gives the truth: the axis is the z axis, the
 * outer surface faces away from it. At the end of the minor axis the outer ellipse's
 * radius of curvature is a^2 / b = 80 mm (analytic geometry of the ellipse), so the wall is
 * nearly flat and its normal lines meet far away on either side about equally well.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { analyseFragment } from '../../../core/geometry/analyse-fragment';
import { fitShaftAxis, settleAxisSide } from '../../../core/geometry/shaft-axis';
import { brokenTube, wallSideInputs, fractureAgreement, type BrokenTube } from './broken-tube';
import { expectMirroredAxisSettled } from './mirrored-axis-check';

const half = (20 * Math.PI) / 180;


describe('shaft axis side on a flat wall (elliptic tube wedge)', () => {
  let wedge: BrokenTube;
  let centroids: Float32Array, normals: Float32Array, areas: Float64Array, meanCurvature: Float32Array;
  beforeAll(async () => {
    wedge = await brokenTube({
      cuts: [
        // Keep the 40-degree sector about +y: between the planes through the z axis at +-20 degrees.
        { normal: [Math.cos(half), Math.sin(half), 0], offset: 0 },
        { normal: [-Math.cos(half), Math.sin(half), 0], offset: 0 },
        { normal: [0, 0, 1], offset: -20 },
        { normal: [0, 0, -1], offset: -20 },
      ],
      warp: (x, y, z) => [2 * x, 0.6 * y, z],
    });
    ({ centroids, normals, areas, meanCurvature } = wallSideInputs(wedge.mesh));
  });

  it('is the flat side: the wedge spans y 4.2 to 7.2 mm and is wider than thick', () => {
    let yMin = Infinity, yMax = -Infinity, xMax = 0;
    const p = wedge.mesh.positions;
    for (let i = 0; i < p.length; i += 3) { yMin = Math.min(yMin, p[i + 1]); yMax = Math.max(yMax, p[i + 1]); xMax = Math.max(xMax, Math.abs(p[i])); }
    // Roughened break faces move a little off their planes; the ellipse ends are exact.
    expect(yMax).toBeGreaterThan(7.0);
    expect(yMax).toBeLessThan(7.6);
    expect(xMax).toBeGreaterThan(2 * 12 * Math.sin(half) - 0.6);
  });

  it('an axis fitted on the outer side (mirrored through the area centroid) is moved back to the z axis', () => {
    // the outer surface at the minor axis end is 7.2 mm from the axis
    expectMirroredAxisSettled(7.2, { centroids, normals, areas, meanCurvature });
  });

  it('the fitted and settled axis has the outer surface facing out, and the breaks are found', () => {
    const axis = settleAxisSide(fitShaftAxis(centroids, normals, areas, 0.45), centroids, normals, areas, meanCurvature);
    expect(Math.abs(axis.direction[2])).toBeGreaterThan(0.99);
    expect(axis.point[1]).toBeLessThan(4.2); // on the medullary side of the wall
    const a = analyseFragment(wedge.mesh);
    expect(fractureAgreement(a, wedge.truth, areas)).toBeGreaterThan(0.95);
  });
});
