/**
 * Worker thread of a proposal run. Holds recently used fragments (analysed and prepared) and
 * answers three kinds of task, each `{ taskId, kind, ... }` -> `{ taskId, ok, result | error }`:
 *   analyse:  read and analyse a scan (or take it from the run's cache); result: its summary
 *             (break face areas for the run's spacing, size, shaft axis) or the problem
 *   describe: prepare the fragment at the run's spacing; result: its faces' traits for the index
 *   match:    align two fragments through the given face pairs; result: best motions, scored
 * What is analysed and described is written to the cache (fragment-cache.ts) for later runs.
 */
import { parentPort, threadId } from 'node:worker_threads';
import { KnitboneError } from '../host/errors';
import { fragmentFaceTraits, type FaceTraits } from '../geometry/proposals/face-traits';
import { matchFragments, type FaceMatch, type MatchParameters } from '../geometry/proposals/pairwise-match';
import { assemblePrepared, prepareFragment, preparedParts, type FragmentInput, type PreparedFragment, type SamplingParameters } from '../geometry/proposals/prepared-fragment';
import { cachedFromLoaded, readFragment, readPrepared, readTriangleOrder, writeFragment, writePrepared, writeProblem, writeTraits, writeTriangleOrder, type FragmentSummary } from './fragment-cache';
import { loadFragment, readScanBytes, type AnalysisChoices, type LengthUnit } from './fragment-loader';

export interface ScanRef {
  scanId: number;
  file: string;
  units: LengthUnit;
  /** Cache folder and this scan's key in it (fragment-cache.ts); no cache when absent. */
  cache?: { dir: string; key: string };
  /** Settings and region corrections the scan was analysed with when imported. */
  choices?: AnalysisChoices;
}

export type ProposalTask =
  | { kind: 'analyse'; scan: ScanRef }
  | { kind: 'describe'; scan: ScanRef; sampling: SamplingParameters }
  /** keep: best distinct motions wanted; a pair none of whose motions reaches minScore (not stored as a proposal) answers with none (pairwise-match.ts bestDistinct). */
  | { kind: 'match'; a: ScanRef; b: ScanRef; facePairs: Array<[number, number]>; sampling: SamplingParameters; params: MatchParameters; keep: number; minScore?: number };

export interface AnalyseResult extends FragmentSummary {
  scanId: number;
  problem?: string;
}

export interface DescribeResult {
  scanId: number;
  /** Per prepared face: the segmentation face it is (or is a patch of), and its traits. */
  parents: number[];
  traits: FaceTraits[];
}

export interface MatchResult {
  scanA: number;
  scanB: number;
  matches: FaceMatch[];
  /** The worker thread that answered, fragments it had to prepare for this task (not in its memory), and its busy milliseconds. */
  worker: number;
  prepared: number;
  busyMs: number;
}

/** How many fragments a worker keeps in memory (the pool mirrors this for its affinity). */
export const WORKER_CACHE_SIZE = 120;

const analysed = new Map<number, { input: FragmentInput; summary: FragmentSummary }>();
const prepared = new Map<string, PreparedFragment>();

function remember<K, V>(m: Map<K, V>, k: K, v: V): V {
  m.delete(k);
  m.set(k, v);
  while (m.size > WORKER_CACHE_SIZE) m.delete(m.keys().next().value as K);
  return v;
}

/** Analysed fragment: from memory, the cache folder, or by reading and analysing the scan (then cached). */
function analysedFragment(scan: ScanRef): { input: FragmentInput; summary: FragmentSummary } {
  const hit = analysed.get(scan.scanId);
  if (hit) return remember(analysed, scan.scanId, hit);
  const cached = scan.cache ? readFragment(scan.cache.dir, scan.cache.key) : undefined;
  if (cached) return remember(analysed, scan.scanId, cached);
  const entry = cachedFromLoaded(loadFragment(scan.file, scan.units, readScanBytes(scan.file), scan.choices));
  if (scan.cache) writeFragment(scan.cache.dir, scan.cache.key, entry);
  return remember(analysed, scan.scanId, entry);
}

/** Fragments this worker has prepared so far (each time one was neither in its memory nor in the cache folder). */
let preparations = 0;

/**
 * A prepared fragment: from memory, else built from the parts another worker (or an earlier run)
 * stored in the cache folder, else prepared here (and its parts stored for the others).
 */
function preparedFragment(scan: ScanRef, sampling: SamplingParameters): PreparedFragment {
  const key = `${scan.scanId}@${sampling.spacing}/${sampling.fpfhRadiusSpacings}`;
  const hit = prepared.get(key);
  if (hit) return remember(prepared, key, hit);
  const input = analysedFragment(scan).input;
  const parts = scan.cache ? readPrepared(scan.cache.dir, scan.cache.key, sampling) : undefined;
  // the mesh BVH's triangle order: the same tree without sorting (written by whoever built it first)
  const order = scan.cache ? readTriangleOrder(scan.cache.dir, scan.cache.key) : undefined;
  if (!parts) preparations++;
  const f = parts ? assemblePrepared(input, parts, order) : prepareFragment(input, sampling);
  try {
    if (scan.cache && !parts) writePrepared(scan.cache.dir, scan.cache.key, sampling, preparedParts(f));
    if (scan.cache && !order) writeTriangleOrder(scan.cache.dir, scan.cache.key, f.surface.bvh.triangleOrder);
  } catch {
    // the cache only saves time: a worker that cannot read it prepares the fragment itself
  }
  return remember(prepared, key, f);
}

function run(task: ProposalTask): AnalyseResult | DescribeResult | MatchResult {
  switch (task.kind) {
    case 'analyse': {
      try {
        return { scanId: task.scan.scanId, ...analysedFragment(task.scan).summary };
      } catch (err) {
        if (err instanceof KnitboneError) {
          if (task.scan.cache && err.kind === 'bad-input') writeProblem(task.scan.cache.dir, task.scan.cache.key, err.message);
          return { scanId: task.scan.scanId, faceAreas: [], diagonalMm: 0, centroid: [0, 0, 0], axis: { direction: [0, 0, 1], point: [0, 0, 0], support: 0 }, problem: err.message };
        }
        throw err;
      }
    }
    case 'describe': {
      const f = preparedFragment(task.scan, task.sampling);
      const analysed = analysedFragment(task.scan);
      const out = { parents: f.faces.map((x) => x.parent), traits: fragmentFaceTraits(analysed.input, f, analysed.summary.axis) };
      if (task.scan.cache) writeTraits(task.scan.cache.dir, task.scan.cache.key, task.sampling, out);
      return { scanId: task.scan.scanId, ...out };
    }
    case 'match': {
      const t0 = performance.now();
      const before = preparations;
      const a = preparedFragment(task.a, task.sampling);
      const b = preparedFragment(task.b, task.sampling);
      const matches = matchFragments(a, b, task.params, task.facePairs, task.keep, task.minScore);
      return { scanA: task.a.scanId, scanB: task.b.scanId, matches, worker: threadId, prepared: preparations - before, busyMs: performance.now() - t0 };
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
