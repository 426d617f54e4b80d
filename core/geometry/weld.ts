import type { TriangleMesh } from './mesh';

/**
 * Merge vertices closer than `tolerance` (snapped to a grid of that size, as three.js's
 * BufferGeometryUtils.mergeVertices does, but with an integer hash table so a
 * 600,000-vertex STL soup welds in tens of milliseconds), then drop triangles that became
 * degenerate (two corners on one vertex). sourceTriangle[i] is the input index of kept
 * triangle i.
 */
export function weldVertices(mesh: TriangleMesh, tolerance: number): {
  mesh: TriangleMesh;
  sourceTriangle: Uint32Array;
  droppedDegenerate: number;
} {
  const p = mesh.positions;
  const nv = p.length / 3;
  const inv = 1 / Math.max(tolerance, 1e-12);
  const qx = new Int32Array(nv), qy = new Int32Array(nv), qz = new Int32Array(nv);
  for (let v = 0; v < nv; v++) {
    qx[v] = Math.round(p[3 * v] * inv);
    qy[v] = Math.round(p[3 * v + 1] * inv);
    qz[v] = Math.round(p[3 * v + 2] * inv);
  }
  let size = 1;
  while (size < nv * 2) size <<= 1;
  const mask = size - 1;
  const table = new Int32Array(size).fill(-1);
  const remap = new Uint32Array(nv);
  const kept: number[] = [];
  for (let v = 0; v < nv; v++) {
    let h = (Math.imul(qx[v], 73856093) ^ Math.imul(qy[v], 19349663) ^ Math.imul(qz[v], 83492791)) & mask;
    for (;;) {
      const slot = table[h];
      if (slot === -1) {
        table[h] = v;
        remap[v] = kept.length;
        kept.push(v);
        break;
      }
      if (qx[slot] === qx[v] && qy[slot] === qy[v] && qz[slot] === qz[v]) {
        remap[v] = remap[slot];
        break;
      }
      h = (h + 1) & mask;
    }
  }
  const positions = new Float32Array(kept.length * 3);
  for (let i = 0; i < kept.length; i++) {
    positions[3 * i] = p[3 * kept[i]];
    positions[3 * i + 1] = p[3 * kept[i] + 1];
    positions[3 * i + 2] = p[3 * kept[i] + 2];
  }
  const t = mesh.triangles;
  const nt = t.length / 3;
  const triangles = new Uint32Array(t.length);
  const sourceTriangle = new Uint32Array(nt);
  let k = 0;
  for (let f = 0; f < nt; f++) {
    const a = remap[t[3 * f]], b = remap[t[3 * f + 1]], c = remap[t[3 * f + 2]];
    if (a === b || b === c || a === c) continue;
    triangles[3 * k] = a;
    triangles[3 * k + 1] = b;
    triangles[3 * k + 2] = c;
    sourceTriangle[k] = f;
    k++;
  }
  return {
    mesh: { positions, triangles: triangles.slice(0, 3 * k) },
    sourceTriangle: sourceTriangle.slice(0, k),
    droppedDegenerate: nt - k,
  };
}

/** Keep only the listed triangles and the vertices they use. */
export function keepTriangles(mesh: TriangleMesh, keep: (f: number) => boolean): { mesh: TriangleMesh; kept: Uint32Array } {
  const t = mesh.triangles;
  const nt = t.length / 3;
  const keptList: number[] = [];
  for (let f = 0; f < nt; f++) if (keep(f)) keptList.push(f);
  const nv = mesh.positions.length / 3;
  const remap = new Int32Array(nv).fill(-1);
  let count = 0;
  const triangles = new Uint32Array(keptList.length * 3);
  keptList.forEach((f, i) => {
    for (let j = 0; j < 3; j++) {
      const v = t[3 * f + j];
      if (remap[v] < 0) remap[v] = count++;
      triangles[3 * i + j] = remap[v];
    }
  });
  const positions = new Float32Array(count * 3);
  for (let v = 0; v < nv; v++) {
    const r = remap[v];
    if (r >= 0) {
      positions[3 * r] = mesh.positions[3 * v];
      positions[3 * r + 1] = mesh.positions[3 * v + 1];
      positions[3 * r + 2] = mesh.positions[3 * v + 2];
    }
  }
  return { mesh: { positions, triangles }, kept: Uint32Array.from(keptList) };
}
