/**
 * Test fixture from open data: the Stanford bunny (npm package `bunny`, Stanford 3D Scanning
 * Repository), scaled to millimetres and cut in two by a rough surface with manifold-3d.
 * The cut surface is known, so the test knows which triangles are break faces (the truth);
 * the matcher only ever sees samples of those faces, never the cut itself.
 */
import { createRequire } from 'node:module';
import Module from 'manifold-3d';
import { mulberry32 } from '../../core/geometry/seeded-random';
import { manifoldArrays } from './manifold-arrays';

export interface CutPiece {
  positions: Float32Array;
  triangles: Uint32Array;
  /** 1 for triangles on the cut surface (truth from the set-up), else 0. */
  onCut: Uint8Array;
}

/** Height of the rough cutting surface above the plane y = cutY at (x, z), in mm. */
export function roughness(x: number, z: number, amplitude: number): number {
  return (
    amplitude *
    (0.5 * Math.sin(x / 7.3 + 0.4) * Math.cos(z / 9.1 - 1.1) +
      0.3 * Math.sin((x + z) / 4.1 + 2.0) +
      0.2 * Math.cos((x - 2 * z) / 2.9 + 0.7) +
      0.04 * x / amplitude)
  );
}

type Options = { cutY?: number; amplitude?: number; noise?: number; seed?: number };

export async function cutBunny(options: Options & { scale?: number } = {}): Promise<{ lower: CutPiece; upper: CutPiece; diagonal: number }> {
  const scale = options.scale ?? 10;
  const b = createRequire(import.meta.url)('bunny') as { positions: number[][]; cells: number[][] };
  const vert = new Float32Array(b.positions.length * 3);
  b.positions.forEach((p, i) => {
    vert[3 * i] = p[0] * scale;
    vert[3 * i + 1] = p[1] * scale;
    vert[3 * i + 2] = p[2] * scale;
  });
  const tri = new Uint32Array(b.cells.length * 3);
  b.cells.forEach((c, i) => tri.set(c, 3 * i));
  return cutSolid(vert, tri, { cutY: 45, ...options });
}

/**
 * A shaft-like piece: a tube (outer radius R, inner r, length L along y, analytic solid of
 * revolution built by manifold-3d) refined to about 1 mm edges, then cut like the bunny.
 */
export async function cutTube(options: Options & { outerRadius?: number; innerRadius?: number; length?: number; lengthwise?: boolean } = {}): Promise<{ lower: CutPiece; upper: CutPiece; diagonal: number }> {
  const wasm = await kernel();
  const { Manifold } = wasm;
  const R = options.outerRadius ?? 12, r = options.innerRadius ?? 7, L = options.length ?? 90;
  const outer = Manifold.cylinder(L, R, R, 72, true);
  const inner = Manifold.cylinder(L + 2, r, r, 48, true);
  const tube = outer.subtract(inner);
  // upright along y (the cut y = const is across the tube), or lying along x (lengthwise: the cut splits the wall into two long strips)
  const upright = options.lengthwise ? tube.rotate([0, 90, 0]) : tube.rotate([90, 0, 0]);
  const fine = upright.refineToLength(2);
  const m = fine.getMesh();
  for (const o of [outer, inner, tube, upright, fine]) o.delete();
  const np = m.numProp;
  const nv = m.vertProperties.length / np;
  const vert = new Float32Array(nv * 3);
  for (let i = 0; i < nv; i++) for (let k = 0; k < 3; k++) vert[3 * i + k] = m.vertProperties[i * np + k];
  return cutSolid(vert, Uint32Array.from(m.triVerts), { cutY: 0, amplitude: 1.5, ...options });
}

let wasmKernel: Awaited<ReturnType<typeof Module>> | undefined;
/** The manifold-3d kernel, set up once per test file. */
export async function kernel(): Promise<Awaited<ReturnType<typeof Module>>> {
  if (!wasmKernel) {
    wasmKernel = await Module();
    wasmKernel.setup();
  }
  return wasmKernel;
}

async function cutSolid(vert: Float32Array, tri: Uint32Array, options: Options & { cutY: number }): Promise<{ lower: CutPiece; upper: CutPiece; diagonal: number }> {
  const cutY = options.cutY;
  const amp = options.amplitude ?? 3;
  const wasm = await kernel();
  const { Manifold, Mesh } = wasm;
  const mesh = new Mesh({ numProp: 3, vertProperties: vert, triVerts: tri });
  mesh.merge();
  const solid = new Manifold(mesh);
  // a slab below y = cutY whose top is rough; refine so the top can be displaced
  const lo = -200, size = 400;
  const cube = Manifold.cube([size, cutY - lo, size]).translate([-size / 2, lo, -size / 2]);
  const refined = cube.refine(160);
  const cutter = refined.warp((v) => {
    if (Math.abs(v[1] - cutY) < 1e-6) v[1] = cutY + roughness(v[0], v[2], amp);
  });
  const [lowerSolid, upperSolid] = solid.split(cutter);
  const lower = toPiece(lowerSolid.getMesh(), cutY, amp);
  const upper = toPiece(upperSolid.getMesh(), cutY, amp);
  for (const o of [solid, cube, refined, cutter, lowerSolid, upperSolid]) o.delete();
  let mn = [Infinity, Infinity, Infinity], mx = [-Infinity, -Infinity, -Infinity];
  for (let i = 0; i < vert.length; i += 3) for (let k = 0; k < 3; k++) {
    mn[k] = Math.min(mn[k], vert[i + k]);
    mx[k] = Math.max(mx[k], vert[i + k]);
  }
  const diagonal = Math.hypot(mx[0] - mn[0], mx[1] - mn[1], mx[2] - mn[2]);
  const rand = mulberry32(options.seed ?? 5);
  const noise = options.noise ?? 0.03;
  // independent scanner-like noise on each piece, so the two sides of the cut share no vertex
  for (const p of [lower, upper]) for (let i = 0; i < p.positions.length; i++) p.positions[i] += noise * gauss(rand);
  return { lower, upper, diagonal };
}

function toPiece(m: { numProp: number; vertProperties: Float32Array; triVerts: Uint32Array }, cutY: number, amp: number): CutPiece {
  const { positions, triangles } = manifoldArrays(m);
  const nt = triangles.length / 3;
  const onCut = new Uint8Array(nt);
  const onSurface = (i: number): boolean => Math.abs(positions[3 * i + 1] - (cutY + roughness(positions[3 * i], positions[3 * i + 2], amp))) < 0.05;
  for (let t = 0; t < nt; t++) {
    const a = triangles[3 * t], b = triangles[3 * t + 1], c = triangles[3 * t + 2];
    // centroid on the cut surface too (a triangle of the bunny with three vertices on the cut is rare)
    const cx = (positions[3 * a] + positions[3 * b] + positions[3 * c]) / 3;
    const cy = (positions[3 * a + 1] + positions[3 * b + 1] + positions[3 * c + 1]) / 3;
    const cz = (positions[3 * a + 2] + positions[3 * b + 2] + positions[3 * c + 2]) / 3;
    const centreOn = Math.abs(cy - (cutY + roughness(cx, cz, amp))) < 0.3;
    onCut[t] = onSurface(a) && onSurface(b) && onSurface(c) && centreOn ? 1 : 0;
  }
  return { positions, triangles, onCut };
}

function gauss(r: () => number): number {
  return Math.sqrt(-2 * Math.log(1 - r())) * Math.cos(2 * Math.PI * r());
}
