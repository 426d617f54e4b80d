import type { Command } from 'commander';
import { stringify } from 'csv-stringify/sync';
import { Host } from '../../host/host';
import { TALLY_COLUMNS, tallyRows } from '../../quant/tally-tables';
import { KnitboneError } from '../../host/errors';
import { printJson } from '../output';

/** knitbone tally <catalogue> [--json | --csv]: NSP, NISP, MNE, MNI, MAU as recorded and refitted. */
export function registerTally(program: Command): void {
  program
    .command('tally')
    .description('count the assemblage: NSP, NISP, MNE, MNI, MAU and %MAU, as recorded and after refits')
    .argument('<catalogue>', 'the catalogue file')
    .option('--json', 'print JSON')
    .option('--csv', 'print the counts as one CSV table for a spreadsheet (a row per reading, taxon and element)')
    .action(async (catalogue: string, opts: { json?: boolean; csv?: boolean }) => {
      if (opts.json && opts.csv) throw new KnitboneError('usage', 'give --json or --csv, not both');
      const counts = await new Host().call('tally.counts', { catalogue });
      if (opts.json) return printJson(counts);
      if (opts.csv) {
        process.stdout.write(stringify([[...TALLY_COLUMNS], ...tallyRows(counts).map((r) => r.map((v) => v ?? ''))]));
        return;
      }
      const pct = (x: number) => `${(x * 100).toFixed(1)}%`;
      process.stdout.write(`NSP ${counts.nsp}\n`);
      for (const [name, t] of [['recorded', counts.recorded], ['refitted', counts.refitted]] as const) {
        process.stdout.write(
          `${name}: NISP ${t.nisp} (fragments ${t.nispFragments}); identified to element ${pct(t.identifiedToElement)}, to taxon ${pct(t.identifiedToTaxon)}\n`,
        );
        for (const x of t.byTaxon) process.stdout.write(`  ${x.taxon}: NISP ${x.nisp}, MNI ${x.mni}${x.lrp !== undefined ? `, L+R-P ${x.lrp}` : ''}\n`);
      }
    });
}
