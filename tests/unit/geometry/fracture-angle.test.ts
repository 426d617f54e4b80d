/**
 * The fracture angle (Villa & Mahieu 1991: the angle between the fracture surface and the
 * cortical surface, read across the break edge) against analytic geometry. Every test piece is
 * a tube of outer radius R = 12 mm cut by a surface whose angle with the wall is known in closed
 * form (analytic geometry of a cylinder and the cutting surface); the cut faces are left smooth
 * so that the construction alone decides the answer. Folded angles: 90 is a right angle.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { analyseFragment, type FragmentAnalysis } from '../../../core/geometry/analyse-fragment';
import { fractureFaces, type FractureFace } from '../../../core/geometry/fracture-faces';
import { triangleNormalsAndAreas } from '../../../core/geometry/mesh';
import { triangleCentroids } from '../../../core/geometry/normal-filter';
import { SURFACE_CLASSES } from '../../../core/geometry/surface-classes';
import { buildTopology } from '../../../core/geometry/topology';
import { brokenTube, type Cut } from './broken-tube';

const R = 12;
const deg = (rad: number): number => (rad * 180) / Math.PI;
const folded = (f: FractureFace): number[] => Array.from(f.anglesDeg, (a) => Math.min(a, 180 - a));

/** Shift along the axis by A sin(angle round the axis): cylinders about z map onto themselves. */
const wave = (A: number) => (x: number, y: number, z: number): [number, number, number] => {
  const rho = Math.hypot(x, y);
  return [x, y, rho > 0 ? z + (A * y) / rho : z];
};

async function analyse(cuts: Cut[], warp?: (x: number, y: number, z: number) => [number, number, number]): Promise<FragmentAnalysis> {
  const tube = await brokenTube({ cuts, roughness: 0, edgeLength: 0.9, warp });
  return analyseFragment(tube.mesh);
}

/** The face whose outline runs along the axis the most (a splinter side), or the largest. */
const alongAxis = (a: FragmentAnalysis): FractureFace => [...a.fractureFaces].sort((x, y) => (y.outlineAxisAlignment || 0) - (x.outlineAxisAlignment || 0))[0];
const largest = (a: FragmentAnalysis): FractureFace => [...a.fractureFaces].sort((x, y) => y.area - x.area)[0];

/** The angle at which half of a length-weighted distribution lies below. */
function weightedMedian(rows: Array<[number, number]>): number {
  rows.sort((x, y) => x[0] - y[0]);
  const half = rows.reduce((s, r) => s + r[1], 0) / 2;
  let acc = 0;
  for (const [v, w] of rows) if ((acc += w) >= half) return v;
  return NaN;
}

/**
 * The analysis's inputs to fractureFaces for `a`, with the outer wall's triangle normals turned
 * by `tiltDeg` each, in directions round the radial one that step by the golden angle from
 * triangle to triangle (no two neighbours alike, no trend across the rim): what a rough,
 * scanned periosteal surface does to the normals of a few triangles beside a jagged rim.
 */
function scatteredOuterNormals(a: FragmentAnalysis, tiltDeg: number) {
  const { normals, areas } = triangleNormalsAndAreas(a.mesh);
  const centroids = triangleCentroids(a.mesh.positions, a.mesh.triangles);
  const outer = SURFACE_CLASSES.indexOf('outer-cortical');
  const tilt = (tiltDeg * Math.PI) / 180;
  let turned = 0;
  for (let t = 0; t < areas.length; t++) {
    if (a.triangleClass[t] !== outer) continue;
    const rho = Math.hypot(centroids[3 * t], centroids[3 * t + 1]);
    const ex = centroids[3 * t] / rho, ey = centroids[3 * t + 1] / rho;
    const psi = t * 2.399963229728653;
    // Tangent direction cos(psi) e_phi + sin(psi) e_z, with e_phi = (-ey, ex, 0).
    normals[3 * t] = Math.cos(tilt) * ex - Math.sin(tilt) * Math.cos(psi) * ey;
    normals[3 * t + 1] = Math.cos(tilt) * ey + Math.sin(tilt) * Math.cos(psi) * ex;
    normals[3 * t + 2] = Math.sin(tilt) * Math.sin(psi);
    turned++;
  }
  return { turned, ctx: faceInputs(a, { triNormals: normals }) };
}

/**
 * fractureFaces' inputs as the analysis of `a` gives them (smooth faces: roughness 1), with any
 * of the per-triangle arrays replaced (turned normals, relabelled classes, given face groups).
 */
function faceInputs(a: FragmentAnalysis, over: { triNormals?: Float32Array; triClass?: Uint8Array; faceGroup?: Int32Array } = {}) {
  const { normals, areas } = triangleNormalsAndAreas(a.mesh);
  const centroids = triangleCentroids(a.mesh.positions, a.mesh.triangles);
  return {
    mesh: a.mesh, neighbours: buildTopology(a.mesh).neighbours, triNormals: normals, areas, centroids, triClass: a.triangleClass,
    triRoughness: new Float32Array(areas.length).fill(1), medianRoughness: 1, axis: a.axis, samples: a.samples, settings: a.settings,
    ...over,
  };
}

describe('fracture angle against analytic geometry (smooth cuts through a tube, R = 12 mm)', () => {
  let transverse: FragmentAnalysis, radialChord: FragmentAnalysis, offsetChord: FragmentAnalysis;
  let cone: FragmentAnalysis, wavy: FragmentAnalysis, bevelledWavy: FragmentAnalysis, tilted: FragmentAnalysis;
  const tilt = (40 * Math.PI) / 180;
  beforeAll(async () => {
    transverse = await analyse([{ normal: [0, 0, 1], offset: -30 }]);
    // Splinter-like cuts along the shaft: a plane parallel to the axis at distance d meets the
    // wall x^2 + y^2 = R^2 where the wall's normal (x, y)/R makes acos(d / R) with the plane's
    // normal (1, 0, 0): a folded angle of 90 - asin(d / R) at the outer rim.
    radialChord = await analyse([{ normal: [-1, 0, 0], offset: 0 }, { normal: [0, 0, 1], offset: -35 }]);
    offsetChord = await analyse([{ normal: [-1, 0, 0], offset: -6 }, { normal: [0, 0, 1], offset: -35 }]);
    // A cone about the axis with half angle h meets the wall (parallel to the axis) at h.
    cone = await analyse([{ baseZ: -45, baseRadius: 50, halfAngleDeg: 30 }]);
    // z = A sin(phi): a wavy front ruled by radial lines, so right-angled all round.
    wavy = await analyse([{ normal: [0, 0, 1], offset: -30 }], wave(6));
    // z = A sin(phi) - rho cot(h) + c: the cone's bevel on a wavy front (see the test).
    bevelledWavy = await analyse([{ baseZ: -45, baseRadius: 50, halfAngleDeg: 60 }], wave(6));
    tilted = await analyse([{ normal: [-Math.sin(tilt), 0, -Math.cos(tilt)], offset: 0 }]);
  }, 60_000);

  it('a transverse plane meets the wall at 90 degrees: right', () => {
    const face = largest(transverse);
    for (const a of folded(face)) expect(a).toBeGreaterThan(88);
    expect(face.angleClass).toBe('right');
  });

  it('a plane through the axis (a splinter edge with no bevel) reads 90 along the shaft, not less', () => {
    // The wall curves away from the edge: a plane fitted some millimetres off the edge leans
    // by about distance / R (7-8 degrees here); the angle must be read at the edge itself.
    const face = alongAxis(radialChord);
    expect(face.medianAngleDeg).toBeGreaterThan(88);
    expect(face.angleClass).toBe('right');
  });

  it('a plane parallel to the axis 6 mm off it meets the outer wall at 90 - asin(6/12) = 60 degrees', () => {
    const face = alongAxis(offsetChord);
    const expected = 90 - deg(Math.asin(6 / R));
    expect(Math.abs(face.medianAngleDeg - expected)).toBeLessThan(2);
    expect(face.angleClass).toBe('oblique');
  });

  it('a cone of half angle 30 degrees meets the wall at 30 degrees all round: oblique', () => {
    const face = cone.fractureFaces.find((f) => f.angleClass !== 'right');
    expect(face).toBeDefined();
    const angles = folded(face!);
    expect(angles.length).toBeGreaterThan(10);
    for (const a of angles) expect(Math.abs(a - 30)).toBeLessThan(2.5);
    expect(face!.angleClass).toBe('oblique');
  });

  it('a plane tilted 40 degrees: the angle round the rim, its median and right-angle share as the closed form gives', () => {
    // The plane z = x tan(t) + c meets the wall at 90 - asin(sin(t) |cos(p)|) degrees at the
    // angle p round the axis (normals (-sin t, 0, cos t) and (cos p, sin p, 0)); the rim's
    // length element is sqrt(1 + sin^2(p) tan^2(t)) dp. The share within d of 90 is
    // (2 / pi) asin(sin(d) / sin(t)) by angle; weighted by length, computed numerically.
    const d = tilted.settings.rightAngleToleranceDeg;
    const rows: Array<[number, number]> = [];
    let within = 0, total = 0;
    for (let i = 0; i < 10000; i++) {
      const p = ((i + 0.5) / 10000) * 2 * Math.PI;
      const angle = 90 - deg(Math.asin(Math.sin(tilt) * Math.abs(Math.cos(p))));
      const w = Math.sqrt(1 + Math.sin(p) ** 2 * Math.tan(tilt) ** 2);
      rows.push([angle, w]);
      total += w;
      if (90 - angle <= d) within += w;
    }
    const face = tilted.fractureFaces.find((f) => f.angleClass !== 'right');
    expect(face).toBeDefined();
    const angles = folded(face!);
    expect(angles.length).toBeGreaterThan(15);
    for (const a of angles) expect(a).toBeGreaterThan(90 - deg(tilt) - 2);
    expect(Math.abs(face!.medianAngleDeg - weightedMedian(rows))).toBeLessThan(3);
    expect(Math.abs(face!.rightShare - within / total)).toBeLessThan(0.1);
    expect(face!.angleClass).toBe('oblique');
  });

  it('a wavy front ruled by radial lines meets the wall at right angles: an outline alone makes no oblique angle', () => {
    // The surface z = A sin(phi) has normal proportional to (-A cos(phi) / rho) e_phi + e_z,
    // perpendicular to the wall's normal e_rho: 90 degrees wherever it crosses the wall.
    const face = largest(wavy);
    expect(face.outlineAxisAlignment).toBeGreaterThan(0.2);
    expect(face.medianAngleDeg).toBeGreaterThan(87);
    expect(face.angleClass).toBe('right');
  });

  it('a bevelled wavy front: the angle round the rim follows the closed form', () => {
    // Surface F = z - A sin(phi) + rho cot(h) = const, gradient (cot h) e_rho - (A cos(phi) / rho)
    // e_phi + e_z; against the wall's normal e_rho the folded angle at rho = R is
    // 90 - asin(cot h / sqrt(1 + cot^2 h + (A cos(phi) / R)^2)), from 60 (where the front runs
    // round the shaft) to 67.8 degrees (where it is steepest), for h = 60 degrees and A = 6 mm.
    // Samples are spaced along the rim, whose length element is sqrt(R^2 + A^2 cos^2 phi) dphi.
    const cot = 1 / Math.tan((60 * Math.PI) / 180), A = 6;
    const rows: Array<[number, number]> = [];
    for (let i = 0; i < 10000; i++) {
      const phi = ((i + 0.5) / 10000) * 2 * Math.PI;
      const s = (A * Math.cos(phi)) / R;
      rows.push([90 - deg(Math.asin(cot / Math.sqrt(1 + cot * cot + s * s))), Math.sqrt(R * R + A * A * Math.cos(phi) ** 2)]);
    }
    const face = bevelledWavy.fractureFaces.find((f) => f.angleClass !== 'right');
    expect(face).toBeDefined();
    expect(Math.abs(face!.medianAngleDeg - weightedMedian(rows))).toBeLessThan(2.5);
    for (const a of folded(face!)) {
      expect(a).toBeGreaterThan(57);
      expect(a).toBeLessThan(71);
    }
    expect(face!.angleClass).toBe('oblique');
  });

  it('across the shaft, scattered surface normals at the rim do not tilt the angle: a transverse cut still reads 90', () => {
    // The transverse cut again (90 degrees all round, closed form), with every outer-wall
    // triangle normal turned 15 degrees (scatteredOuterNormals). Their mean over a patch beside
    // the rim stays near radial; a linear fit extrapolated 1-3.5 mm out to the edge multiplies
    // their scatter (samples down to 58 degrees, median 79, without angleMeanEdgeAxisMax).
    const { turned, ctx } = scatteredOuterNormals(transverse, 15);
    expect(turned).toBeGreaterThan(500);
    const faceOf = (settings: typeof ctx.settings) => fractureFaces({ ...ctx, settings }).sort((x, y) => y.area - x.area)[0];
    const face = faceOf(ctx.settings);
    expect(face.anglesDeg.length).toBeGreaterThan(15);
    expect(face.medianAngleDeg).toBeGreaterThan(84);
    for (const a of folded(face)) expect(a).toBeGreaterThan(78);
    expect(face.angleClass).toBe('right');
    // Switched off, the extrapolated fit scatters (the same check, failing).
    const off = faceOf({ ...ctx.settings, angleMeanEdgeAxisMax: 0 });
    expect(Math.min(...folded(off))).toBeLessThan(70);
  });

  it('a front that curves through the wall is read near the rim: bevelled 35 degrees there, right-angled 2.5 mm in, oblique', async () => {
    // The transverse cut bent by z += tan(b) u - tan(b) u^2 / (2 D), u = R - rho the depth into
    // the wall from the outer surface (a shift along the axis, so the walls stay cylinders):
    // the front's slope along the radius is tan(b) (1 - u / D), so it meets the outer wall at
    // 90 - b = 55 degrees (closed form) and runs square to the wall from u = D = 2.5 mm on, as a
    // splinter face that turns through the wall does. A break-face normal averaged out to 3.5 mm
    // from the edge point reads 80 (right); out to angleFaceRadiusMm (2.5 mm) about 75.
    const b = (35 * Math.PI) / 180, D = 2.5;
    const bend = (x: number, y: number, z: number): [number, number, number] => {
      const u = R - Math.hypot(x, y);
      return [x, y, z + Math.tan(b) * u - (Math.tan(b) * u * u) / (2 * D)];
    };
    const a = await analyse([{ normal: [0, 0, 1], offset: -30 }], bend);
    const face = largest(a);
    expect(face.anglesDeg.length).toBeGreaterThan(15);
    expect(face.medianAngleDeg).toBeGreaterThan(55);
    expect(face.medianAngleDeg).toBeLessThan(78);
    expect(face.angleClass).toBe('oblique');
  }, 30_000);

  it('a short rim against the outer surface is sampled more densely: a 5 mm stretch of the 60-degree chord still reads oblique', () => {
    // The chord 6 mm off the axis again (90 - asin(6/12) = 60 degrees at the outer rim, closed
    // form), with the outer wall left as outer surface only along 5 mm of one rim (the rest
    // relabelled medullary, where no angle is read): at anglePlaneRadiusMm (3.5 mm) spacing that
    // rim holds at most 2 samples, too few for a class; sampled at half and a quarter of it, it
    // holds enough, each still reading the closed form.
    const a = offsetChord;
    const chord = alongAxis(a);
    const { areas } = triangleNormalsAndAreas(a.mesh);
    const centroids = triangleCentroids(a.mesh.positions, a.mesh.triangles);
    let zc = 0;
    for (const t of chord.triangleIds) zc += centroids[3 * t + 2] / chord.triangleIds.length;
    const outer = SURFACE_CLASSES.indexOf('outer-cortical'), medullary = SURFACE_CLASSES.indexOf('medullary');
    const triClass = Uint8Array.from(a.triangleClass, (c, t) => (c === outer && !(centroids[3 * t + 1] > 0 && Math.abs(centroids[3 * t + 2] - zc) < 2.5) ? medullary : c));
    const faceGroup = new Int32Array(areas.length).fill(-1);
    for (const f of a.fractureFaces) for (const t of f.triangleIds) faceGroup[t] = f.id;
    const faceOf = (settings: typeof a.settings) => fractureFaces({ ...faceInputs(a, { triClass, faceGroup }), settings })
      .find((f) => f.triangleIds.includes(chord.triangleIds[0]))!;
    const expected = 90 - deg(Math.asin(6 / R));
    const face = faceOf(a.settings);
    // A class needs 3 samples (angleMinSamples).
    expect(face.anglesDeg.length).toBeGreaterThanOrEqual(3);
    for (const x of folded(face)) expect(Math.abs(x - expected)).toBeLessThan(3);
    expect(face.angleClass).toBe('oblique');
    // At the plane radius's spacing only, the stretch is too short for a class.
    const sparse = faceOf({ ...a.settings, angleMinSpacingMm: 100 });
    expect(sparse.anglesDeg.length).toBeLessThan(3);
    expect(sparse.angleClass).toBe('indeterminate');
    // The whole rim (the analysis's own classes) has enough samples at that spacing: read as before.
    const whole = (settings: typeof a.settings) => fractureFaces({ ...faceInputs(a, { faceGroup }), settings })
      .find((f) => f.triangleIds.includes(chord.triangleIds[0]))!.anglesDeg;
    expect(whole(a.settings).length).toBeGreaterThan(3);
    expect(Array.from(whole(a.settings))).toEqual(Array.from(whole({ ...a.settings, angleMinSpacingMm: 100 })));
  });

  it('a failed bone-surface fit at the rim (normals turned 50 degrees off the wall) is caught by the shaft check', () => {
    // The transverse cut again, with the outer wall's triangle normals within 5 mm of the cut
    // turned by 50 degrees towards the axis direction (what a chipped or rounded rim does to a
    // fit on a few triangles): the fitted surface normal then makes 90 - 50 = 40 degrees with
    // the face. The tube's wall is parallel to the axis, so the shaft model's radial direction
    // is the true surface normal and the face is right-angled (90 degrees).
    const a = transverse;
    const face = largest(a);
    const { normals, areas } = triangleNormalsAndAreas(a.mesh);
    const centroids = triangleCentroids(a.mesh.positions, a.mesh.triangles);
    let zc = 0;
    for (const t of face.triangleIds) zc += centroids[3 * t + 2] / face.triangleIds.length;
    const outer = SURFACE_CLASSES.indexOf('outer-cortical');
    const turn = (50 * Math.PI) / 180;
    let turned = 0;
    for (let t = 0; t < areas.length; t++) {
      if (a.triangleClass[t] !== outer || Math.abs(centroids[3 * t + 2] - zc) > 5) continue;
      const rho = Math.hypot(centroids[3 * t], centroids[3 * t + 1]);
      normals[3 * t] = (Math.cos(turn) * centroids[3 * t]) / rho;
      normals[3 * t + 1] = (Math.cos(turn) * centroids[3 * t + 1]) / rho;
      normals[3 * t + 2] = Math.sin(turn);
      turned++;
    }
    expect(turned).toBeGreaterThan(50);
    const faceOf = (settings: typeof a.settings) => fractureFaces({ ...faceInputs(a, { triNormals: normals }), settings }).sort((x, y) => y.area - x.area)[0];
    expect(a.axis.support).toBeGreaterThanOrEqual(a.settings.angleShaftSupportMin);
    const checked = faceOf(a.settings);
    expect(checked.medianAngleDeg).toBeGreaterThan(88);
    expect(checked.angleClass).toBe('right');
    // Without the check (any lean accepted) the failed fit decides: 40 degrees, oblique.
    const unchecked = faceOf({ ...a.settings, angleFitShaftMaxDeg: 180 });
    expect(Math.abs(unchecked.medianAngleDeg - 40)).toBeLessThan(3);
    expect(unchecked.angleClass).toBe('oblique');
  });
});
