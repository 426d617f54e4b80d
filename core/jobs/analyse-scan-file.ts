import { createHash } from 'node:crypto';
import { readFileSync, statSync } from 'node:fs';
import { basename } from 'node:path';
import { analyseFragment, fractureLabelsForInput } from '../geometry/analyse-fragment';
import { summariseFragment, type FragmentSummary } from '../geometry/fragment-summary';
import { DEFAULT_MAX_MESH_BYTES, MeshFileError, parseMeshFile, type MeshFileFormat } from '../geometry/parse/index';
import type { AnalysisSettings } from '../geometry/settings';
import type { SurfaceClass } from '../geometry/surface-classes';
import { toMillimetres, type LengthUnit } from '../geometry/units';
import { storeAnalysisForMatching } from './fragment-cache';

export interface ScanFileJob {
  path: string;
  units: LengthUnit;
  maxBytes?: number;
  settings?: Partial<AnalysisSettings>;
  /** The analyst's region class corrections, [region id, class]. */
  corrections?: Array<[number, SurfaceClass]>;
  /** Also return one byte per input triangle (1 fracture). */
  withLabels?: boolean;
  /** Also keep what join proposals need in this cache folder (fragment-cache.ts), so `propose` does not read the scan again. */
  matchCacheDir?: string;
}

export interface ScanFileResult {
  path: string;
  contentHash: string;
  bytes: number;
  format: MeshFileFormat;
  units: LengthUnit;
  settings: AnalysisSettings;
  summary: FragmentSummary;
  labels?: Uint8Array;
}

/** A problem with one scan file: the file and one sentence (and a line for text files). */
export interface ScanFileProblem {
  file: string;
  line?: number;
  message: string;
}

export class ScanFileFailure extends Error {
  constructor(readonly problem: ScanFileProblem) {
    super(`${problem.file}${problem.line ? `, line ${problem.line}` : ''}: ${problem.message}`);
    this.name = 'ScanFileFailure';
  }
}

/** Read, check, measure and segment one scan file (runs in a worker thread or in-process). */
export function analyseScanFile(job: ScanFileJob): ScanFileResult {
  const file = basename(job.path);
  const maxBytes = job.maxBytes ?? DEFAULT_MAX_MESH_BYTES;
  let bytes: Uint8Array;
  try {
    const size = statSync(job.path).size;
    if (size > maxBytes) throw new MeshFileError(`file is ${size} bytes, over the limit of ${maxBytes} bytes (raise the size limit to read it)`);
    bytes = readFileSync(job.path);
  } catch (err) {
    if (err instanceof MeshFileError) throw new ScanFileFailure({ file, message: err.message });
    throw new ScanFileFailure({ file, message: `cannot read the file: ${(err as Error).message}` });
  }
  const contentHash = createHash('sha256').update(bytes).digest('hex');
  let parsed;
  try {
    parsed = parseMeshFile(bytes, job.path, maxBytes);
  } catch (err) {
    if (err instanceof MeshFileError) throw new ScanFileFailure({ file, line: err.line, message: err.message });
    throw new ScanFileFailure({ file, message: `the file could not be read as a mesh: ${(err as Error).message}` });
  }
  const mesh = toMillimetres(parsed.mesh, job.units);
  const analysis = analyseFragment(mesh, job.settings ?? {}, new Map(job.corrections ?? []));
  if (job.matchCacheDir) storeAnalysisForMatching(job.matchCacheDir, { file: job.path, contentHash, units: job.units, corrections: job.corrections }, mesh, analysis);
  return {
    path: job.path,
    contentHash,
    bytes: bytes.length,
    format: parsed.format,
    units: job.units,
    settings: analysis.settings,
    summary: summariseFragment(analysis, parsed.warnings.slice(0, 5)),
    labels: job.withLabels ? fractureLabelsForInput(analysis) : undefined,
  };
}
