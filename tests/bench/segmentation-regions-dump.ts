/**
 * Dumps one row per segmentation region of generated folders (figures, truth share, border
 * adjacency split into crease / smooth length) as JSON lines, for studying the region
 * classifier offline. Run: npx tsx tests/bench/segmentation-regions-dump.ts DIR[,DIR...] OUT.jsonl [settings JSON]
 */
import { writeFileSync } from 'node:fs';
import { basename } from 'node:path';
import { typicalWallDepth } from '../../core/geometry/classify-regions';
import { triangleNormalsAndAreas } from '../../core/geometry/mesh';
import { studyFragments } from './segmentation-study-fragments';

const dirs = (process.argv[2] ?? '').split(',').filter(Boolean);
const out: string[] = [];
const settings = JSON.parse(process.argv[4] ?? '{}');
for (const dir of dirs) {
  for (const { frag, labels, source, a, topo, normals, areas, filtered } of studyFragments(dir, settings)) {
    const { areas: srcAreas } = triangleNormalsAndAreas(source);
    const mesh = a.mesh;
    const nr = a.regions.length;
    const fr = new Float64Array(nr), tot = new Float64Array(nr);
    for (let f = 0; f < a.regionOfTriangle.length; f++) {
      const src = a.sourceTriangle[f], r = a.regionOfTriangle[f];
      tot[r] += srcAreas[src];
      if (labels[src] >= 2) fr[r] += srcAreas[src];
    }
    // Border lengths per neighbouring region: [crease length, smooth length].
    const nb: Array<Map<number, [number, number]>> = Array.from({ length: nr }, () => new Map());
    const cosMax = Math.cos((a.settings.ridgeAngleDeg * Math.PI) / 180);
    const t = mesh.triangles, p = mesh.positions, reg = a.regionOfTriangle;
    for (let f = 0; f < reg.length; f++) {
      for (let j = 0; j < 3; j++) {
        const g = topo.neighbours[3 * f + j];
        if (g < 0 || reg[g] === reg[f]) continue;
        const u = t[3 * f + j], v = t[3 * f + ((j + 1) % 3)];
        const len = Math.hypot(p[3 * u] - p[3 * v], p[3 * u + 1] - p[3 * v + 1], p[3 * u + 2] - p[3 * v + 2]);
        const dot = filtered[3 * f] * filtered[3 * g] + filtered[3 * f + 1] * filtered[3 * g + 1] + filtered[3 * f + 2] * filtered[3 * g + 2];
        const e = nb[reg[f]].get(reg[g]) ?? [0, 0];
        if (dot < cosMax) e[0] += len; else e[1] += len;
        nb[reg[f]].set(reg[g], e);
      }
    }
    const wallDepth = typicalWallDepth(a.regions);
    // Roughness away from the region's border: rings of triangles from it (the quadric fit of a
    // vertex near a crease straddles it), area-weighted mean of min(4, roughness / median) at ring >= 2 and >= 3.
    const ringOf = new Int32Array(reg.length).fill(-1);
    let front: number[] = [];
    for (let f = 0; f < reg.length; f++) for (let j = 0; j < 3; j++) { const g = topo.neighbours[3 * f + j]; if (g < 0 || reg[g] !== reg[f]) { ringOf[f] = 0; front.push(f); break; } }
    for (let dd = 1; front.length; dd++) {
      const next: number[] = [];
      for (const f of front) for (let j = 0; j < 3; j++) { const g = topo.neighbours[3 * f + j]; if (g >= 0 && ringOf[g] < 0 && reg[g] === reg[f]) { ringOf[g] = dd; next.push(g); } }
      front = next;
    }
    const triRough = Float32Array.from({ length: reg.length }, (_, f) => (a.curvature.roughness[t[3 * f]] + a.curvature.roughness[t[3 * f + 1]] + a.curvature.roughness[t[3 * f + 2]]) / 3);
    const roughMedian = Float32Array.from(triRough).sort()[reg.length >> 1] || 1e-9;
    const rin = [2, 3].map((k) => { const sum = new Float64Array(nr), w = new Float64Array(nr); for (let f = 0; f < reg.length; f++) if (ringOf[f] >= k) { sum[reg[f]] += areas[f] * Math.min(4, triRough[f] / roughMedian); w[reg[f]] += areas[f]; } return { sum, w }; });
    // Per region: area-weighted mean and median triangle curvedness sqrt((k1^2 + k2^2) / 2), mean 1 - raw.filtered normal.
    const k1 = a.curvature.k1, k2 = a.curvature.k2;
    const cv: number[][] = Array.from({ length: nr }, () => []);
    const cvSum = new Float64Array(nr), devSum = new Float64Array(nr), arSum = new Float64Array(nr);
    for (let f = 0; f < reg.length; f++) {
      let c = 0;
      for (let j = 0; j < 3; j++) { const v = t[3 * f + j]; c += Math.sqrt((k1[v] * k1[v] + k2[v] * k2[v]) / 2) / 3; }
      cv[reg[f]].push(c);
      cvSum[reg[f]] += areas[f] * c; arSum[reg[f]] += areas[f];
      devSum[reg[f]] += areas[f] * (1 - (normals[3 * f] * filtered[3 * f] + normals[3 * f + 1] * filtered[3 * f + 1] + normals[3 * f + 2] * filtered[3 * f + 2]));
    }
    const nrm = new Float64Array(3 * nr);
    for (let f = 0; f < reg.length; f++) for (let k = 0; k < 3; k++) nrm[3 * reg[f] + k] += areas[f] * filtered[3 * f + k];
    const med = (x: number[]): number => { const s = [...x].sort((p, q) => p - q); return s[Math.floor(s.length / 2)] ?? 0; };
    const allCv = cv.flat();
    const fragCurvd = med(allCv);
    for (const r of a.regions) {
      out.push(JSON.stringify({
        set: basename(dir), frag: frag.catalogueNo, element: frag.element, region: r.id, cls: r.surfaceClass,
        truthF: tot[r.id] > 0 ? fr[r.id] / tot[r.id] : 0, areaTruth: tot[r.id],
        fragArea: a.stats.area, axisSupport: a.axis.support, axisRadius: a.axis.radius, wallDepth,
        area: r.area, tris: r.triangleCount, radial: r.radial, axial: r.axial, rough: r.roughnessRatio, curv: r.meanCurvature,
        depth: Number.isFinite(r.rayDepth) ? r.rayDepth : null, exitCos: Number.isFinite(r.rayExitCosine) ? r.rayExitCosine : null,
        rays: r.rays, outHit: r.outwardHitShare, oCrease: r.originalCreaseBorderShare, curvdA: r.curvedness, headOn: Number.isFinite(r.headOnShare) ? r.headOnShare : null,
        sharp: r.sharpBorderShare, out: r.outwardBorderShare, in: r.inwardBorderShare,
        curvd: cvSum[r.id] / (arSum[r.id] || 1), curvdMed: med(cv[r.id]), fragCurvd, rawDev: devSum[r.id] / (arSum[r.id] || 1),
        roughIn2: rin[0].w[r.id] > 0 ? rin[0].sum[r.id] / rin[0].w[r.id] : null, roughIn2Share: rin[0].w[r.id] / (arSum[r.id] || 1),
        roughIn3: rin[1].w[r.id] > 0 ? rin[1].sum[r.id] / rin[1].w[r.id] : null, roughIn3Share: rin[1].w[r.id] / (arSum[r.id] || 1),
        nb: [...nb[r.id].entries()].map(([s, [c, m]]) => [s, c, m]),
        nrm: (() => { const x = nrm[3 * r.id], y = nrm[3 * r.id + 1], z = nrm[3 * r.id + 2]; const l = Math.hypot(x, y, z) || 1; return [x / l, y / l, z / l]; })(),
      }));
    }
  }
  process.stderr.write(`${dir} done\n`);
}
writeFileSync(process.argv[3], out.join('\n') + '\n');
