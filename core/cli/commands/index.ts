import type { Command } from 'commander';
import { registerAbout } from './about';
import { registerDemo } from './demo';
import { registerImportScans } from './import-scans';
import { registerInit } from './init';
import { registerMatch } from './match';
import { registerPropose } from './propose';
import { registerInspect } from './inspect';
import { registerImportSpecimens } from './import-specimens';
import { registerExport } from './export';
import { registerVocabulary } from './vocabulary';
import { registerServe } from './serve';
import { registerLink } from './link';
import { registerAccept } from './accept';
import { registerReject } from './reject';
import { registerUnlink } from './unlink';
import { registerJoins } from './joins';
import { registerConflicts } from './conflicts';
import { registerTally } from './tally';
import { registerSite } from './site';
import { registerSpatial } from './spatial';

/**
 * Every subcommand registers itself here, one file per command (or small family) in this
 * folder. Commands are thin: parse arguments, call the host API, print.
 */
export const commandRegistrations: Array<(program: Command) => void> = [
  registerAbout,
  registerDemo,
  registerInit,
  registerMatch,
  registerPropose,
  registerInspect,
  registerImportScans,
  registerImportSpecimens,
  registerExport,
  registerVocabulary,
  registerServe,
  registerLink,
  registerAccept,
  registerReject,
  registerUnlink,
  registerJoins,
  registerConflicts,
  registerTally,
  registerSpatial,
  registerSite,
];
