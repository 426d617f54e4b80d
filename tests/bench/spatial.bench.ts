/**
 * Spatial refit analysis on invented sites of growing size: time to analyse, time to build
 * each figure, and each figure's size. With KNITBONE_BENCH_PNG=1 the largest site's figures
 * are also drawn to PNG (headless Chromium) in the system's temporary folder, to be looked at.
 */
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { analyseRefits } from '../../core/spatial/analyse';
import { buildFigure, figureKinds } from '../../core/spatial/figures/build';
import { openCatalogue } from '../../core/catalogue/catalogue';
import { emptySpecimenFields, type BreakAge, type JoinType } from '../../core/catalogue/records';
import { SiteDefinitionRepository } from '../../core/catalogue/site-definitions';
import { Host } from '../../core/host/host';
import { inventedSite, type InventedSite } from './spatial-site';

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

  await throughCatalogue(inventedSite(10_000, 2_000));

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
    await browserDraw(keep.plan);
  }
}

/** The same analysis and plan through a real SQLite catalogue and the host API (what the app and CLI call). */
async function throughCatalogue(site: InventedSite): Promise<void> {
  const dir = mkdtempSync(join(tmpdir(), 'knitbone-spatial-bench-'));
  const file = join(dir, 'site.sqlite');
  try {
    const cat = openCatalogue(file, { create: true, who: 'bench' });
    const ids = new Map<number, number>();
    const stored = cat.specimens.insertMany(site.specimens.map((s) => ({
      ...emptySpecimenFields(s.catalogueNo), unit: s.unit, level: s.level, layer: s.layer, x: s.x, y: s.y, z: s.z, taxon: s.taxon,
    })));
    site.specimens.forEach((s, i) => ids.set(s.id, stored[i].id));
    cat.transaction(() => {
      for (const j of site.joins) {
        cat.joins.insert({
          specimenA: ids.get(j.a) as number, specimenB: ids.get(j.b) as number, status: 'accepted',
          type: j.type as JoinType, breakAge: (j.breakAge ?? null) as BreakAge | null,
        });
      }
    });
    new SiteDefinitionRepository(cat.db, cat.history, cat.who).store(site.site);
    cat.close();
    const host = new Host();
    await host.call('spatial.analyse', { catalogue: file }); // first call applies nothing new but warms up
    let t = performance.now();
    const report = await host.call('spatial.analyse', { catalogue: file });
    const a = performance.now() - t;
    t = performance.now();
    const fig = await host.call('spatial.figure', { catalogue: file, kind: 'plan' });
    const f = performance.now() - t;
    const json = JSON.stringify(report);
    process.stdout.write(
      `through the catalogue (10,000 specimens, 2,000 accepted joins): spatial.analyse ${a.toFixed(0)} ms ` +
        `(JSON ${(json.length / 1024).toFixed(0)} KiB), spatial.figure plan ${f.toFixed(0)} ms (${(fig.svg.length / 1024).toFixed(0)} KiB)\n`,
    );
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/** How long Chromium takes to lay out and paint the plan SVG (the app shows figures the same way). */
async function browserDraw(svg: string): Promise<void> {
  const { findChromium } = await import('../../core/host/svg-to-png');
  const { chromium } = await import('playwright-core');
  const executablePath = findChromium();
  if (!executablePath) return;
  const profile = mkdtempSync(join(tmpdir(), 'knitbone-draw-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath, headless: true,
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
  try {
    const page = await context.newPage();
    await page.setContent('<!doctype html><html><body style="margin:0"><div id="host"></div></body></html>');
    const times: number[] = [];
    for (let i = 0; i < 5; i++) {
      const ms = await page.evaluate(async (text) => {
        const host = document.getElementById('host') as HTMLElement;
        host.innerHTML = '';
        const t0 = performance.now();
        host.innerHTML = text;
        host.getBoundingClientRect();
        await new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r)));
        return performance.now() - t0;
      }, svg);
      times.push(ms);
    }
    times.sort((p, q) => p - q);
    process.stdout.write(`Chromium parse, layout and paint of the 10,000-specimen plan: median ${times[2].toFixed(0)} ms of 5 (software rendering)\n`);
  } finally {
    await context.close();
    rmSync(profile, { recursive: true, force: true });
  }
}
