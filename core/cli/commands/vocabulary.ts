import type { Command } from 'commander';
import { Host } from '../../host/host';
import { KnitboneError } from '../../host/errors';
import { printJson } from '../output';

/**
 * knitbone vocabulary list <catalogue> [--json]
 * knitbone vocabulary add <catalogue> <kind> <term> [--parent P] [--rank R] ...
 * Analysts add taxa and elements to their catalogue without editing code.
 */
export function registerVocabulary(program: Command): void {
  const group = program.command('vocabulary').description("list or extend a catalogue's controlled vocabularies");
  group.exitOverride();

  group
    .command('list')
    .description('print the terms a catalogue accepts (taxa, elements, sides, zones...)')
    .argument('<catalogue>', 'the catalogue file')
    .option('--json', 'print JSON')
    .exitOverride()
    .action(async (catalogue: string, opts: { json?: boolean }) => {
      const v = await new Host().call('vocabulary.list', { catalogue });
      if (opts.json) return printJson(v);
      const out = process.stdout;
      out.write(`taxa (${v.taxa.length}):\n`);
      for (const t of v.taxa) out.write(`  ${t.name} [${t.rank}]${t.parent ? ` < ${t.parent}` : ''}${t.added ? ' (added)' : ''}\n`);
      out.write(`elements (${v.elements.length}):\n`);
      for (const e of v.elements) out.write(`  ${e.name}${e.specific ? '' : ' [category]'}${e.parent ? ` < ${e.parent}` : ''}${e.added ? ' (added)' : ''}\n`);
      out.write(`sides: ${v.sides.join(', ')}\nbreak ages: ${v.breakAges.join(', ')}\nfusion: ${v.fusion.join(', ')}\n`);
      out.write(`modifications: ${v.modifications.join(', ')}\nportion zones: ${v.portionZones.join(', ')}\n`);
    });

  group
    .command('add')
    .description('add a taxon, element, fusion state or modification to a catalogue')
    .argument('<catalogue>', 'the catalogue file')
    .argument('<kind>', 'taxon | element | fusion | modification')
    .argument('<term>', 'the canonical spelling to store, e.g. "Saiga tatarica"')
    .option('--parent <term>', 'the broader taxon or element it belongs under (required for taxa and elements)')
    .option('--rank <rank>', 'taxon rank: class, order, family, subfamily, tribe, genus, species')
    .option('--size-class <n>', 'typical body-size class 1-6 (taxa)')
    .option('--category', 'an element category rather than a specific element')
    .option('--paired', 'the element has a left and a right')
    .option('--synonym <spelling...>', 'other spellings that mean the same term')
    .option('--source <text>', 'where the term comes from')
    .option('--by <name>', 'who is working (for the history)')
    .option('--json', 'print JSON')
    .exitOverride()
    .action(async (catalogue: string, kind: string, term: string, opts: Record<string, string | boolean | string[] | undefined>) => {
      if (!['taxon', 'element', 'fusion', 'modification'].includes(kind)) {
        throw new KnitboneError('usage', `kind must be taxon, element, fusion or modification, not "${kind}"`);
      }
      const sizeClass = opts.sizeClass === undefined ? undefined : Number(opts.sizeClass);
      const r = await new Host().call('vocabulary.add', {
        catalogue,
        kind: kind as 'taxon',
        term,
        parent: opts.parent as string | undefined,
        rank: opts.rank as string | undefined,
        sizeClass,
        specific: kind === 'element' ? !opts.category : undefined,
        paired: kind === 'element' ? Boolean(opts.paired) : undefined,
        synonyms: opts.synonym as string[] | undefined,
        source: opts.source as string | undefined,
        who: opts.by as string | undefined,
      });
      if (opts.json) return printJson(r);
      process.stdout.write(`added ${r.kind} "${r.term}"${r.parent ? ` under "${r.parent}"` : ''}\n`);
    });
}
