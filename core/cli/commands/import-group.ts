import type { Command } from 'commander';

/**
 * The `knitbone import` command group (import specimens, import scans, ...). Each area adds
 * its own subcommand through this, so the group is created once whoever registers first.
 */
export function importGroup(program: Command): Command {
  const existing = program.commands.find((c) => c.name() === 'import');
  if (existing) return existing;
  return program.command('import').description('bring specimens or scans into a catalogue');
}
