import type { Command } from 'commander';
import { Host } from '../../host/host';
import { printJson } from '../output';

/** knitbone joins <catalogue> [--status S]: list joins. */
export function registerJoins(program: Command): void {
  program
    .command('joins')
    .description('list the joins of a catalogue')
    .argument('<catalogue>', 'the catalogue file')
    .option('--status <status>', 'only proposed, accepted or rejected joins')
    .option('--json', 'print JSON')
    .action(async (catalogue: string, opts: { status?: string; json?: boolean }) => {
      const list = await new Host().callUnchecked('joins.list', { catalogue, status: opts.status });
      if (opts.json) return printJson(list);
      for (const j of list as Array<{ id: number; a: string; b: string; status: string; type: string | null; score: number | null }>) {
        const score = j.score === null ? '' : ` score ${j.score.toFixed(3)}`;
        process.stdout.write(`${j.id}\t${j.a} + ${j.b}\t${j.status}\t${j.type ?? 'untyped'}${score}\n`);
      }
    });
}
