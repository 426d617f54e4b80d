import type { Command } from 'commander';
import { registerAbout } from './about';
import { registerDemo } from './demo';

/**
 * Every subcommand registers itself here, one file per command (or small family) in this
 * folder. Commands are thin: parse arguments, call the host API, print.
 */
export const commandRegistrations: Array<(program: Command) => void> = [
  registerAbout,
  registerDemo,
];
