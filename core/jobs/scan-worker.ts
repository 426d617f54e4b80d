/**
 * Worker thread body for reading and segmenting scans (started by worker-pool.ts): one
 * ScanFileJob in, one ScanFileResult or a problem out.
 */
import { parentPort } from 'node:worker_threads';
import { analyseScanFile, ScanFileFailure, type ScanFileJob, type ScanFileResult } from './analyse-scan-file';
import type { AnswerMessage, TaskMessage } from './worker-pool';

parentPort!.on('message', (m: TaskMessage<ScanFileJob>) => {
  let answer: AnswerMessage<ScanFileResult>;
  try {
    answer = { id: m.id, ok: true, result: analyseScanFile(m.task) };
  } catch (err) {
    answer = err instanceof ScanFileFailure
      ? { id: m.id, ok: false, error: { name: err.name, message: err.message, detail: err.problem } }
      : { id: m.id, ok: false, error: { name: (err as Error).name ?? 'Error', message: (err as Error).message ?? String(err) } };
  }
  parentPort!.postMessage(answer);
});
