import type { Command } from 'commander';
import { Host } from '../../host/host';
import { printJson } from '../output';

export function registerAbout(program: Command): void {
  program
    .command('about')
    .description('print the name and version of this knitbone')
    .option('--json', 'print JSON')
    .action(async (opts: { json?: boolean }) => {
      const about = await new Host().call('app.about', {});
      if (opts.json) printJson(about);
      else process.stdout.write(`${about.name} ${about.version}\n`);
    });
}
