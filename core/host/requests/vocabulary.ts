import { z } from 'zod';
import { withCatalogue } from '../../catalogue/catalogue';
import { vocabularyOf } from '../../catalogue/catalogue-vocabulary';
import { PORTION_ZONES } from '../../vocab/portion-zones';
import { SIZE_CLASSES } from '../../vocab/size-classes';
import { checkUserTerm, type UserTerm } from '../../vocab/vocabulary';
import { KnitboneError } from '../errors';
import { defineRequest } from '../request';

const cataloguePath = z.string().trim().min(1, 'give the path of a catalogue file');

/** Requests about a catalogue's controlled vocabularies (built-in terms plus its own). */
export const vocabularyRequests = {
  'vocabulary.list': defineRequest({
    summary: "Every term a catalogue accepts: taxa and elements as trees, sides, break ages, fusion, modifications, zones, size classes",
    input: z.object({ catalogue: cataloguePath }).strict(),
    run: (input) =>
      withCatalogue(input.catalogue, (cat) => {
        const v = vocabularyOf(cat);
        return {
          taxa: v.taxa.all().map((t) => ({ name: t.name, parent: t.parent, rank: t.rank, synonyms: t.synonyms, sizeClass: t.sizeClass ?? null, added: t.addedBy !== undefined })),
          elements: v.elements.all().map((e) => ({ name: e.name, parent: e.parent, specific: e.specific, paired: e.paired, synonyms: e.synonyms, added: e.addedBy !== undefined })),
          sides: v.sides.terms,
          breakAges: v.breakAges.terms,
          fusion: v.fusion.terms,
          modifications: v.modifications.terms,
          portionZones: PORTION_ZONES,
          sizeClasses: SIZE_CLASSES,
        };
      }),
  }),

  'vocabulary.add': defineRequest({
    summary: "Add a taxon, element, fusion state or modification to a catalogue's vocabulary",
    input: z
      .object({
        catalogue: cataloguePath,
        kind: z.enum(['taxon', 'element', 'fusion', 'modification']),
        term: z.string().trim().min(1),
        parent: z.string().trim().min(1).nullable().optional(),
        rank: z.string().optional(),
        sizeClass: z.number().int().min(1).max(6).optional(),
        skeletonGroup: z.string().optional(),
        specific: z.boolean().optional(),
        paired: z.boolean().optional(),
        synonyms: z.array(z.string().trim().min(1)).optional(),
        source: z.string().optional(),
        who: z.string().trim().min(1).optional(),
      })
      .strict(),
    run: (input) =>
      withCatalogue(
        input.catalogue,
        (cat) => {
          const v = vocabularyOf(cat);
          // Parents may be typed loosely too: resolve them to the canonical term.
          const h = input.kind === 'taxon' ? v.taxa : input.kind === 'element' ? v.elements : undefined;
          const parent = input.parent && h ? (h.resolve(input.parent) ?? input.parent) : (input.parent ?? null);
          const details: UserTerm['details'] = {};
          for (const k of ['rank', 'sizeClass', 'skeletonGroup', 'specific', 'paired', 'synonyms'] as const) {
            if (input[k] !== undefined) (details as Record<string, unknown>)[k] = input[k];
          }
          const term: UserTerm = { kind: input.kind, term: input.term, parent, details, source: input.source ?? null };
          const problems = checkUserTerm(v, term);
          if (problems.length) throw new KnitboneError('bad-input', problems.map((message) => ({ field: 'term', message })));
          return cat.vocabulary.add({ kind: term.kind, term: term.term, parent, details, source: term.source });
        },
        { who: input.who },
      ),
  }),
};
