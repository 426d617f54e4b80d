import type { Command } from 'commander';
import { Host } from '../../host/host';
import { printJson } from '../output';
import { terminalProgress } from '../progress';
import { importGroup } from './import-group';

/** knitbone import scans <catalogue> <folder>: file name stem = catalogue number. */
export function registerImportScans(program: Command): void {
  importGroup(program)
    .command('scans')
    .exitOverride()
    .description('read every .ply, .stl and .obj file in a folder and link it to the specimen whose catalogue number is the file name')
    .argument('<catalogue>', 'path of the catalogue file')
    .argument('<folder>', 'folder that holds the scan files')
    .option('--units <units>', 'length unit of the files: mm, cm or m', 'mm')
    .option('--skip-bad', 'import the good files even when some cannot be read (they are listed)')
    .option('--workers <n>', 'worker threads (default: one per core)', (v) => Number.parseInt(v, 10))
    .option('--max-bytes <n>', 'largest file to read, in bytes (default 2 GB)', (v) => Number.parseInt(v, 10))
    .option('--by <name>', 'who is working (for the history)')
    .option('--json', 'print JSON')
    .action(async (catalogue: string, folder: string, opts: { units: string; skipBad?: boolean; workers?: number; maxBytes?: number; by?: string; json?: boolean }) => {
      const progress = terminalProgress();
      const abort = new AbortController();
      const onSigint = (): void => abort.abort();
      process.once('SIGINT', onSigint);
      try {
        const r = await new Host().callUnchecked(
          'scans.import',
          { catalogue, folder, units: opts.units, skipBad: !!opts.skipBad, workers: opts.workers, maxBytes: opts.maxBytes, who: opts.by },
          { onProgress: progress.onProgress, signal: abort.signal },
        ) as {
          imported: Array<{ file: string; catalogueNo: string; scanId: number; fractureFaces: number; warnings: string[] }>;
          alreadyImported: unknown[];
          describedForMatching: number;
          unmatched: string[];
          bad: Array<{ file?: string; line?: number; message: string }>;
          cancelled: boolean;
          remaining: string[];
        };
        progress.finish();
        if (r.cancelled) process.exitCode = 1;
        if (opts.json) return printJson(r);
        for (const s of r.imported) {
          process.stdout.write(`${s.file} -> ${s.catalogueNo}: scan ${s.scanId}, ${s.fractureFaces} fracture faces\n`);
          for (const w of s.warnings) process.stderr.write(`knitbone: ${s.file}: warning: ${w}\n`);
        }
        process.stdout.write(`${r.imported.length} imported, ${r.alreadyImported.length} already in the catalogue\n`);
        if (r.describedForMatching) process.stdout.write(`break faces of ${r.describedForMatching} scans described for join proposals\n`);
        if (r.unmatched.length) process.stdout.write(`no specimen with these catalogue numbers: ${r.unmatched.join(', ')}\n`);
        for (const b of r.bad) process.stderr.write(`knitbone: ${b.file ?? ''}${b.line ? `, line ${b.line}` : ''}: ${b.message} (skipped)\n`);
        if (r.cancelled) process.stderr.write(`knitbone: cancelled; ${r.remaining.length} files not read yet: run the same command again to resume\n`);
      } finally {
        progress.finish();
        process.removeListener('SIGINT', onSigint);
      }
    });
}
