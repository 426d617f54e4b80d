/**
 * The elliptic section's wall check (shaft-section.ts fitEllipseSection with a wall check,
 * strict-wall-check.ts; settings `ellipseSectionWallCheck`, `ellipseSectionWallShareMax` and
 * `shaftCentreWallStrictSupportMin`): a section whose centre
 * lies inside the material is refused on a clear shaft piece, as the consensus and the section
 * segment / point search refuse such centres. Rows built from analytic geometry: a piece of a
 * flattened tube, outer ellipse 22 x 12 mm and cavity 15 x 5 mm about the z axis (the proportions
 * of section-wall-ratio.test.ts), whose wall pairs (each outer point with the cavity point of the
 * same parameter, head-on) make the fit keep that section about the z axis. The inward rays'
 * lengths (what wall-crossing.ts reads) are those of one of two objects with the same faces:
 * - the tube itself: a ray along the inward normal of the outer surface stops where it meets
 *   the cavity ellipse (ray-ellipse intersection, a quadratic), so the rays aimed at the centre
 *   stop before it (wall-crossing share 0, wall-crossing.ts's closed form for a point in the
 *   cavity);
 * - the same faces on a solid wall (the faces the fit takes for a cavity are breaks inside the
 *   wall, as on the thick tibia wall of dev s398 QS-10994): the rays run on to the far side of
 *   the outer ellipse, so every ray aimed at the centre passes it in the material (share 1).
 */
import { describe, expect, it } from 'vitest';
import type { ShaftAxis } from '../../../core/geometry/shaft-axis';
import { ellipseFitOptions, fitEllipseSection } from '../../../core/geometry/shaft-section';
import { analysisSettings } from '../../../core/geometry/settings';
import { ellipticTubePiece } from './elliptic-tube-piece';
import { strictWallCheck } from '../../../core/geometry/strict-wall-check';

const A = 22, B = 12, Ai = 15, Bi = 5;

/** Distance along the ray p + s u (u unit) to the ellipse x²/a² + y²/b² = 1 (the larger root: leaving it, or the first entry when `first`); undefined where it misses. */
function toEllipse(px: number, py: number, ux: number, uy: number, a: number, b: number, first: boolean): number | undefined {
  const qa = (ux / a) ** 2 + (uy / b) ** 2, qb = 2 * ((px * ux) / (a * a) + (py * uy) / (b * b)), qc = (px / a) ** 2 + (py / b) ** 2 - 1;
  const disc = qb * qb - 4 * qa * qc;
  if (disc < 0) return undefined;
  const s1 = (-qb - Math.sqrt(disc)) / (2 * qa), s2 = (-qb + Math.sqrt(disc)) / (2 * qa);
  if (first) return s1 > 1e-9 ? s1 : s2 > 1e-9 ? s2 : undefined;
  return s2 > 1e-9 ? s2 : undefined;
}

/**
 * The piece from `fromDeg` to `toDeg` on 10 sections 3 mm apart; areas are arc lengths. Each
 * outer triangle shoots one ray (exit: the cavity triangle of the same parameter, cosine 1) and
 * each cavity triangle one back. `solid`: the rays' lengths are those of a solid wall (above).
 */
function piece(fromDeg: number, toDeg: number, solid: boolean) {
  // Inward rays run along minus the normal.
  return ellipticTubePiece(A, B, Ai, Bi, fromDeg, toDeg, 120, (o, m) => {
    const throughWall = toEllipse(o.x, o.y, -o.nx, -o.ny, A, B, false)!;
    return [solid ? throughWall : toEllipse(o.x, o.y, -o.nx, -o.ny, Ai, Bi, true) ?? throughWall, toEllipse(m.x, m.y, -m.nx, -m.ny, A, B, false)!];
  }) as ReturnType<typeof ellipticTubePiece> & { rays: { distance: Float32Array } };
}

const settings = analysisSettings();
const wallOf = (rays: { triangles: Uint32Array; distance: Float32Array }) => ({
  rays, shareMax: settings.shaftCentreWallShareMax, tolerance: settings.shaftCentreWallToleranceMm, supportMin: settings.shaftCentreWallSupportMin,
  strictShareMax: settings.shaftCentreWallStrictShareMax, strictSupportMin: settings.shaftCentreWallStrictSupportMin,
});
const on = ellipseFitOptions(settings);
const off = ellipseFitOptions(analysisSettings({ ellipseSectionWallCheck: false }));
/** The section fitted about `axis` on a piece, with the wall check and without it. */
function fitBothWays(axis: ShaftAxis, p: ReturnType<typeof piece>) {
  const fit = (options: typeof on) => fitEllipseSection(axis, p.centroids, p.normals, p.areas, p.rays, options, wallOf(p.rays));
  return { checked: fit(on), unchecked: fit(off) };
}

describe('fitEllipseSection with the wall check', () => {
  // A clear shaft piece (support 0.9, at least shaftCentreWallStrictSupportMin 0.85), the round centre 4 mm off.
  const axis: ShaftAxis = { direction: [0, 0, 1], point: [4, 0, 0], radius: 18, support: 0.9 };

  it('keeps a section whose centre lies in the cavity, as without the check', () => {
    const p = piece(-40, 80, false);
    const { checked, unchecked } = fitBothWays(axis, p);
    // Truth: the section about the z axis (construction); measured within 1 mm of 22 mm and 5 mm.
    expect(unchecked.section).toBeDefined();
    expect(Math.hypot(unchecked.point[0], unchecked.point[1])).toBeLessThan(1);
    expect(Math.abs(unchecked.section!.outer[0] - A)).toBeLessThan(1);
    expect(checked.section).toEqual(unchecked.section);
    expect(checked.point).toEqual(unchecked.point);
    // Analytic: the rays aimed at the centre stop at the cavity ellipse around it (share 0).
    expect(strictWallCheck(wallOf(p.rays), axis.support, axis.direction, p.centroids, p.normals, p.areas)!(unchecked.point[0], unchecked.point[1])).toBe(false);
  });

  it('refuses the same section where its centre lies in the material, keeping the round axis', () => {
    const p = piece(-40, 80, true);
    const { checked, unchecked } = fitBothWays(axis, p);
    // Without the check the wall pairs alone decide: the same section as above.
    expect(unchecked.section).toBeDefined();
    expect(Math.hypot(unchecked.point[0], unchecked.point[1])).toBeLessThan(1);
    // With it: every ray aimed at the centre crosses it in the material (share 1 > 0.5), so the
    // axis fitted before is kept as it was.
    expect(checked.section).toBeUndefined();
    expect(checked).toEqual(axis);
  });

  it('applies only on clear shaft pieces (axis support at least shaftCentreWallStrictSupportMin)', () => {
    // Support 0.8: a piece that may hold a bone end, whose axis runs through solid bone there.
    const p = piece(-40, 80, true);
    const nearEnd: ShaftAxis = { ...axis, support: 0.8 };
    expect(strictWallCheck(wallOf(p.rays), nearEnd.support, nearEnd.direction, p.centroids, p.normals, p.areas)).toBeUndefined();
    const checked = fitEllipseSection(nearEnd, p.centroids, p.normals, p.areas, p.rays, on, wallOf(p.rays));
    expect(checked.section).toBeDefined();
  });
});
