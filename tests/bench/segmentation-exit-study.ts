/**
 * Where the inward rays of regions read as bone surface leave the fragment (issue 5 study): for
 * every region the pipeline classes as original surface, the share of its inward rays
 * (wall-rays.ts) that leave through triangles it classes as fracture, and how many of those leave
 * head-on, beside the region's truth (share of break area). A bone-surface region whose rays leave
 * through break faces may be a break face itself (two parallel breaks of a sliver).
 * Run: npx tsx tests/bench/segmentation-exit-study.ts DIR[,DIR...] [settings JSON] [min share, default 0.3]
 */
import { basename } from 'node:path';
import { castWallRays } from '../../core/geometry/wall-rays';
import { studyFragments } from './segmentation-study-fragments';

const dirs = (process.argv[2] ?? '').split(',').filter(Boolean);
const settings = JSON.parse(process.argv[3] ?? '{}') as Record<string, unknown>;
const minShare = Number(process.argv[4] ?? 0.3);
for (const dir of dirs) {
  for (const { frag, labels, a, areas, centroids, filtered } of studyFragments(dir, settings)) {
    const mesh = a.mesh;
    const rays = castWallRays(mesh, filtered, centroids, a.settings.maxWallRays);
    const nr = a.regions.length;
    const n = new Float64Array(nr), toF = new Float64Array(nr), toFHead = new Float64Array(nr), brk = new Float64Array(nr), tot = new Float64Array(nr);
    for (let k = 0; k < rays.triangles.length; k++) {
      const r = a.regionOfTriangle[rays.triangles[k]];
      n[r]++;
      const g = rays.exitTriangle[k];
      if (g >= 0 && a.triangleClass[g] === 0) { toF[r]++; if (rays.exitCosine[k] >= a.settings.headOnCosineMin) toFHead[r]++; }
    }
    for (let f = 0; f < a.regionOfTriangle.length; f++) {
      const r = a.regionOfTriangle[f];
      tot[r] += areas[f];
      if (labels[a.sourceTriangle[f]] >= 2) brk[r] += areas[f];
    }
    for (const r of a.regions) {
      if (r.kind !== 'original' || n[r.id] === 0 || toF[r.id] / n[r.id] < minShare) continue;
      console.log([basename(dir), frag.catalogueNo, frag.element, r.id, r.surfaceClass, r.area.toFixed(0), `brk ${(brk[r.id] / tot[r.id]).toFixed(2)}`,
        `toF ${(toF[r.id] / n[r.id]).toFixed(2)}`, `toFhead ${(toFHead[r.id] / n[r.id]).toFixed(2)}`, `headOn ${r.headOnShare.toFixed(2)}`, `depth ${r.rayDepth.toFixed(1)}`,
        `H ${r.meanCurvature.toFixed(3)}`, `radial ${r.radial.toFixed(2)}`, `sharp ${r.sharpBorderShare.toFixed(2)}`, `support ${a.axis.support.toFixed(2)}`].join(' '));
    }
  }
}
