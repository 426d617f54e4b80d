/**
 * Elliptic section against the truth (issue 5 study): per fragment, the per-triangle agreement
 * of the pipeline under the fitted axis, under the generator's axis as a round section (point
 * centre), and under the generator's axis with the generator's elliptic section (outer semi-axes
 * r (1 +- oval), cavity the same less the cortical wall; the cos 3θ and wobble terms left out),
 * through analyseFragment's study-only `axisOverride`. Also prints whether the fit took an
 * elliptic section, and its semi-axes against the generator's.
 * Run: npx tsx tests/bench/segmentation-ellipse-study.ts DIR[,DIR...] [elements,] [settings JSON]
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { analyseFragment } from '../../core/geometry/analyse-fragment';
import { triangleNormalsAndAreas } from '../../core/geometry/mesh';
import { triangleCentroids } from '../../core/geometry/normal-filter';
import { parseMeshFile } from '../../core/geometry/parse/index';
import type { ShaftAxis } from '../../core/geometry/shaft-axis';
import { BoneShape, clamp } from '../../demo-data/bone-shape';
import { ELEMENTS } from '../../demo-data/skeleton';

interface Fragment { catalogueNo: string; scanFile: string; triangleLabels: string; element: string; taxon: string; side: 'left' | 'right'; poseBoneToScan: number[] }
const [dirs, elements, json] = process.argv.slice(2);
const only = elements ? elements.split(',') : undefined;
const settings = JSON.parse(json ?? '{}') as Record<string, unknown>;
const names = ['fitted', 'true pt', 'true ell'];
for (const dir of dirs.split(',')) {
  const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { fragments: Fragment[] };
  const sums = names.map(() => 0);
  let areaAll = 0;
  for (const frag of truth.fragments) {
    if (only && !only.includes(frag.element)) continue;
    const spec = ELEMENTS.find((e) => e.taxon === frag.taxon && e.element === frag.element);
    if (!spec) continue;
    const shape = new BoneShape(spec, frag.side);
    const parsed = parseMeshFile(readFileSync(join(dir, frag.scanFile)), frag.scanFile);
    const labels = Buffer.from(frag.triangleLabels, 'base64');
    const a = analyseFragment(parsed.mesh, settings);
    const { areas } = triangleNormalsAndAreas(a.mesh);
    const centroids = triangleCentroids(a.mesh.positions, a.mesh.triangles);
    const P = frag.poseBoneToScan;
    const R = (i: number, j: number): number => P[4 * i + j];
    const t = [P[3], P[7], P[11]];
    const toBone = (p: number[]): number[] => [0, 1, 2].map((j) => R(0, j) * (p[0] - t[0]) + R(1, j) * (p[1] - t[1]) + R(2, j) * (p[2] - t[2]));
    const toScan = (p: number[]): [number, number, number] => [0, 1, 2].map((i) => R(i, 0) * p[0] + R(i, 1) * p[1] + R(i, 2) * p[2] + t[i]) as [number, number, number];
    const turn = (v: number[]): [number, number, number] => [0, 1, 2].map((i) => R(i, 0) * v[0] + R(i, 1) * v[1] + R(i, 2) * v[2]) as [number, number, number];
    let total = 0, zm = 0;
    for (let f = 0; f < areas.length; f++) {
      total += areas[f];
      zm += areas[f] * toBone([centroids[3 * f], centroids[3 * f + 1], centroids[3 * f + 2]])[2];
    }
    zm /= total;
    const [cx, cy] = shape.center(zm);
    const along = turn(shape.tangent(zm));
    const point = toScan([cx, cy, zm]);
    // Major semi-axis along the bone's x (θ = 0), made square to the axis.
    const xb = turn([1, 0, 0]);
    const d = xb[0] * along[0] + xb[1] * along[1] + xb[2] * along[2];
    const mj = [xb[0] - d * along[0], xb[1] - d * along[1], xb[2] - d * along[2]];
    const ml = Math.hypot(mj[0], mj[1], mj[2]);
    const major: [number, number, number] = [mj[0] / ml, mj[1] / ml, mj[2] / ml];
    const r = shape.shaftRadius(zm), e = spec.oval;
    const zc = clamp(zm, shape.cavityStart, shape.cavityEnd);
    const ri = shape.shaftRadius(zc), c = shape.cortical(zc);
    const outer: [number, number] = [r * (1 + e), r * (1 - e)];
    const inner: [number, number] = [Math.max(0.8, ri * (1 + e) - c), Math.max(0.8, ri * (1 - e) - c)];
    const base: ShaftAxis = { direction: along, point, radius: r, support: 1 };
    const models: ShaftAxis[] = [a.axis, base, { ...base, section: { major, outer, inner } }];
    const agreements = models.map((m, i) => {
      const b = i === 0 ? a : analyseFragment(parsed.mesh, settings, new Map(), (fitted) => ({ ...m, radius: fitted.radius, support: fitted.support }));
      let ok = 0;
      for (let f = 0; f < b.triangleClass.length; f++) if ((b.triangleClass[f] === 0) === (labels[b.sourceTriangle[f]] >= 2)) ok += areas[f];
      sums[i] += ok;
      return ok / total;
    });
    areaAll += total;
    const fit = a.axis.section;
    const fitted = fit ? `ell ${fit.outer.map((x) => x.toFixed(1)).join('x')}/${fit.inner.map((x) => x.toFixed(1)).join('x')}` : a.axis.medial ? 'seg' : '';
    console.log(`${frag.catalogueNo} ${frag.element.padEnd(11)} area ${total.toFixed(0).padStart(6)} agree ${agreements.map((x) => (100 * x).toFixed(1).padStart(5)).join(' ')}  support ${a.axis.support.toFixed(2)} ${fitted}  true ${outer.map((x) => x.toFixed(1)).join('x')}/${inner.map((x) => x.toFixed(1)).join('x')}`);
  }
  console.log(`${dir}: agreement ` + sums.map((s, i) => `${names[i]} ${(100 * s / areaAll).toFixed(2)}`).join('  '));
}
