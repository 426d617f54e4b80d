/**
 * Spatial refit analysis on invented sites of growing size: time to analyse, time to build
 * each figure, and each figure's size. With KNITBONE_BENCH_PNG=1 the largest site's figures
 * are also drawn to PNG (headless Chromium) in the system's temporary folder, to be looked at.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { analyseRefits } from '../../core/spatial/analyse';
import { buildFigure, figureKinds } from '../../core/spatial/figures/build';
import { inventedSite } from './spatial-site';

const sizes: [number, number][] = [
  [1_000, 200],
  [10_000, 2_000],
  [50_000, 10_000],
];

function medianMs(runs: number, f: () => unknown): number {
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t = performance.now();
    f();
    times.push(performance.now() - t);
  }
  times.sort((p, q) => p - q);
  return times[times.length >> 1];
}

export default async function bench(): Promise<void> {
  const rows: string[][] = [['specimens', 'joins', 'analyse ms', ...figureKinds.flatMap((k) => [`${k} ms`, `${k} KB`])]];
  let keep: Record<string, string> = {};
  for (const [n, m] of sizes) {
    const site = inventedSite(n, m);
    const analysis = analyseRefits(site.specimens, site.joins, site.site);
    const analyseMs = medianMs(5, () => analyseRefits(site.specimens, site.joins, site.site));
    const row = [n.toLocaleString('en-GB'), m.toLocaleString('en-GB'), analyseMs.toFixed(1)];
    const svgs: Record<string, string> = {};
    for (const kind of figureKinds) {
      svgs[kind] = buildFigure({ kind }, site.specimens, analysis, site.site);
      const ms = medianMs(5, () => buildFigure({ kind }, site.specimens, analysis, site.site));
      row.push(ms.toFixed(1), (Buffer.byteLength(svgs[kind]) / 1024).toFixed(1));
    }
    rows.push(row);
    if (n === 10_000) keep = svgs;
  }
  const widths = rows[0].map((_, c) => Math.max(...rows.map((r) => r[c].length)));
  for (const r of rows) process.stdout.write(r.map((v, c) => v.padStart(widths[c])).join('  ') + '\n');
  process.stdout.write('(median of 5 runs; SVG sizes in KiB; figures at their default widths)\n');

  if (process.env.KNITBONE_BENCH_PNG === '1') {
    const { svgToPng } = await import('../../core/host/svg-to-png');
    const dir = join(tmpdir(), 'knitbone-spatial-bench');
    mkdirSync(dir, { recursive: true });
    const kinds = Object.keys(keep);
    const t = performance.now();
    const pngs = await svgToPng(kinds.map((k) => keep[k]), 1.5);
    const ms = performance.now() - t;
    kinds.forEach((k, i) => {
      writeFileSync(join(dir, `${k}.svg`), keep[k]);
      writeFileSync(join(dir, `${k}.png`), pngs[i]);
    });
    process.stdout.write(`PNG of the 10,000-specimen figures (Chromium start included): ${ms.toFixed(0)} ms, in ${dir}\n`);
  }
}
