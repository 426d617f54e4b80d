import type { Command } from 'commander';
import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import { KnitboneError } from '../../host/errors';
import { demoCatalogue, rendererDist } from '../../host/http/paths';
import { startLoopbackServer } from '../../host/http/server';

/**
 * `knitbone serve <catalogue> [--port P]`: the app in a browser on this computer only.
 * Prints the address (with this run's token) and serves until interrupted.
 */
export function registerServe(program: Command): void {
  program
    .command('serve')
    .description('serve the app for a catalogue on http://127.0.0.1 (this computer only) and print the address')
    .argument('<catalogue>', 'the catalogue file (.sqlite)')
    .option('--port <port>', 'port to listen on (default: any free port)', parsePort)
    .action(async (catalogue: string, opts: { port?: number }) => {
      const path = resolve(catalogue);
      if (!existsSync(path)) {
        throw new KnitboneError('bad-input', [
          { file: catalogue, message: 'no catalogue here; create one with `knitbone init <catalogue.sqlite>`' },
        ]);
      }
      const { ensureRendererBuilt } = await import('../../../bin/renderer-build');
      await ensureRendererBuilt((line) => process.stderr.write(line + '\n'));
      const server = await startLoopbackServer({
        rendererDir: rendererDist,
        port: opts.port,
        session: () => ({
          catalogue: path,
          demoCatalogue: existsSync(demoCatalogue) ? demoCatalogue : null,
          recent: [],
          canPickFiles: false,
        }),
      });
      process.stdout.write(`knitbone is serving ${path}\nopen ${server.url}\n`);
      await new Promise<void>((done) => {
        const stop = (): void => {
          void server.close().then(done);
        };
        process.once('SIGINT', stop);
        process.once('SIGTERM', stop);
      });
    });
}

function parsePort(value: string): number {
  const n = Number(value);
  if (!Number.isInteger(n) || n < 0 || n > 65535) {
    throw new KnitboneError('usage', `--port must be a whole number from 0 to 65535, not "${value}"`);
  }
  return n;
}
