import { join } from 'node:path';
import type { Command } from 'commander';
import { KnitboneError } from '../../host/errors';
import { Host } from '../../host/host';
import { printJson } from '../output';
import { terminalProgress } from '../progress';

function positiveInt(name: string) {
  return (v: string): number => {
    if (!/^\d+$/.test(v) || Number(v) < 1) throw new KnitboneError('usage', `--${name} must be a whole number of 1 or more, not "${v}"`);
    return Number(v);
  };
}

/**
 * `knitbone demo <dir>`: generate the invented assemblage, then load it into a catalogue
 * `<dir>/demo.sqlite` (specimens, then scans) through the same host requests as
 * `knitbone init`, `import specimens` and `import scans`.
 */
export function registerDemo(program: Command): void {
  program
    .command('demo')
    .description('generate the invented demo assemblage in <dir> (scans, specimens.csv, site.json, truth.json) and load it into <dir>/demo.sqlite')
    .argument('<dir>', 'new or empty folder to write into (an earlier demo without its catalogue is replaced)')
    .option('--fragments <N>', 'number of fragments', positiveInt('fragments'), 60)
    .option('--seed <S>', 'seed: the same seed gives the same files', 'quarnel')
    .option('--spacing <mm>', 'scanner point spacing in mm, 0.1-3 (default 1; a structured-light scanner is 0.1-0.5)', (v: string) => {
      const n = Number(v);
      if (!Number.isFinite(n) || n < 0.1 || n > 3) throw new KnitboneError('usage', `--spacing must be between 0.1 and 3 mm, not "${v}"`);
      return n;
    })
    .option('--workers <N>', 'worker threads making bones (default: one per core); the files do not depend on it', positiveInt('workers'))
    .option('--no-catalogue', 'write the files only; do not build demo.sqlite')
    .option('--json', 'print a JSON summary')
    .action(async (dir: string, opts: { fragments: number; seed: string; spacing?: number; workers?: number; catalogue: boolean; json?: boolean }) => {
      const host = new Host();
      const progress = terminalProgress();
      try {
        const generated = await host.call(
          'demo.generate',
          { dir, fragments: opts.fragments, seed: opts.seed, pointSpacing: opts.spacing, workers: opts.workers },
          { onProgress: progress.onProgress },
        );
        let catalogue: { path: string; specimens: unknown; site: unknown; scans: { imported: number; unmatched: number } } | undefined;
        if (opts.catalogue) {
          const path = join(dir, 'demo.sqlite');
          await host.call('catalogue.init', { catalogue: path, who: 'knitbone demo' });
          const specimens = await host.call(
            'specimens.import',
            { catalogue: path, file: generated.specimensCsv, who: 'knitbone demo' },
            { onProgress: progress.onProgress },
          );
          // the invented site's units, spits and layer tops, for the spatial figures
          const site = await host.call('spatial.definitions.import', { catalogue: path, file: generated.siteJson, who: 'knitbone demo' });
          const scans = await host.call(
            'scans.import',
            { catalogue: path, folder: generated.scansFolder, units: 'mm', workers: opts.workers, who: 'knitbone demo' },
            { onProgress: progress.onProgress },
          );
          catalogue = { path, specimens, site, scans: { imported: scans.imported.length, unmatched: scans.unmatched.length } };
        }
        progress.finish();
        const summary = { ...generated, catalogue };
        if (opts.json) printJson(summary);
        else
          process.stderr.write(
            `wrote ${generated.fragments} fragments of ${generated.bones} bones (${generated.joins} true joins) to ${dir} ` +
              `in ${generated.seconds.toFixed(1)} s, ${(generated.bytesWritten / 1e6).toFixed(1)} MB` +
              (catalogue ? `; catalogue ${catalogue.path} with ${catalogue.scans.imported} scans linked` : '') +
              '\n',
          );
      } finally {
        progress.finish();
      }
    });
}
