/**
 * The describing stage of join proposals, shared by `proposals.run` and `scans.import`: which
 * scans of a catalogue take part (the latest scan of each specimen, with its key in the match
 * cache), the sampling a run over them uses, and the traits of every break face at that
 * sampling (face-traits.ts), read from the match cache or computed on proposal workers and
 * stored there.
 *
 * Importing scans describes the catalogue's faces at the sampling the next run will choose, so
 * that `knitbone propose` finds the traits and the prepared fragments in the cache and only
 * aligns. The sampling follows from the face areas of all the catalogue's scans
 * (prepared-fragment.ts, runSpacing): when a later import moves it to another rung, that run
 * describes again (the cache is keyed by sampling, nothing stale is read).
 */
import { isAbsolute, resolve, dirname } from 'node:path';
import { availableParallelism } from 'node:os';
import type { Catalogue } from '../../catalogue/catalogue';
import type { Scan } from '../../catalogue/records';
import { DEFAULT_FPFH_RADIUS_SPACINGS, runSpacing, type SamplingParameters } from '../../geometry/proposals/prepared-fragment';
import { runPool, type PoolTask } from '../../jobs/affinity-pool';
import { cacheDirFor, fragmentKey, readSummary, readTraits, type FragmentSummary } from '../../jobs/fragment-cache';
import type { LengthUnit } from '../../jobs/fragment-loader';
import { WORKER_CACHE_SIZE, type DescribeResult, type ProposalTask, type ScanRef } from '../../jobs/proposal-worker';
import { startTypeScriptWorker } from '../../jobs/typescript-worker';
import type { Worker } from 'node:worker_threads';
import type { ProgressEvent } from '../request';

/** The latest scan of each specimen, as the proposal workers take it (file, units, cache key, analysis choices). */
export function latestScanRefs(cat: Catalogue): { scans: ScanRef[]; specimenOfScan: Map<number, number> } {
  const base = dirname(cat.path);
  const latest = new Map<number, Scan>();
  for (const s of cat.scans.list()) {
    const old = latest.get(s.specimenId);
    if (!old || s.id > old.id) latest.set(s.specimenId, s);
  }
  const cacheDir = cacheDirFor(cat.path);
  const scans: ScanRef[] = [...latest.values()].map((s) => {
    const settings = (s.stats as { settings?: Record<string, unknown> }).settings;
    const corrections = [...cat.regionClasses.inForce(s.id).entries()];
    return {
      scanId: s.id,
      file: isAbsolute(s.path) ? s.path : resolve(base, s.path),
      units: s.units as LengthUnit,
      cache: { dir: cacheDir, key: fragmentKey(s.contentHash, s.units, settings, corrections) },
      choices: { settings, corrections },
    };
  });
  return { scans, specimenOfScan: new Map([...latest.values()].map((s) => [s.id, s.specimenId])) };
}

/** The sampling of a run over these analysed scans: one spacing for all their break faces. */
export function runSampling(summaries: FragmentSummary[]): SamplingParameters {
  return { spacing: runSpacing(summaries.flatMap((s) => s.faceAreas)), fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS };
}

export interface DescribeOptions {
  workers: Worker[];
  signal?: AbortSignal;
  onResult: (r: DescribeResult) => void;
  onError?: (scan: ScanRef, message: string) => void;
  onProgress?: (e: ProgressEvent) => void;
}

/**
 * Traits of every scan's faces at the sampling: those the cache holds are handed to onResult
 * at once, the others are described on the workers (which store them, and the prepared
 * fragments' parts, in the cache). Returns how many scans went to the workers.
 */
export async function describeFaces(scans: ScanRef[], sampling: SamplingParameters, options: DescribeOptions): Promise<{ described: number; cancelled: boolean }> {
  const toDescribe = scans.filter((scan) => {
    const cached = scan.cache ? readTraits(scan.cache.dir, scan.cache.key, sampling) : undefined;
    if (cached) options.onResult({ scanId: scan.scanId, ...cached });
    return !cached;
  });
  const tasks: PoolTask<ProposalTask>[] = toDescribe.map((scan) => ({ keys: [String(scan.scanId)], message: { kind: 'describe', scan, sampling } }));
  const d = await runPool<ProposalTask, DescribeResult>(tasks, {
    workers: options.workers, cacheSize: WORKER_CACHE_SIZE, signal: options.signal,
    onResult: options.onResult,
    onError: (message, i) => options.onError?.(toDescribe[i], message),
    onProgress: (done, total) => options.onProgress?.({ stage: 'describing break faces', done, total }),
  });
  return { described: d.done, cancelled: d.cancelled };
}

/**
 * After scans are imported: describe the catalogue's break faces at the sampling the next
 * proposal run will use, so that run only aligns. Needs every scan's analysis in the match
 * cache (importing stores it); when one is missing (a catalogue from before the cache, a cache
 * that could not be written) nothing is done and the run describes what it needs itself.
 * Never fails the import: a scan that cannot be described is left to the run, which reports it.
 * Returns the number of scans described.
 */
export async function describeForMatching(cat: Catalogue, options: { workers?: number; signal?: AbortSignal; onProgress?: (e: ProgressEvent) => void }): Promise<number> {
  const { scans } = latestScanRefs(cat);
  const summaries: FragmentSummary[] = [];
  const usable: ScanRef[] = [];
  for (const scan of scans) {
    const s = readSummary(scan.cache!.dir, scan.cache!.key);
    if (!s) return 0;
    if (s.problem) continue;
    summaries.push(s);
    usable.push(scan);
  }
  if (usable.length === 0) return 0;
  const sampling = runSampling(summaries);
  const missing = usable.filter((scan) => !readTraits(scan.cache!.dir, scan.cache!.key, sampling));
  if (missing.length === 0) return 0;
  const count = Math.max(1, Math.min(options.workers ?? availableParallelism(), 64, missing.length));
  const workers = Array.from({ length: count }, () => startTypeScriptWorker(new URL('../../jobs/proposal-worker.ts', import.meta.url)));
  try {
    let described = 0;
    await describeFaces(missing, sampling, { workers, signal: options.signal, onResult: () => described++, onProgress: options.onProgress });
    return described;
  } finally {
    for (const w of workers) void w.terminate();
  }
}
