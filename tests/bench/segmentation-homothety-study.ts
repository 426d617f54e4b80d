/**
 * Homothety centre study (issue 5): per fragment, the centre of the homothety that maps the
 * outer wall onto the cavity wall (pairs of wall triangles with opposite normals across the
 * axis; p_inner = k p_outer + (1 - k) c, linear least squares in k and (1 - k) c), against
 * the fitted centre and the generator's axis (bone frame). Run: npx tsx tests/bench/segmentation-homothety-study.ts DIR [elements,]
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { analyseFragment } from '../../core/geometry/analyse-fragment';
import { triangleNormalsAndAreas } from '../../core/geometry/mesh';
import { bilateralNormalFilter, triangleCentroids } from '../../core/geometry/normal-filter';
import { buildTopology } from '../../core/geometry/topology';
import { parseMeshFile } from '../../core/geometry/parse/index';
import { homothetyCentre } from '../../core/geometry/section-homothety';
import { castWallRays } from '../../core/geometry/wall-rays';

interface Truth { fragments: Array<{ catalogueNo: string; scanFile: string; triangleLabels: string; element: string; poseBoneToScan: number[] }> }
const [dir, elements, json] = process.argv.slice(2);
const only = elements ? elements.split(',') : undefined;
const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as Truth;
for (const frag of truth.fragments) {
  if (only && !only.includes(frag.element)) continue;
  const parsed = parseMeshFile(readFileSync(join(dir, frag.scanFile)), frag.scanFile);
  const a = analyseFragment(parsed.mesh, JSON.parse(json ?? '{}'));
  const { normals: raw, areas } = triangleNormalsAndAreas(a.mesh);
  const centroids = triangleCentroids(a.mesh.positions, a.mesh.triangles);
  const normals = bilateralNormalFilter(raw, areas, centroids, buildTopology(a.mesh).neighbours, a.settings.normalFilterIterations, a.settings.normalFilterRange);
  const rays = castWallRays(a.mesh, normals, centroids, 4000);
  const h = homothetyCentre(a.axis, centroids, normals, areas, rays, a.settings.headOnCosineMin, { binDeg: Number(process.env.BIN ?? 3), minBins: 12 });
  const P = frag.poseBoneToScan;
  const xb = [P[0], P[4], P[8]], yb = [P[1], P[5], P[9]], org = [P[3], P[7], P[11]];
  const frame = (p: number[]): string => { const r = [p[0] - org[0], p[1] - org[1], p[2] - org[2]]; return `(${(r[0] * xb[0] + r[1] * xb[1] + r[2] * xb[2]).toFixed(1)},${(r[0] * yb[0] + r[1] * yb[1] + r[2] * yb[2]).toFixed(1)})`; };
  const labels = Buffer.from(frag.triangleLabels, 'base64');
  const agree = (b: typeof a): number => {
    let ok = 0, all = 0;
    for (let f = 0; f < b.triangleClass.length; f++) { all += areas[f]; if ((b.triangleClass[f] === 0) === (labels[b.sourceTriangle[f]] >= 2)) ok += areas[f]; }
    return ok / all;
  };
  const other = process.env.OTHER ? analyseFragment(parsed.mesh, JSON.parse(process.env.OTHER)) : undefined;
  if (process.env.OTHER && other && other.axis.point.every((x, i) => x === a.axis.point[i])) continue;
  const moved = other ? Math.hypot(...other.axis.point.map((x, i) => x - a.axis.point[i])) : 0;
  console.log(`${frag.catalogueNo} area ${areas.reduce((p, q) => p + q, 0).toFixed(0)} agree ${(100 * agree(a)).toFixed(1)}${other ? ` -> ${(100 * agree(other)).toFixed(1)} moved ${moved.toFixed(1)}` : ''} R ${a.axis.radius.toFixed(1)} rms/R ${h ? (h.rms / a.axis.radius).toFixed(3) : '-'} square ${h ? `${h.squareBefore.toFixed(3)} -> ${h.square.toFixed(3)}` : '-'}`);
  console.log(`${frag.catalogueNo} ${frag.element.padEnd(11)} support ${a.axis.support.toFixed(2)} fitted ${frame(a.axis.point)} homothety ${h ? `${frame(h.point)} k ${h.k.toFixed(2)} pairs ${h.pairs} rms ${h.rms.toFixed(2)}` : '-'}`);
}
