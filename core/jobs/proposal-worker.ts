/**
 * Worker thread of a proposal run. Holds recently used fragments (analysed and prepared) and
 * answers three kinds of task, each `{ taskId, kind, ... }` -> `{ taskId, ok, result | error }`:
 *   analyse:  read and analyse a scan; result: its break faces' areas (for the run's spacing)
 *   describe: prepare the fragment at the run's spacing; result: face descriptors for the index
 *   match:    align two fragments through the given face pairs; result: best motions, scored
 */
import { parentPort } from 'node:worker_threads';
import { KnitboneError } from '../host/errors';
import { matchFragments, type FaceMatch, type MatchParameters } from '../geometry/proposals/pairwise-match';
import { prepareFragment, type FragmentInput, type PreparedFragment, type SamplingParameters } from '../geometry/proposals/prepared-fragment';
import { loadFragment, type LengthUnit } from './fragment-loader';

export interface ScanRef {
  scanId: number;
  file: string;
  units: LengthUnit;
}

export type ProposalTask =
  | { kind: 'analyse'; scan: ScanRef }
  | { kind: 'describe'; scan: ScanRef; sampling: SamplingParameters }
  | { kind: 'match'; a: ScanRef; b: ScanRef; facePairs: Array<[number, number]>; sampling: SamplingParameters; params: MatchParameters; keep: number };

export interface AnalyseResult {
  scanId: number;
  faceAreas: number[];
  diagonalMm: number;
  centroid: [number, number, number];
  problem?: string;
}

export interface DescribeResult {
  scanId: number;
  descriptors: Float32Array[];
  areas: number[];
}

export interface MatchResult {
  scanA: number;
  scanB: number;
  matches: FaceMatch[];
}

/** How many fragments a worker keeps in memory (the pool mirrors this for its affinity). */
export const WORKER_CACHE_SIZE = 120;

const analysed = new Map<number, FragmentInput>();
const prepared = new Map<string, PreparedFragment>();

function remember<K, V>(m: Map<K, V>, k: K, v: V): V {
  m.delete(k);
  m.set(k, v);
  while (m.size > WORKER_CACHE_SIZE) m.delete(m.keys().next().value as K);
  return v;
}

function analysedInput(scan: ScanRef): FragmentInput {
  const hit = analysed.get(scan.scanId);
  if (hit) return remember(analysed, scan.scanId, hit);
  return remember(analysed, scan.scanId, loadFragment(scan.file, scan.units).input);
}

function preparedFragment(scan: ScanRef, sampling: SamplingParameters): PreparedFragment {
  const key = `${scan.scanId}@${sampling.spacing}/${sampling.fpfhRadiusSpacings}`;
  const hit = prepared.get(key);
  if (hit) return remember(prepared, key, hit);
  return remember(prepared, key, prepareFragment(analysedInput(scan), sampling));
}

function run(task: ProposalTask): AnalyseResult | DescribeResult | MatchResult {
  switch (task.kind) {
    case 'analyse': {
      try {
        const loaded = loadFragment(task.scan.file, task.scan.units);
        remember(analysed, task.scan.scanId, loaded.input);
        return { scanId: task.scan.scanId, faceAreas: loaded.input.faces.map((f) => f.area ?? 0), diagonalMm: loaded.diagonalMm, centroid: loaded.centroid };
      } catch (err) {
        if (err instanceof KnitboneError) return { scanId: task.scan.scanId, faceAreas: [], diagonalMm: 0, centroid: [0, 0, 0], problem: err.message };
        throw err;
      }
    }
    case 'describe': {
      const f = preparedFragment(task.scan, task.sampling);
      return { scanId: task.scan.scanId, descriptors: f.faces.map((x) => x.descriptor), areas: f.faces.map((x) => x.area) };
    }
    case 'match': {
      const a = preparedFragment(task.a, task.sampling);
      const b = preparedFragment(task.b, task.sampling);
      const matches = matchFragments(a, b, task.params, task.facePairs).slice(0, task.keep);
      return { scanA: task.a.scanId, scanB: task.b.scanId, matches };
    }
  }
}

parentPort?.on('message', (msg: ProposalTask & { taskId: number }) => {
  try {
    parentPort!.postMessage({ taskId: msg.taskId, ok: true, result: run(msg) });
  } catch (err) {
    parentPort!.postMessage({ taskId: msg.taskId, ok: false, error: err instanceof Error ? err.message : String(err) });
  }
});
