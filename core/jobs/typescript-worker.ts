import { createRequire } from 'node:module';
import { pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';

/**
 * Start a worker thread on a TypeScript module. The sources run through tsx with no build
 * step, and a worker does not inherit the parent's loader, so a tiny bootstrap registers tsx
 * inside the worker first and then imports the module. (Measured on Node 20: passing
 * `execArgv: ['--import', 'tsx']` to the Worker does not register the loader there.)
 */
export function startTypeScriptWorker(moduleUrl: URL, workerData?: unknown): Worker {
  const require = createRequire(import.meta.url);
  // The ESM build of tsx's API (require.resolve finds the CommonJS one next to it).
  const api = pathToFileURL(require.resolve('tsx/esm/api').replace(/\.cjs$/, '.mjs')).href;
  const code = `import(${JSON.stringify(api)}).then((m) => { m.register(); return import(${JSON.stringify(moduleUrl.href)}); });`;
  return new Worker(code, { eval: true, workerData });
}
