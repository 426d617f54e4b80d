/**
 * Worker thread body for the demo generator (started through core/jobs/ordered-pool.ts): one
 * BoneTask in, one BoneResult out, its scan arrays handed over without copying. Each worker
 * loads its own manifold-3d kernel.
 */
import { parentPort } from 'node:worker_threads';
import type { AnswerMessage, TaskMessage } from '../core/jobs/worker-pool';
import { type BoneResult, type BoneTask, makeBone, transferablesOf } from './bone-job';
import { manifoldKernel } from './manifold-kernel';

parentPort!.on('message', (m: TaskMessage<BoneTask>) => {
  manifoldKernel()
    .then((wasm) => {
      const result = makeBone(wasm, m.task);
      parentPort!.postMessage({ id: m.id, ok: true, result } satisfies AnswerMessage<BoneResult>, transferablesOf(result));
    })
    .catch((err: Error) => {
      parentPort!.postMessage({ id: m.id, ok: false, error: { name: err?.name ?? 'Error', message: `${err?.message ?? String(err)}\n${err?.stack ?? ''}` } } satisfies AnswerMessage<BoneResult>);
    });
});
