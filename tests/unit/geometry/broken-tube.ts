/**
 * A shaft-like test piece with analytic truth: a tube (outer radius R, inner radius r) cut by
 * planes with manifold-3d, the cut faces roughened by a smooth displacement along the plane
 * normal. A triangle is a fracture triangle exactly when its three corners lay on a cut plane
 * before roughening, so the truth comes from the construction, not from our code.
 */
import Module from 'manifold-3d';
import { vertexRings } from '../../../core/geometry/adjacency';
import { analyseFragment, type FragmentAnalysis } from '../../../core/geometry/analyse-fragment';
import { principalCurvatures } from '../../../core/geometry/curvature';
import { triangleNormalsAndAreas, vertexNormals, type TriangleMesh } from '../../../core/geometry/mesh';
import { triangleCentroids } from '../../../core/geometry/normal-filter';
import type { AnalysisSettings } from '../../../core/geometry/settings';
import type { ShaftAxis } from '../../../core/geometry/shaft-axis';

/** A plane cut: keeps the side the unit normal points into. */
export interface PlaneCut {
  normal: [number, number, number];
  offset: number;
}

/**
 * A conical cut: keeps the part of the tube inside a cone about the tube's axis whose radius
 * shrinks from `baseRadius` at z = `baseZ` by tan(halfAngle) per mm of z, so the break meets
 * the tube wall (parallel to the axis) at a constant dihedral angle equal to the half angle
 * all round, i.e. 90 - halfAngle degrees away from a right angle.
 */
export interface ConeCut {
  baseZ: number;
  baseRadius: number;
  halfAngleDeg: number;
  /** Keep the part outside the cone instead (the other side of the same break). */
  keepOutside?: boolean;
}

/**
 * A cylindrical cut parallel to the tube's axis: keeps the part of the tube within `radius` of
 * the line through (x, y) = `centre` along z, so the break is a convex cylinder face whose
 * normal lines all pass that line.
 */
export interface CylinderCut {
  centre: [number, number];
  radius: number;
}

export type Cut = PlaneCut | ConeCut | CylinderCut;

export interface BrokenTube {
  mesh: TriangleMesh;
  /** 1 = fracture, 0 = original surface, per triangle. */
  truth: Uint8Array;
  /** Index in `cuts` of the cut a fracture triangle lies on, -1 on original surface, per triangle. */
  cutOf: Int8Array;
}

let wasm: Awaited<ReturnType<typeof Module>> | undefined;

export type BrokenTubeOptions = Parameters<typeof brokenTube>[0];

export async function brokenTube(options: {
  outerRadius?: number;
  innerRadius?: number;
  length?: number;
  cuts: Cut[];
  edgeLength?: number;
  roughness?: number;
  /**
   * A smooth map applied to every vertex last (after roughening and labelling), e.g. a shift
   * along the axis by A sin(angle round the axis), which bends a cut into a wavy or helical
   * one while the tube walls stay where they were.
   */
  warp?: (x: number, y: number, z: number) => [number, number, number];
  /**
   * A lens-shaped medullary cavity instead of the round one: the intersection of two cylinders
   * whose arcs meet at x = +-halfWidth (pointed ends: concave creases of the medullary surface
   * running along the tube) and reach y = +-halfHeight. innerRadius is then not used.
   */
  lensCavity?: { halfWidth: number; halfHeight: number };
  /**
   * An elliptic section instead of the round one: outer and cavity ellipses about the axis with
   * semi-axes (along x, along y), e.g. a flattened shaft with a slit-like cavity. outerRadius,
   * innerRadius and lensCavity are then not used.
   */
  ellipticSection?: { outer: [number, number]; inner: [number, number] };
}): Promise<BrokenTube> {
  if (!wasm) {
    wasm = await Module();
    wasm.setup();
  }
  const { Manifold } = wasm;
  const R = options.outerRadius ?? 12, r = options.innerRadius ?? 7, L = options.length ?? 80;
  const edge = options.edgeLength ?? 1;
  const amp = options.roughness ?? 0.25;
  const es = options.ellipticSection;
  const outer = es ? Manifold.cylinder(L, es.outer[1], es.outer[1], 192, true).scale([es.outer[0] / es.outer[1], 1, 1]) : Manifold.cylinder(L, R, R, 96, true);
  let inner;
  if (es) {
    inner = Manifold.cylinder(L + 2, es.inner[1], es.inner[1], 192, true).scale([es.inner[0] / es.inner[1], 1, 1]);
  } else if (options.lensCavity) {
    // Circle through (+-w, 0) and (0, h) centred at (0, -d): rho = (w² + h²) / 2h, d = rho - h.
    const { halfWidth: w, halfHeight: h } = options.lensCavity;
    const rho = (w * w + h * h) / (2 * h), d = rho - h;
    const up = Manifold.cylinder(L + 2, rho, rho, 192, true).translate([0, -d, 0]);
    const down = Manifold.cylinder(L + 2, rho, rho, 192, true).translate([0, d, 0]);
    inner = up.intersect(down);
    up.delete();
    down.delete();
  } else {
    inner = Manifold.cylinder(L + 2, r, r, 96, true);
  }
  let solid = outer.subtract(inner);
  outer.delete();
  inner.delete();
  for (const c of options.cuts) {
    let next;
    if ('normal' in c) {
      next = solid.trimByPlane(c.normal, c.offset);
    } else if ('centre' in c) {
      const cyl = Manifold.cylinder(L + 4, c.radius, c.radius, 192, true).translate([c.centre[0], c.centre[1], 0]);
      next = solid.intersect(cyl);
      cyl.delete();
    } else {
      const ta = Math.tan((c.halfAngleDeg * Math.PI) / 180);
      const h = (c.baseRadius - 0.01) / ta;
      const cone = Manifold.cylinder(h, c.baseRadius, 0.01, 192, false).translate([0, 0, c.baseZ]);
      next = c.keepOutside ? solid.subtract(cone) : solid.intersect(cone);
      cone.delete();
    }
    solid.delete();
    solid = next;
  }
  const refined = solid.refineToLength(edge);
  solid.delete();
  const m = refined.getMesh();
  refined.delete();
  const np = m.numProp;
  const nv = m.vertProperties.length / np;
  const positions = new Float32Array(nv * 3);
  const onCut = new Int8Array(nv).fill(-1);
  for (let v = 0; v < nv; v++) {
    const x = m.vertProperties[v * np], y = m.vertProperties[v * np + 1], z = m.vertProperties[v * np + 2];
    let px = x, py = y, pz = z;
    options.cuts.forEach((c, i) => {
      let d: number, n: [number, number, number];
      if ('normal' in c) {
        d = x * c.normal[0] + y * c.normal[1] + z * c.normal[2] - c.offset;
        n = c.normal;
      } else if ('centre' in c) {
        // distance to the cylinder's side (its 192-gon's vertices lie on it), outward normal
        const rho = Math.hypot(x - c.centre[0], y - c.centre[1]);
        d = c.radius - rho;
        // points refined along a side edge of the 192-gon lie up to r (1 - cos(pi / 192)) inside it
        if (d >= 0 && d < c.radius * 1.5e-4) d = 0;
        n = rho > 0 ? [(c.centre[0] - x) / rho, (c.centre[1] - y) / rho, 0] : [0, 0, 1];
      } else {
        // distance to the cone's side, measured in the plane through the axis
        const ta = Math.tan((c.halfAngleDeg * Math.PI) / 180);
        const rho = Math.hypot(x, y);
        const cos = Math.cos((c.halfAngleDeg * Math.PI) / 180);
        d = (c.baseRadius - (z - c.baseZ) * ta - rho) * cos;
        const sin = Math.sin((c.halfAngleDeg * Math.PI) / 180);
        n = rho > 0 ? [(-x / rho) * cos, (-y / rho) * cos, -sin] : [0, 0, -1];
      }
      if (Math.abs(d) < 1e-3) {
        onCut[v] = i;
        const bump = amp * (Math.sin(1.7 * x + 0.3) * Math.cos(1.3 * y - 0.7) + 0.6 * Math.sin(2.9 * z + 1.1 * x));
        px -= bump * n[0];
        py -= bump * n[1];
        pz -= bump * n[2];
      }
    });
    if (options.warp) [px, py, pz] = options.warp(px, py, pz);
    positions[3 * v] = px;
    positions[3 * v + 1] = py;
    positions[3 * v + 2] = pz;
  }
  const triangles = Uint32Array.from(m.triVerts);
  const nt = triangles.length / 3;
  const truth = new Uint8Array(nt);
  const cutOf = new Int8Array(nt).fill(-1);
  for (let f = 0; f < nt; f++) {
    const a = onCut[triangles[3 * f]], b = onCut[triangles[3 * f + 1]], c = onCut[triangles[3 * f + 2]];
    truth[f] = a >= 0 && a === b && b === c ? 1 : 0;
    if (truth[f]) cutOf[f] = a;
  }
  return { mesh: { positions, triangles }, truth, cutOf };
}

/** Distance from the z axis (the tube's axis) of an axis line given by a point and a direction, at z = 0. */
/**
 * A splinter of a three-lobed tube (outer radius 13 mm, cavity 8.5 mm unless given, 80 mm long) cut along two
 * planes through its axis at `fromDeg` and `toDeg` and across 30 mm either side of the middle,
 * then mapped after labelling: turned about the axis by `twist` rad per mm of radius from the
 * outer surface in (a radial break becomes a spiral face), then scaled across the axis by
 * 1 + lobe cos 3θ (both radii at each θ by the same factor: the cavity stays the outer outline
 * scaled about the axis). The axis is the z axis.
 */
export function lobedTubePiece(o: { lobe: number; twist: number; fromDeg: number; toDeg: number; outerRadius?: number; innerRadius?: number }): Promise<BrokenTube> {
  const R = o.outerRadius ?? 13;
  const warp = (x: number, y: number, z: number): [number, number, number] => {
    const a = o.twist * (Math.hypot(x, y) - R);
    const X = x * Math.cos(a) - y * Math.sin(a), Y = x * Math.sin(a) + y * Math.cos(a);
    const f = 1 + o.lobe * Math.cos(3 * Math.atan2(Y, X));
    return [f * X, f * Y, z];
  };
  const a1 = (o.fromDeg * Math.PI) / 180, a2 = (o.toDeg * Math.PI) / 180;
  return brokenTube({
    outerRadius: R, innerRadius: o.innerRadius ?? 8.5, length: 80, roughness: 0.3, warp,
    cuts: [
      { normal: [-Math.sin(a1), Math.cos(a1), 0], offset: 0 },
      { normal: [Math.sin(a2), -Math.cos(a2), 0], offset: 0 },
      { normal: [0, 0, 1], offset: -30 }, { normal: [0, 0, -1], offset: -30 },
    ],
  });
}

export function offAxis(point: ArrayLike<number>, direction: ArrayLike<number>): number {
  const t = -point[2] / direction[2];
  return Math.hypot(point[0] + t * direction[0], point[1] + t * direction[1]);
}

/**
 * Area-weighted share of the input triangles whose fracture/original class from the analysis
 * (triangle class 0 = fracture) agrees with the tube's truth (1 = break face), weighted by the
 * input triangles' areas.
 */
export function fractureAgreement(
  analysis: { triangleClass: ArrayLike<number>; sourceTriangle: ArrayLike<number> }, truth: ArrayLike<number>, inputAreas: ArrayLike<number>,
): number {
  let agree = 0, total = 0;
  for (let f = 0; f < analysis.triangleClass.length; f++) {
    const src = analysis.sourceTriangle[f];
    total += inputAreas[src];
    if ((analysis.triangleClass[f] === 0 ? 1 : 0) === truth[src]) agree += inputAreas[src];
  }
  return agree / total;
}

/** Share of the area of cut `cut` (by construction, `cutOf`) that the analysis classes fracture (triangle class 0). */
export function cutReadAsBreak(
  analysis: { triangleClass: ArrayLike<number>; sourceTriangle: ArrayLike<number> }, cutOf: ArrayLike<number>, inputAreas: ArrayLike<number>, cut: number,
): number {
  let on = 0, read = 0;
  for (let f = 0; f < analysis.triangleClass.length; f++) {
    const src = analysis.sourceTriangle[f];
    if (cutOf[src] !== cut) continue;
    on += inputAreas[src];
    if (analysis.triangleClass[f] === 0) read += inputAreas[src];
  }
  return read / on;
}

/**
 * What `settleAxisSide` reads of a mesh, per triangle: centroid, unit normal, area and mean
 * curvature (the mean of its corners' (k1 + k2) / 2, as analyse-fragment.ts takes it).
 */
export function wallSideInputs(mesh: TriangleMesh): { centroids: Float32Array; normals: Float32Array; areas: Float64Array; meanCurvature: Float32Array } {
  const { normals, areas } = triangleNormalsAndAreas(mesh);
  const centroids = triangleCentroids(mesh.positions, mesh.triangles);
  const curvature = principalCurvatures(mesh, vertexNormals(mesh), vertexRings(mesh));
  const t = mesh.triangles;
  const meanCurvature = new Float32Array(areas.length);
  for (let f = 0; f < areas.length; f++) {
    let s = 0;
    for (let k = 0; k < 3; k++) s += curvature.k1[t[3 * f + k]] + curvature.k2[t[3 * f + k]];
    meanCurvature[f] = s / 6;
  }
  return { centroids, normals, areas, meanCurvature };
}

/**
 * The axis mirrored through the area centroid of the triangles (in x and y, at z = 0): where a
 * fit lands when the normal lines meet on the wrong side of the wall.
 */
export function mirroredThroughCentroid<T extends { point: number[] | readonly number[] }>(axis: T, centroids: ArrayLike<number>, areas: ArrayLike<number>): T {
  let cx = 0, cy = 0, w = 0;
  for (let f = 0; f < areas.length; f++) { cx += areas[f] * centroids[3 * f]; cy += areas[f] * centroids[3 * f + 1]; w += areas[f]; }
  return { ...axis, point: [2 * cx / w, 2 * cy / w, 0] };
}

/**
 * The tube's own axis (the z axis through `point`, default the origin) in place of the fitted
 * one, keeping the fit's support: with it only the stages after the axis fit are under test.
 */
/**
 * A splinter of the 12/8 mm tube (90 mm long, roughness 0.05, edges 0.8 mm) between two planes
 * through its axis at +-`side` radians from +x and across at z = +-30 mm, with `extra` cuts,
 * analysed with each named set of setting overrides about the tube's own axis (the z axis):
 * the set-up of the tests that switch one region rule off and on.
 */
export function analysedSplinter<K extends string>(side: number, extra: Cut[], runs: Record<K, Partial<AnalysisSettings>>): ReturnType<typeof analysedTube<K>> {
  return analysedTube({
    outerRadius: 12, innerRadius: 8, length: 90, roughness: 0.05, edgeLength: 0.8,
    cuts: [
      { normal: [Math.sin(side), Math.cos(side), 0], offset: 0 }, { normal: [Math.sin(side), -Math.cos(side), 0], offset: 0 },
      { normal: [0, 0, 1], offset: -30 }, { normal: [0, 0, -1], offset: -30 },
      ...extra,
    ],
  }, runs, tubeAxis(12));
}

export function tubeAxis(radius: number, point: [number, number, number] = [0, 0, 0]): (fitted: ShaftAxis) => ShaftAxis {
  return (fitted) => ({ direction: [0, 0, 1], point, radius, support: fitted.support });
}

/**
 * A broken tube analysed once per named set of setting overrides (e.g. `{ off: {...}, on: {} }`),
 * all with the same axis override (none: the fitted axis), with the input triangles' areas for
 * fractureAgreement and cutReadAsBreak: the common set-up of the tests that read a rule's effect
 * on one piece by switching it off and on.
 */
export async function analysedTube<K extends string>(
  options: BrokenTubeOptions,
  runs: Record<K, Partial<AnalysisSettings>>,
  axis?: (fitted: ShaftAxis) => ShaftAxis,
): Promise<{ tube: BrokenTube; areas: Float64Array } & Record<K, FragmentAnalysis>> {
  const tube = await brokenTube(options);
  const areas = triangleNormalsAndAreas(tube.mesh).areas;
  const analyses = {} as Record<K, FragmentAnalysis>;
  for (const name of Object.keys(runs) as K[]) analyses[name] = analyseFragment(tube.mesh, runs[name], new Map(), axis);
  return { tube, areas, ...analyses };
}
