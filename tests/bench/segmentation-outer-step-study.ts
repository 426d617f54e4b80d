/**
 * Outer-read regions whose wall is thin for their own fragment (issue 5 study): for every region
 * the pipeline reads as outer cortical, the median depth of its inward rays that leave head-on
 * through regions read medullary, against the fragment's reference crossing (all such rays of
 * outer-read regions, area-weighted quantile), and its median distance from the axis against
 * that of all outer-read surface; with the region's truth share of break. Writes JSON lines.
 * Run: npx tsx tests/bench/segmentation-outer-step-study.ts DIR[,DIR...] OUT.jsonl [settings JSON]
 */
import { appendFileSync, writeFileSync } from 'node:fs';
import { basename } from 'node:path';
import { castWallRays } from '../../core/geometry/wall-rays';
import { offsetFromAxis } from '../../core/geometry/shaft-axis';
import { studyFragments } from './segmentation-study-fragments';

const dirs = (process.argv[2] ?? '').split(',').filter(Boolean);
const outFile = process.argv[3] ?? '/tmp/outer-step.jsonl';
const settings = JSON.parse(process.argv[4] ?? '{}') as Record<string, unknown>;
writeFileSync(outFile, '');
const quant = (x: number[], q: number): number => { const s = [...x].sort((a, b) => a - b); return s.length ? s[Math.min(s.length - 1, Math.floor(q * s.length))] : NaN; };
for (const dir of dirs) {
  for (const { frag, labels, a, areas, centroids, filtered } of studyFragments(dir, settings)) {
    const rays = castWallRays(a.mesh, filtered, centroids, a.settings.maxWallRays);
    const nr = a.regions.length, reg = a.regionOfTriangle;
    const cls = a.regions.map((r) => r.surfaceClass);
    const brk = new Float64Array(nr), tot = new Float64Array(nr);
    for (let f = 0; f < reg.length; f++) { tot[reg[f]] += areas[f]; if (labels[a.sourceTriangle[f]] >= 2) brk[reg[f]] += areas[f]; }
    const dist: number[][] = Array.from({ length: nr }, () => []);
    const q: [number, number, number] = [0, 0, 0];
    const outerDist: number[] = [];
    for (let f = 0; f < reg.length; f++) {
      const [x, y, z] = offsetFromAxis(a.axis, centroids[3 * f], centroids[3 * f + 1], centroids[3 * f + 2], q);
      const d = Math.hypot(x, y, z);
      dist[reg[f]].push(d);
      if (cls[reg[f]] === 'outer-cortical') outerDist.push(d);
    }
    const cross: number[][] = Array.from({ length: nr }, () => []);
    const all: number[] = [];
    const nRays = new Float64Array(nr);
    for (let k = 0; k < rays.triangles.length; k++) {
      const f = rays.triangles[k], r = reg[f];
      nRays[r]++;
      const g = rays.exitTriangle[k];
      if (cls[r] !== 'outer-cortical' || g < 0 || rays.exitCosine[k] < a.settings.headOnCosineMin || cls[reg[g]] !== 'medullary') continue;
      cross[r].push(rays.distance[k]);
      all.push(rays.distance[k]);
    }
    const ref50 = quant(all, 0.5), ref75 = quant(all, 0.75);
    const outerMed = quant(outerDist, 0.5), outer75 = quant(outerDist, 0.75);
    for (const r of a.regions) {
      if (r.surfaceClass !== 'outer-cortical' || r.area < 30) continue;
      const row = {
        set: basename(dir), frag: frag.catalogueNo, element: frag.element, region: r.id, area: +r.area.toFixed(0), truthF: +(brk[r.id] / tot[r.id]).toFixed(3),
        support: +a.axis.support.toFixed(2), ell: !!a.axis.section, radial: +r.radial.toFixed(2), H: +r.meanCurvature.toFixed(3),
        crossN: cross[r.id].length, crossShare: +(cross[r.id].length / (nRays[r.id] || 1)).toFixed(2), cross50: +quant(cross[r.id], 0.5).toFixed(2),
        ref50: +ref50.toFixed(2), ref75: +ref75.toFixed(2), refN: all.length, dist50: +quant(dist[r.id], 0.5).toFixed(2), outerMed: +outerMed.toFixed(2), outer75: +outer75.toFixed(2),
        headOn: +r.headOnShare.toFixed(2), thin: +r.thinCrossingShare.toFixed(2), depth: +r.rayDepth.toFixed(2),
      };
      appendFileSync(outFile, JSON.stringify(row) + '\n');
    }
  }
  console.log('done', dir);
}
