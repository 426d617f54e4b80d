/**
 * An elliptic section whose wall is much thicker at the ends of its major axis than at those of
 * its minor one is not kept (shaft-section.ts, fitEllipseSection; setting
 * ellipseSectionMinorWallRatioMax). Truth from the construction (broken-tube.ts, manifold-3d):
 * - a slab off the outer side of a thick-walled three-lobed tube: outer radius 18 mm, cavity
 *   7.5 mm (the proportions of a cattle tibia's shaft wall, common practice), the wedge between
 *   two planes through the axis at +-50 or +-80 degrees cut by a plane parallel to the axis 11 mm
 *   from it (so no cavity is left) and across 30 mm either side of the middle, then scaled across
 *   the axis by 1 + 0.13 cos 3θ (three lobes, as the generator's tibia, demo-data/skeleton.ts
 *   tri 0.13). Its flat inner break lies under the outer surface like a cavity wall of a large
 *   flattened section, so the fit lays a cavity ellipse along it nearly touching the outer one at
 *   the minor ends; the section is a round tube, so any kept ellipse is spurious.
 * - a flattened tube of even wall (outer 21 x 12 mm, cavity 13 x 4 mm: the wall 8 mm at both
 *   axes, as a cortex of even thickness, whose inner face meets the axes at A - c and B - c;
 *   the generator's cattle metacarpal is about 21 x 12 / 12 x 3 mm) keeps its section.
 */
import { describe, expect, it } from 'vitest';
import { analyseFragment } from '../../../core/geometry/analyse-fragment';
import { triangleNormalsAndAreas } from '../../../core/geometry/mesh';
import { sectionWallRatio } from '../../../core/geometry/section-wall-ratio';
import { brokenTube, fractureAgreement, type BrokenTube } from './broken-tube';

const deg = Math.PI / 180;

function lobedSlab(halfDeg: number): Promise<BrokenTube> {
  const warp = (x: number, y: number, z: number): [number, number, number] => {
    const f = 1 + 0.13 * Math.cos(3 * Math.atan2(y, x));
    return [f * x, f * y, z];
  };
  const h = halfDeg * deg;
  return brokenTube({
    outerRadius: 18, innerRadius: 7.5, length: 80, roughness: 0.3, warp,
    cuts: [
      { normal: [1, 0, 0], offset: 11 },
      { normal: [Math.sin(h), Math.cos(h), 0], offset: 0 }, { normal: [Math.sin(h), -Math.cos(h), 0], offset: 0 },
      { normal: [0, 0, 1], offset: -30 }, { normal: [0, 0, -1], offset: -30 },
    ],
  });
}

describe('a slab off the outer side of a thick-walled three-lobed tube', () => {
  for (const half of [50, 80]) {
    it(`keeps the round model, not a cavity ellipse laid along its inner break (wedge of ${2 * half} degrees)`, async () => {
      const piece = await lobedSlab(half);
      const areas = triangleNormalsAndAreas(piece.mesh).areas;
      const off = analyseFragment(piece.mesh, { ellipseSectionMinorWallRatioMax: 0 });
      const on = analyseFragment(piece.mesh);
      // Measured without the check: 28.6 x 16.5 / 20.7 x 16.1 mm (100 degrees) and 29.3 x 16.7 /
      // 21.3 x 16.2 mm (160 degrees), walls 8.0 and 0.5 mm; agreement 0.671 -> 0.875 and 0.754 -> 0.894.
      const s = off.axis.section;
      expect(s).toBeDefined();
      expect(s!.outer[0] - s!.inner[0]).toBeGreaterThan(2.25 * (s!.outer[1] - s!.inner[1]));
      expect(on.axis.section).toBeUndefined();
      expect(fractureAgreement(on, piece.truth, areas)).toBeGreaterThan(fractureAgreement(off, piece.truth, areas) + 0.1);
      expect(fractureAgreement(on, piece.truth, areas)).toBeGreaterThan(0.85);
    }, 60_000);
  }
});

describe('a flattened tube of even wall', () => {
  it('keeps its elliptic section', async () => {
    const piece = await brokenTube({
      ellipticSection: { outer: [21, 12], inner: [13, 4] }, length: 80, roughness: 0.3,
      cuts: [
        { normal: [-Math.sin(-30 * deg), Math.cos(-30 * deg), 0], offset: 0 },
        { normal: [Math.sin(60 * deg), -Math.cos(60 * deg), 0], offset: 0 },
        { normal: [0, 0, 1], offset: -25 }, { normal: [0, 0, -1], offset: -25 },
      ],
    });
    const on = analyseFragment(piece.mesh);
    const off = analyseFragment(piece.mesh, { ellipseSectionMinorWallRatioMax: 0 });
    const s = on.axis.section;
    expect(s).toBeDefined();
    expect(s).toEqual(off.axis.section);
    // Construction: walls 8 mm at both axes (ratio 1).
    expect(sectionWallRatio(s!.outer[0], s!.outer[1], s!.inner[0], s!.inner[1])).toBeLessThan(2);
    expect(Math.abs(s!.outer[0] - 21)).toBeLessThan(1.5);
  }, 60_000);
});
