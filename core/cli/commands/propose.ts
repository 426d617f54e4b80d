import type { Command } from 'commander';
import { availableParallelism } from 'node:os';
import { KnitboneError } from '../../host/errors';
import { Host } from '../../host/host';
import { printJson } from '../output';
import { terminalProgress } from '../progress';

/** `knitbone propose <catalogue> [--workers N] [--json]`: propose joins across the catalogue. */
export function registerPropose(program: Command): void {
  program
    .command('propose')
    .description('compare every scanned specimen with the others and store the joins worth a look as proposals')
    .argument('<catalogue>', 'the catalogue file')
    .option('--workers <n>', 'worker threads (default: the cores available)', String(availableParallelism()))
    .option('--exhaustive', 'align every pair of break faces instead of the candidates the index suggests (slow; for measuring)')
    .option('--min-score <p>', 'store proposals scoring at least this (0-1)', '0.05')
    .option('--size-class-gap <n>', 'pair only pieces whose recorded size classes are at most n classes apart; pieces with no class pair with all; "any" ignores size classes (default: the same class only)')
    .option('--json', 'print the proposed joins as `knitbone joins --json` does')
    .action(async (catalogue: string, opts: { workers: string; exhaustive?: boolean; minScore: string; sizeClassGap?: string; json?: boolean }) => {
      const workers = Number(opts.workers);
      if (!Number.isInteger(workers) || workers < 1) throw new KnitboneError('usage', `--workers must be a whole number of at least 1 (got "${opts.workers}")`);
      const gap = opts.sizeClassGap === undefined ? undefined : opts.sizeClassGap.trim().toLowerCase() === 'any' ? null : Number(opts.sizeClassGap);
      if (gap !== undefined && gap !== null && (!Number.isInteger(gap) || gap < 0 || gap > 10)) {
        throw new KnitboneError('usage', `--size-class-gap must be a whole number of classes from 0 to 10, or "any" to ignore size classes (got "${opts.sizeClassGap}")`);
      }
      const progress = terminalProgress();
      const abort = new AbortController();
      const onSigint = (): void => abort.abort();
      process.once('SIGINT', onSigint);
      let out;
      try {
        out = (await new Host().callUnchecked(
          'proposals.run',
          { catalogue, workers, exhaustive: opts.exhaustive ?? false, minScore: Number(opts.minScore), ...(gap === undefined ? {} : { sizeClassMaxDifference: gap }) },
          { onProgress: progress.onProgress, signal: abort.signal },
        )) as { run: { scans: number; faces: number; candidatePairs: number; alignedPairs: number; skippedDone: number; skippedDecided: number; sizeClasses: { gap: number | null; piecesWithClass: number }; stored: number; cancelled: boolean; problems: Array<{ file: string; message: string }>; seconds: number; candidateFacePairs: number; alignedFacePairs: number; analysedScans: number; describedScans: number; stageSeconds: { reading: number; describing: number; aligning: number }; aligningPreparations: number; workerBusySeconds: number[] } };
      } finally {
        progress.finish();
        process.removeListener('SIGINT', onSigint);
      }
      const r = out.run;
      for (const p of r.problems) process.stderr.write(`knitbone: ${p.file}: ${p.message}\n`);
      const line =
        `${r.scans} scans, ${r.faces} break faces, ${r.candidatePairs} candidate pairs; aligned ${r.alignedPairs}, ` +
        `skipped ${r.skippedDone} done before and ${r.skippedDecided} already decided; stored ${r.stored} proposals in ${r.seconds.toFixed(1)} s\n` +
        `(${r.analysedScans} scans analysed and ${r.describedScans} described in this run, the others from the cache; ${r.candidateFacePairs} candidate face pairs, ${r.alignedFacePairs} aligned; ` +
        `reading ${r.stageSeconds.reading.toFixed(1)} s, describing ${r.stageSeconds.describing.toFixed(1)} s, aligning ${r.stageSeconds.aligning.toFixed(1)} s)\n` +
        (r.sizeClasses.gap === null
          ? '(size classes not used)\n'
          : `(size classes: ${r.sizeClasses.piecesWithClass} of ${r.scans} pieces have one recorded; pieces more than ${r.sizeClasses.gap} class${r.sizeClasses.gap === 1 ? '' : 'es'} apart were not paired: use --size-class-gap any if classes may be wrong)\n`) +
        `(while aligning: ${r.aligningPreparations} fragments prepared by the workers; workers busy ${r.workerBusySeconds.map((x) => x.toFixed(1)).join(' / ') || '-'} s of ${r.stageSeconds.aligning.toFixed(1)} s)\n`;
      if (r.cancelled) {
        process.stderr.write(`knitbone: cancelled; ${r.alignedPairs} pairs are saved. Run the same command again to resume.\n`);
        process.exitCode = 1;
      }
      const list = await new Host().callUnchecked('joins.list', { catalogue, status: 'proposed' }).catch(() => (out as unknown as { proposals: unknown }).proposals);
      if (opts.json) printJson(list);
      else {
        process.stdout.write(line);
        for (const j of list as Array<{ id: number; a?: string; b?: string; specimenA?: number; specimenB?: number; score: number | null }>) {
          process.stdout.write(`${j.id}\t${j.a ?? j.specimenA} + ${j.b ?? j.specimenB}\tproposed\tscore ${(j.score ?? 0).toFixed(3)}\n`);
        }
      }
    });
}
