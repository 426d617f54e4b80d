import { beforeAll, describe, expect, it } from 'vitest';
import { analyseFragment } from '../../../core/geometry/analyse-fragment';
import { triangleNormalsAndAreas } from '../../../core/geometry/mesh';
import { brokenTube, fractureAgreement, type BrokenTube } from './broken-tube';

/**
 * The concavity term of the neighbourhood pass (region-context.ts, settings contextConcaveWeight,
 * contextConcaveHeadOnMin) on a piece whose truth comes from its construction (broken-tube.ts,
 * manifold-3d): a 12 mm tube with a lens-shaped cavity 16 x 6 mm (a flattened shaft's flat,
 * pointed medullary cavity), cut lengthwise by a plane at 45 degrees to the lens's width, 2 mm
 * from the axis. The piece keeps one pointed end of the cavity with parts of both of its faces.
 * Analytic geometry: each lens face is an arc of a circle of radius rho = (w² + h²) / 2h =
 * 12.2 mm, so it curves inwards with mean curvature -1/(2 rho) = -0.041/mm (a cylinder of radius
 * rho; do Carmo 1976, section 3-3), while the cut is a plane (roughened) and the outer surface
 * convex. The lens faces face the axis at 30-70 degrees off square, so the facing term tells
 * them poorly from the break.
 */
describe('a lengthwise piece of a tube with a lens-shaped cavity', () => {
  let piece: BrokenTube;
  let areas: Float64Array;
  beforeAll(async () => {
    const s = Math.SQRT1_2;
    piece = await brokenTube({
      outerRadius: 12, length: 80, lensCavity: { halfWidth: 8, halfHeight: 3 }, roughness: 0.3,
      cuts: [{ normal: [s, s, 0], offset: 2 }, { normal: [0, 0, 1], offset: -25 }, { normal: [0, 0, -1], offset: -25 }],
    });
    areas = triangleNormalsAndAreas(piece.mesh).areas;
  }, 60_000);

  it('reads the concave cavity faces as bone surface (agreement with the construction)', () => {
    // Measured: 0.988 with the term, 0.935 without it (a lens face read as break face).
    const withTerm = fractureAgreement(analyseFragment(piece.mesh), piece.truth, areas);
    const without = fractureAgreement(analyseFragment(piece.mesh, { contextConcaveWeight: 0 }), piece.truth, areas);
    expect(withTerm).toBeGreaterThan(0.97);
    expect(withTerm).toBeGreaterThan(without + 0.03);
  });

  it('finds the lens faces concave and the cut not (mean curvature of the regions, 1/mm)', () => {
    const a = analyseFragment(piece.mesh);
    // Area-weighted mean curvature over the analysed triangles of the cavity (truth: original
    // surface facing the axis) and of the cut.
    let cavity = 0, cavityArea = 0, cut = 0, cutArea = 0;
    for (let f = 0; f < a.triangleClass.length; f++) {
      const src = a.sourceTriangle[f];
      const r = a.regions[a.regionOfTriangle[f]];
      const c = a.mesh.positions;
      const t = a.mesh.triangles;
      const x = (c[3 * t[3 * f]] + c[3 * t[3 * f + 1]] + c[3 * t[3 * f + 2]]) / 3, y = (c[3 * t[3 * f] + 1] + c[3 * t[3 * f + 1] + 1] + c[3 * t[3 * f + 2] + 1]) / 3;
      if (piece.truth[src]) { cut += areas[src] * r.meanCurvature; cutArea += areas[src]; }
      else if (Math.hypot(x, y) < 9) { cavity += areas[src] * r.meanCurvature; cavityArea += areas[src]; }
    }
    expect(cavity / cavityArea).toBeLessThan(-0.02);
    expect(cut / cutArea).toBeGreaterThan(-0.01);
  });
});
