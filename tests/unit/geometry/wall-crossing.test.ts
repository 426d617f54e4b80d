/**
 * A shaft axis centre inside the wall (wall-crossing.ts, shaft-axis.ts fitShaftAxis with
 * `shaftCentreWallShareMax` and, on clear shaft pieces, `shaftCentreWallStrictShareMax`), on broken tubes whose truth comes from their construction
 * (broken-tube.ts, manifold-3d): a thick-walled round tube (outer radius 18 mm, cavity 7.5 mm,
 * the proportions of a cattle tibia's shaft wall, common practice) whose axis is the z axis.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { analyseFragment } from '../../../core/geometry/analyse-fragment';
import { triangleNormalsAndAreas } from '../../../core/geometry/mesh';
import { triangleCentroids } from '../../../core/geometry/normal-filter';
import { castWallRays } from '../../../core/geometry/wall-rays';
import { wallCrossingShare, wallSegments } from '../../../core/geometry/wall-crossing';
import { brokenTube, fractureAgreement, offAxis, type BrokenTube } from './broken-tube';

const R = 18, r = 7.5;

describe('wall crossing share of a point across the axis', () => {
  it('is 0 on the axis of a whole ring and (R + r) / (2R + r) inside its wall', async () => {
    const ring = await brokenTube({ outerRadius: R, innerRadius: r, length: 80, roughness: 0, cuts: [{ normal: [0, 0, 1], offset: -20 }, { normal: [0, 0, -1], offset: -20 }] });
    const { normals, areas } = triangleNormalsAndAreas(ring.mesh);
    const centroids = triangleCentroids(ring.mesh.positions, ring.mesh.triangles);
    const rays = castWallRays(ring.mesh, normals, centroids, 20000);
    const segments = wallSegments(rays, centroids, normals, areas, [0, 0, 1], [1, 0, 0], [0, 1, 0]);
    // Analytic: the inward rays of a round tube run radially; those aimed at the axis all stop
    // at the cavity (radius r > 0) before reaching it.
    expect(wallCrossingShare(segments, 0, 0, 1)).toBe(0);
    // A point at radius (R + r) / 2: the rays aimed through it are the radial ones of its own
    // bearing from outside (area share R) and from the cavity (r), which cross it, and those of
    // the opposite bearing from outside (R), which stop at the cavity first: (R + r) / (2R + r).
    const mid = (R + r) / 2;
    for (const deg of [0, 50, 130, 250]) {
      const a = (deg * Math.PI) / 180;
      expect(wallCrossingShare(segments, mid * Math.cos(a), mid * Math.sin(a), 1)).toBeCloseTo((R + r) / (2 * R + r), 1);
    }
    // A point in the cavity, off the axis: no ray crosses it before it leaves the material.
    expect(wallCrossingShare(segments, 4, 2, 1)).toBe(0);
  }, 60_000);
});

describe('a piece whose break faces all face a line inside the wall', () => {
  // The tube kept within 8 mm of the line x = 12.75, y = 0 (mid-wall): its break face is a
  // convex cylinder whose normal lines all pass that line (55 % of the area), the outer and
  // cavity arcs' normal lines pass the tube's axis. About the line inside the wall every face
  // faces out squarely, so the break reads as outer surface.
  let piece: BrokenTube;
  let inputAreas: Float64Array;
  beforeAll(async () => {
    piece = await brokenTube({ outerRadius: R, innerRadius: r, length: 80, roughness: 0.3, cuts: [
      { centre: [12.75, 0], radius: 8 }, { normal: [0, 0, 1], offset: -30 }, { normal: [0, 0, -1], offset: -30 }] });
    inputAreas = triangleNormalsAndAreas(piece.mesh).areas;
  }, 60_000);

  it('gets its centre on the tube axis, not in the wall', () => {
    const checked = analyseFragment(piece.mesh);
    const unchecked = analyseFragment(piece.mesh, { shaftCentreWallShareMax: 0, shaftCentreWallStrictShareMax: 0 });
    // Truth: the z axis (construction). Measured: 11.4 mm off without the check (the scoop's
    // line), 0.0 with it; agreement 0.960 -> 0.980.
    expect(offAxis(unchecked.axis.point, unchecked.axis.direction)).toBeGreaterThan(8);
    expect(offAxis(checked.axis.point, checked.axis.direction)).toBeLessThan(1);
    expect(checked.axis.radius).toBeGreaterThan(R - 1.5);
    expect(fractureAgreement(checked, piece.truth, inputAreas)).toBeGreaterThan(fractureAgreement(unchecked, piece.truth, inputAreas) + 0.01);
  });

  it('gets it on the axis by the strict check alone, only on clear shaft pieces (shaftCentreWallStrictShareMax)', () => {
    // The strict check (0.2, support at least shaftCentreWallStrictSupportMin 0.85) with the
    // plain one (shaftCentreWallShareMax) off. Measured: 11.4 mm off without any check, 0.0
    // with the strict one alone (support 0.90); agreement 0.960 -> 0.980.
    const none = analyseFragment(piece.mesh, { shaftCentreWallShareMax: 0, shaftCentreWallStrictShareMax: 0 });
    const strict = analyseFragment(piece.mesh, { shaftCentreWallShareMax: 0, shaftCentreWallStrictShareMax: 0.2 });
    // Gate above the piece's support: the strict check does not apply, the centre stays on the line.
    const gated = analyseFragment(piece.mesh, { shaftCentreWallShareMax: 0, shaftCentreWallStrictShareMax: 0.2, shaftCentreWallStrictSupportMin: 0.99 });
    // The piece's walls and break run along the axis: more than 0.85 of its area.
    expect(none.axis.support).toBeGreaterThan(0.85);
    // Truth: the z axis (construction); the line inside the wall is 12.75 mm off it.
    expect(offAxis(none.axis.point, none.axis.direction)).toBeGreaterThan(8);
    expect(offAxis(gated.axis.point, gated.axis.direction)).toBeGreaterThan(8);
    expect(offAxis(strict.axis.point, strict.axis.direction)).toBeLessThan(1);
    expect(fractureAgreement(strict, piece.truth, inputAreas)).toBeGreaterThan(fractureAgreement(none, piece.truth, inputAreas) + 0.01);
  }, 60_000);
});
