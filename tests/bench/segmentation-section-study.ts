/**
 * Shaft section models against the truth (issue 5 study): per fragment, how much of its area
 * faces the way its true class says under a given axis model: truth outer surface facing out
 * (radial >= corticalRadialMin), medullary facing in, break faces neither. Models: the fitted
 * axis (analyseFragment), the generator's axis as a point, and the generator's axis with a
 * symmetric medial segment along the section's major axis (half-lengths 5, 10, 15 mm).
 * Run: npx tsx tests/bench/segmentation-section-study.ts DIR [elements,] [settings JSON]
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { analyseFragment } from '../../core/geometry/analyse-fragment';
import { triangleNormalsAndAreas } from '../../core/geometry/mesh';
import { triangleCentroids } from '../../core/geometry/normal-filter';
import { parseMeshFile } from '../../core/geometry/parse/index';
import { offsetFromAxis, type ShaftAxis } from '../../core/geometry/shaft-axis';

interface Truth { fragments: Array<{ catalogueNo: string; scanFile: string; triangleLabels: string; element: string; poseBoneToScan: number[] }> }
const [dir, elements, json] = process.argv.slice(2);
const only = elements ? elements.split(',') : undefined;
const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as Truth;
const names = ['fitted', 'true pt', 'true 5', 'true 10', 'true 15'];
const sums = names.map(() => 0), agreeSums = names.map(() => 0);
let areaAll = 0;
for (const frag of truth.fragments) {
  if (only && !only.includes(frag.element)) continue;
  const parsed = parseMeshFile(readFileSync(join(dir, frag.scanFile)), frag.scanFile);
  const labels = Buffer.from(frag.triangleLabels, 'base64');
  const a = analyseFragment(parsed.mesh, JSON.parse(json ?? '{}'));
  const { normals, areas } = triangleNormalsAndAreas(a.mesh);
  const centroids = triangleCentroids(a.mesh.positions, a.mesh.triangles);
  const P = frag.poseBoneToScan;
  const zb: [number, number, number] = [P[2], P[6], P[10]];
  const xb: [number, number, number] = [P[0], P[4], P[8]];
  const org: [number, number, number] = [P[3], P[7], P[11]];
  const base: ShaftAxis = { direction: zb, point: org, radius: 1, support: 1 };
  const models: ShaftAxis[] = [a.axis, base];
  for (const h of [5, 10, 15]) models.push({ ...base, point: [org[0] - h * xb[0], org[1] - h * xb[1], org[2] - h * xb[2]], medial: { direction: xb, length: 2 * h } });
  const cut = a.settings.corticalRadialMin;
  const q: [number, number, number] = [0, 0, 0];
  const scores = models.map((m) => {
    let ok = 0;
    for (let f = 0; f < areas.length; f++) {
      offsetFromAxis(m, centroids[3 * f], centroids[3 * f + 1], centroids[3 * f + 2], q);
      const r = (q[0] * normals[3 * f] + q[1] * normals[3 * f + 1] + q[2] * normals[3 * f + 2]) / (Math.hypot(q[0], q[1], q[2]) || 1);
      const l = labels[a.sourceTriangle[f]];
      const want = l === 0 ? 1 : l === 1 ? -1 : 0;
      const got = r >= cut ? 1 : r <= -cut ? -1 : 0;
      if (want === got) ok += areas[f];
    }
    return ok;
  });
  let total = 0, cx = 0, cy = 0, cz = 0;
  for (let f = 0; f < areas.length; f++) { total += areas[f]; cx += areas[f] * centroids[3 * f]; cy += areas[f] * centroids[3 * f + 1]; cz += areas[f] * centroids[3 * f + 2]; }
  const yb = [P[1], P[5], P[9]];
  const frame = (p: number[]): string => { const r = [p[0] - org[0], p[1] - org[1], p[2] - org[2]]; return `(${(r[0] * xb[0] + r[1] * xb[1] + r[2] * xb[2]).toFixed(0)},${(r[0] * yb[0] + r[1] * yb[1] + r[2] * yb[2]).toFixed(0)})`; };
  const where = `centroid ${frame([cx / total, cy / total, cz / total])} centre ${frame(a.axis.point)}`;
  scores.forEach((s, i) => { sums[i] += s; });
  // Per-triangle agreement of the whole pipeline under each model (the fitted one is a itself).
  const agreements = models.map((m, i) => {
    const b = i === 0 ? a : analyseFragment(parsed.mesh, JSON.parse(json ?? '{}'), new Map(), (fitted) => ({ ...m, radius: fitted.radius, support: fitted.support }));
    let ok = 0, all = 0;
    for (let f = 0; f < b.triangleClass.length; f++) {
      const l = labels[b.sourceTriangle[f]];
      all += areas[f];
      if ((b.triangleClass[f] === 0) === (l >= 2)) ok += areas[f];
    }
    agreeSums[i] += ok;
    return ok / all;
  });
  areaAll += total;
  console.log(`${frag.catalogueNo} ${frag.element.padEnd(11)} area ${total.toFixed(0).padStart(6)} ` + scores.map((s, i) => `${names[i]} ${(100 * s / total).toFixed(1).padStart(5)}`).join('  ') + ' agree ' + agreements.map((x) => (100 * x).toFixed(1)).join(' ') + ` medial ${a.axis.medial ? a.axis.medial.length.toFixed(1) : '-'} ${where}`);
}
console.log('agreement ' + agreeSums.map((s, i) => `${names[i]} ${(100 * s / areaAll).toFixed(1)}`).join('  '));
console.log('all ' + sums.map((s, i) => `${names[i]} ${(100 * s / areaAll).toFixed(1)}`).join('  '));
