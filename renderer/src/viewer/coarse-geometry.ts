import { BufferAttribute, BufferGeometry } from 'three';

/**
 * A lighter copy of an indexed geometry for drawing while the view turns: vertices are
 * clustered on a cubic grid (each cell's vertices become their mean; normals and colours are
 * averaged) and triangles that collapse are dropped. The cell size is chosen so about
 * `targetTriangles` remain. Software WebGL spends its time per triangle, so a 200,000-triangle
 * scan turns at the speed of a 50,000-triangle one; the full geometry is drawn once it stops.
 */
export function coarseGeometry(fine: BufferGeometry, targetTriangles: number): BufferGeometry | null {
  const index = fine.getIndex();
  const pos = fine.getAttribute('position') as BufferAttribute | undefined;
  if (!index || !pos) return null;
  const triangles = index.count / 3;
  if (triangles <= targetTriangles) return null;
  fine.computeBoundingBox();
  const box = fine.boundingBox!;
  const diagonal = box.min.distanceTo(box.max);
  if (!(diagonal > 0)) return null;
  // Triangles left go roughly with 1 / cell^2 on a surface: start from the mean edge length
  // the count implies, and correct once.
  let cell = diagonal / Math.sqrt(targetTriangles);
  let best: BufferGeometry | null = null;
  for (let attempt = 0; attempt < 3; attempt++) {
    const g = cluster(fine, cell);
    const n = g.getIndex()!.count / 3;
    best?.dispose();
    best = g;
    if (n <= targetTriangles * 1.25 && n >= targetTriangles * 0.6) break;
    cell *= Math.sqrt(n / targetTriangles);
  }
  return best;
}

function cluster(fine: BufferGeometry, cell: number): BufferGeometry {
  const index = fine.getIndex()!.array;
  const pos = (fine.getAttribute('position') as BufferAttribute).array;
  const nor = (fine.getAttribute('normal') as BufferAttribute | undefined)?.array;
  const col = (fine.getAttribute('color') as BufferAttribute | undefined)?.array;
  const box = fine.boundingBox!;
  const vertices = pos.length / 3;
  const nx = Math.floor((box.max.x - box.min.x) / cell) + 1;
  const ny = Math.floor((box.max.y - box.min.y) / cell) + 1;
  const clusterOf = new Int32Array(vertices);
  const ids = new Map<number, number>();
  for (let v = 0; v < vertices; v++) {
    const ix = Math.floor((pos[3 * v] - box.min.x) / cell);
    const iy = Math.floor((pos[3 * v + 1] - box.min.y) / cell);
    const iz = Math.floor((pos[3 * v + 2] - box.min.z) / cell);
    const key = ix + nx * (iy + ny * iz);
    let id = ids.get(key);
    if (id === undefined) {
      id = ids.size;
      ids.set(key, id);
    }
    clusterOf[v] = id;
  }
  const k = ids.size;
  const p = new Float32Array(k * 3);
  const n = new Float32Array(k * 3);
  const c = new Float32Array(k * 3);
  const members = new Uint32Array(k);
  for (let v = 0; v < vertices; v++) {
    const id = clusterOf[v];
    members[id]++;
    for (let a = 0; a < 3; a++) {
      p[3 * id + a] += pos[3 * v + a];
      if (nor) n[3 * id + a] += nor[3 * v + a];
      if (col) c[3 * id + a] += col[3 * v + a];
    }
  }
  for (let id = 0; id < k; id++) {
    const m = members[id];
    for (let a = 0; a < 3; a++) {
      p[3 * id + a] /= m;
      c[3 * id + a] /= m;
    }
    const l = Math.hypot(n[3 * id], n[3 * id + 1], n[3 * id + 2]) || 1;
    for (let a = 0; a < 3; a++) n[3 * id + a] /= l;
  }
  const kept: number[] = [];
  for (let t = 0; t < index.length; t += 3) {
    const a = clusterOf[index[t]], b = clusterOf[index[t + 1]], d = clusterOf[index[t + 2]];
    if (a !== b && b !== d && a !== d) kept.push(a, b, d);
  }
  const g = new BufferGeometry();
  g.setAttribute('position', new BufferAttribute(p, 3));
  if (nor) g.setAttribute('normal', new BufferAttribute(n, 3));
  if (col) g.setAttribute('color', new BufferAttribute(c, 3));
  g.setIndex(new BufferAttribute(k > 65535 ? Uint32Array.from(kept) : Uint16Array.from(kept), 1));
  g.computeBoundingSphere();
  return g;
}
