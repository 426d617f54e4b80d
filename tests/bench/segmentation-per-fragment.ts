/**
 * Per-fragment segmentation agreement (issue 5 study) on generated development folders: one
 * line per fragment (catalogue number, element, area, agreement, axis support, whether the axis
 * took a medial segment), the worst first, and each folder's area-weighted figure. With a second
 * settings JSON it prints both runs side by side, so a change's winners and losers show.
 * Run: npx tsx tests/bench/segmentation-per-fragment.ts DIR[,DIR...] [settings JSON] [other settings JSON]
 */
import { analyseFragment } from '../../core/geometry/analyse-fragment';
import { labelAgreement, labelledScans } from './segmentation-study-fragments';

const dirs = (process.argv[2] ?? '').split(',').filter(Boolean);
const variants = [process.argv[3] ?? '{}', ...(process.argv[4] ? [process.argv[4]] : [])].map((j) => JSON.parse(j) as Record<string, unknown>);
const listMax = Number(process.env.STUDY_LIST ?? 12);
for (const dir of dirs) {
  const rows: Array<{ no: string; element: string; area: number; agree: number[]; support: number; medial: string }> = [];
  for (const scan of labelledScans(dir)) {
    const agree: number[] = [];
    let support = 0, medial = '';
    for (const settings of variants) {
      const a = analyseFragment(scan.source, settings);
      agree.push(labelAgreement(a, scan));
      if (agree.length === 1) { support = a.axis.support; medial = a.axis.medial ? 'seg' : ''; }
    }
    rows.push({ no: scan.frag.catalogueNo, element: scan.frag.element, area: scan.total, agree, support, medial });
  }
  const all = rows.reduce((s, r) => s + r.area, 0);
  const figs = variants.map((_, i) => rows.reduce((s, r) => s + r.area * r.agree[i], 0) / all);
  console.log(`${dir}: ${figs.map((x) => (100 * x).toFixed(2)).join(' -> ')}`);
  const key = (r: (typeof rows)[number]): number => (variants.length > 1 ? -Math.abs(r.agree[1] - r.agree[0]) * r.area : (r.agree[0] - 1) * r.area);
  for (const r of [...rows].sort((x, y) => key(x) - key(y)).slice(0, listMax)) {
    console.log(`  ${r.no} ${r.element.padEnd(12)} ${r.area.toFixed(0).padStart(6)} mm2 ${r.agree.map((x) => (100 * x).toFixed(1)).join(' -> ')}  lost ${(r.area * (1 - r.agree[0])).toFixed(0)} mm2  support ${r.support.toFixed(2)} ${r.medial}`);
  }
}
