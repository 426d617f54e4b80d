/**
 * One true join of the committed generated sample (demo-data/sample, truth.json: the generator's
 * record of how it cut the bone) with both fragments prepared from their scan files, as a propose
 * run prepares them. The matcher sees only the scans; the truth motion is kept for checking.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { prepareFragment, type PreparedFragment } from '../../../core/geometry/proposals/prepared-fragment';
import { loadFragment } from '../../../core/jobs/fragment-loader';

export const SAMPLE_DIR = join(import.meta.dirname, '../../../demo-data/sample');
/** The spacing `knitbone propose` chooses for the sample (runSpacing of its break face areas). */
export const SAMPLE_SAMPLING = { spacing: 0.85, fpfhRadiusSpacings: 5 };

export interface SampleJoin {
  /** B's file frame -> A's file frame, row-major 4 x 4 (the generator's truth). */
  transformBToA: number[];
  A: PreparedFragment;
  B: PreparedFragment;
}

export function sampleJoin(a: string, b: string): SampleJoin {
  const truth = JSON.parse(readFileSync(join(SAMPLE_DIR, 'truth.json'), 'utf8')) as { joins: Array<{ a: string; b: string; type: string; transformBToA: number[] }> };
  const j = truth.joins.find((x) => x.a === a && x.b === b && x.type === 'conjoin');
  if (!j) throw new Error(`${a} + ${b}: no conjoin in ${join(SAMPLE_DIR, 'truth.json')}`);
  const prepare = (no: string) => prepareFragment(loadFragment(join(SAMPLE_DIR, 'scans', `${no}.ply`)).input, SAMPLE_SAMPLING);
  return { transformBToA: j.transformBToA, A: prepare(a), B: prepare(b) };
}
