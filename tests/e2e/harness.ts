import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { ensureRendererBuilt } from '../../bin/renderer-build';
import { rendererDist } from '../../core/host/http/paths';
import { startLoopbackServer, type LoopbackServer } from '../../core/host/http/server';
import type { ShellSession } from '../../core/host/session';

/** Screenshots of every browser test land here (gitignored); look at them. */
export const screenshotDir = join(import.meta.dirname, 'screenshots');

export interface Browsing {
  server: LoopbackServer;
  context: BrowserContext;
  page: Page;
  /** Console errors and CSP violations seen by the page. */
  pageErrors: string[];
  /** Chromium's profile folder (its processes name it on their command lines). */
  profile: string;
  shot(name: string): Promise<string>;
  close(): Promise<void>;
}

/**
 * The loopback server on a given session and Debian's Chromium driving it (software
 * WebGL through SwiftShader; flags from design.md section 3).
 */
export async function browse(session: Omit<ShellSession, 'requests'>, options: { width?: number; height?: number; dark?: boolean } = {}): Promise<Browsing> {
  await ensureRendererBuilt();
  mkdirSync(screenshotDir, { recursive: true });
  const server = await startLoopbackServer({ rendererDir: rendererDist, session: () => session });
  const profile = mkdtempSync(join(tmpdir(), 'knitbone-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: '/usr/bin/chromium',
    headless: true,
    viewport: { width: options.width ?? 1360, height: options.height ?? 860 },
    colorScheme: options.dark ? 'dark' : 'light',
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
  context.setDefaultTimeout(15_000);
  const page = context.pages()[0] ?? (await context.newPage());
  const pageErrors: string[] = [];
  page.on('console', (m) => {
    // Answers 400 and 409 are the host refusing bad input, which the screens show in place.
    if (m.type() === 'error' && !/status of (400|409) /.test(m.text())) pageErrors.push(m.text());
  });
  page.on('pageerror', (e) => pageErrors.push(e.message));
  await page.goto(server.url);
  return {
    server,
    context,
    page,
    pageErrors,
    profile,
    async shot(name) {
      const file = join(screenshotDir, `${name}.png`);
      await page.screenshot({ path: file });
      return file;
    },
    async close() {
      await context.close();
      await server.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

export function tempDir(prefix: string): string {
  return mkdtempSync(join(tmpdir(), `knitbone-${prefix}-`));
}
