import type { VertexRings } from './adjacency';
import type { TriangleMesh } from './mesh';
import { hypot } from './hypot';

export interface SurfaceCurvature {
  /** Larger principal curvature per vertex (1/mm); convex seen from outside is positive. */
  k1: Float32Array;
  /** Smaller principal curvature per vertex (1/mm). */
  k2: Float32Array;
  /** Unit direction of k2 (the direction of least bending: a cylinder's axis), xyz per vertex. */
  minDirection: Float32Array;
  /** RMS distance (mm) of the neighbourhood from the fitted quadric: local roughness. */
  roughness: Float32Array;
}

/**
 * Principal curvatures by local quadric fitting: in the tangent frame of each vertex
 * (x, y in the tangent plane, z along the vertex normal) fit the height function
 * z = a x^2 + b xy + c y^2 + d x + e y by least squares over the vertex's 2-ring, then take
 * the eigenvalues of the shape operator (Weingarten map) S = I^-1 II of the graph surface
 * (do Carmo, "Differential Geometry of Curves and Surfaces", 1976, section 3-3; the jet
 * fitting of Cazals & Pouget 2005 uses the same idea). The fit's residual is the roughness.
 */
export function principalCurvatures(mesh: TriangleMesh, normals: Float32Array, rings: VertexRings): SurfaceCurvature {
  const p = mesh.positions;
  const nv = p.length / 3;
  const k1 = new Float32Array(nv), k2 = new Float32Array(nv), rough = new Float32Array(nv);
  const minDirection = new Float32Array(nv * 3);
  const mark = new Int32Array(nv).fill(-1);
  const hood: number[] = [];
  const A = new Float64Array(25), rhs = new Float64Array(5), sol = new Float64Array(5);
  const row = new Float64Array(5);
  const solveM = new Float64Array(25), solveY = new Float64Array(5);
  // Neighbourhood coordinates in the tangent frame, scaled by h (grown as needed).
  let xs = new Float64Array(64), ys = new Float64Array(64), zs = new Float64Array(64);
  for (let v = 0; v < nv; v++) {
    const nx = normals[3 * v], ny = normals[3 * v + 1], nz = normals[3 * v + 2];
    // Two-ring neighbourhood.
    hood.length = 0;
    mark[v] = v;
    for (let i = rings.start[v]; i < rings.start[v + 1]; i++) {
      const w = rings.list[i];
      if (mark[w] !== v) { mark[w] = v; hood.push(w); }
    }
    const ring1 = hood.length;
    for (let k = 0; k < ring1; k++) {
      const w = hood[k];
      for (let i = rings.start[w]; i < rings.start[w + 1]; i++) {
        const u = rings.list[i];
        if (mark[u] !== v) { mark[u] = v; hood.push(u); }
      }
    }
    if (hood.length < 5 || (nx === 0 && ny === 0 && nz === 0)) continue;
    // Tangent frame.
    let ux: number, uy: number, uz: number;
    if (Math.abs(nx) < 0.9) { ux = 0; uy = nz; uz = -ny; } else { ux = -nz; uy = 0; uz = nx; }
    const ul = hypot(ux, uy, uz);
    ux /= ul; uy /= ul; uz /= ul;
    const wx = ny * uz - nz * uy, wy = nz * ux - nx * uz, wz = nx * uy - ny * ux;
    const m = hood.length;
    if (xs.length < m) { xs = new Float64Array(2 * m); ys = new Float64Array(2 * m); zs = new Float64Array(2 * m); }
    let h = 0;
    for (let i = 0; i < m; i++) {
      const w = hood[i];
      const dx = p[3 * w] - p[3 * v], dy = p[3 * w + 1] - p[3 * v + 1], dz = p[3 * w + 2] - p[3 * v + 2];
      const x = dx * ux + dy * uy + dz * uz, y = dx * wx + dy * wy + dz * wz, z = dx * nx + dy * ny + dz * nz;
      xs[i] = x; ys[i] = y; zs[i] = z;
      h += hypot(x, y);
    }
    h = h / m || 1;
    for (let i = 0; i < m; i++) { xs[i] /= h; ys[i] /= h; zs[i] /= h; }
    A.fill(0); rhs.fill(0);
    for (let i = 0; i < m; i++) {
      const x = xs[i], y = ys[i], z = zs[i];
      row[0] = x * x; row[1] = x * y; row[2] = y * y; row[3] = x; row[4] = y;
      for (let r = 0; r < 5; r++) {
        rhs[r] += row[r] * z;
        for (let c = r; c < 5; c++) A[5 * r + c] += row[r] * row[c];
      }
    }
    // The normal matrix is symmetric: the lower triangle is the upper one's mirror.
    for (let r = 1; r < 5; r++) for (let c = 0; c < r; c++) A[5 * r + c] = A[5 * c + r];
    if (!solve5(A, rhs, sol, solveM, solveY)) continue;
    let res = 0;
    for (let i = 0; i < m; i++) {
      const x = xs[i], y = ys[i];
      const e = sol[0] * x * x + sol[1] * x * y + sol[2] * y * y + sol[3] * x + sol[4] * y - zs[i];
      res += e * e;
    }
    rough[v] = Math.sqrt(res / m) * h;
    const fx = sol[3], fy = sol[4];
    const fxx = (2 * sol[0]) / h, fxy = sol[1] / h, fyy = (2 * sol[2]) / h;
    const E = 1 + fx * fx, F = fx * fy, G = 1 + fy * fy;
    const wn = Math.sqrt(1 + fx * fx + fy * fy);
    const L = fxx / wn, M = fxy / wn, N = fyy / wn;
    const det = E * G - F * F;
    // S = I^-1 II, with the sign flipped so that a surface bending away from its outward
    // normal (a sphere seen from outside) has positive curvature.
    const s11 = -(G * L - F * M) / det, s12 = -(G * M - F * N) / det;
    const s21 = -(E * M - F * L) / det, s22 = -(E * N - F * M) / det;
    const tr = s11 + s22, dt = s11 * s22 - s12 * s21;
    const disc = Math.sqrt(Math.max(0, (tr * tr) / 4 - dt));
    const l1 = tr / 2 + disc, l2 = tr / 2 - disc;
    k1[v] = l1;
    k2[v] = l2;
    // Eigenvector of S for l2, in (u, w) coordinates.
    let ex: number, ey: number;
    if (Math.abs(s12) > 1e-12) { ex = s12; ey = l2 - s11; }
    else if (Math.abs(s21) > 1e-12) { ex = l2 - s22; ey = s21; }
    else { ex = s11 <= s22 ? 1 : 0; ey = s11 <= s22 ? 0 : 1; }
    const el = hypot(ex, ey) || 1;
    ex /= el; ey /= el;
    minDirection[3 * v] = ex * ux + ey * wx;
    minDirection[3 * v + 1] = ex * uy + ey * wy;
    minDirection[3 * v + 2] = ex * uz + ey * wz;
  }
  return { k1, k2, minDirection, roughness: rough };
}

/** Gaussian elimination with partial pivoting on a 5x5 system; false when singular. M and y are work space (A and b are left as they are). */
function solve5(A: Float64Array, b: Float64Array, x: Float64Array, M: Float64Array, y: Float64Array): boolean {
  const n = 5;
  M.set(A);
  y.set(b);
  for (let c = 0; c < n; c++) {
    let piv = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(M[5 * r + c]) > Math.abs(M[5 * piv + c])) piv = r;
    if (Math.abs(M[5 * piv + c]) < 1e-12) return false;
    if (piv !== c) {
      for (let k = 0; k < n; k++) { const tmp = M[5 * c + k]; M[5 * c + k] = M[5 * piv + k]; M[5 * piv + k] = tmp; }
      const tmp = y[c]; y[c] = y[piv]; y[piv] = tmp;
    }
    for (let r = c + 1; r < n; r++) {
      const f = M[5 * r + c] / M[5 * c + c];
      if (f === 0) continue;
      for (let k = c; k < n; k++) M[5 * r + k] -= f * M[5 * c + k];
      y[r] -= f * y[c];
    }
  }
  for (let r = n - 1; r >= 0; r--) {
    let s = y[r];
    for (let k = r + 1; k < n; k++) s -= M[5 * r + k] * x[k];
    x[r] = s / M[5 * r + r];
  }
  return true;
}
