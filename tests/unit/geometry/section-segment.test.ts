import { beforeAll, describe, expect, it } from 'vitest';
import { analyseFragment } from '../../../core/geometry/analyse-fragment';
import { triangleNormalsAndAreas } from '../../../core/geometry/mesh';
import { brokenTube, fractureAgreement, type BrokenTube } from './broken-tube';

/**
 * The medial segment fitted in direction and extent from wall-ray pairs (shaft-axis.ts
 * fitSectionSegment, settings sectionSegment*), on a piece whose truth comes from its
 * construction (broken-tube.ts, manifold-3d): the elliptic tube of medial-segment.test.ts
 * (a 12 mm tube with a lens cavity 18 x 5 mm stretched 1.7 times along x: section semi-axes
 * 20.4 and 12 mm, cavity 30.6 x 5 mm), cut lengthwise through its axis (x > 0), so the piece
 * holds one narrow edge and half of both flat walls. Analytic geometry: the normal lines of an
 * ellipse cross its major axis (x here) within a - b²/a = 13.3 mm of the centre, so the segment
 * that makes the walls face squarely runs along x.
 */
describe('half of an elliptic tube cut through its axis', () => {
  let piece: BrokenTube;
  let areas: Float64Array;
  beforeAll(async () => {
    piece = await brokenTube({
      outerRadius: 12, length: 80, lensCavity: { halfWidth: 9, halfHeight: 2.5 }, roughness: 0.3,
      warp: (x, y, z) => [1.7 * x, y, z],
      cuts: [{ normal: [1, 0, 0], offset: 0 }, { normal: [0, 0, 1], offset: -25 }, { normal: [0, 0, -1], offset: -25 }],
    });
    areas = triangleNormalsAndAreas(piece.mesh).areas;
  }, 60_000);

  it('gets a medial segment along the major axis', () => {
    const a = analyseFragment(piece.mesh);
    expect(a.axis.medial).toBeDefined();
    expect(Math.abs(a.axis.medial!.direction[0])).toBeGreaterThan(0.9);
  });

  it('reads walls and the break as the construction says', () => {
    // Measured: 0.993 with the fitted segment; 0.975 with the point centre (the segment along
    // the line from the area centroid to the centre, fitMedialSegment, is not taken here).
    const fitted = fractureAgreement(analyseFragment(piece.mesh), piece.truth, areas);
    const without = fractureAgreement(analyseFragment(piece.mesh, { sectionSegmentReaches: [] }), piece.truth, areas);
    expect(fitted).toBeGreaterThan(0.985);
    expect(fitted).toBeGreaterThan(without + 0.01);
  });
});
