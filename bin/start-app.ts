import { spawn } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { demoCatalogue, demoSampleDir, packageRoot, rendererDist } from '../core/host/http/paths';
import { startLoopbackServer } from '../core/host/http/server';
import { ensureDemoCatalogue } from '../core/host/demo-catalogue';
import { ensureRendererBuilt } from './renderer-build';

const say = (line: string): void => void process.stderr.write(line + '\n');

/** The Electron executable when its binary is installed (never triggers a download). */
function installedElectron(): string | null {
  const dir = join(packageRoot, 'node_modules', 'electron');
  const pathFile = join(dir, 'path.txt');
  if (!existsSync(pathFile)) return null;
  const rel = readFileSync(pathFile, 'utf8').trim();
  const exe = process.env.ELECTRON_OVERRIDE_DIST_PATH
    ? join(process.env.ELECTRON_OVERRIDE_DIST_PATH, rel)
    : join(dir, 'dist', rel);
  return existsSync(exe) ? exe : null;
}

await ensureRendererBuilt(say);
const electron = installedElectron();
if (electron) {
  const { buildDesktopShell } = await import('./electron-build');
  await buildDesktopShell(say);
  const child = spawn(electron, [packageRoot, ...process.argv.slice(2)], { stdio: 'inherit' });
  child.on('exit', (code) => process.exit(code ?? 0));
} else {
  say("Electron's binary is not installed here, so knitbone serves its screens to your browser on this computer instead.");
  const demo = await ensureDemoCatalogue(demoSampleDir, demoCatalogue, say);
  const server = await startLoopbackServer({
    rendererDir: rendererDist,
    session: () => ({ catalogue: null, demoCatalogue: demo, recent: [], canPickFiles: false }),
  });
  process.stdout.write(`open ${server.url}\n`);
  const stop = (): void => void server.close().then(() => process.exit(0));
  process.once('SIGINT', stop);
  process.once('SIGTERM', stop);
}
