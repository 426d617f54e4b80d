import type { Command } from 'commander';
import { KnitboneError } from '../../host/errors';
import { Host } from '../../host/host';
import { printJson } from '../output';
import { terminalProgress } from '../progress';

function positiveInt(name: string) {
  return (v: string): number => {
    if (!/^\d+$/.test(v) || Number(v) < 1) throw new KnitboneError('usage', `--${name} must be a whole number of 1 or more, not "${v}"`);
    return Number(v);
  };
}

export function registerDemo(program: Command): void {
  program
    .command('demo')
    .description('generate the invented demo assemblage (scans, specimens.csv, truth.json) in <dir>')
    .argument('<dir>', 'folder to write into (created if missing)')
    .option('--fragments <N>', 'number of fragments', positiveInt('fragments'), 60)
    .option('--seed <S>', 'seed: the same seed gives the same files', 'quarnel')
    .option('--spacing <mm>', 'scanner point spacing in mm (default 0.5)', (v: string) => {
      const n = Number(v);
      if (!Number.isFinite(n) || n < 0.1 || n > 3) throw new KnitboneError('usage', `--spacing must be between 0.1 and 3 mm, not "${v}"`);
      return n;
    })
    .option('--json', 'print a JSON summary')
    .action(async (dir: string, opts: { fragments: number; seed: string; spacing?: number; json?: boolean }) => {
      const progress = terminalProgress();
      const summary = await new Host().call(
        'demo.generate',
        { dir, fragments: opts.fragments, seed: opts.seed, pointSpacing: opts.spacing },
        { onProgress: progress.onProgress },
      );
      progress.finish();
      if (opts.json) printJson(summary);
      else
        process.stderr.write(
          `wrote ${summary.fragments} fragments of ${summary.bones} bones (${summary.joins} true joins) to ${dir} ` +
            `in ${summary.seconds.toFixed(1)} s, ${(summary.bytesWritten / 1e6).toFixed(1)} MB\n`,
        );
    });
}
