import { beforeAll, describe, expect, it } from 'vitest';
import { analyseFragment, fractureLabelsForInput, type FragmentAnalysis } from '../../../core/geometry/analyse-fragment';
import { triangleNormalsAndAreas } from '../../../core/geometry/mesh';
import { brokenTube, type BrokenTube } from './broken-tube';

/** Area-weighted share of triangles whose fracture/original label agrees with the truth. */
function agreement(tube: BrokenTube, a: FragmentAnalysis): number {
  const labels = fractureLabelsForInput(a);
  const { areas } = triangleNormalsAndAreas(tube.mesh);
  let agree = 0, total = 0;
  for (let f = 0; f < labels.length; f++) {
    total += areas[f];
    if (labels[f] === tube.truth[f]) agree += areas[f];
  }
  return agree / total;
}

describe('segmentation of a tube broken by known surfaces (truth from the construction)', () => {
  let planar: BrokenTube, conical: BrokenTube;
  let a: FragmentAnalysis, b: FragmentAnalysis;
  const tilt = (40 * Math.PI) / 180;
  beforeAll(async () => {
    // A transverse plane at one end, a plane tilted 40 degrees at the other.
    planar = await brokenTube({ cuts: [{ normal: [0, 0, 1], offset: -30 }, { normal: [-Math.sin(tilt), 0, -Math.cos(tilt)], offset: -25 }] });
    // A cone meeting the wall at 45 degrees all round, and a transverse plane.
    conical = await brokenTube({ cuts: [{ baseZ: -45, baseRadius: 50, halfAngleDeg: 45 }, { normal: [0, 0, 1], offset: -30 }] });
    a = analyseFragment(planar.mesh);
    b = analyseFragment(conical.mesh);
  });

  it('labels at least 97 % of the area as the construction does', () => {
    expect(agreement(planar, a)).toBeGreaterThan(0.97);
    expect(agreement(conical, b)).toBeGreaterThan(0.97);
  });

  it('finds the outer and medullary surfaces and two fracture faces, with no seed points', () => {
    for (const r of [a, b]) {
      const classes = new Set(r.regions.map((x) => x.surfaceClass));
      expect(classes.has('outer-cortical')).toBe(true);
      expect(classes.has('medullary')).toBe(true);
      expect(r.fractureFaces.length).toBe(2);
      // Each face is a ring through the wall: two outline loops.
      for (const f of r.fractureFaces) expect(f.outlines.length).toBe(2);
    }
    // The shaft axis is the tube's axis (z).
    expect(Math.abs(a.axis.direction[2])).toBeGreaterThan(0.999);
    expect(a.axis.radius).toBeCloseTo(12, 0);
  });

  it('a transverse plane cut: area and width of the ring, right angle, transverse outline', () => {
    // Analytic: ring between radii 7 and 12 has area pi (144 - 49) = 298.5 (before roughening,
    // which adds a little) and width 5.
    const face = a.fractureFaces.find((f) => f.outlineClass === 'transverse' && f.angleClass === 'right');
    expect(face).toBeDefined();
    expect(face!.area).toBeGreaterThan(298);
    expect(face!.area).toBeLessThan(330);
    expect(face!.meanWidth).toBeGreaterThan(4.5);
    expect(face!.meanWidth).toBeLessThan(6.5);
    expect(face!.meanAngleDeg).toBeGreaterThan(80);
    expect(face!.breakAge.suggestion).toBe('dry');
    expect(face!.points.length).toBeGreaterThan(0);
    expect(face!.points.length).toBe(face!.normals.length);
  });

  it('a plane tilted 40 degrees: outline alignment with the axis as the cylinder-plane section predicts', () => {
    // Analytic: the section of the cylinder x^2 + y^2 = R^2 by z = x tan(t) has tangent
    // (-sin p, cos p, -sin p tan t); length-weighted mean |tangent . z| =
    // integral |sin p| tan t dp / integral sqrt(1 + sin^2 p tan^2 t) dp.
    const tt = Math.tan(tilt);
    let num = 0, den = 0;
    for (let i = 0; i < 10000; i++) {
      const p = ((i + 0.5) / 10000) * 2 * Math.PI;
      num += Math.abs(Math.sin(p)) * tt;
      den += Math.sqrt(1 + Math.sin(p) ** 2 * tt * tt);
    }
    const face = a.fractureFaces.find((f) => f.outlineClass !== 'transverse');
    expect(face).toBeDefined();
    expect(Math.abs(face!.outlineAxisAlignment - num / den)).toBeLessThan(0.08);
    // Round the tube the angle between the tilted plane and the wall is 90 - asin(sin(t) |cos p|)
    // degrees, so the share within the right-angle tolerance d is (2 / pi) asin(sin(d) / sin(t)).
    const d = (a.settings.rightAngleToleranceDeg * Math.PI) / 180;
    const share = (2 / Math.PI) * Math.asin(Math.min(1, Math.sin(d) / Math.sin(tilt)));
    expect(Math.abs(face!.rightShare - share)).toBeLessThan(0.12);
    // The median angle: the angle at which half the outline's length (ds ~ sqrt(1 + sin^2 p
    // tan^2 t) dp) meets the wall more obliquely: 64.9 degrees, so the face is oblique. The
    // samples are some 18 plane fits 3.5 mm apart, hence the allowance.
    const rows: Array<[number, number]> = [];
    for (let i = 0; i < 10000; i++) {
      const p = ((i + 0.5) / 10000) * 2 * Math.PI;
      rows.push([90 - (Math.asin(Math.sin(tilt) * Math.abs(Math.cos(p))) * 180) / Math.PI, Math.sqrt(1 + Math.sin(p) ** 2 * tt * tt)]);
    }
    rows.sort((x, y) => x[0] - y[0]);
    const half = rows.reduce((s, r) => s + r[1], 0) / 2;
    let acc = 0, median = NaN;
    for (const [angle, w] of rows) if ((acc += w) >= half) { median = angle; break; }
    expect(Math.abs(face!.medianAngleDeg - median)).toBeLessThan(7);
    expect(face!.angleClass).toBe('oblique');
  });

  it('a conical cut meeting the wall at 45 degrees: oblique angle, suggests no dry break', () => {
    const face = b.fractureFaces.find((f) => f.angleClass === 'oblique');
    expect(face).toBeDefined();
    expect(face!.meanAngleDeg).toBeGreaterThan(35);
    expect(face!.meanAngleDeg).toBeLessThan(55);
    expect(face!.breakAge.suggestion).not.toBe('dry');
  });

  it('an analyst correction of a region class is applied', () => {
    // Every region of one fracture face called articular: that face is gone, the other stays.
    const face = a.fractureFaces[0];
    const ids = [...new Set(Array.from(face.triangleIds, (t) => a.regionOfTriangle[t]))];
    const corrected = analyseFragment(planar.mesh, {}, new Map(ids.map((id) => [id, 'articular' as const])));
    for (const id of ids) expect(corrected.regions[id].surfaceClass).toBe('articular');
    expect(corrected.fractureFaces.length).toBe(a.fractureFaces.length - 1);
  });
});
