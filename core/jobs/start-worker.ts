import { Worker } from 'node:worker_threads';

/** Start a worker thread running a TypeScript module (its URL), with data for it in workerData.data. */
export function startTypeScriptWorker(entry: URL, data: unknown = {}): Worker {
  return new Worker(new URL('./typescript-worker.mjs', import.meta.url), {
    workerData: { entry: entry.href, data },
  });
}
