import type { Command } from 'commander';
import { Host } from '../../host/host';
import { printJson } from '../output';
import { printDecision } from './decision-output';

/** knitbone unlink <catalogue> <join-id>: undo an accepted join. */
export function registerUnlink(program: Command): void {
  program
    .command('unlink')
    .description('undo an accepted join: it returns to what it was (a link made by hand is removed) and counts follow')
    .argument('<catalogue>', 'the catalogue file')
    .argument('<join-id>', 'the join number (see knitbone joins)')
    .option('--by <name>', 'who decided (default: $KNITBONE_ANALYST or the user name)')
    .option('--json', 'print JSON')
    .action(async (catalogue: string, id: string, opts: { by?: string; json?: boolean }) => {
      const r = await new Host().callUnchecked('joins.unlink', { catalogue, id: Number(id), by: opts.by });
      if (opts.json) return printJson(r);
      printDecision(r, 'undone');
    });
}
