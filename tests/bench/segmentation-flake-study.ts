/**
 * Flake scars along the cavity (issue 5 study): regions facing the shaft axis whose truth holds
 * break and cavity together, and whether the distance from the fitted axis (or the depth of the
 * inward rays) tells the two apart. Per region facing the axis (radial at most -0.5, 300 mm² or
 * more, break share at least STUDY_MIN_BREAK, default 0.05): per truth part the area-weighted
 * median distance from the axis and ray depth; the fragment's cavity radius (area-weighted median
 * distance of the triangles classed medullary, and the elliptic section's mean cavity radius when
 * it has one); the best threshold on distance (oracle: area labelled right against the region's
 * majority), and the area beyond cavity radius + 1, 1.5, 2, 3 mm by truth part.
 * Run: npx tsx tests/bench/segmentation-flake-study.ts DIR[,DIR...] [settings JSON] [catalogue numbers, comma-separated]
 */
import { basename } from 'node:path';
import { offsetFromAxis } from '../../core/geometry/shaft-axis';
import { castWallRays } from '../../core/geometry/wall-rays';
import { weightedMedian } from '../../core/geometry/weighted-median';
import { studyFragments } from './segmentation-study-fragments';

const dirs = (process.argv[2] ?? '').split(',').filter(Boolean);
const settings = JSON.parse(process.argv[3] ?? '{}') as Record<string, unknown>;
const only = new Set((process.argv[4] ?? '').split(',').filter(Boolean));
const minBreak = Number(process.env.STUDY_MIN_BREAK ?? 0.05);
const minArea = Number(process.env.STUDY_MIN_AREA ?? 300);
const deltas = [1, 1.5, 2, 3];
const f1 = (x: number): string => x.toFixed(1), f2 = (x: number): string => x.toFixed(2);
const wmed = (rows: Array<[number, number]>): number => (rows.length ? weightedMedian(rows) : NaN);
for (const dir of dirs) {
  let total = 0, oracleGain = 0;
  const beyondAll = deltas.map(() => [0, 0]);
  for (const { frag, labels, a, areas, centroids, filtered } of studyFragments(dir, settings)) {
    if (only.size && !only.has(frag.catalogueNo)) continue;
    const reg = a.regionOfTriangle, nt = reg.length, nr = a.regions.length;
    const isBreak = (f: number): boolean => labels[a.sourceTriangle[f]] >= 2;
    const q: [number, number, number] = [0, 0, 0];
    const dist = new Float64Array(nt), radial = new Float64Array(nt);
    for (let f = 0; f < nt; f++) {
      total += areas[f];
      offsetFromAxis(a.axis, centroids[3 * f], centroids[3 * f + 1], centroids[3 * f + 2], q);
      dist[f] = Math.hypot(q[0], q[1], q[2]);
      radial[f] = (filtered[3 * f] * q[0] + filtered[3 * f + 1] * q[1] + filtered[3 * f + 2] * q[2]) / (dist[f] || 1);
    }
    if (a.axis.support < 0.5) continue;
    const medRows: Array<[number, number]> = [];
    for (let f = 0; f < nt; f++) if (a.regions[reg[f]].surfaceClass === 'medullary') medRows.push([dist[f], areas[f]]);
    const cavity = wmed(medRows);
    const s = a.axis.section;
    const sectionCavity = s ? (s.inner[0] + s.inner[1]) / 2 : NaN;
    const rays = castWallRays(a.mesh, filtered, centroids, a.settings.maxWallRays);
    const depthOf = new Float64Array(nt).fill(NaN);
    for (let k = 0; k < rays.triangles.length; k++) depthOf[rays.triangles[k]] = rays.distance[k];
    for (let r = 0; r < nr; r++) {
      const R = a.regions[r];
      if (R.area < minArea || R.radial > -0.5) continue;
      const tris: number[] = [];
      for (let f = 0; f < nt; f++) if (reg[f] === r) tris.push(f);
      let br = 0, all = 0;
      for (const f of tris) { all += areas[f]; if (isBreak(f)) br += areas[f]; }
      if (br / all < minBreak) continue;
      const part = (b: boolean): { d: number; depth: number } => ({
        d: wmed(tris.filter((f) => isBreak(f) === b).map((f) => [dist[f], areas[f]] as [number, number])),
        depth: wmed(tris.filter((f) => isBreak(f) === b && Number.isFinite(depthOf[f])).map((f) => [depthOf[f], areas[f]] as [number, number])),
      });
      const pb = part(true), po = part(false);
      // Oracle threshold on distance: break beyond it (the scar lies deeper in the wall than the cavity).
      const sorted = [...tris].sort((x, y) => dist[x] - dist[y]);
      let belowBreak = 0, belowOrig = 0, best = Math.max(br, all - br), bestT = NaN;
      for (const f of sorted) {
        if (isBreak(f)) belowBreak += areas[f]; else belowOrig += areas[f];
        const right = belowOrig + (br - belowBreak);
        if (right > best) { best = right; bestT = dist[f]; }
      }
      oracleGain += best - Math.max(br, all - br);
      const beyond = deltas.map((dl, i) => {
        let b = 0, o = 0;
        for (const f of tris) if (dist[f] > cavity + dl) { if (isBreak(f)) b += areas[f]; else o += areas[f]; }
        beyondAll[i][0] += b; beyondAll[i][1] += o;
        return `+${dl}: ${b.toFixed(0)}/${o.toFixed(0)}`;
      });
      console.log(`${basename(dir)} ${frag.catalogueNo} ${frag.element} r${r} ${R.surfaceClass} area ${all.toFixed(0)} break ${f2(br / all)} R ${f1(a.axis.radius)} cavity ${f1(cavity)}${s ? ` section cavity ${f1(sectionCavity)}` : ''} support ${f2(a.axis.support)}`);
      console.log(`   dist break ${f1(pb.d)} orig ${f1(po.d)}; ray depth break ${f1(pb.depth)} orig ${f1(po.depth)}; oracle threshold ${f1(bestT)} gains ${(best - Math.max(br, all - br)).toFixed(0)} mm2; beyond cavity (break/orig) ${beyond.join(' ')}`);
    }
  }
  console.log(`${basename(dir)}: oracle distance split gains ${(100 * oracleGain / total).toFixed(2)} points; beyond cavity + d over regions listed (break/orig mm2): ${deltas.map((dl, i) => `+${dl} ${beyondAll[i][0].toFixed(0)}/${beyondAll[i][1].toFixed(0)}`).join(', ')}`);
}
