/**
 * Study of segmentation errors (issue 5) on generated folders: where the misread area lies.
 * Per sample, the fracture->original and original->fracture area split by cause:
 * - region: the region's majority truth disagrees with its class (a whole region misread);
 *   further split into "classifier" (classifyRegion alone got it wrong) and "small" (the
 *   classifier said fracture but small-faces.ts absorbed it), by the truth break's pattern;
 * - margin: the region's class is its majority truth, the minority area is misread.
 * Lists the largest misread regions with the figures that decided them.
 * Run: npx tsx tests/bench/segmentation-study.ts DIR[,DIR...] [settings JSON]
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { analyseFragment } from '../../core/geometry/analyse-fragment';
import { classifyRegion, fractureEvidence, typicalWallDepth } from '../../core/geometry/classify-regions';
import { triangleNormalsAndAreas } from '../../core/geometry/mesh';
import { parseMeshFile } from '../../core/geometry/parse/index';

interface TruthBreak { id: number; age: string; pattern: string; nominalBevelDeg: number }
interface Truth {
  fragments: Array<{ catalogueNo: string; scanFile: string; boneId: string; triangleLabels: string; element: string }>;
  bones: Array<{ boneId: string; breaks: TruthBreak[] }>;
}

const dirs = (process.argv[2] ?? '').split(',').filter(Boolean);
const settings = JSON.parse(process.argv[3] ?? '{}');
const listMax = Number(process.env.STUDY_LIST ?? 25);
for (const dir of dirs) {
  const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as Truth;
  const breaks = new Map<string, Map<number, TruthBreak>>();
  for (const b of truth.bones) breaks.set(b.boneId, new Map(b.breaks.map((x) => [x.id, x])));
  let total = 0;
  const split: Record<string, number> = {};
  const add = (k: string, v: number): void => { split[k] = (split[k] ?? 0) + v; };
  const rows: Array<Record<string, string | number>> = [];
  for (const frag of truth.fragments) {
    const parsed = parseMeshFile(readFileSync(join(dir, frag.scanFile)), frag.scanFile);
    const labels = Buffer.from(frag.triangleLabels, 'base64');
    const a = analyseFragment(parsed.mesh, settings);
    const { areas } = triangleNormalsAndAreas(parsed.mesh);
    const nr = a.regions.length;
    const fr = new Float64Array(nr), tot = new Float64Array(nr);
    const brk: Array<Map<number, number>> = Array.from({ length: nr }, () => new Map());
    for (let f = 0; f < a.regionOfTriangle.length; f++) {
      const src = a.sourceTriangle[f], r = a.regionOfTriangle[f];
      tot[r] += areas[src];
      if (labels[src] >= 2) fr[r] += areas[src];
      if (labels[src] >= 10) brk[r].set(labels[src] - 10, (brk[r].get(labels[src] - 10) ?? 0) + areas[src]);
    }
    for (let f = 0; f < labels.length; f++) total += areas[f];
    const wallDepth = typicalWallDepth(a.regions);
    for (let r = 0; r < nr; r++) {
      const reg = a.regions[r];
      const isF = reg.kind === 'fracture';
      const raw = classifyRegion(reg, a.axis, a.settings, wallDepth) === 'fracture';
      const majF = fr[r] > tot[r] / 2;
      const topBreak = [...brk[r].entries()].sort((x, y) => y[1] - x[1])[0]?.[0];
      const b = topBreak === undefined ? undefined : breaks.get(frag.boneId)?.get(topBreak);
      const pat = b ? `${b.age}-${b.pattern}` : 'damage';
      if (isF) { add('O->F margin', tot[r] - fr[r]); if (!majF) add(`O->F region ${raw ? 'classifier' : '?'}`, tot[r] - fr[r]); }
      else {
        if (majF) add(`F->O region ${raw ? 'small' : 'classifier'} ${pat}`, fr[r]);
        else add('F->O margin', fr[r]);
      }
      if (majF !== isF && tot[r] > 0) {
        rows.push({
          frag: frag.catalogueNo, el: frag.element, r, cls: reg.surfaceClass, raw: raw ? 'F' : 'O', pat: majF ? pat : '-',
          area: +tot[r].toFixed(1), truthF: +(fr[r] / tot[r]).toFixed(2), ev: +fractureEvidence(reg, a.settings).toFixed(2),
          headOn: +reg.headOnShare.toFixed(2), sharp: +reg.sharpBorderShare.toFixed(2), out: +reg.outwardBorderShare.toFixed(2), in: +reg.inwardBorderShare.toFixed(2),
          rough: +reg.roughnessRatio.toFixed(2), radial: +reg.radial.toFixed(2), rays: reg.rays, depth: +reg.rayDepth.toFixed(1), ax: +a.axis.support.toFixed(2),
        });
      }
    }
  }
  process.stdout.write(`\n== ${dir}: misread area as % of all area\n`);
  console.table(Object.fromEntries(Object.entries(split).sort().map(([k, v]) => [k, (100 * v / total).toFixed(2)])));
  rows.sort((x, y) => (y.area as number) * Math.abs(Number(y.truthF) - 0.5) - (x.area as number) * Math.abs(Number(x.truthF) - 0.5));
  console.table(rows.slice(0, listMax).map((x) => ({ ...x, pctOfSample: +(100 * (x.area as number) * Math.abs(2 * Number(x.truthF) - 1) / 2 / total + 0).toFixed(2) })));
}
