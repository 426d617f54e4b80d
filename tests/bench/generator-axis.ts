/**
 * The generator's shaft axis at a demo fragment (benches and studies only): the bone's bowed
 * centre line (BoneShape.center and tangent) at the fragment's area-weighted z in the bone
 * frame, carried into the scan frame by the fragment's pose (truth.json poseBoneToScan), as
 * segmentation-axis-stages.ts prints it. zBone is that z. Undefined when the element is not in the skeleton.
 */
import type { TriangleMesh } from '../../core/geometry/mesh';
import { triangleNormalsAndAreas } from '../../core/geometry/mesh';
import { triangleCentroids } from '../../core/geometry/normal-filter';
import type { ShaftAxis } from '../../core/geometry/shaft-axis';
import { BoneShape } from '../../demo-data/bone-shape';
import { ELEMENTS } from '../../demo-data/skeleton';

export interface TruthFragment { catalogueNo: string; scanFile: string; triangleLabels: string; element: string; taxon: string; side: 'left' | 'right'; poseBoneToScan: number[] }

export function generatorAxis(frag: TruthFragment, mesh: TriangleMesh): { direction: [number, number, number]; point: [number, number, number]; zBone: number } | undefined {
  const spec = ELEMENTS.find((e) => e.element === frag.element && e.taxon === frag.taxon);
  if (!spec) return undefined;
  const { areas } = triangleNormalsAndAreas(mesh);
  const cents = triangleCentroids(mesh.positions, mesh.triangles);
  const P = frag.poseBoneToScan;
  const xb = [P[0], P[4], P[8]], yb = [P[1], P[5], P[9]], zc = [P[2], P[6], P[10]];
  const shape = new BoneShape(spec, frag.side);
  let zMid = 0, aSum = 0;
  for (let f = 0; f < areas.length; f++) {
    zMid += areas[f] * ((cents[3 * f] - P[3]) * P[2] + (cents[3 * f + 1] - P[7]) * P[6] + (cents[3 * f + 2] - P[11]) * P[10]);
    aSum += areas[f];
  }
  zMid /= aSum;
  const [bx, by] = shape.center(zMid);
  const tz = shape.tangent(zMid);
  const d = [0, 1, 2].map((i) => tz[0] * xb[i] + tz[1] * yb[i] + tz[2] * zc[i]);
  const o = [0, 1, 2].map((i) => P[3 + 4 * i] + bx * xb[i] + by * yb[i] + zMid * zc[i]);
  return { direction: [d[0], d[1], d[2]], point: [o[0], o[1], o[2]], zBone: zMid };
}

/** An axisOverride for analyseFragment that puts the generator's line in place of the fitted one (radius and support kept). */
export function generatorAxisOverride(frag: TruthFragment, mesh: TriangleMesh): ((a: ShaftAxis) => ShaftAxis) | undefined {
  const g = generatorAxis(frag, mesh);
  return g ? (a) => ({ direction: g.direction, point: g.point, radius: a.radius, support: a.support }) : undefined;
}
