/**
 * `npm run bench`: runs every tests/bench/*.bench.ts in turn (or those named on the command
 * line, e.g. `npm run bench -- catalogue`). Each benchmark prints its own table of figures.
 * Benchmarks are measurements, not pass/fail tests, and do not run in CI.
 */
import { readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const filters = process.argv.slice(2);
const files = readdirSync(here)
  .filter((f) => f.endsWith('.bench.ts'))
  .filter((f) => filters.length === 0 || filters.some((x) => f.includes(x)))
  .sort();
if (files.length === 0) {
  process.stderr.write(`no benchmark matches ${filters.join(' ')}\n`);
  process.exitCode = 2;
}
for (const f of files) {
  process.stdout.write(`\n== ${f}\n`);
  const mod = (await import(pathToFileURL(join(here, f)).href)) as { default?: () => Promise<void> | void };
  if (typeof mod.default === 'function') await mod.default();
}
