/**
 * Test fixture with analytic truth: a splinter split off a shaft along its length. A tube
 * (outer radius 12 mm, inner 7 mm, axis along z, built by manifold-3d) is split by a wedge
 * reaching from the axis between the angles 0 and 90 degrees: the splinter is the quarter of
 * the wall inside the wedge, the rest is a C-shaped shaft piece. The break at angle 0 is rough
 * (a relief across the half-plane y = 0); the one at 90 degrees is the plane x = 0.
 *
 * The relief is chosen so that the splinter turned end over end about the break's normal (the
 * y axis) through the middle of the wall, (x, y, z) -> (2 m - x, y, -z) with m the wall's mean
 * radius, lays the rough break exactly onto itself: contact, gaps and outlines cannot tell that
 * pose from the true one; only the bone on either side of the break can (the splinter's outer
 * surface then continues the other piece's medullary surface, and its axis lies on the far side
 * of the wall).
 */
import { kernel, type CutPiece } from './bunny-cut';
import { mulberry32 } from '../../core/geometry/seeded-random';
import { manifoldArrays } from './manifold-arrays';

export const OUTER_RADIUS = 12;
export const INNER_RADIUS = 7;
export const LENGTH = 60;
/** The wall's mean radius: the flip about the break normal turns about the line x = MID_WALL, z = 0. */
export const MID_WALL = (OUTER_RADIUS + INNER_RADIUS) / 2;

/** Relief of the rough break (mm, along y) at (x, z): unchanged by (x, z) -> (2 MID_WALL - x, -z). */
export function splitRelief(x: number, z: number, amplitude = 0.8): number {
  const u = x - MID_WALL;
  return amplitude * (Math.cos((2 * Math.PI * u) / 6.5) * Math.cos((2 * Math.PI * z) / 9) + 0.6 * Math.sin((2 * Math.PI * u) / 5) * Math.sin((2 * Math.PI * z) / 7));
}

export interface SplitPiece extends CutPiece {
  /** 1 on the rough break (angle 0), 2 on the plane break (angle 90 degrees), 3 on the cut across a halved splinter, else 0. */
  breakOf: Uint8Array;
}

export interface SplitOptions {
  noise?: number;
  seed?: number;
  /** Tube radii and length (mm); default OUTER_RADIUS, INNER_RADIUS, LENGTH. */
  outerRadius?: number;
  innerRadius?: number;
  length?: number;
  /** Keep only the half z < 0 of the splinter (cut across at z = 0): it meets half of each break. */
  halveSplinter?: boolean;
  /**
   * Chips taken out of the splinter only (balls centred on the rough break at (x, relief, z)),
   * as post-depositional damage takes material from one side of a break: the shaft's break face
   * then faces a pit there. The pits' surfaces are not break (label 0).
   */
  chips?: Array<{ x: number; z: number; radius: number }>;
}

export async function splitTube(options: SplitOptions = {}): Promise<{ shaft: SplitPiece; splinter: SplitPiece }> {
  const { Manifold, CrossSection } = await kernel();
  const R = options.outerRadius ?? OUTER_RADIUS, r = options.innerRadius ?? INNER_RADIUS, L = options.length ?? LENGTH;
  const outer = Manifold.cylinder(L, R, R, 96, true);
  const inner = Manifold.cylinder(L + 2, r, r, 64, true);
  const tube = outer.subtract(inner);
  const fineTube = tube.refineToLength(1.5);
  // the wedge: a quarter annulus (radii 3..30) in the xy plane, longer than the tube
  const ring: Array<[number, number]> = [];
  for (let k = 0; k <= 24; k++) ring.push([30 * Math.cos((k / 24) * (Math.PI / 2)), 30 * Math.sin((k / 24) * (Math.PI / 2))]);
  for (let k = 24; k >= 0; k--) ring.push([3 * Math.cos((k / 24) * (Math.PI / 2)), 3 * Math.sin((k / 24) * (Math.PI / 2))]);
  const section = new CrossSection([ring]);
  const wedge = section.extrude(L + 20, 0, 0, 1, true);
  const fineWedge = wedge.refineToLength(0.6);
  const cutter = fineWedge.warp((v) => {
    if (Math.abs(v[1]) < 1e-6 && v[0] > 2.9) v[1] = splitRelief(v[0], v[2]);
  });
  const [inside, outside] = fineTube.split(cutter);
  const [upperHalf, lowerHalf0] = options.halveSplinter ? inside.splitByPlane([0, 0, 1], 0) : [inside, inside];
  const balls = (options.chips ?? []).map((c) => Manifold.sphere(c.radius, 48).translate([c.x, splitRelief(c.x, c.z), c.z]));
  const lowerHalf = balls.length ? lowerHalf0.subtract(Manifold.union(balls)) : lowerHalf0;
  const rand = mulberry32(options.seed ?? 7);
  const noise = options.noise ?? 0.02;
  const shape = { R, r, L, halved: options.halveSplinter ?? false };
  const splinter = toPiece(lowerHalf.getMesh(), rand, noise, shape);
  const shaft = toPiece(outside.getMesh(), rand, noise, { ...shape, halved: false });
  for (const o of new Set([outer, inner, tube, fineTube, section, wedge, fineWedge, cutter, inside, outside, upperHalf, lowerHalf0, lowerHalf, ...balls])) o.delete();
  return { shaft, splinter };
}

function toPiece(m: { numProp: number; vertProperties: Float32Array; triVerts: Uint32Array }, rand: () => number, noise: number, shape: { R: number; r: number; L: number; halved: boolean }): SplitPiece {
  const { positions, triangles } = manifoldArrays(m);
  const nt = triangles.length / 3;
  const breakOf = new Uint8Array(nt);
  const which = (x: number, y: number, z: number): number => {
    const r = Math.hypot(x, y);
    if (r < shape.r - 0.05 || r > shape.R + 0.05 || Math.abs(z) > shape.L / 2 - 0.01) return 0;
    if (shape.halved && Math.abs(z) < 0.02) return 3;
    if (x > 0 && Math.abs(y - splitRelief(x, z)) < 0.02) return 1;
    if (y > 0 && Math.abs(x) < 0.02) return 2;
    return 0;
  };
  for (let t = 0; t < nt; t++) {
    const v = [0, 1, 2].map((e) => triangles[3 * t + e]);
    const kinds = v.map((i) => which(positions[3 * i], positions[3 * i + 1], positions[3 * i + 2]));
    const c = [0, 1, 2].map((k) => (positions[3 * v[0] + k] + positions[3 * v[1] + k] + positions[3 * v[2] + k]) / 3);
    // the centre too: a triangle of the outer or medullary surface can have its three corners on the break's edge
    if (kinds[0] && kinds[0] === kinds[1] && kinds[1] === kinds[2] && which(c[0], c[1], c[2]) === kinds[0]) breakOf[t] = kinds[0];
  }
  const gauss = (): number => Math.sqrt(-2 * Math.log(1 - rand())) * Math.cos(2 * Math.PI * rand());
  for (let i = 0; i < positions.length; i++) positions[i] += noise * gauss();
  const onCut = Uint8Array.from(breakOf, (b) => (b === 1 ? 1 : 0));
  return { positions, triangles, onCut, breakOf };
}
