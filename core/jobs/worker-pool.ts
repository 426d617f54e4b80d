import { availableParallelism } from 'node:os';
import type { Worker } from 'node:worker_threads';
import { startTypeScriptWorker } from './typescript-worker';

/** What a pool worker module receives and answers (see scan-worker.ts). */
export interface TaskMessage<T> {
  id: number;
  task: T;
}
export type AnswerMessage<R> = { id: number; ok: true; result: R } | { id: number; ok: false; error: { name: string; message: string; detail?: unknown } };

export interface PoolRun<T, R> {
  moduleUrl: URL;
  tasks: T[];
  workers?: number;
  signal?: AbortSignal;
  /** Called in task order of completion. Return 'stop' to end the run early (remaining tasks are not started). */
  onResult: (index: number, result: R) => void | 'stop';
  onError: (index: number, error: { name: string; message: string; detail?: unknown }) => void | 'stop';
}

export interface PoolOutcome {
  completed: number;
  failed: number;
  /** Tasks never finished because the run was cancelled or stopped. */
  notRun: number;
  cancelled: boolean;
  stopped: boolean;
}

/** Default number of worker threads: one per core, at least one. */
export function defaultWorkerCount(): number {
  return Math.max(1, availableParallelism());
}

/**
 * Run tasks on a pool of worker threads, each task posted to the next free worker. The
 * abort signal ends the run at once: running workers are terminated, their tasks count as
 * not run (callers resume by running what is left).
 */
export function runInWorkerPool<T, R>(run: PoolRun<T, R>): Promise<PoolOutcome> {
  const count = Math.max(1, Math.min(run.workers ?? defaultWorkerCount(), run.tasks.length));
  return new Promise((resolve) => {
    if (run.tasks.length === 0) {
      resolve({ completed: 0, failed: 0, notRun: 0, cancelled: false, stopped: false });
      return;
    }
    const workers: Worker[] = [];
    let next = 0, completed = 0, failed = 0, settled = false, stopped = false;
    const busy = new Set<number>();
    const finish = (cancelled: boolean): void => {
      if (settled) return;
      settled = true;
      run.signal?.removeEventListener('abort', onAbort);
      for (const w of workers) void w.terminate();
      resolve({ completed, failed, notRun: run.tasks.length - completed - failed, cancelled, stopped });
    };
    const onAbort = (): void => finish(true);
    if (run.signal?.aborted) { finish(true); return; }
    run.signal?.addEventListener('abort', onAbort);
    const feed = (w: Worker, slot: number): void => {
      if (settled) return;
      if (stopped || next >= run.tasks.length) {
        busy.delete(slot);
        if (busy.size === 0) finish(false);
        return;
      }
      const id = next++;
      busy.add(slot);
      w.postMessage({ id, task: run.tasks[id] } satisfies TaskMessage<T>);
    };
    for (let slot = 0; slot < count; slot++) {
      const w = startTypeScriptWorker(run.moduleUrl);
      workers.push(w);
      w.on('message', (m: AnswerMessage<R>) => {
        if (settled) return;
        if (m.ok) {
          completed++;
          if (run.onResult(m.id, m.result) === 'stop') stopped = true;
        } else {
          failed++;
          if (run.onError(m.id, m.error) === 'stop') stopped = true;
        }
        feed(w, slot);
      });
      w.on('error', (err) => {
        if (settled) return;
        failed++;
        run.onError(-1, { name: err.name, message: err.message });
        stopped = true;
        busy.delete(slot);
        if (busy.size === 0) finish(false);
      });
      feed(w, slot);
    }
  });
}
