import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BufferAttribute, BufferGeometry, Vector3 } from 'three';
import { MeshBVH } from 'three-mesh-bvh';
import { generateAssemblage } from '../../../demo-data/generate';
import { loadTruth, readScanPly, type Truth } from './read-scan';

// A small noise-free assemblage without damage or losses: the truth must then hold exactly.
let dir: string;
let truth: Truth;
beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'knitbone-demo-truth-'));
  await generateAssemblage({ outDir: dir, fragments: 12, seed: 'truth-check', pointSpacing: 1.5, noiseSd: [0, 0], damage: false, losses: false, elements: [0, 1] });
  truth = loadTruth(dir);
}, 180_000);
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('demo assemblage truth', () => {
  it('writes one scan per specimen row and per truth fragment', () => {
    const scans = readdirSync(join(dir, 'scans'));
    const rows = readFileSync(join(dir, 'specimens.csv'), 'utf8').trim().split('\n');
    expect(scans.length).toBe(12);
    expect(rows.length).toBe(13);
    expect(truth.fragments.map((f) => `${f.catalogueNo}.ply`).sort()).toEqual(scans.sort());
  });

  it('has the columns of the catalogue import format (issue 2, item 5)', () => {
    const header = readFileSync(join(dir, 'specimens.csv'), 'utf8').split('\n')[0];
    expect(header).toBe('catalogue_no,unit,level,layer,x,y,z,taxon,element,side,portion,fusion,size_class,break_age,modifications,weight_g,notes');
  });

  it('true transforms bring the two sides of every break into contact (mean gap < 0.2 mm before noise)', () => {
    expect(truth.joins.length).toBeGreaterThan(4);
    const byNo = new Map(truth.fragments.map((f) => [f.catalogueNo, f]));
    const spacing = truth.pointSpacingMm;
    let checked = 0;
    for (const join of truth.joins) {
      if (join.contactAreaMm2 < 30) continue;
      const A = byNo.get(join.a)!;
      const B = byNo.get(join.b)!;
      const label = 10 + join.breakId;
      const a = faceOf(dir, A, label);
      const b = faceOf(dir, B, label);
      // either direction: the smaller face lies on the larger one
      const ab = gapOnto(b.vertices, join.transformBToA, a, spacing);
      const ba = gapOnto(a.vertices, invert(join.transformBToA), b, spacing);
      const best = ab.covered >= ba.covered ? ab : ba;
      expect(best.covered, `${join.a}-${join.b} break ${join.breakId}`).toBeGreaterThan(0.3);
      expect(best.meanGap, `${join.a}-${join.b} break ${join.breakId}`).toBeLessThan(0.2);
      checked++;
    }
    expect(checked).toBeGreaterThan(4);
  });

  it('every scan is a closed, consistently oriented surface whose volume agrees with the truth', () => {
    for (const f of truth.fragments) {
      const { positions, triangles } = readScanPly(join(dir, f.scanFile));
      // closed 2-manifold: each directed edge once, and its reverse once (definition)
      const directed = new Map<string, number>();
      for (let t = 0; t < triangles.length; t += 3)
        for (let e = 0; e < 3; e++) {
          const k = `${triangles[t + e]},${triangles[t + ((e + 1) % 3)]}`;
          directed.set(k, (directed.get(k) ?? 0) + 1);
        }
      let bad = 0;
      for (const [k, n] of directed) {
        const [x, y] = k.split(',');
        if (n !== 1 || directed.get(`${y},${x}`) !== 1) bad++;
      }
      expect(bad, f.catalogueNo).toBe(0);
      // divergence theorem: V = sum over triangles of a.(b x c)/6
      let v = 0;
      for (let t = 0; t < triangles.length; t += 3) {
        const [a, b, c] = [triangles[t] * 3, triangles[t + 1] * 3, triangles[t + 2] * 3];
        const p = positions;
        v += p[a] * (p[b + 1] * p[c + 2] - p[b + 2] * p[c + 1]) - p[a + 1] * (p[b] * p[c + 2] - p[b + 2] * p[c]) + p[a + 2] * (p[b] * p[c + 1] - p[b + 1] * p[c]);
      }
      expect(Math.abs(v / 6 - f.volumeMm3) / f.volumeMm3, f.catalogueNo).toBeLessThan(0.02);
    }
  });
});

interface Face {
  vertices: number[];
  bvh: MeshBVH;
  /** Edges of the face's outline: used by one triangle of the face only (x0 y0 z0 x1 y1 z1 ...). */
  outline: number[];
}

/** Vertices and a BVH of the triangles of one fracture face of a scan. */
function faceOf(dir: string, f: Truth['fragments'][number], label: number): Face {
  const { positions, triangles } = readScanPly(join(dir, f.scanFile));
  const labels = Buffer.from(f.triangleLabels, 'base64');
  const tris: number[] = [];
  const verts = new Set<number>();
  for (let t = 0; t < labels.length; t++) {
    if (labels[t] !== label) continue;
    tris.push(triangles[t * 3], triangles[t * 3 + 1], triangles[t * 3 + 2]);
    for (let k = 0; k < 3; k++) verts.add(triangles[t * 3 + k]);
  }
  const g = new BufferGeometry();
  g.setAttribute('position', new BufferAttribute(positions, 3));
  g.setIndex(tris);
  const vertices: number[] = [];
  for (const v of verts) vertices.push(positions[v * 3], positions[v * 3 + 1], positions[v * 3 + 2]);
  const uses = new Map<string, number>();
  for (let t = 0; t < tris.length; t += 3)
    for (let e = 0; e < 3; e++) {
      const [a, b] = [tris[t + e], tris[t + ((e + 1) % 3)]];
      const k = a < b ? `${a},${b}` : `${b},${a}`;
      uses.set(k, (uses.get(k) ?? 0) + 1);
    }
  const outline: number[] = [];
  for (const [k, n] of uses) {
    if (n !== 1) continue;
    const [a, b] = k.split(',').map(Number);
    outline.push(positions[a * 3], positions[a * 3 + 1], positions[a * 3 + 2], positions[b * 3], positions[b * 3 + 1], positions[b * 3 + 2]);
  }
  return { vertices, bvh: new MeshBVH(g), outline };
}

/**
 * Move points by m and measure their distance to the other face (three-mesh-bvh's closest
 * point). A point is measured only where the other face has surface under it: its closest
 * point must not lie on that face's outline (so a face that extends past its partner's edge,
 * where the partner broke again, is not measured where the partner has no surface).
 */
function gapOnto(points: number[], m: number[], onto: Face, spacing: number): { covered: number; meanGap: number } {
  const p = new Vector3();
  const target = new Vector3();
  let sum = 0;
  let n = 0;
  const total = points.length / 3;
  const onOutline = spacing * 1e-3;
  for (let i = 0; i < total; i++) {
    const [x, y, z] = [points[i * 3], points[i * 3 + 1], points[i * 3 + 2]];
    p.set(m[0] * x + m[1] * y + m[2] * z + m[3], m[4] * x + m[5] * y + m[6] * z + m[7], m[8] * x + m[9] * y + m[10] * z + m[11]);
    const hit = onto.bvh.closestPointToPoint(p, { point: target, distance: 0, faceIndex: 0 } as never);
    if (!hit || distanceToOutline(onto.outline, hit.point) < onOutline) continue;
    sum += hit.distance;
    n++;
  }
  return { covered: n / total, meanGap: n ? sum / n : Infinity };
}

function distanceToOutline(o: number[], q: Vector3): number {
  let best = Infinity;
  for (let i = 0; i < o.length; i += 6) {
    const dx = o[i + 3] - o[i], dy = o[i + 4] - o[i + 1], dz = o[i + 5] - o[i + 2];
    const len2 = dx * dx + dy * dy + dz * dz || 1e-30;
    const t = Math.max(0, Math.min(1, ((q.x - o[i]) * dx + (q.y - o[i + 1]) * dy + (q.z - o[i + 2]) * dz) / len2));
    const ex = o[i] + t * dx - q.x, ey = o[i + 1] + t * dy - q.y, ez = o[i + 2] + t * dz - q.z;
    best = Math.min(best, ex * ex + ey * ey + ez * ez);
  }
  return Math.sqrt(best);
}

function invert(m: number[]): number[] {
  const r = [m[0], m[4], m[8], m[1], m[5], m[9], m[2], m[6], m[10]];
  const t = [m[3], m[7], m[11]];
  const ti = [0, 1, 2].map((i) => -(r[i * 3] * t[0] + r[i * 3 + 1] * t[1] + r[i * 3 + 2] * t[2]));
  return [r[0], r[1], r[2], ti[0], r[3], r[4], r[5], ti[1], r[6], r[7], r[8], ti[2], 0, 0, 0, 1];
}
