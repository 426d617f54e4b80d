import type { Command } from 'commander';
import { Host } from '../../host/host';
import { printJson } from '../output';

/** knitbone init <catalogue.sqlite>: create a catalogue, or bring an existing one to the newest schema. */
export function registerInit(program: Command): void {
  program
    .command('init')
    .description('create a catalogue file for an assemblage (an existing one is brought up to date)')
    .argument('<catalogue>', 'path of the catalogue file, e.g. site.sqlite')
    .option('--by <name>', 'who is working (for the history); default: $KNITBONE_ANALYST or the user name')
    .option('--json', 'print JSON')
    .action(async (catalogue: string, opts: { by?: string; json?: boolean }) => {
      const r = await new Host().call('catalogue.init', { catalogue, who: opts.by });
      if (opts.json) return printJson(r);
      if (r.created) process.stdout.write(`created catalogue ${r.path} (schema version ${r.schemaVersion})\n`);
      else if (r.appliedMigrations.length) {
        process.stdout.write(`updated catalogue ${r.path} to schema version ${r.schemaVersion}; copy of the old file: ${r.backupPath}\n`);
      } else process.stdout.write(`${r.path} is already a catalogue at schema version ${r.schemaVersion} (${r.specimens} specimens)\n`);
    });
}
