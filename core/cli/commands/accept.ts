import type { Command } from 'commander';
import { Host } from '../../host/host';
import { printJson } from '../output';
import { printDecision } from './decision-output';

/** knitbone accept <catalogue> <join-id>: accept a proposed join. */
export function registerAccept(program: Command): void {
  program
    .command('accept')
    .description('accept a proposed join; identifications propagate and counts follow')
    .argument('<catalogue>', 'the catalogue file')
    .argument('<join-id>', 'the join number (see knitbone joins)')
    .option('--type <type>', 'conjoin-green, conjoin-dry, conjoin-modern, articulation or pair (default: the type it has)')
    .option('--by <name>', 'who decided (default: $KNITBONE_ANALYST or the user name)')
    .option('--force', 'accept it even though the two observations conflict (nothing is carried through the conflicting field)')
    .option('--json', 'print JSON')
    .action(async (catalogue: string, id: string, opts: { type?: string; by?: string; force?: boolean; json?: boolean }) => {
      const r = await new Host().callUnchecked('joins.accept', { catalogue, id: Number(id), type: opts.type, by: opts.by, force: opts.force });
      if (opts.json) return printJson(r);
      printDecision(r, 'accepted');
    });
}
