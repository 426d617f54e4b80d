import type { Command } from 'commander';
import { Host } from '../../host/host';
import { printJson } from '../output';
import { importGroup } from './import-group';

/**
 * knitbone import site <catalogue> <file>: define excavation units, levels and layer tops
 * (CSV or JSON, all or nothing). knitbone site <catalogue>: list what is defined.
 */
export function registerSite(program: Command): void {
  importGroup(program)
    .command('site')
    .description('read excavation unit, level or layer-top definitions from a CSV or JSON file; a file with any bad row imports nothing')
    .argument('<catalogue>', 'path of the catalogue file')
    .argument('<file>', 'CSV (unit,x_min,y_min,x_max,y_max | unit,level,top_z,bottom_z | layer,x,y,z) or JSON')
    .option('--by <name>', 'who is working (for the history)')
    .option('--json', 'print JSON')
    .exitOverride()
    .action(async (catalogue: string, file: string, opts: { by?: string; json?: boolean }) => {
      const r = await new Host().call('spatial.definitions.import', { catalogue, file, who: opts.by });
      if (opts.json) return printJson(r);
      process.stdout.write(
        `units: ${r.unitsAdded} added, ${r.unitsChanged} changed; levels: ${r.levelsAdded} added, ${r.levelsChanged} changed; ` +
          `layer tops replaced: ${r.layersReplaced.length ? r.layersReplaced.join(', ') : 'none'} (${r.boundaryPoints} points in all)\n`,
      );
    });
  program
    .command('site')
    .description('list the excavation units, levels and layer-top points defined in a catalogue')
    .argument('<catalogue>', 'path of the catalogue file')
    .option('--json', 'print JSON')
    .action(async (catalogue: string, opts: { json?: boolean }) => {
      const d = await new Host().call('spatial.definitions', { catalogue });
      if (opts.json) return printJson(d);
      const out: string[] = [`${d.units.length} units, ${d.levels.length} levels, ${d.layerBoundaries.length} layer-top points`];
      for (const u of d.units) out.push(`unit ${u.unit}: x ${u.xMin} to ${u.xMax}, y ${u.yMin} to ${u.yMax}`);
      for (const l of d.levels) out.push(`level ${l.level} (${l.unit ?? 'every unit'}): top ${l.topZ} m, bottom ${l.bottomZ} m`);
      const layers = new Map<string, number>();
      for (const p of d.layerBoundaries) layers.set(p.layer, (layers.get(p.layer) ?? 0) + 1);
      for (const [layer, n] of layers) out.push(`layer ${layer}: ${n} points on its top`);
      process.stdout.write(out.join('\n') + '\n');
    });
}
