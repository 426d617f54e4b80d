/**
 * Study (issue 5, slabs): per pair of regions read outer cortical and medullary whose inward
 * rays cross head-on from one to the other, the median depth of those crossings against the
 * outer region's distance from the shaft axis, with both regions' truth.
 * Run: npx tsx tests/bench/wall-pair-study.ts DIR[,DIR] [settings]
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { analyseFragment } from '../../core/geometry/analyse-fragment';
import { buildTopology } from '../../core/geometry/topology';
import { triangleNormalsAndAreas } from '../../core/geometry/mesh';
import { bilateralNormalFilter, triangleCentroids } from '../../core/geometry/normal-filter';
import { parseMeshFile } from '../../core/geometry/parse/index';
import { offsetFromAxis } from '../../core/geometry/shaft-axis';
import { castWallRays } from '../../core/geometry/wall-rays';
import type { TruthFragment } from './generator-axis';

interface Truth { fragments: TruthFragment[] }
const dirs = (process.argv[2] ?? '').split(',').filter(Boolean);
const overrides = JSON.parse(process.argv[3] ?? '{}') as Record<string, unknown>;
const median = (v: number[]): number => { const s = [...v].sort((x, y) => x - y); return s.length ? s[Math.floor(s.length / 2)] : NaN; };
for (const dir of dirs) {
  const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as Truth;
  for (const frag of truth.fragments) {
    const parsed = parseMeshFile(readFileSync(join(dir, frag.scanFile)), frag.scanFile);
    const labels = Buffer.from(frag.triangleLabels, 'base64');
    const { areas: srcAreas } = triangleNormalsAndAreas(parsed.mesh);
    const a = analyseFragment(parsed.mesh, overrides);
    const s = a.settings;
    const { normals, areas } = triangleNormalsAndAreas(a.mesh);
    const topo = buildTopology(a.mesh);
    const centroids = triangleCentroids(a.mesh.positions, a.mesh.triangles);
    const filtered = bilateralNormalFilter(normals, areas, centroids, topo.neighbours, s.normalFilterIterations, s.normalFilterRange);
    const rays = castWallRays(a.mesh, filtered, centroids, s.maxWallRays);
    const reg = a.regionOfTriangle;
    const nr = a.regions.length;
    const brk = new Float64Array(nr), tot = new Float64Array(nr), dist = new Float64Array(nr), dw = new Float64Array(nr);
    const q: [number, number, number] = [0, 0, 0];
    for (let f = 0; f < reg.length; f++) {
      const sa = srcAreas[a.sourceTriangle[f]];
      tot[reg[f]] += sa; if (labels[a.sourceTriangle[f]] >= 2) brk[reg[f]] += sa;
      offsetFromAxis(a.axis, centroids[3 * f], centroids[3 * f + 1], centroids[3 * f + 2], q);
      dist[reg[f]] += areas[f] * Math.hypot(q[0], q[1], q[2]); dw[reg[f]] += areas[f];
    }
    const depths = new Map<string, number[]>();
    const raysOf = new Float64Array(nr);
    for (let k = 0; k < rays.triangles.length; k++) {
      const A = reg[rays.triangles[k]]; raysOf[A]++;
      const g = rays.exitTriangle[k];
      if (g < 0 || rays.exitCosine[k] < s.headOnCosineMin) continue;
      const B = reg[g]; if (A === B) continue;
      const key = `${A},${B}`;
      (depths.get(key) ?? depths.set(key, []).get(key)!).push(rays.distance[k]);
    }
    const cls = a.regions.map((r) => r.surfaceClass);
    for (const [key, d] of depths) {
      const [A, B] = key.split(',').map(Number);
      if (cls[A] !== 'outer-cortical' || cls[B] !== 'medullary') continue;
      const back = depths.get(`${B},${A}`) ?? [];
      if (d.length + back.length < 10) continue;
      const D = median([...d, ...back]);
      const dA = dist[A] / dw[A], dB = dist[B] / dw[B];
      console.log(`${dir.split('/').pop()} ${frag.catalogueNo} ${frag.element.padEnd(10)} out r${A} ${a.regions[A].area.toFixed(0)} brk ${(brk[A] / tot[A]).toFixed(2)} med r${B} ${a.regions[B].area.toFixed(0)} brk ${(brk[B] / tot[B]).toFixed(2)} n ${d.length}/${raysOf[A]} ${back.length}/${raysOf[B]} depth ${D.toFixed(2)} dA ${dA.toFixed(1)} dB ${dB.toFixed(1)} R ${a.axis.radius.toFixed(1)} ratio ${(D / dA).toFixed(3)} HA ${a.regions[A].meanCurvature.toFixed(3)} HB ${a.regions[B].meanCurvature.toFixed(3)}${a.axis.section ? ' ell' : ''}`);
    }
  }
}
