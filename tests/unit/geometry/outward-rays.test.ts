import { beforeAll, describe, expect, it } from 'vitest';
import { analyseFragment } from '../../../core/geometry/analyse-fragment';
import { triangleNormalsAndAreas } from '../../../core/geometry/mesh';
import { triangleCentroids } from '../../../core/geometry/normal-filter';
import { castWallRays } from '../../../core/geometry/wall-rays';
import { brokenTube, fractureAgreement, type BrokenTube } from './broken-tube';

/**
 * Outward rays (wall-rays.ts outwardCosine) and the cue they give the region classifier
 * (settings outwardHitWeight), on tubes whose truth comes from their construction
 * (broken-tube.ts, manifold-3d).
 * - Analytic geometry: a line through the centre of a circle meets it perpendicularly, so an
 *   outward ray from the round medullary surface of a whole tube (along the normal, towards
 *   the axis) crosses the cavity and meets the far side squarely (cosine 1 up to the polygon's
 *   facets), while a ray from the convex outer surface meets nothing.
 * - A piece from the narrow edge of a flattened shaft: a 12 mm tube with a lens-shaped cavity
 *   18 x 5 mm (as in the generator's radius and metacarpal), cut lengthwise 4 mm from the axis
 *   across the lens's width, keeps the pointed end of the cavity with both flat faces. The
 *   flat faces face the axis only obliquely, so their radial figure tells them poorly from
 *   the lengthwise break (which faces the axis too); each looks across the cavity at the other.
 */
describe('outward rays across the medullary cavity', () => {
  it('meet the far side of a round cavity squarely, and nothing from the outer surface', async () => {
    const tube = await brokenTube({ outerRadius: 12, innerRadius: 7, length: 40, cuts: [] });
    const { normals } = triangleNormalsAndAreas(tube.mesh);
    const centroids = triangleCentroids(tube.mesh.positions, tube.mesh.triangles);
    const rays = castWallRays(tube.mesh, normals, centroids, 4000, undefined, true);
    let inner = 0, innerSquare = 0, outer = 0, outerHit = 0;
    for (let k = 0; k < rays.triangles.length; k++) {
      const f = rays.triangles[k];
      if (Math.abs(normals[3 * f + 2]) > 0.1) continue; // the tube's end rings
      const rho = Math.hypot(centroids[3 * f], centroids[3 * f + 1]);
      if (rho < 9.5) { inner++; if (rays.outwardCosine[k] > 0.99) innerSquare++; }
      else { outer++; if (rays.outwardCosine[k] > -2) outerHit++; }
    }
    expect(inner).toBeGreaterThan(100);
    expect(innerSquare / inner).toBeGreaterThan(0.95);
    expect(outer).toBeGreaterThan(100);
    expect(outerHit).toBe(0);
  });

  it('are not cast unless asked for', async () => {
    const tube = await brokenTube({ outerRadius: 12, innerRadius: 7, length: 20, cuts: [] });
    const { normals } = triangleNormalsAndAreas(tube.mesh);
    const rays = castWallRays(tube.mesh, normals, triangleCentroids(tube.mesh.positions, tube.mesh.triangles), 500);
    expect(rays.outwardCosine.every((c) => c === -2)).toBe(true);
  });
});

describe('a piece from the narrow edge of a flattened shaft (lens-shaped cavity)', () => {
  let piece: BrokenTube;
  let areas: Float64Array;
  beforeAll(async () => {
    piece = await brokenTube({
      outerRadius: 12, length: 80, lensCavity: { halfWidth: 9, halfHeight: 2.5 }, roughness: 0.3,
      cuts: [{ normal: [1, 0, 0], offset: 4 }, { normal: [0, 0, 1], offset: -25 }, { normal: [0, 0, -1], offset: -25 }],
    });
    areas = triangleNormalsAndAreas(piece.mesh).areas;
  }, 60_000);

  it('reads the flat cavity faces as bone surface (agreement with the construction)', () => {
    // Measured: 0.934 with the cue, 0.853 without it (half the cavity read as break face).
    const withCue = fractureAgreement(analyseFragment(piece.mesh), piece.truth, areas);
    const without = fractureAgreement(analyseFragment(piece.mesh, { outwardHitWeight: 0 }), piece.truth, areas);
    expect(withCue).toBeGreaterThan(0.92);
    expect(withCue).toBeGreaterThan(without + 0.04);
  });
});
