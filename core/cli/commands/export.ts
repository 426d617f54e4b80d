import type { Command } from 'commander';
import { Host } from '../../host/host';
import { printJson } from '../output';

/** knitbone export <catalogue> --out <dir> */
export function registerExport(program: Command): void {
  program
    .command('export')
    .description('write specimens.csv, joins.csv and history.csv of a catalogue into a folder')
    .argument('<catalogue>', 'the catalogue file')
    .requiredOption('--out <dir>', 'folder to write the CSV files to (created if missing)')
    .option('--json', 'print JSON')
    .action(async (catalogue: string, opts: { out: string; json?: boolean }) => {
      const r = await new Host().call('catalogue.export', { catalogue, out: opts.out });
      if (opts.json) return printJson(r);
      for (const f of r.files) process.stdout.write(`${f.path} (${f.rows} rows)\n`);
    });
}
