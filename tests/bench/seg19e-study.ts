import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { analyseFragment } from '../../core/geometry/analyse-fragment';
import { triangleNormalsAndAreas } from '../../core/geometry/mesh';
import { parseMeshFile } from '../../core/geometry/parse/index';
import { ellipseStudy } from '../../core/geometry/shaft-section';

interface Truth { fragments: Array<{ catalogueNo: string; scanFile: string; triangleLabels: string; element: string }> }
const dirs = (process.argv[2] ?? '').split(',').filter(Boolean);
const alt = JSON.parse(process.argv[3] ?? '{"ellipseSectionSupportMin":2}') as Record<string, unknown>;
for (const dir of dirs) {
  const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as Truth;
  for (const frag of truth.fragments) {
    const parsed = parseMeshFile(readFileSync(join(dir, frag.scanFile)), frag.scanFile);
    const labels = Buffer.from(frag.triangleLabels, 'base64');
    const { areas } = triangleNormalsAndAreas(parsed.mesh);
    let total = 0;
    for (let f = 0; f < labels.length; f++) total += areas[f];
    const agreeOf = (a: ReturnType<typeof analyseFragment>): number => {
      let ok = 0;
      for (let f = 0; f < a.triangleClass.length; f++) if ((a.triangleClass[f] === 0) === (labels[a.sourceTriangle[f]] >= 2)) ok += areas[a.sourceTriangle[f]];
      return ok / total;
    };
    let info: Record<string, unknown> | undefined;
    ellipseStudy.hook = (x) => { info = x; };
    const a = analyseFragment(parsed.mesh, {});
    ellipseStudy.hook = undefined;
    if (!a.axis.section || !info) continue;
    const b = analyseFragment(parsed.mesh, alt);
    const i = info as { A: number; B: number; Ai: number; Bi: number; score: number; outer: number; inner: number; round: number; circle: number; circleR: number[]; radius: number; width: number; cu: number; cv: number; c0: number[]; inward: number; outward: number };
    const f = (x: number, d = 1): string => x.toFixed(d);
    console.log(`${dir.split('/').pop()} ${frag.catalogueNo} ${frag.element.padEnd(10)} area ${f(total, 0).padStart(6)} keep ${f(100 * agreeOf(a)).padStart(5)} drop ${f(100 * agreeOf(b)).padStart(5)} ell ${f(i.A)}x${f(i.B)}/${f(i.Ai)}x${f(i.Bi)} R ${f(i.radius)} w ${f(i.width)} sc ${f(i.score, 0)} out ${f(i.outer, 0)} in ${f(i.inner, 0)} round ${f(i.round, 0)} circ ${f(i.circle, 0)} (${i.circleR.map((x) => f(x)).join('/')}) e/c ${f(i.score / i.circle, 2)} e/r ${f(i.score / i.round, 2)} iw ${f(i.inner / i.inward, 2)} ow ${f(i.outer / i.outward, 2)} io ${f(i.inner / i.outer, 2)} shift ${f(Math.hypot(i.cu - i.c0[0], i.cv - i.c0[1]))}`);
  }
}
