/**
 * Rasterise SVG figures to PNG with a headless Chromium driven by playwright-core. Optional:
 * where no Chromium is found, `svgToPng` throws a KnitboneError saying so, and SVG export still
 * works. Several figures share one browser.
 */
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { KnitboneError } from './errors';

const CANDIDATES = ['/usr/bin/chromium', '/usr/bin/chromium-browser', '/usr/bin/google-chrome'];
const FLAGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

export function findChromium(): string | undefined {
  const fromEnv = process.env.KNITBONE_CHROMIUM;
  if (fromEnv && existsSync(fromEnv)) return fromEnv;
  return CANDIDATES.find((p) => existsSync(p));
}

/** PNG bytes of each SVG, drawn at `scale` device pixels per SVG pixel (2 suits print). */
export async function svgToPng(svgs: readonly string[], scale = 2): Promise<Buffer[]> {
  const executablePath = findChromium();
  if (!executablePath) {
    throw new KnitboneError('refused', 'no Chromium found for PNG export; install chromium or set KNITBONE_CHROMIUM, or export SVG');
  }
  const { chromium } = await import('playwright-core');
  const profile = mkdtempSync(join(tmpdir(), 'knitbone-png-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath,
    headless: true,
    args: FLAGS,
    deviceScaleFactor: scale,
  });
  try {
    const page = await context.newPage();
    const out: Buffer[] = [];
    for (const svg of svgs) {
      const w = Number(/width="([\d.]+)"/.exec(svg)?.[1] ?? 800);
      const h = Number(/height="([\d.]+)"/.exec(svg)?.[1] ?? 600);
      await page.setViewportSize({ width: Math.ceil(w), height: Math.ceil(h) });
      await page.setContent(`<!doctype html><html><body style="margin:0;background:#fff">${svg}</body></html>`);
      const el = await page.$('svg');
      out.push(el ? await el.screenshot({ type: 'png' }) : await page.screenshot({ type: 'png' }));
    }
    return out;
  } finally {
    await context.close();
    rmSync(profile, { recursive: true, force: true });
  }
}
