/**
 * Fitted shaft axis against the generator's (issue 5 study): per fragment, the angle between the
 * fitted axis and the bone's z axis (poseBoneToScan), the distance of the fitted centre from the
 * bone's axis at the fragment (the bone's gentle bow ignored), the fitted radius and support, and
 * the per-triangle agreement. Run: npx tsx tests/bench/segmentation-axis-study.ts DIR [elements,] [settings JSON]
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { analyseFragment } from '../../core/geometry/analyse-fragment';
import { triangleNormalsAndAreas } from '../../core/geometry/mesh';
import { parseMeshFile } from '../../core/geometry/parse/index';
import { BufferAttribute, BufferGeometry, DoubleSide, Ray, Vector3 } from 'three';
import { MeshBVH } from 'three-mesh-bvh';

/** Whether a point lies inside the closed mesh: crossings of rays in three directions, majority of parities. */
function inside(positions: Float32Array, triangles: Uint32Array, p: number[]): boolean {
  const g = new BufferGeometry();
  g.setAttribute('position', new BufferAttribute(positions, 3));
  g.setIndex(new BufferAttribute(triangles.slice(), 1));
  const bvh = new MeshBVH(g, { indirect: true });
  let odd = 0;
  for (const d of [[0.31, 0.52, 0.79], [-0.6, 0.7, -0.39], [0.83, -0.45, 0.33]]) {
    const ray = new Ray(new Vector3(p[0], p[1], p[2]), new Vector3(d[0], d[1], d[2]).normalize());
    if (bvh.raycast(ray, DoubleSide).length % 2 === 1) odd++;
  }
  return odd >= 2;
}

interface Truth { fragments: Array<{ catalogueNo: string; scanFile: string; triangleLabels: string; element: string; poseBoneToScan: number[] }> }
const [dir, elements, json] = process.argv.slice(2);
const only = elements ? elements.split(',') : undefined;
const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as Truth;
let agreeAll = 0, areaAll = 0;
for (const frag of truth.fragments) {
  if (only && !only.includes(frag.element)) continue;
  const parsed = parseMeshFile(readFileSync(join(dir, frag.scanFile)), frag.scanFile);
  const labels = Buffer.from(frag.triangleLabels, 'base64');
  const a = analyseFragment(parsed.mesh, JSON.parse(json ?? '{}'));
  const { areas } = triangleNormalsAndAreas(parsed.mesh);
  let agree = 0, total = 0;
  for (let f = 0; f < a.triangleClass.length; f++) {
    const s = a.sourceTriangle[f];
    total += areas[s];
    if ((a.triangleClass[f] === 0 ? 1 : 0) === (labels[s] >= 2 ? 1 : 0)) agree += areas[s];
  }
  agreeAll += agree; areaAll += total;
  const P = frag.poseBoneToScan;
  const dir3 = [P[2], P[6], P[10]];
  const org = [P[3], P[7], P[11]];
  const ang = (Math.acos(Math.min(1, Math.abs(dir3[0] * a.axis.direction[0] + dir3[1] * a.axis.direction[1] + dir3[2] * a.axis.direction[2]))) * 180) / Math.PI;
  const r = [a.axis.point[0] - org[0], a.axis.point[1] - org[1], a.axis.point[2] - org[2]];
  const t = r[0] * dir3[0] + r[1] * dir3[1] + r[2] * dir3[2];
  const off = Math.hypot(r[0] - t * dir3[0], r[1] - t * dir3[1], r[2] - t * dir3[2]);
  console.log(`${frag.catalogueNo} ${frag.element.padEnd(11)} agree ${(100 * agree / total).toFixed(1).padStart(5)} area ${total.toFixed(0).padStart(6)} axis ${ang.toFixed(0).padStart(3)} deg off ${off.toFixed(1).padStart(5)} mm R ${a.axis.radius.toFixed(1).padStart(5)} support ${a.axis.support.toFixed(2)} medial ${a.axis.medial ? a.axis.medial.length.toFixed(1) : "-"} centre ${inside(a.mesh.positions, a.mesh.triangles, a.axis.point) ? 'IN MATERIAL' : 'in air'}`);
}
console.log(`all ${(100 * agreeAll / areaAll).toFixed(2)}`);
