import type { Command } from 'commander';
import { Host } from '../../host/host';
import { printJson } from '../output';
import { printDecision } from './decision-output';

/** knitbone reject <catalogue> <join-id>: reject a proposed join. */
export function registerReject(program: Command): void {
  program
    .command('reject')
    .description('reject a proposed join')
    .argument('<catalogue>', 'the catalogue file')
    .argument('<join-id>', 'the join number (see knitbone joins)')
    .option('--type <type>', 'record the type the proposal would have been')
    .option('--by <name>', 'who decided (default: $KNITBONE_ANALYST or the user name)')
    .option('--json', 'print JSON')
    .action(async (catalogue: string, id: string, opts: { type?: string; by?: string; json?: boolean }) => {
      const r = await new Host().callUnchecked('joins.reject', { catalogue, id: Number(id), type: opts.type, by: opts.by });
      if (opts.json) return printJson(r);
      printDecision(r, 'rejected');
    });
}
