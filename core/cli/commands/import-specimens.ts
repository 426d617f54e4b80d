import type { Command } from 'commander';
import { Host } from '../../host/host';
import { printJson } from '../output';
import { terminalProgress } from '../progress';
import { importGroup } from './import-group';

/** knitbone import specimens <catalogue> <file.csv> [--update] */
export function registerImportSpecimens(program: Command): void {
  importGroup(program)
    .command('specimens')
    .description('import specimens from a CSV file (all or nothing); --update changes existing ones')
    .argument('<catalogue>', 'the catalogue file')
    .argument('<file>', 'CSV with a header row: catalogue_no and any of unit, level, layer, x, y, z, taxon, element, side, portion, fusion, size_class, break_age, modifications, weight_g, notes')
    .option('--update', 'change specimens whose catalogue number is already in the catalogue (each change goes to history)')
    .option('--by <name>', 'who is working (for the history)')
    .option('--json', 'print JSON')
    .exitOverride()
    .action(async (catalogue: string, file: string, opts: { update?: boolean; by?: string; json?: boolean }) => {
      const bar = terminalProgress();
      try {
        const r = await new Host().call('specimens.import', { catalogue, file, update: Boolean(opts.update), who: opts.by }, { onProgress: bar.onProgress });
        bar.finish();
        if (opts.json) return printJson(r);
        const parts = [`${r.inserted} added`];
        if (opts.update) parts.push(`${r.updated} updated`, `${r.unchanged} unchanged`);
        process.stdout.write(`imported ${r.rows} rows from ${r.file}: ${parts.join(', ')}\n`);
      } finally {
        bar.finish();
      }
    });
}
