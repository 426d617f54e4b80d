import type { LabelledMesh } from '../../../demo-data/labelled-mesh';
import { FRACTURE_BASE, LABEL_ORIGINAL } from '../../../demo-data/shatter';

/** One rim sample: where, on which break, the angle (degrees) and the fitted face plane's unit normal. */
export interface RimSample {
  breakId: number;
  angle: number;
  at: [number, number, number];
  faceNormal: [number, number, number];
}

/**
 * Macroscopic fracture angle along a break's edge on the outer (cortical) surface: at rim
 * vertices, the angle inside the bone between a plane fitted to the fracture face nearby and
 * the mean normal of the cortical surface nearby (degrees; 90 is a right angle). This is the
 * angle Villa & Mahieu (1991) score by eye as oblique or right. Every `every`-th rim vertex is
 * a sample, with its place and the fitted face plane's normal.
 */
export function rimFractureSamples(
  mesh: LabelledMesh,
  keep: (x: number, y: number, z: number) => boolean = () => true,
  radius = 3,
  every = 3,
): RimSample[] {
  const { positions: p, triangles: t, labels } = mesh;
  const nv = p.length / 3;
  const triNormal = (f: number): [number, number, number] => {
    const a = t[f * 3] * 3, b = t[f * 3 + 1] * 3, c = t[f * 3 + 2] * 3;
    const ux = p[b] - p[a], uy = p[b + 1] - p[a + 1], uz = p[b + 2] - p[a + 2];
    const vx = p[c] - p[a], vy = p[c + 1] - p[a + 1], vz = p[c + 2] - p[a + 2];
    return [uy * vz - uz * vy, uz * vx - ux * vz, ux * vy - uy * vx];
  };
  const onOuter = new Uint8Array(nv);
  const faceOfVertex = new Int32Array(nv).fill(-1);
  for (let f = 0; f < labels.length; f++) {
    for (let k = 0; k < 3; k++) {
      const v = t[f * 3 + k];
      if (labels[f] === LABEL_ORIGINAL) onOuter[v] = 1;
      else if (labels[f] >= FRACTURE_BASE) faceOfVertex[v] = labels[f];
    }
  }
  // triangle centroids by label, in a coarse grid for neighbourhood queries
  const cell = radius;
  const grid = new Map<string, number[]>();
  const key = (x: number, y: number, z: number) => `${Math.floor(x / cell)},${Math.floor(y / cell)},${Math.floor(z / cell)}`;
  const cent = new Float64Array(labels.length * 3);
  for (let f = 0; f < labels.length; f++) {
    for (let d = 0; d < 3; d++) cent[f * 3 + d] = (p[t[f * 3] * 3 + d] + p[t[f * 3 + 1] * 3 + d] + p[t[f * 3 + 2] * 3 + d]) / 3;
    const k = key(cent[f * 3], cent[f * 3 + 1], cent[f * 3 + 2]);
    let list = grid.get(k);
    if (!list) grid.set(k, (list = []));
    list.push(f);
  }
  const result: RimSample[] = [];
  let n = 0;
  for (let v = 0; v < nv; v++) {
    const label = faceOfVertex[v];
    if (label < 0 || !onOuter[v]) continue;
    if (n++ % every !== 0) continue;
    const x = p[v * 3], y = p[v * 3 + 1], z = p[v * 3 + 2];
    if (!keep(x, y, z)) continue;
    const frac: number[] = [];
    const outer = [0, 0, 0];
    const fracN = [0, 0, 0];
    for (let i = -1; i <= 1; i++)
      for (let j = -1; j <= 1; j++)
        for (let k = -1; k <= 1; k++) {
          const list = grid.get(`${Math.floor(x / cell) + i},${Math.floor(y / cell) + j},${Math.floor(z / cell) + k}`);
          if (!list) continue;
          for (const f of list) {
            const dx = cent[f * 3] - x, dy = cent[f * 3 + 1] - y, dz = cent[f * 3 + 2] - z;
            if (dx * dx + dy * dy + dz * dz > radius * radius) continue;
            const nn = triNormal(f);
            if (labels[f] === LABEL_ORIGINAL) for (let d = 0; d < 3; d++) outer[d] += nn[d];
            else if (labels[f] === label) {
              frac.push(cent[f * 3], cent[f * 3 + 1], cent[f * 3 + 2]);
              for (let d = 0; d < 3; d++) fracN[d] += nn[d];
            }
          }
        }
    if (frac.length < 9 * 3) continue;
    const nf = planeNormal(frac);
    if (nf[0] * fracN[0] + nf[1] * fracN[1] + nf[2] * fracN[2] < 0) for (let d = 0; d < 3; d++) nf[d] = -nf[d];
    const no = Math.hypot(outer[0], outer[1], outer[2]);
    if (no === 0) continue;
    const cos = (nf[0] * outer[0] + nf[1] * outer[1] + nf[2] * outer[2]) / no;
    const angle = 180 - (Math.acos(Math.max(-1, Math.min(1, cos))) * 180) / Math.PI;
    result.push({ breakId: label - FRACTURE_BASE, angle, at: [x, y, z], faceNormal: nf });
  }
  return result;
}

/** Normal of the least-squares plane through points (smallest principal axis, by power iteration). */
function planeNormal(pts: number[]): [number, number, number] {
  const n = pts.length / 3;
  let mx = 0, my = 0, mz = 0;
  for (let i = 0; i < n; i++) {
    mx += pts[i * 3];
    my += pts[i * 3 + 1];
    mz += pts[i * 3 + 2];
  }
  mx /= n; my /= n; mz /= n;
  const c = [0, 0, 0, 0, 0, 0, 0, 0, 0];
  for (let i = 0; i < n; i++) {
    const d = [pts[i * 3] - mx, pts[i * 3 + 1] - my, pts[i * 3 + 2] - mz];
    for (let a = 0; a < 3; a++) for (let b = 0; b < 3; b++) c[a * 3 + b] += d[a] * d[b];
  }
  // smallest eigenvector of C = largest of (tr C) I - C
  const tr = c[0] + c[4] + c[8];
  const m = c.map((v, i) => (i % 4 === 0 ? tr - v : -v));
  let v: [number, number, number] = [0.577, 0.577, 0.577];
  for (let it = 0; it < 60; it++) {
    const w: [number, number, number] = [
      m[0] * v[0] + m[1] * v[1] + m[2] * v[2],
      m[3] * v[0] + m[4] * v[1] + m[5] * v[2],
      m[6] * v[0] + m[7] * v[1] + m[8] * v[2],
    ];
    const l = Math.hypot(...w) || 1;
    v = [w[0] / l, w[1] / l, w[2] / l];
  }
  return v;
}
