// Boot file for worker threads that run TypeScript modules: registers tsx's loader in the
// worker, then imports the entry module named in workerData.entry. (On Node 20, passing
// `execArgv: ['--import', 'tsx']` to a Worker does not give the worker tsx's loader.)
import { register } from 'tsx/esm/api';
import { workerData } from 'node:worker_threads';

register();
await import(workerData.entry);
