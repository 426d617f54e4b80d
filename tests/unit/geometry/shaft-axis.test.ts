/**
 * Shaft axis of a splinter: a 40-degree wedge of a tube (outer radius 12 mm, inner 7 mm, axis
 * the z axis by construction) broken along two planes through the axis and across at both
 * ends (broken-tube.ts, manifold-3d). The break faces outweigh the outer surface, the case
 * where a plain least-squares meeting point of the normal lines lands inside the wall. Truth
 * is the construction: the axis is the z axis and the outer radius 12 mm (analytic geometry).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { analyseFragment } from '../../../core/geometry/analyse-fragment';
import { triangleNormalsAndAreas } from '../../../core/geometry/mesh';
import { triangleCentroids } from '../../../core/geometry/normal-filter';
import { fitShaftAxis } from '../../../core/geometry/shaft-axis';
import { brokenTube, fractureAgreement, offAxis, type BrokenTube } from './broken-tube';

const half = (20 * Math.PI) / 180;


describe('shaft axis of a long splinter (consensus start)', () => {
  let splinter: BrokenTube;
  beforeAll(async () => {
    splinter = await brokenTube({
      cuts: [
        { normal: [Math.sin(half), Math.cos(half), 0], offset: 0 },
        { normal: [Math.sin(half), -Math.cos(half), 0], offset: 0 },
        { normal: [0, 0, 1], offset: -20 },
        { normal: [0, 0, -1], offset: -20 },
      ],
    });
  });

  it('break faces outweigh the outer surface (the case being tested)', () => {
    const { areas } = triangleNormalsAndAreas(splinter.mesh);
    let fracture = 0, total = 0;
    for (let f = 0; f < areas.length; f++) { total += areas[f]; if (splinter.truth[f]) fracture += areas[f]; }
    // Outer arc 12 x 0.70 x 40 = 335 mm², break faces 2 x 5 x 40 + ends about 66 mm².
    expect(fracture / total).toBeGreaterThan(0.45);
  });

  it('finds the z axis within 0.5 mm and the outer radius within 0.5 mm', () => {
    const { normals, areas } = triangleNormalsAndAreas(splinter.mesh);
    const c = triangleCentroids(splinter.mesh.positions, splinter.mesh.triangles);
    const axis = fitShaftAxis(c, normals, areas, 0.45);
    expect(Math.abs(axis.direction[2])).toBeGreaterThan(0.999);
    expect(offAxis(axis.point, axis.direction)).toBeLessThan(0.5);
    expect(Math.abs(axis.radius - 12)).toBeLessThan(0.5);
  });

  it('so the outer and medullary surfaces face out and in, and the breaks are found', () => {
    const a = analyseFragment(splinter.mesh);
    const { areas } = triangleNormalsAndAreas(splinter.mesh);
    expect(fractureAgreement(a, splinter.truth, areas)).toBeGreaterThan(0.95);
  });
});
