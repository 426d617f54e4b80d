import { existsSync, readdirSync, statSync } from 'node:fs';
import { join, resolve } from 'node:path';

/**
 * Build the renderer with vite when renderer/dist is missing or older than any source
 * file under renderer/. Used by `npm start`, `knitbone serve` and the browser tests, so a
 * fresh checkout needs no separate build step.
 */
const root = resolve(import.meta.dirname, '..');
const rendererRoot = join(root, 'renderer');
const distIndex = join(rendererRoot, 'dist', 'index.html');

function newestSource(dir: string): number {
  let newest = 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    if (entry.name === 'dist' || entry.name === 'node_modules') continue;
    const full = join(dir, entry.name);
    const t = entry.isDirectory() ? newestSource(full) : statSync(full).mtimeMs;
    if (t > newest) newest = t;
  }
  return newest;
}

export function rendererIsStale(): boolean {
  if (!existsSync(distIndex)) return true;
  return newestSource(rendererRoot) > statSync(distIndex).mtimeMs;
}

export async function ensureRendererBuilt(say: (line: string) => void = () => {}): Promise<void> {
  if (!rendererIsStale()) return;
  say('building the app screens (renderer) with vite...');
  const { build } = await import('vite');
  await build({ configFile: join(rendererRoot, 'vite.config.ts'), logLevel: 'warn' });
}
