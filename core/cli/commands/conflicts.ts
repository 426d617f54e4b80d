import type { Command } from 'commander';
import { Host } from '../../host/host';
import { printJson } from '../output';

/** knitbone conflicts <catalogue>: joins whose observations disagree. */
export function registerConflicts(program: Command): void {
  program
    .command('conflicts')
    .description('list accepted joins forced over a conflict, and proposed joins that would conflict, with reasons')
    .argument('<catalogue>', 'the catalogue file')
    .option('--json', 'print JSON')
    .action(async (catalogue: string, opts: { json?: boolean }) => {
      const list = await new Host().callUnchecked('joins.conflicts', { catalogue });
      if (opts.json) return printJson(list);
      const rows = list as Array<{ id: number; a: string; b: string; status: string; conflicts: Array<{ field: string; reason: string }> }>;
      if (rows.length === 0) process.stdout.write('no conflicts\n');
      for (const j of rows) {
        for (const c of j.conflicts) process.stdout.write(`${j.id}\t${j.a} + ${j.b}\t${j.status}\t${c.field}: ${c.reason}\n`);
      }
    });
}
