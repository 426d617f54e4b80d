import { join, resolve } from 'node:path';

/** Build electron/dist/main.js and preload.cjs with vite (only where Electron is installed). */
export async function buildDesktopShell(say: (line: string) => void = () => {}): Promise<void> {
  const { build } = await import('vite');
  const configFile = join(resolve(import.meta.dirname, '..'), 'electron', 'vite.config.ts');
  say('building the desktop shell...');
  for (const part of ['main', 'preload']) {
    process.env.KNITBONE_ELECTRON_PART = part;
    await build({ configFile, logLevel: 'warn' });
  }
}
