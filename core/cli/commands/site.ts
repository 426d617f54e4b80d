import type { Command } from 'commander';
import { Host } from '../../host/host';
import { printJson } from '../output';

/**
 * knitbone site import <catalogue> <file>: define excavation units, levels and layer tops
 * (CSV or JSON, all or nothing); knitbone site show <catalogue>: list them.
 */
export function registerSite(program: Command): void {
  const site = program.command('site').description('where excavation units, levels and layers are, for spatial analysis');
  site
    .command('import')
    .description('read unit, level or layer-top definitions from a CSV or JSON file; a file with any bad row imports nothing')
    .argument('<catalogue>', 'path of the catalogue file')
    .argument('<file>', 'CSV (unit,x_min,y_min,x_max,y_max | unit,level,top_z,bottom_z | layer,x,y,z) or JSON')
    .option('--by <name>', 'who is working (for the history)')
    .option('--json', 'print JSON')
    .action(async (catalogue: string, file: string, opts: { by?: string; json?: boolean }) => {
      const r = await new Host().call('spatial.definitions.import', { catalogue, file, who: opts.by });
      if (opts.json) return printJson(r);
      process.stdout.write(
        `units: ${r.unitsAdded} added, ${r.unitsChanged} changed; levels: ${r.levelsAdded} added, ${r.levelsChanged} changed; ` +
          `layer tops replaced: ${r.layersReplaced.length ? r.layersReplaced.join(', ') : 'none'} (${r.boundaryPoints} points in all)\n`,
      );
    });
  site
    .command('show')
    .description('list the units, levels and layer-top points defined in a catalogue')
    .argument('<catalogue>', 'path of the catalogue file')
    .option('--json', 'print JSON')
    .action(async (catalogue: string, opts: { json?: boolean }) => {
      const d = await new Host().call('spatial.definitions', { catalogue });
      if (opts.json) return printJson(d);
      const out: string[] = [`${d.units.length} units, ${d.levels.length} levels, ${d.layerBoundaries.length} layer-top points`];
      for (const u of d.units) out.push(`unit ${u.unit}: x ${u.xMin} to ${u.xMax}, y ${u.yMin} to ${u.yMax}`);
      for (const l of d.levels) out.push(`level ${l.level} (${l.unit ?? 'every unit'}): ${l.topZ} to ${l.bottomZ} m`);
      process.stdout.write(out.join('\n') + '\n');
    });
}
