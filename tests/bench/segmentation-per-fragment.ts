/**
 * Per-fragment segmentation agreement (issue 5 study) on generated development folders: one
 * line per fragment (catalogue number, element, area, agreement, axis support, whether the axis
 * took a medial segment), the worst first, and each folder's area-weighted figure. With a second
 * settings JSON it prints both runs side by side, so a change's winners and losers show.
 * Run: npx tsx tests/bench/segmentation-per-fragment.ts DIR[,DIR...] [settings JSON] [other settings JSON]
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { analyseFragment } from '../../core/geometry/analyse-fragment';
import { triangleNormalsAndAreas } from '../../core/geometry/mesh';
import { parseMeshFile } from '../../core/geometry/parse/index';

interface Truth { fragments: Array<{ catalogueNo: string; scanFile: string; triangleLabels: string; element: string }> }
const dirs = (process.argv[2] ?? '').split(',').filter(Boolean);
const variants = [process.argv[3] ?? '{}', ...(process.argv[4] ? [process.argv[4]] : [])].map((j) => JSON.parse(j) as Record<string, unknown>);
const listMax = Number(process.env.STUDY_LIST ?? 12);
for (const dir of dirs) {
  const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as Truth;
  const rows: Array<{ no: string; element: string; area: number; agree: number[]; support: number; medial: string }> = [];
  for (const frag of truth.fragments) {
    const parsed = parseMeshFile(readFileSync(join(dir, frag.scanFile)), frag.scanFile);
    const labels = Buffer.from(frag.triangleLabels, 'base64');
    const { areas } = triangleNormalsAndAreas(parsed.mesh);
    let total = 0;
    for (let f = 0; f < labels.length; f++) total += areas[f];
    const agree: number[] = [];
    let support = 0, medial = '';
    for (const settings of variants) {
      const a = analyseFragment(parsed.mesh, settings);
      const predicted = new Uint8Array(labels.length);
      for (let f = 0; f < a.triangleClass.length; f++) if (a.triangleClass[f] === 0) predicted[a.sourceTriangle[f]] = 1;
      let ok = 0;
      for (let f = 0; f < labels.length; f++) if (predicted[f] === (labels[f] >= 2 ? 1 : 0)) ok += areas[f];
      agree.push(ok / total);
      if (agree.length === 1) { support = a.axis.support; medial = a.axis.medial ? 'seg' : ''; }
    }
    rows.push({ no: frag.catalogueNo, element: frag.element, area: total, agree, support, medial });
  }
  const all = rows.reduce((s, r) => s + r.area, 0);
  const figs = variants.map((_, i) => rows.reduce((s, r) => s + r.area * r.agree[i], 0) / all);
  console.log(`${dir}: ${figs.map((x) => (100 * x).toFixed(2)).join(' -> ')}`);
  const key = (r: (typeof rows)[number]): number => (variants.length > 1 ? -Math.abs(r.agree[1] - r.agree[0]) * r.area : (r.agree[0] - 1) * r.area);
  for (const r of [...rows].sort((x, y) => key(x) - key(y)).slice(0, listMax)) {
    console.log(`  ${r.no} ${r.element.padEnd(12)} ${r.area.toFixed(0).padStart(6)} mm2 ${r.agree.map((x) => (100 * x).toFixed(1)).join(' -> ')}  lost ${(r.area * (1 - r.agree[0])).toFixed(0)} mm2  support ${r.support.toFixed(2)} ${r.medial}`);
  }
}
