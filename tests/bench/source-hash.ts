/**
 * Keys for results the benchmarks keep between runs: a hash of the TypeScript sources that made
 * them, so a changed analysis or generator never reuses a stale file.
 */
import { createHash } from 'node:crypto';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';

const root = join(import.meta.dirname, '../..');

/** Hash of the TypeScript sources in these folders of the repository (not their subfolders). */
export function sourceHash(...folders: string[]): string {
  const h = createHash('sha256');
  for (const d of folders) for (const f of readdirSync(join(root, d)).filter((x) => x.endsWith('.ts')).sort()) h.update(f).update(readFileSync(join(root, d, f)));
  return h.digest('hex').slice(0, 12);
}

/** The folders whose code reads and analyses a scan for matching. */
export const ANALYSIS_FOLDERS = ['core/geometry', 'core/geometry/parse', 'core/jobs'] as const;
