import { KnitboneError, formatProblem } from '../host/errors';

/** `--json` prints one JSON document on stdout and nothing else there. */
export function printJson(value: unknown): void {
  process.stdout.write(JSON.stringify(value, null, 2) + '\n');
}

/** Exit codes of every command (design.md section 9). */
export const EXIT_OK = 0;
export const EXIT_BAD_INPUT = 1;
export const EXIT_USAGE = 2;

/** Report an error as one line per problem on stderr and return the exit code to use. */
export function reportError(err: unknown): number {
  if (err instanceof KnitboneError) {
    for (const p of err.problems) process.stderr.write(`knitbone: ${formatProblem(p)}\n`);
    if (err.kind === 'usage') return EXIT_USAGE;
    if (err.kind === 'internal') return EXIT_BAD_INPUT;
    return EXIT_BAD_INPUT;
  }
  const message = err instanceof Error ? err.message : String(err);
  process.stderr.write(`knitbone: internal error: ${message}\n`);
  if (process.env.KNITBONE_DEBUG && err instanceof Error && err.stack) process.stderr.write(err.stack + '\n');
  return EXIT_BAD_INPUT;
}
