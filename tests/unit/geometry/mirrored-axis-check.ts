/**
 * The check shared by the tests of settleAxisSide on pieces with analytic truth (the z axis): the
 * true axis mirrored through the surface's area centroid lands beyond the outer surface; settling
 * its side must bring it back within 0.5 mm of the z axis with the outer radius measured within
 * 0.6 mm, and must leave the true axis where it is.
 */
import { expect } from 'vitest';
import { settleAxisSide, type ShaftAxis } from '../../../core/geometry/shaft-axis';
import { mirroredThroughCentroid, offAxis, type wallSideInputs } from './broken-tube';

export function expectMirroredAxisSettled(outerRadius: number, inputs: ReturnType<typeof wallSideInputs>): void {
  const { centroids, normals, areas, meanCurvature } = inputs;
  const truthAxis: ShaftAxis = { direction: [0, 0, 1], point: [0, 0, 0], radius: outerRadius, support: 0.9 };
  const wrongSide = mirroredThroughCentroid(truthAxis, centroids, areas);
  expect(wrongSide.point[1]).toBeGreaterThan(outerRadius); // beyond the outer surface
  const settled = settleAxisSide(wrongSide, centroids, normals, areas, meanCurvature);
  expect(offAxis(settled.point, settled.direction)).toBeLessThan(0.5);
  expect(Math.abs(settled.radius - outerRadius)).toBeLessThan(0.6);
  // and the right side is kept
  const kept = settleAxisSide(truthAxis, centroids, normals, areas, meanCurvature);
  expect(kept.point).toEqual(truthAxis.point);
}
