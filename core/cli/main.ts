import { Command, CommanderError } from 'commander';
import { commandRegistrations } from './commands/index';
import { EXIT_USAGE, reportError } from './output';

/** Build the `knitbone` program: every command from ./commands, usage errors exit 2. */
export function buildProgram(): Command {
  const program = new Command();
  program
    .name('knitbone')
    .description('Catalogue, refit and count a zooarchaeological assemblage.')
    .showHelpAfterError('(run knitbone --help for usage)')
    .exitOverride();
  for (const register of commandRegistrations) register(program);
  for (const cmd of program.commands) cmd.exitOverride();
  return program;
}

/** Run the CLI with the given arguments (without node and script); resolves to the exit code. */
export async function runCli(argv: string[]): Promise<number> {
  const program = buildProgram();
  try {
    await program.parseAsync(argv, { from: 'user' });
    return process.exitCode === undefined ? 0 : Number(process.exitCode);
  } catch (err) {
    if (err instanceof CommanderError) {
      if (err.code === 'commander.helpDisplayed' || err.code === 'commander.version' || err.code === 'commander.help') return 0;
      return EXIT_USAGE;
    }
    return reportError(err);
  }
}

const isMain = process.argv[1] !== undefined && /knitbone(\.js)?$|main\.ts$/.test(process.argv[1]);
if (isMain) {
  const code = await runCli(process.argv.slice(2));
  process.exitCode = code;
}
