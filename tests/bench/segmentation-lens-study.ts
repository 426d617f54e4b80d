/**
 * Flattened-shaft pieces with analytic truth (broken-tube.ts `lensCavity`): a 12 mm tube with a
 * lens-shaped cavity cut lengthwise by planes at several offsets, per-triangle agreement with the
 * construction. Run: npx tsx tests/bench/segmentation-lens-study.ts [settings JSON]
 */
import { analyseFragment } from '../../core/geometry/analyse-fragment';
import { triangleNormalsAndAreas } from '../../core/geometry/mesh';
import { brokenTube, fractureAgreement, type Cut } from '../unit/geometry/broken-tube';

const settings = JSON.parse(process.argv[2] ?? '{}');
const ends: Cut[] = [{ normal: [0, 0, 1], offset: -25 }, { normal: [0, 0, -1], offset: -25 }];
const cases: Array<{ name: string; lens: { halfWidth: number; halfHeight: number }; cuts: Cut[] }> = [];
for (const lens of [{ halfWidth: 9, halfHeight: 2.5 }, { halfWidth: 8, halfHeight: 3 }]) {
  for (const off of [0, 2, 4, 6]) cases.push({ name: `lens ${2 * lens.halfWidth}x${2 * lens.halfHeight} x>${off}`, lens, cuts: [{ normal: [1, 0, 0], offset: off }, ...ends] });
  for (const off of [-1, 1]) cases.push({ name: `lens ${2 * lens.halfWidth}x${2 * lens.halfHeight} y>${off}`, lens, cuts: [{ normal: [0, 1, 0], offset: off }, ...ends] });
  const s = Math.SQRT1_2;
  cases.push({ name: `lens ${2 * lens.halfWidth}x${2 * lens.halfHeight} diag`, lens, cuts: [{ normal: [s, s, 0], offset: 2 }, ...ends] });
  cases.push({ name: `lens ${2 * lens.halfWidth}x${2 * lens.halfHeight} wedge`, lens, cuts: [{ normal: [s, s, 0], offset: 0 }, { normal: [s, -s, 0], offset: 0 }, ...ends] });
}
let sum = 0;
for (const c of cases) {
  const tube = await brokenTube({ outerRadius: 12, length: 80, lensCavity: c.lens, roughness: 0.3, cuts: c.cuts });
  const { areas } = triangleNormalsAndAreas(tube.mesh);
  const a = analyseFragment(tube.mesh, settings);
  const agree = fractureAgreement(a, tube.truth, areas);
  sum += agree;
  console.log(c.name.padEnd(24), (100 * agree).toFixed(1), 'axis off', Math.hypot(a.axis.point[0], a.axis.point[1]).toFixed(1));
}
console.log('mean', (100 * sum / cases.length).toFixed(1));
