/**
 * A small pool of worker threads for long runs: tasks go to idle workers, preferring a worker
 * that already holds the task's inputs (affinity keys, e.g. fragments it has loaded), results
 * come back in any order, progress is reported, and an abort signal stops the run (workers are
 * terminated; finished results stay delivered).
 */
import type { Worker } from 'node:worker_threads';

export interface PoolTask<M> {
  /** Inputs this task needs (a worker that has seen them is preferred). */
  keys: string[];
  message: M;
}

export interface PoolOptions<R> {
  workers: Worker[];
  /** How many keys a worker is assumed to keep (mirrors the worker's own cache size). */
  cacheSize: number;
  onResult: (result: R, taskIndex: number) => void;
  /** A task that failed in its worker; without this, the first failure stops the run. */
  onError?: (message: string, taskIndex: number) => void;
  onProgress?: (done: number, total: number) => void;
  signal?: AbortSignal;
  /** How far down the queue to look for a task whose inputs a worker already has. */
  lookahead?: number;
}

export interface PoolOutcome {
  done: number;
  cancelled: boolean;
}

interface WorkerReply<R> {
  taskId: number;
  ok: boolean;
  result?: R;
  error?: string;
}

/** Run tasks on the given workers; each worker answers `{ taskId, ok, result | error }` per message `{ taskId, ...message }`. */
export function runPool<M extends object, R>(tasks: PoolTask<M>[], options: PoolOptions<R>): Promise<PoolOutcome> {
  const { workers, cacheSize } = options;
  const lookahead = options.lookahead ?? 256;
  const queue: number[] = tasks.map((_, i) => i);
  const caches = workers.map(() => new Map<string, true>());
  let done = 0;
  let running = 0;
  let finished = false;
  return new Promise<PoolOutcome>((resolve, reject) => {
    const stopAll = (): void => {
      for (const w of workers) {
        w.removeAllListeners('message');
        w.removeAllListeners('error');
        void w.terminate();
      }
    };
    const finish = (cancelled: boolean): void => {
      if (finished) return;
      finished = true;
      options.signal?.removeEventListener('abort', onAbort);
      resolve({ done, cancelled });
    };
    const fail = (err: Error): void => {
      if (finished) return;
      finished = true;
      options.signal?.removeEventListener('abort', onAbort);
      stopAll();
      reject(err);
    };
    const onAbort = (): void => {
      stopAll();
      finish(true);
    };
    if (options.signal?.aborted) {
      finish(true);
      return;
    }
    options.signal?.addEventListener('abort', onAbort);

    const pick = (w: number): number => {
      const cache = caches[w];
      let best = -1, bestHits = -1;
      const n = Math.min(queue.length, lookahead);
      for (let q = 0; q < n; q++) {
        const keys = tasks[queue[q]].keys;
        let hits = 0;
        for (const k of keys) if (cache.has(k)) hits++;
        if (hits > bestHits) {
          best = q;
          bestHits = hits;
          if (hits === keys.length) break;
        }
      }
      return best < 0 ? -1 : queue.splice(best, 1)[0];
    };
    const dispatch = (w: number): void => {
      if (finished) return;
      const t = pick(w);
      if (t < 0) {
        if (running === 0) finish(false);
        return;
      }
      const cache = caches[w];
      for (const k of tasks[t].keys) {
        cache.delete(k);
        cache.set(k, true);
        while (cache.size > cacheSize) cache.delete(cache.keys().next().value as string);
      }
      running++;
      workers[w].postMessage({ taskId: t, ...tasks[t].message });
    };
    workers.forEach((worker, w) => {
      worker.on('message', (reply: WorkerReply<R>) => {
        if (finished) return;
        running--;
        if (!reply.ok && !options.onError) {
          fail(new Error(reply.error ?? 'worker task failed'));
          return;
        }
        done++;
        try {
          if (reply.ok) options.onResult(reply.result as R, reply.taskId);
          else options.onError!(reply.error ?? 'worker task failed', reply.taskId);
        } catch (err) {
          fail(err as Error);
          return;
        }
        options.onProgress?.(done, tasks.length);
        dispatch(w);
      });
      worker.on('error', (err) => fail(err));
    });
    if (tasks.length === 0) {
      finish(false);
      return;
    }
    workers.forEach((_, w) => dispatch(w));
  });
}
