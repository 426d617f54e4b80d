import type { Command } from 'commander';

/**
 * `knitbone import <what> ...` is one command with a subcommand per kind of input
 * (specimens, scans). Each area's command file calls this to get the shared group.
 */
export function importGroup(program: Command): Command {
  const existing = program.commands.find((c) => c.name() === 'import');
  if (existing) return existing;
  const group = program.command('import').description('bring specimens or scans into a catalogue');
  group.exitOverride();
  return group;
}
