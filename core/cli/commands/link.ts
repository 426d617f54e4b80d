import type { Command } from 'commander';
import { Host } from '../../host/host';
import { printJson } from '../output';
import { printDecision } from './decision-output';

/** knitbone link <catalogue> <a> <b> --type T: record a join found by hand, as accepted. */
export function registerLink(program: Command): void {
  program
    .command('link')
    .description('record a join found by hand between two specimens, as accepted')
    .argument('<catalogue>', 'the catalogue file')
    .argument('<catalogue-no-a>', 'catalogue number of one specimen')
    .argument('<catalogue-no-b>', 'catalogue number of the other')
    .requiredOption('--type <type>', 'conjoin-green, conjoin-dry, conjoin-modern, articulation or pair')
    .option('--by <name>', 'who decided (default: $KNITBONE_ANALYST or the user name)')
    .option('--note <text>', 'a note kept with the join')
    .option('--force', 'record it even though the two observations conflict (nothing is carried through the conflicting field)')
    .option('--json', 'print JSON')
    .action(async (catalogue: string, a: string, b: string, opts: { type: string; by?: string; note?: string; force?: boolean; json?: boolean }) => {
      const r = await new Host().callUnchecked('joins.link', { catalogue, a, b, type: opts.type, by: opts.by, note: opts.note, force: opts.force });
      if (opts.json) return printJson(r);
      printDecision(r, 'linked');
    });
}
