/**
 * Mixed regions (issue 5 study): regions whose truth holds break and bone surface together
 * (neither over `STUDY_MIX` of the area, default 0.8), with what might split them: per part
 * (break / original) its area, mean filtered normal, mean radial component about the fitted
 * axis, median distance from the axis, median mean curvature and roughness; the angle between
 * the parts' mean normals; and along the truth border inside the region its length and the
 * angle between the filtered normals across it (mean, share over 10 and 20 degrees).
 * Run: npx tsx tests/bench/segmentation-mixed-regions.ts DIR[,DIR...] [settings JSON] [catalogue numbers, comma-separated]
 */
import { basename } from 'node:path';
import { offsetFromAxis } from '../../core/geometry/shaft-axis';
import { studyFragments } from './segmentation-study-fragments';

const dirs = (process.argv[2] ?? '').split(',').filter(Boolean);
const settings = JSON.parse(process.argv[3] ?? '{}') as Record<string, unknown>;
const only = new Set((process.argv[4] ?? '').split(',').filter(Boolean));
const mix = Number(process.env.STUDY_MIX ?? 0.8);
const minArea = Number(process.env.STUDY_MIN_AREA ?? 300);
const med = (x: number[]): number => { const s = [...x].sort((p, q) => p - q); return s[Math.floor(s.length / 2)] ?? NaN; };
const f2 = (x: number): string => x.toFixed(2), f3 = (x: number): string => x.toFixed(3);
for (const dir of dirs) {
  let total = 0, mixedUnavoidable = 0;
  for (const { frag, labels, a, topo, areas, centroids, filtered } of studyFragments(dir, settings)) {
    if (only.size && !only.has(frag.catalogueNo)) continue;
    const reg = a.regionOfTriangle, nt = reg.length, nr = a.regions.length;
    const isBreak = (f: number): boolean => labels[a.sourceTriangle[f]] >= 2;
    const br = new Float64Array(nr), tot = new Float64Array(nr);
    for (let f = 0; f < nt; f++) { tot[reg[f]] += areas[f]; if (isBreak(f)) br[reg[f]] += areas[f]; total += areas[f]; }
    const k1 = a.curvature.k1, k2 = a.curvature.k2, rough = a.curvature.roughness, t = a.mesh.triangles, p = a.mesh.positions;
    const q: [number, number, number] = [0, 0, 0];
    for (let r = 0; r < nr; r++) {
      const share = br[r] / (tot[r] || 1);
      if (tot[r] < minArea || share <= 1 - mix || share >= mix) continue;
      mixedUnavoidable += Math.min(br[r], tot[r] - br[r]);
      const parts = [0, 1].map(() => ({ area: 0, n: [0, 0, 0], radial: 0, dist: [] as number[], H: [] as number[], R: [] as number[] }));
      let bLen = 0, bAng = 0, b10 = 0, b20 = 0;
      for (let f = 0; f < nt; f++) {
        if (reg[f] !== r) continue;
        const P = parts[isBreak(f) ? 0 : 1];
        P.area += areas[f];
        for (let k = 0; k < 3; k++) P.n[k] += areas[f] * filtered[3 * f + k];
        const [qx, qy, qz] = offsetFromAxis(a.axis, centroids[3 * f], centroids[3 * f + 1], centroids[3 * f + 2], q);
        const ql = Math.hypot(qx, qy, qz) || 1;
        P.radial += areas[f] * (filtered[3 * f] * qx + filtered[3 * f + 1] * qy + filtered[3 * f + 2] * qz) / ql;
        P.dist.push(ql);
        let h = 0, rr = 0;
        for (let j = 0; j < 3; j++) { const v = t[3 * f + j]; h += (k1[v] + k2[v]) / 6; rr += rough[v] / 3; }
        P.H.push(h); P.R.push(rr);
        for (let j = 0; j < 3; j++) {
          const g = topo.neighbours[3 * f + j];
          if (g < 0 || g < f || reg[g] !== r || isBreak(g) === isBreak(f)) continue;
          const u = t[3 * f + j], v = t[3 * f + ((j + 1) % 3)];
          const len = Math.hypot(p[3 * u] - p[3 * v], p[3 * u + 1] - p[3 * v + 1], p[3 * u + 2] - p[3 * v + 2]);
          const dot = filtered[3 * f] * filtered[3 * g] + filtered[3 * f + 1] * filtered[3 * g + 1] + filtered[3 * f + 2] * filtered[3 * g + 2];
          const ang = (Math.acos(Math.max(-1, Math.min(1, dot))) * 180) / Math.PI;
          bLen += len; bAng += len * ang; if (ang > 10) b10 += len; if (ang > 20) b20 += len;
        }
      }
      const nm = parts.map((P) => { const l = Math.hypot(P.n[0], P.n[1], P.n[2]) || 1; return P.n.map((x) => x / l); });
      const between = (Math.acos(Math.max(-1, Math.min(1, nm[0][0] * nm[1][0] + nm[0][1] * nm[1][1] + nm[0][2] * nm[1][2]))) * 180) / Math.PI;
      console.log(`${basename(dir)} ${frag.catalogueNo} ${frag.element} region ${r} ${a.regions[r].surfaceClass} area ${tot[r].toFixed(0)} break ${f2(share)} support ${f2(a.axis.support)} R ${a.axis.radius.toFixed(1)}${a.axis.section ? ' section' : ''}`);
      for (const [i, P] of parts.entries()) {
        console.log(`   ${i ? 'orig ' : 'break'} ${P.area.toFixed(0)} mm2 radial ${f2(P.radial / (P.area || 1))} dist ${f2(med(P.dist))} H ${f3(med(P.H))} rough ${(med(P.R) * 1000).toFixed(2)}e-3`);
      }
      console.log(`   mean normals ${between.toFixed(1)} deg apart; truth border inside ${bLen.toFixed(0)} mm, angle across ${(bAng / (bLen || 1)).toFixed(1)} deg, over 10: ${f2(b10 / (bLen || 1))}, over 20: ${f2(b20 / (bLen || 1))}`);
    }
  }
  console.log(`${basename(dir)}: unavoidable loss in mixed regions ${(100 * mixedUnavoidable / total).toFixed(2)} points`);
}
