import type { TriangleMesh } from './mesh';
import { hypot } from './hypot';
import { MinHeap } from './min-heap';

/**
 * Split break faces at the corners of their rim against the outer bone surface. On a shaft a
 * break face is a strip through the wall, and where two breaks meet, the line where the strip
 * meets the outer surface turns sharply (a splinter side running into a ring break, the tip of
 * a V) even when the two break surfaces meet at a shallow angle and no crease or difference of
 * mean normals separates them (face-split.ts). A corner is a point of the outer rim where the
 * rim's direction over `windowMm` before and after it differs by more than `cornerAngleDeg`;
 * the face is cut there along the shortest path over the face's interior edges from the
 * corner to its rim on the other side (any border that is not outer surface: the medullary
 * rim, another face). A cut is kept only when both pieces keep at least `minFaceArea` (mm²)
 * and `minOuterEdge` (mm) of rim against the outer surface (where the fracture angle is read)
 * and their mean normals differ by at least `minNormalDeg` (a rough single break also turns
 * along its rim; two breaks meeting at a corner face different ways as a whole even where
 * their surfaces run into each other without a crease).
 *
 * `faceGroup` is the face group of each triangle (-1: not fracture); faces are connected
 * triangles of one group. Returns new groups (split pieces get new ids; others keep theirs).
 */
export interface CornerSplitSettings {
  cornerAngleDeg: number;
  windowMm: number;
  minFaceArea: number;
  minOuterEdge: number;
  minNormalDeg: number;
  /** At most this many cuts per face. */
  maxCuts: number;
}

export function splitFacesAtCorners(
  mesh: TriangleMesh,
  neighbours: Int32Array,
  normals: Float32Array,
  areas: Float64Array,
  faceGroup: Int32Array,
  isOuter: (triangle: number) => boolean,
  settings: CornerSplitSettings,
): Int32Array {
  const out = Int32Array.from(faceGroup);
  if (settings.cornerAngleDeg >= 180 || settings.maxCuts <= 0) return out;
  const nt = faceGroup.length;
  const seen = new Uint8Array(nt);
  let nextGroup = 0;
  for (let f = 0; f < nt; f++) if (faceGroup[f] + 1 > nextGroup) nextGroup = faceGroup[f] + 1;
  const queue: number[][] = [];
  for (let s = 0; s < nt; s++) {
    if (faceGroup[s] < 0 || seen[s]) continue;
    const list = [s];
    seen[s] = 1;
    for (let k = 0; k < list.length; k++) {
      const f = list[k];
      for (let j = 0; j < 3; j++) {
        const g = neighbours[3 * f + j];
        if (g >= 0 && !seen[g] && faceGroup[g] === faceGroup[f]) { seen[g] = 1; list.push(g); }
      }
    }
    queue.push(list);
  }
  const inPiece = new Int32Array(nt).fill(-1);
  let pieceStamp = 0;
  const work = queue.map((tris) => ({ tris, cuts: 0 }));
  // Per-mesh work space of cutOnce: local numbers of a face's triangles and vertices.
  const nv = mesh.positions.length / 3;
  const scratch: CutScratch = { triangleLocal: new Int32Array(nt), vertexLocal: new Int32Array(nv), vertexSeen: new Int32Array(nv), vertexStamp: 0 };
  while (work.length) {
    const item = work.pop()!;
    if (item.cuts >= settings.maxCuts) continue;
    const stamp = ++pieceStamp;
    for (const f of item.tris) inPiece[f] = stamp;
    const pieces = cutOnce(mesh, neighbours, normals, areas, item.tris, (f) => f >= 0 && inPiece[f] === stamp, isOuter, settings, scratch);
    if (!pieces) continue;
    // The first piece keeps the group, the second takes a new one.
    const group = out[item.tris[0]];
    for (const f of pieces[1]) out[f] = nextGroup;
    for (const f of pieces[0]) out[f] = group;
    nextGroup++;
    work.push({ tris: pieces[0], cuts: item.cuts + 1 }, { tris: pieces[1], cuts: item.cuts + 1 });
  }
  return out;
}

/** Work space shared by the cuts of one mesh: local numbers (valid while `vertexSeen` holds the current stamp). */
interface CutScratch {
  triangleLocal: Int32Array;
  vertexLocal: Int32Array;
  vertexSeen: Int32Array;
  vertexStamp: number;
}

function cutOnce(
  mesh: TriangleMesh,
  neighbours: Int32Array,
  normals: Float32Array,
  areas: Float64Array,
  tris: number[],
  inFace: (f: number) => boolean,
  isOuter: (triangle: number) => boolean,
  settings: CornerSplitSettings,
  scratch: CutScratch,
): [number[], number[]] | undefined {
  const t = mesh.triangles, p = mesh.positions;
  let area = 0;
  for (const f of tris) area += areas[f];
  if (area < 2 * settings.minFaceArea) return undefined;
  // Border half-edges: outer rim (start vertex -> end vertex) and the other border's vertices.
  const rimNext = new Map<number, number>();
  const rimPrev = new Map<number, number>();
  const otherBorder = new Set<number>();
  const outerRimVertex = new Set<number>();
  for (const f of tris) {
    for (let j = 0; j < 3; j++) {
      const g = neighbours[3 * f + j];
      if (g >= 0 && inFace(g)) continue;
      const a = t[3 * f + j], b = t[3 * f + ((j + 1) % 3)];
      if (g >= 0 && isOuter(g)) {
        rimNext.set(a, b);
        rimPrev.set(b, a);
        outerRimVertex.add(a);
        outerRimVertex.add(b);
      } else {
        otherBorder.add(a);
        otherBorder.add(b);
      }
    }
  }
  if (!rimNext.size || !otherBorder.size) return undefined;
  // Chains of the outer rim: from a vertex with no predecessor, or round a loop.
  const chains: number[][] = [];
  const used = new Set<number>();
  const starts = [...rimNext.keys()].filter((v) => !rimPrev.has(v));
  for (const s of [...starts, ...rimNext.keys()]) {
    if (used.has(s)) continue;
    const chain = [s];
    used.add(s);
    let v = s;
    for (let guard = 0; guard < rimNext.size + 1; guard++) {
      const w = rimNext.get(v);
      if (w === undefined || used.has(w)) { if (w !== undefined && w === s) chain.push(s); break; }
      chain.push(w);
      used.add(w);
      v = w;
    }
    if (chain.length > 2) chains.push(chain);
  }
  const dist3 = (a: number, b: number): number => hypot(p[3 * a] - p[3 * b], p[3 * a + 1] - p[3 * b + 1], p[3 * a + 2] - p[3 * b + 2]);
  const cosCorner = Math.cos((settings.cornerAngleDeg * Math.PI) / 180);
  const corners: Array<{ v: number; turn: number }> = [];
  for (const chain of chains) {
    const loop = chain[0] === chain[chain.length - 1];
    const m = loop ? chain.length - 1 : chain.length;
    let total = 0;
    for (let i = 1; i < chain.length; i++) total += dist3(chain[i - 1], chain[i]);
    if (total < 2 * settings.windowMm) continue;
    const at = (i: number): number => chain[((i % m) + m) % m];
    const turns = new Float64Array(m).fill(-2);
    for (let i = 0; i < m; i++) {
      // walk back and forward windowMm along the rim
      let b = i, db = 0;
      while (db < settings.windowMm) { if (!loop && b === 0) break; const nb = b - 1; db += dist3(at(nb), at(b)); b = nb; if (b < i - m) break; }
      let fw = i, df = 0;
      while (df < settings.windowMm) { if (!loop && fw === m - 1) break; const nf = fw + 1; df += dist3(at(fw), at(nf)); fw = nf; if (fw > i + m) break; }
      if (db < settings.windowMm || df < settings.windowMm) continue;
      const c = at(i), pb = at(b), pf = at(fw);
      const ux = p[3 * c] - p[3 * pb], uy = p[3 * c + 1] - p[3 * pb + 1], uz = p[3 * c + 2] - p[3 * pb + 2];
      const vx = p[3 * pf] - p[3 * c], vy = p[3 * pf + 1] - p[3 * c + 1], vz = p[3 * pf + 2] - p[3 * c + 2];
      const cos = (ux * vx + uy * vy + uz * vz) / ((hypot(ux, uy, uz) * hypot(vx, vy, vz)) || 1);
      turns[i] = cos;
    }
    for (let i = 0; i < m; i++) {
      if (turns[i] === -2 || turns[i] >= cosCorner) continue;
      // local extreme within the window (smallest cosine)
      let best = true;
      let d = 0;
      for (let k = i + 1; d < settings.windowMm && (loop || k < m); k++) { d += dist3(at(k - 1), at(k)); if (turns[((k % m) + m) % m] !== -2 && turns[((k % m) + m) % m] < turns[i]) { best = false; break; } if (k > i + m) break; }
      d = 0;
      for (let k = i - 1; best && d < settings.windowMm && (loop || k >= 0); k--) { d += dist3(at(k + 1), at(k)); if (turns[((k % m) + m) % m] !== -2 && turns[((k % m) + m) % m] <= turns[i]) { best = false; break; } if (k < i - m) break; }
      if (best) corners.push({ v: at(i), turn: turns[i] });
    }
  }
  if (!corners.length) return undefined;
  corners.sort((x, y) => x.turn - y.turn);
  // Interior edges of the face (shared by two of its triangles) and the vertex graph over them.
  const edgeCount = new Map<number, number>();
  const nv = p.length / 3;
  for (const f of tris) for (let j = 0; j < 3; j++) {
    const a = t[3 * f + j], b = t[3 * f + ((j + 1) % 3)];
    const key = Math.min(a, b) * nv + Math.max(a, b);
    edgeCount.set(key, (edgeCount.get(key) ?? 0) + 1);
  }
  // The face in local numbers: triangle i is tris[i]; its vertices numbered in order of first use.
  const nf = tris.length;
  const vStamp = ++scratch.vertexStamp;
  const vertexOf: number[] = [];
  const localVertex = (v: number): number => {
    if (scratch.vertexSeen[v] !== vStamp) { scratch.vertexSeen[v] = vStamp; scratch.vertexLocal[v] = vertexOf.length; vertexOf.push(v); }
    return scratch.vertexLocal[v];
  };
  for (let i = 0; i < nf; i++) scratch.triangleLocal[tris[i]] = i;
  const localNeighbour = new Int32Array(3 * nf), cornerVertex = new Int32Array(3 * nf);
  // Length of each edge against outer surface outside the face (0 elsewhere): the pieces' rim.
  const rimEdge = new Float64Array(3 * nf);
  for (let i = 0; i < nf; i++) {
    const f = tris[i];
    for (let j = 0; j < 3; j++) {
      const g = neighbours[3 * f + j];
      const inside = g >= 0 && inFace(g);
      localNeighbour[3 * i + j] = inside ? scratch.triangleLocal[g] : -1;
      cornerVertex[3 * i + j] = localVertex(t[3 * f + j]);
      if (g >= 0 && !inside && isOuter(g)) rimEdge[3 * i + j] = dist3(t[3 * f + j], t[3 * f + ((j + 1) % 3)]);
    }
  }
  const nl = vertexOf.length;
  // Interior-edge graph over local vertices (compressed rows, in the order the edges were met).
  const degree = new Int32Array(nl + 1);
  for (const [key, c] of edgeCount) {
    if (c !== 2) continue;
    degree[scratch.vertexLocal[Math.floor(key / nv)]]++;
    degree[scratch.vertexLocal[key % nv]]++;
  }
  const rowStart = new Int32Array(nl + 1);
  for (let v = 0; v < nl; v++) rowStart[v + 1] = rowStart[v] + degree[v];
  const rowFill = rowStart.slice(0, nl);
  const adjacent = new Int32Array(rowStart[nl]);
  for (const [key, c] of edgeCount) {
    if (c !== 2) continue;
    const a = scratch.vertexLocal[Math.floor(key / nv)], b = scratch.vertexLocal[key % nv];
    adjacent[rowFill[a]++] = b;
    adjacent[rowFill[b]++] = a;
  }
  const graph: LocalGraph = { rowStart, adjacent, vertexOf, target: new Uint8Array(nl), outerRim: new Uint8Array(nl) };
  for (const v of otherBorder) graph.target[scratch.vertexLocal[v]] = 1;
  for (const v of outerRimVertex) graph.outerRim[scratch.vertexLocal[v]] = 1;
  const search: DijkstraSpace = { dist: new Float64Array(nl).fill(Infinity), prev: new Int32Array(nl).fill(-1), done: new Uint8Array(nl), touched: [], heap: new MinHeap() };
  const pathPos = new Int32Array(nl).fill(-1);
  const label = new Int32Array(nf).fill(-1);
  const cosNormal = Math.cos((settings.minNormalDeg * Math.PI) / 180);
  for (let c = 0; c < corners.length; c++) {
    const corner = corners[c];
    // The corner vertex itself may have no interior edge (a mesh corner): start from its rim neighbours too.
    const starts = [corner.v, rimNext.get(corner.v), rimPrev.get(corner.v)].filter((v): v is number => v !== undefined);
    const path = shortestCut(starts.map((v) => scratch.vertexLocal[v]), graph, search, (a, b) => dist3(vertexOf[a], vertexOf[b]));
    if (!path) continue;
    // Cut edges: consecutive vertices of the path (pathPos is the step, stamped by the corner's try).
    const base = 3 * c * (nl + 1);
    for (let k = 0; k < path.length; k++) pathPos[path[k]] = base + k;
    const isCut = (a: number, b: number): boolean => {
      const pa = pathPos[a], pb = pathPos[b];
      return pa >= base && pb >= base && (pa - pb === 1 || pb - pa === 1);
    };
    const pieces = componentsAcross(localNeighbour, cornerVertex, nf, isCut, label, c);
    // The path runs over interior vertices only, so on a face without holes it makes two pieces.
    if (pieces.length !== 2) continue;
    const ok = pieces.every((piece) => {
      let ar = 0, rim = 0;
      for (const i of piece) {
        ar += areas[tris[i]];
        rim += rimEdge[3 * i]; rim += rimEdge[3 * i + 1]; rim += rimEdge[3 * i + 2];
      }
      return ar >= settings.minFaceArea && rim >= settings.minOuterEdge;
    });
    if (!ok) continue;
    const [a, b] = pieces.map((piece) => piece.map((i) => tris[i]));
    if (settings.minNormalDeg > 0) {
      const mean = (piece: number[]): number[] => {
        const m = [0, 0, 0];
        for (const f of piece) for (let i = 0; i < 3; i++) m[i] += areas[f] * normals[3 * f + i];
        const l = hypot(m[0], m[1], m[2]) || 1;
        return m.map((x) => x / l);
      };
      const ma = mean(a), mb = mean(b);
      if (ma[0] * mb[0] + ma[1] * mb[1] + ma[2] * mb[2] > cosNormal) continue;
    }
    return [a, b];
  }
  return undefined;
}

/** A face's interior-edge graph over its own vertex numbers, with the vertices a cut may end on and the outer rim's. */
interface LocalGraph {
  rowStart: Int32Array;
  adjacent: Int32Array;
  /** Mesh vertex of each local vertex. */
  vertexOf: number[];
  /** 1: a vertex of the face's other border (where a cut ends). */
  target: Uint8Array;
  /** 1: a vertex of the outer rim (a cut does not run along it). */
  outerRim: Uint8Array;
}

/** Work space of shortestCut, reset between searches through `touched`. */
interface DijkstraSpace {
  dist: Float64Array;
  prev: Int32Array;
  done: Uint8Array;
  touched: number[];
  heap: MinHeap;
}

/**
 * Dijkstra over interior edges from rim vertices at a corner to the nearest vertex of the face's
 * other border; the path in local vertex numbers, from the corner side.
 */
function shortestCut(starts: number[], graph: LocalGraph, space: DijkstraSpace, dist3: (a: number, b: number) => number): number[] | undefined {
  const { dist, prev, done, touched, heap } = space;
  for (const v of touched) { dist[v] = Infinity; prev[v] = -1; done[v] = 0; }
  touched.length = 0;
  heap.clear();
  for (const v of starts) { dist[v] = dist3(starts[0], v); touched.push(v); }
  for (const v of starts) heap.push(v, dist[v]);
  const isStart = (v: number): boolean => starts.includes(v);
  while (heap.size) {
    const v = heap.pop(), d = heap.lastKey;
    if (done[v]) continue;
    done[v] = 1;
    if (graph.target[v] && !isStart(v)) {
      const path = [v];
      for (let x = v; prev[x] >= 0; ) { x = prev[x]; path.push(x); }
      return path.reverse();
    }
    if (graph.outerRim[v] && !isStart(v)) continue; // do not run along the outer rim
    for (let k = graph.rowStart[v]; k < graph.rowStart[v + 1]; k++) {
      const w = graph.adjacent[k];
      const nd = d + dist3(v, w);
      if (nd < dist[w]) {
        if (dist[w] === Infinity) touched.push(w);
        dist[w] = nd; prev[w] = v; heap.push(w, nd);
      }
    }
  }
  return undefined;
}

/**
 * Connected pieces of the face's triangles (local numbers), not crossing the cut edges.
 * `neighbour`: the face triangle across each edge (-1 outside the face); `corner`: the local
 * vertex at the start of each edge. `label` (per local triangle, reused) receives `stamp`.
 */
function componentsAcross(neighbour: Int32Array, corner: Int32Array, nf: number, isCut: (a: number, b: number) => boolean, label: Int32Array, stamp: number): number[][] {
  const pieces: number[][] = [];
  for (let s = 0; s < nf; s++) {
    if (label[s] === stamp) continue;
    const list = [s];
    label[s] = stamp;
    for (let k = 0; k < list.length; k++) {
      const f = list[k];
      for (let j = 0; j < 3; j++) {
        const g = neighbour[3 * f + j];
        if (g < 0 || label[g] === stamp) continue;
        if (isCut(corner[3 * f + j], corner[3 * f + (j === 2 ? 0 : j + 1)])) continue;
        label[g] = stamp;
        list.push(g);
      }
    }
    pieces.push(list);
  }
  return pieces;
}
