import type { Manifold, ManifoldToplevel, Mat4 } from 'manifold-3d';
import type { LabelledMesh } from './labelled-mesh';
import type { Random } from './random';
import { FRACTURE_BASE, LABEL_DAMAGE, LABEL_ORIGINAL } from './shatter';

export type DamageKind = 'chipped' | 'eroded' | 'flake lost';

export interface DamageRecord {
  breakId: number;
  kind: DamageKind;
}

/**
 * Post-depositional and excavation damage along fracture edges: small chips, a stretch of
 * eroded (rounded, nibbled) edge, or a lost flake of cortex, each taken from one side only so
 * that the two sides of the break no longer match there. Returns the damaged solid (the
 * original is deleted) or the same solid when nothing was done.
 */
export function damageEdges(
  wasm: ManifoldToplevel,
  solid: Manifold,
  mesh: LabelledMesh,
  labelOf: Map<number, number>,
  random: Random,
  probability: number,
): { solid: Manifold; records: DamageRecord[] } {
  const breakLabels = [...new Set(mesh.labels)].filter((l) => l >= FRACTURE_BASE).sort((a, b) => a - b);
  const rims = rimVertices(mesh);
  const tools: Manifold[] = [];
  const records: DamageRecord[] = [];
  for (const label of breakLabels) {
    if (!random.chance(probability)) continue;
    const rim = rims.get(label);
    if (!rim || rim.vertices.length < 4) continue;
    const kind = random.weighted([['chipped', 4], ['eroded', 3], ['flake lost', 2]] as const);
    records.push({ breakId: label - FRACTURE_BASE, kind });
    const pickAt = () => rim.vertices[random.int(0, rim.vertices.length - 1)];
    const p = mesh.positions;
    if (kind === 'chipped') {
      const n = random.int(1, 4);
      for (let i = 0; i < n; i++) {
        const v = pickAt();
        const r = random.uniform(0.8, 2.4);
        tools.push(ellipsoid(wasm, at(p, v, rim.normals, v, 0.25 * r), rim.normals[v], [r, r * random.uniform(0.7, 1), r * random.uniform(0.6, 1)], random));
      }
    } else if (kind === 'eroded') {
      const start = pickAt();
      const reach = random.uniform(6, 16);
      let last: [number, number, number] | undefined;
      for (const v of rim.vertices) {
        const q: [number, number, number] = [p[v * 3], p[v * 3 + 1], p[v * 3 + 2]];
        if (Math.hypot(q[0] - p[start * 3], q[1] - p[start * 3 + 1], q[2] - p[start * 3 + 2]) > reach) continue;
        if (last && Math.hypot(q[0] - last[0], q[1] - last[1], q[2] - last[2]) < 0.9) continue;
        last = q;
        const r = random.uniform(0.5, 1.1);
        tools.push(ellipsoid(wasm, at(p, v, rim.normals, v, 0.35 * r), rim.normals[v], [r, r, r], random));
      }
    } else {
      const v = pickAt();
      const thick = random.uniform(0.9, 1.6);
      tools.push(ellipsoid(wasm, at(p, v, rim.normals, v, thick * 0.45), rim.normals[v], [random.uniform(3, 6), random.uniform(2.5, 4.5), thick], random));
    }
  }
  if (tools.length === 0) return { solid, records };
  const cutter = wasm.Manifold.union(tools);
  for (const t of tools) t.delete();
  const marked = cutter.asOriginal();
  cutter.delete();
  labelOf.set(marked.originalID(), LABEL_DAMAGE);
  const damaged = solid.subtract(marked);
  marked.delete();
  solid.delete();
  // keep the largest part; a chip can cut off a crumb
  const parts = damaged.decompose();
  damaged.delete();
  parts.sort((a, b) => b.volume() - a.volume());
  for (const extra of parts.slice(1)) extra.delete();
  return { solid: parts[0], records };
}

interface Rim {
  vertices: number[];
  normals: Array<[number, number, number]>;
}

/** Vertices where a break face meets the original outer surface, with the outer surface's normal. */
function rimVertices(mesh: LabelledMesh): Map<number, Rim> {
  const { positions: p, triangles: t, labels } = mesh;
  const nv = p.length / 3;
  const outerNormal = new Float64Array(nv * 3);
  const onOuter = new Uint8Array(nv);
  const faceOf = new Map<number, Set<number>>();
  for (let i = 0; i < labels.length; i++) {
    const a = t[i * 3], b = t[i * 3 + 1], c = t[i * 3 + 2];
    if (labels[i] === LABEL_ORIGINAL) {
      const ux = p[b * 3] - p[a * 3], uy = p[b * 3 + 1] - p[a * 3 + 1], uz = p[b * 3 + 2] - p[a * 3 + 2];
      const vx = p[c * 3] - p[a * 3], vy = p[c * 3 + 1] - p[a * 3 + 1], vz = p[c * 3 + 2] - p[a * 3 + 2];
      const nx = uy * vz - uz * vy, ny = uz * vx - ux * vz, nz = ux * vy - uy * vx;
      for (const v of [a, b, c]) {
        onOuter[v] = 1;
        outerNormal[v * 3] += nx;
        outerNormal[v * 3 + 1] += ny;
        outerNormal[v * 3 + 2] += nz;
      }
    } else if (labels[i] >= FRACTURE_BASE) {
      let s = faceOf.get(labels[i]);
      if (!s) faceOf.set(labels[i], (s = new Set()));
      s.add(a).add(b).add(c);
    }
  }
  const rims = new Map<number, Rim>();
  for (const [label, verts] of faceOf) {
    const vertices = [...verts].filter((v) => onOuter[v]).sort((x, y) => x - y);
    const normals: Array<[number, number, number]> = [];
    for (const v of vertices) {
      const n = Math.hypot(outerNormal[v * 3], outerNormal[v * 3 + 1], outerNormal[v * 3 + 2]) || 1;
      normals[v] = [outerNormal[v * 3] / n, outerNormal[v * 3 + 1] / n, outerNormal[v * 3 + 2] / n];
    }
    rims.set(label, { vertices, normals });
  }
  return rims;
}

function at(p: Float32Array, v: number, normals: Array<[number, number, number]>, nv: number, out: number): [number, number, number] {
  const n = normals[nv];
  return [p[v * 3] + n[0] * out, p[v * 3 + 1] + n[1] * out, p[v * 3 + 2] + n[2] * out];
}

/** A low-poly ellipsoid with its third axis along `normal`, turned randomly about it. */
function ellipsoid(wasm: ManifoldToplevel, center: [number, number, number], normal: [number, number, number], radii: [number, number, number], random: Random): Manifold {
  const n = normal;
  let e1: [number, number, number] = Math.abs(n[0]) < 0.9 ? [1, 0, 0] : [0, 1, 0];
  const d = e1[0] * n[0] + e1[1] * n[1] + e1[2] * n[2];
  e1 = [e1[0] - d * n[0], e1[1] - d * n[1], e1[2] - d * n[2]];
  const l = Math.hypot(...e1);
  e1 = [e1[0] / l, e1[1] / l, e1[2] / l];
  let e2: [number, number, number] = [n[1] * e1[2] - n[2] * e1[1], n[2] * e1[0] - n[0] * e1[2], n[0] * e1[1] - n[1] * e1[0]];
  const turn = random.uniform(0, Math.PI);
  const c = Math.cos(turn), s = Math.sin(turn);
  const a1: [number, number, number] = [c * e1[0] + s * e2[0], c * e1[1] + s * e2[1], c * e1[2] + s * e2[2]];
  e2 = [-s * e1[0] + c * e2[0], -s * e1[1] + c * e2[1], -s * e1[2] + c * e2[2]];
  // column-major: columns are the scaled axes, then the translation
  const m: Mat4 = [
    a1[0] * radii[0], a1[1] * radii[0], a1[2] * radii[0], 0,
    e2[0] * radii[1], e2[1] * radii[1], e2[2] * radii[1], 0,
    n[0] * radii[2], n[1] * radii[2], n[2] * radii[2], 0,
    center[0], center[1], center[2], 1,
  ];
  const unit = wasm.Manifold.sphere(1, 16);
  const placed = unit.transform(m);
  unit.delete();
  return placed;
}
