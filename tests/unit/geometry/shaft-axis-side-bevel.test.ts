/**
 * Which side of the wall the shaft axis lies on, for a splinter whose break faces are bevelled
 * so that its outer face is narrower than its medullary face. Test piece: a round tube (outer
 * radius 12 mm, inner 7 mm; broken-tube.ts, manifold-3d) cut across at z = +-20 mm and along
 * by two planes parallel to the axis, each through the inner-surface point 30 degrees from +y
 * and the outer-surface point 12 degrees from +y on its side, so each break face leans about
 * 40 degrees off the radial plane (an oblique fresh break through a thick wall); the two
 * planes meet far above the tube, and a cut at y = 2 mm (through the cavity only) drops the
 * other side of the tube that their wedge also holds. The
 * construction gives the truth: the axis is the z axis and the outer surface faces away from
 * it. Arc lengths (arc = radius x angle, analytic geometry of the circle): outer face
 * 12 x 24 deg = 5.0 mm, medullary face 7 x 60 deg = 7.3 mm, but only the parts within
 * 36.9 degrees of the centre direction count (settleAxisSide), 7 x 60 deg still (all within
 * 30 deg): so the outer face is about 0.69 of the medullary one, although it is the more
 * convex (mean curvature +1/24 against -1/14 per mm; do Carmo 1976, section 3-3).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { brokenTube, wallSideInputs, type BrokenTube } from './broken-tube';
import { expectMirroredAxisSettled } from './mirrored-axis-check';

const deg = Math.PI / 180;
/** Unit normal (pointing into the kept piece) of the plane parallel to z through the inner point at 30 deg and the outer point at 12 deg from +y, on the side `s` (+1: x > 0). */
function bevelCut(s: 1 | -1): { normal: [number, number, number]; offset: number } {
  const ix = s * 7 * Math.sin(30 * deg), iy = 7 * Math.cos(30 * deg);
  const ox = s * 12 * Math.sin(12 * deg), oy = 12 * Math.cos(12 * deg);
  const dx = ox - ix, dy = oy - iy, l = Math.hypot(dx, dy);
  // Perpendicular to the face line, pointing towards x = 0.
  let nx = -dy / l, ny = dx / l;
  if (nx * s > 0) { nx = -nx; ny = -ny; }
  return { normal: [nx, ny, 0], offset: nx * ix + ny * iy };
}

describe('shaft axis side on a splinter with bevelled breaks (outer face narrower than medullary)', () => {
  let piece: BrokenTube;
  let centroids: Float32Array, normals: Float32Array, areas: Float64Array, meanCurvature: Float32Array;
  beforeAll(async () => {
    piece = await brokenTube({
      cuts: [bevelCut(1), bevelCut(-1), { normal: [0, 1, 0], offset: 2 }, { normal: [0, 0, 1], offset: -20 }, { normal: [0, 0, -1], offset: -20 }],
    });
    ({ centroids, normals, areas, meanCurvature } = wallSideInputs(piece.mesh));
  });

  it('is the piece described: outer face narrower than the medullary face', () => {
    // Original-surface area at the outer radius against at the inner one (truth 0 = original).
    let outer = 0, inner = 0;
    for (let f = 0; f < areas.length; f++) {
      if (piece.truth[f]) continue;
      const rho = Math.hypot(centroids[3 * f], centroids[3 * f + 1]);
      if (rho > 9.5) outer += areas[f]; else inner += areas[f];
    }
    // Arc x length 40 mm: outer 12 x 24 deg x 40 = 201 mm^2, inner 7 x 60 deg x 40 = 293 mm^2
    // (a rim triangle with a corner off the cut plane counts as original: up to half an edge more each side).
    expect(outer).toBeGreaterThan(201 * 0.97);
    expect(outer).toBeLessThan(201 * 1.12);
    expect(inner).toBeGreaterThan(293 * 0.97);
    expect(inner).toBeLessThan(293 * 1.12);
    expect(outer / inner).toBeLessThan(0.8);
  });

  it('an axis fitted on the outer side (mirrored through the area centroid) is moved back to the z axis', () => {
    expectMirroredAxisSettled(12, { centroids, normals, areas, meanCurvature });
  });
});
