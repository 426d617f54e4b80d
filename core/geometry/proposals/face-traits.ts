/**
 * Pose-invariant figures of one break face that its partner across the break shares, for the
 * candidate index (design.md section 7, step 5). Both sides of a break are the same surface,
 * so they agree in size and in the scatter of their points and normals (normals flip, their
 * scatter does not); on a shaft, they also sit at the same distance from the shaft axis and
 * span the same cortical thickness, arc and length along the axis, and the break runs the same
 * way across the shaft: its normals make the same angle with the axis (a transverse break lies
 * across it, a longitudinal one along it; the fracture outline of the trade) and lean the same
 * way through the wall (the fracture angle against the bone surface, right or oblique), seen
 * from the other side: the partner's normals point the other way, so its radial lean has the
 * opposite sign. The wall next to either face is equally thick (rim-wall-thickness.ts). None of
 * these depends on where the fragment lies or how its scan file is numbered.
 */
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { FPFH_DIM } from '../registration/fpfh';
import { fpfhWordCounts } from './fpfh-word-counts';
import type { FragmentInput, PreparedFragment } from './prepared-fragment';
import { breakTriangleMask, rimWallThicknesses } from './rim-wall-thickness';

export interface ShaftAxisLike {
  direction: [number, number, number];
  point: [number, number, number];
  /** Share of the fragment's surface that looks like a tube about the axis (0-1). */
  support: number;
}

/** A fragment's axis is trusted for descriptors when at least this share of its surface is tube-like. */
export const AXIS_SUPPORT_MIN = 0.5;

export interface FaceTraits {
  /** mm^2. */
  area: number;
  /** Standard deviations of the face samples along their principal directions, largest first (mm). */
  extents: [number, number, number];
  /** Eigenvalues of the mean of n n^T over the face normals, largest first (sum 1). */
  normalSpread: [number, number, number];
  /** Mean FPFH of the face samples (normals as stored, pointing out of the fragment). */
  meanFpfh: Float32Array;
  /** Median thickness of the bone wall along the face's rim (mm; rim-wall-thickness.ts); absent when not measurable. */
  rimThickness?: number;
  /**
   * How many samples take each FPFH word, and each word of their mirrored FPFH (as the partner
   * would show them; fpfh-word-counts.ts), for the candidate index's second stage. Absent in
   * traits stored before they were counted.
   */
  fpfhWords?: number[];
  fpfhWordsMirrored?: number[];
  /** Figures about the fragment's shaft axis; absent when the fragment is not a shaft piece. */
  tube?: {
    /** 90th and 10th percentile of the samples' distance from the axis (mm): outer and inner edge of the cortex. */
    outerRadius: number;
    innerRadius: number;
    /** 5th-95th percentile span of the samples along the axis (mm). */
    axialSpan: number;
    /** Share of the circumference the face covers (0-1), from 36 sectors about the axis. */
    arcShare: number;
    /**
     * Mean |cosine| between the face normals and the axis (0-1): 1 for a break straight across
     * the shaft, 0 for one along it. The same on both sides of a break (normals flip, the
     * absolute value does not). Absent in traits stored before it was measured.
     */
    axisCosine?: number;
    /**
     * Mean cosine between the face normals and the direction straight out from the axis (-1-1):
     * 0 for a break square through the wall, positive when the face looks outwards. A partner's
     * is the same with the opposite sign.
     */
    radialLean?: number;
  };
}

/** Traits of every prepared face of a fragment, with the wall thickness along each face's rim. */
export function fragmentFaceTraits(input: FragmentInput, prepared: PreparedFragment, axis?: ShaftAxisLike): FaceTraits[] {
  const rims = rimWallThicknesses(input.positions, input.triangles, breakTriangleMask(input.triangles.length / 3, input.faces), prepared.faces.map((x) => x.tree));
  return prepared.faces.map((x, i) => faceTraits(x.points, x.normals, x.area, x.fpfh, axis, rims[i]));
}

export function faceTraits(points: Float32Array, normals: Float32Array, area: number, fpfh: Float32Array, axis?: ShaftAxisLike, rimThickness?: number): FaceTraits {
  const n = points.length / 3;
  const meanFpfh = new Float32Array(FPFH_DIM);
  const m = Math.floor(fpfh.length / FPFH_DIM);
  for (let i = 0; i < m; i++) for (let k = 0; k < FPFH_DIM; k++) meanFpfh[k] += fpfh[i * FPFH_DIM + k];
  if (m) for (let k = 0; k < FPFH_DIM; k++) meanFpfh[k] /= m;
  const traits: FaceTraits = {
    area,
    extents: principalSpread(points, true),
    normalSpread: principalSpread(normals, false),
    meanFpfh,
  };
  if (rimThickness !== undefined && Number.isFinite(rimThickness)) traits.rimThickness = rimThickness;
  if (m) {
    const words = fpfhWordCounts(fpfh);
    traits.fpfhWords = words.words;
    traits.fpfhWordsMirrored = words.mirrored;
  }
  if (axis && axis.support >= AXIS_SUPPORT_MIN && n >= 3) {
    const [dx, dy, dz] = axis.direction;
    const [px, py, pz] = axis.point;
    const radial = new Float64Array(n), along = new Float64Array(n);
    let axisCos = 0, lean = 0;
    const sectors = new Uint8Array(36);
    // two directions across the axis, for the sector angle
    let ux = 0, uy = 0, uz = 0;
    if (Math.abs(dx) < 0.9) { uy = dz; uz = -dy; } else { ux = -dz; uz = dx; }
    const ul = Math.hypot(ux, uy, uz) || 1;
    ux /= ul; uy /= ul; uz /= ul;
    const vx = dy * uz - dz * uy, vy = dz * ux - dx * uz, vz = dx * uy - dy * ux;
    for (let i = 0; i < n; i++) {
      const x = points[3 * i] - px, y = points[3 * i + 1] - py, z = points[3 * i + 2] - pz;
      const t = x * dx + y * dy + z * dz;
      const rx = x - t * dx, ry = y - t * dy, rz = z - t * dz;
      radial[i] = Math.hypot(rx, ry, rz);
      along[i] = t;
      const nx = normals[3 * i], ny = normals[3 * i + 1], nz = normals[3 * i + 2];
      axisCos += Math.abs(nx * dx + ny * dy + nz * dz);
      if (radial[i] > 0) lean += (nx * rx + ny * ry + nz * rz) / radial[i];
      const angle = Math.atan2(rx * vx + ry * vy + rz * vz, rx * ux + ry * uy + rz * uz);
      sectors[Math.min(35, Math.floor(((angle + Math.PI) / (2 * Math.PI)) * 36))] = 1;
    }
    radial.sort();
    along.sort();
    const at = (xs: Float64Array, p: number): number => xs[Math.min(xs.length - 1, Math.floor(p * xs.length))];
    let covered = 0;
    for (const s of sectors) covered += s;
    traits.tube = { outerRadius: at(radial, 0.9), innerRadius: at(radial, 0.1), axialSpan: at(along, 0.95) - at(along, 0.05), arcShare: covered / 36, axisCosine: axisCos / n, radialLean: lean / n };
  }
  return traits;
}

/**
 * Principal spread of packed xyz vectors: standard deviations about the mean (centred) or the
 * eigenvalues of the raw second moment (not centred, for unit normals), largest first.
 */
export function principalSpread(v: Float32Array, centred: boolean): [number, number, number] {
  const n = v.length / 3;
  if (n < 3) return [0, 0, 0];
  let cx = 0, cy = 0, cz = 0;
  if (centred) {
    for (let i = 0; i < n; i++) { cx += v[3 * i]; cy += v[3 * i + 1]; cz += v[3 * i + 2]; }
    cx /= n; cy /= n; cz /= n;
  }
  const C = [0, 0, 0, 0, 0, 0, 0, 0, 0];
  for (let i = 0; i < n; i++) {
    const a = [v[3 * i] - cx, v[3 * i + 1] - cy, v[3 * i + 2] - cz];
    for (let r = 0; r < 3; r++) for (let c = r; c < 3; c++) C[r * 3 + c] += (a[r] * a[c]) / n;
  }
  C[3] = C[1]; C[6] = C[2]; C[7] = C[5];
  const e = new EigenvalueDecomposition(new Matrix([C.slice(0, 3), C.slice(3, 6), C.slice(6, 9)]), { assumeSymmetric: true });
  const vals = e.realEigenvalues.map((x) => Math.max(0, x)).sort((p, q) => q - p);
  return centred ? [Math.sqrt(vals[0]), Math.sqrt(vals[1]), Math.sqrt(vals[2])] : [vals[0], vals[1], vals[2]];
}
