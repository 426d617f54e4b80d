import { z } from 'zod';
import { withCatalogue } from '../../catalogue/catalogue';
import { SiteDefinitionRepository } from '../../catalogue/site-definitions';
import { readSiteDefinitionsFile, siteDefinitionsSchema } from '../../catalogue/site-definitions-import';
import { analyseRefits } from '../../spatial/analyse';
import { buildFigure, figureKinds } from '../../spatial/figures/build';
import type { JoinFilter } from '../../spatial/filters';
import { spatialReport } from '../../spatial/report';
import { defineRequest } from '../request';

const cataloguePath = z.string().trim().min(1, 'give the path of a catalogue file');
const labels = z.array(z.string().trim().min(1)).optional();

/** Which accepted joins to look at: by join type (or type-break age), taxon, layer. */
const filterFields = {
  types: labels,
  taxa: labels,
  layers: labels,
};

const sectionSchema = z
  .object({
    bearingDeg: z.number().finite(),
    halfWidthM: z.number().finite().positive().optional(),
    origin: z.object({ x: z.number().finite(), y: z.number().finite() }).strict().optional(),
  })
  .strict();

function filterOf(input: { types?: string[]; taxa?: string[]; layers?: string[] }): JoinFilter {
  const f: JoinFilter = {};
  if (input.types?.length) f.types = input.types;
  if (input.taxa?.length) f.taxa = input.taxa;
  if (input.layers?.length) f.layers = input.layers;
  return f;
}

/** Requests of spatial refit analysis: numbers, figures, and the unit/level/layer definitions behind them. */
export const spatialRequests = {
  'spatial.analyse': defineRequest({
    summary: 'Distances, directions and unit/level/layer crossings of accepted joins, with summary and layer matrix',
    input: z.object({ catalogue: cataloguePath, ...filterFields }).strict(),
    run: (input) =>
      withCatalogue(input.catalogue, (cat) => {
        const repo = new SiteDefinitionRepository(cat.db, cat.history, cat.who);
        const analysis = analyseRefits(repo.spatialSpecimens(), repo.acceptedJoins(), repo.all(), filterOf(input));
        return spatialReport(analysis);
      }),
  }),

  'spatial.figure': defineRequest({
    summary: 'One figure of the refits as SVG text: plan, section, histogram of distances, rose of directions or layer matrix',
    input: z
      .object({
        catalogue: cataloguePath,
        kind: z.enum(figureKinds as [string, ...string[]]),
        ...filterFields,
        width: z.number().int().min(300).max(4000).optional(),
        title: z.string().max(200).optional(),
        section: sectionSchema.optional(),
        measure: z.enum(['horizontal', 'vertical', '3d']).optional(),
        sectorDeg: z.number().positive().max(90).refine((d) => Math.abs(180 / d - Math.round(180 / d)) < 1e-9, 'must divide 180').optional(),
        axial: z.boolean().optional(),
      })
      .strict(),
    run: (input) =>
      withCatalogue(input.catalogue, (cat) => {
        const repo = new SiteDefinitionRepository(cat.db, cat.history, cat.who);
        const specimens = repo.spatialSpecimens();
        const site = repo.all();
        const analysis = analyseRefits(specimens, repo.acceptedJoins(), site, filterOf(input));
        const svg = buildFigure(
          {
            kind: input.kind as (typeof figureKinds)[number],
            width: input.width,
            title: input.title,
            section: input.section,
            measure: input.measure,
            sectorDeg: input.sectorDeg,
            axial: input.axial,
          },
          specimens,
          analysis,
          site,
        );
        return { kind: input.kind, mediaType: 'image/svg+xml' as const, svg };
      }),
  }),

  'spatial.definitions': defineRequest({
    summary: 'The excavation units, levels and layer-top points defined in a catalogue',
    input: z.object({ catalogue: cataloguePath }).strict(),
    run: (input) =>
      withCatalogue(input.catalogue, (cat) => new SiteDefinitionRepository(cat.db, cat.history, cat.who).all()),
  }),

  'spatial.definitions.import': defineRequest({
    summary: 'Import unit, level or layer-top definitions from a CSV or JSON file, all or nothing',
    input: z
      .object({
        catalogue: cataloguePath,
        /** A file to read, or the definitions themselves (as a form or the app sends them). */
        file: z.string().trim().min(1).optional(),
        definitions: siteDefinitionsSchema.optional(),
        who: z.string().trim().min(1).optional(),
      })
      .strict()
      .refine((i) => (i.file === undefined) !== (i.definitions === undefined), { message: 'give either a file or definitions' }),
    run: (input) => {
      const defs = input.file
        ? readSiteDefinitionsFile(input.file)
        : {
            units: input.definitions?.units ?? [],
            levels: (input.definitions?.levels ?? []).map((l) => ({ ...l, unit: l.unit ?? null })),
            layerBoundaries: input.definitions?.layerBoundaries ?? [],
          };
      return withCatalogue(input.catalogue, (cat) => new SiteDefinitionRepository(cat.db, cat.history, cat.who).store(defs), {
        who: input.who,
      });
    },
  }),
};
