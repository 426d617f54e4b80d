import type { Worker } from 'node:worker_threads';
import { startTypeScriptWorker } from './typescript-worker';
import type { AnswerMessage, TaskMessage } from './worker-pool';

/**
 * An open-ended run of numbered tasks on worker threads whose results are delivered in task
 * order, for output that must not depend on how many workers there were. Tasks are asked for
 * one at a time (`task(k)`: undefined when there are none left, null to wait for more results); at most `lookahead` tasks are
 * running or waiting to be delivered beyond the next one due, so memory stays bounded however
 * slow one task is. Worker modules speak the messages of worker-pool.ts.
 */
export interface OrderedRun<T, R> {
  moduleUrl: URL;
  workers: number;
  /** Task k; undefined when there are no more; null for "not now, ask again after the next result". */
  task: (k: number) => T | undefined | null;
  /** Results in task order. Return 'stop' to end the run: later tasks are dropped. */
  onResult: (k: number, result: R) => void | 'stop';
  /** Tasks started but not yet delivered, at most (default: twice the workers). */
  lookahead?: number;
  signal?: AbortSignal;
}

export interface OrderedOutcome {
  delivered: number;
  stopped: boolean;
}

export class OrderedTaskError extends Error {
  constructor(
    readonly task: number,
    readonly remote: { name: string; message: string },
  ) {
    super(`task ${task} failed: ${remote.name}: ${remote.message}`);
    this.name = 'OrderedTaskError';
  }
}

export function runInOrder<T, R>(run: OrderedRun<T, R>): Promise<OrderedOutcome> {
  const count = Math.max(1, run.workers);
  const lookahead = Math.max(count, run.lookahead ?? count * 2);
  return new Promise((resolve, reject) => {
    const workers: Worker[] = [];
    const idle: Worker[] = [];
    const waiting = new Map<number, R>();
    let next = 0; // next task to start
    let due = 0; // next task to deliver
    let exhausted = false;
    let settled = false;
    const end = (outcome: OrderedOutcome | Error): void => {
      if (settled) return;
      settled = true;
      run.signal?.removeEventListener('abort', onAbort);
      for (const w of workers) void w.terminate();
      if (outcome instanceof Error) reject(outcome);
      else resolve(outcome);
    };
    const onAbort = (): void => end(new Error('cancelled'));
    if (run.signal?.aborted) return end(new Error('cancelled'));
    run.signal?.addEventListener('abort', onAbort);

    const feed = (): void => {
      while (!settled && !exhausted && idle.length > 0 && next < due + lookahead) {
        let task: T | undefined | null;
        try {
          task = run.task(next);
        } catch (err) {
          return end(err as Error);
        }
        if (task === undefined) {
          exhausted = true;
          break;
        }
        if (task === null) break;
        idle.pop()!.postMessage({ id: next++, task } satisfies TaskMessage<T>);
      }
      if (!settled && due === next && (exhausted || idle.length === count)) end({ delivered: due, stopped: false });
    };
    const deliver = (): void => {
      while (!settled && waiting.has(due)) {
        const result = waiting.get(due)!;
        waiting.delete(due);
        let answer: void | 'stop';
        try {
          answer = run.onResult(due, result);
        } catch (err) {
          return end(err as Error);
        }
        due++;
        if (answer === 'stop') return end({ delivered: due, stopped: true });
      }
      feed();
    };
    for (let i = 0; i < count; i++) {
      const w = startTypeScriptWorker(run.moduleUrl);
      workers.push(w);
      idle.push(w);
      w.on('message', (m: AnswerMessage<R>) => {
        if (settled) return;
        if (!m.ok) return end(new OrderedTaskError(m.id, m.error));
        idle.push(w);
        waiting.set(m.id, m.result);
        deliver();
      });
      w.on('error', (err) => end(err));
    }
    feed();
  });
}
