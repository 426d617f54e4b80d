import { readFileSync } from 'node:fs';
import { basename } from 'node:path';
import { z } from 'zod';
import { exportCatalogue } from '../../catalogue/export';
import { tallyExport } from '../counting/tally-export';
import { importSpecimens } from '../../catalogue/import-specimens';
import { openCatalogue, withCatalogue } from '../../catalogue/catalogue';
import { checkSpecimenFields, checkSpecimenPatch } from '../../catalogue/specimen-input';
import { emptySpecimenFields } from '../../catalogue/records';
import { KnitboneError } from '../errors';
import { defineRequest } from '../request';

const cataloguePath = z.string().trim().min(1, 'give the path of a catalogue file');
const who = z.string().trim().min(1).optional();

/**
 * Specimen values as they arrive from a form or a caller: strings for terms (normalised to
 * the vocabulary's canonical terms by checkSpecimen*), numbers for coordinates, lists for
 * portion and modifications. null clears a field.
 */
const optText = z.string().nullable().optional();
const optNumber = z.number().finite().nullable().optional();
export const specimenValuesSchema = z
  .object({
    catalogueNo: z.string().optional(),
    unit: optText,
    level: optText,
    layer: optText,
    x: optNumber,
    y: optNumber,
    z: optNumber,
    taxon: optText,
    element: optText,
    side: optText,
    portion: z.array(z.string()).nullable().optional(),
    fusion: optText,
    sizeClass: z.number().int().nullable().optional(),
    breakAge: optText,
    modifications: z.array(z.string()).nullable().optional(),
    weightG: optNumber,
    notes: optText,
  })
  .strict();

const specimenRef = z
  .object({ id: z.number().int().positive().optional(), catalogueNo: z.string().trim().min(1).optional() })
  .refine((r) => r.id !== undefined || r.catalogueNo !== undefined, { message: 'give the specimen id or its catalogue number' });

/** Requests that create and read catalogues and their specimens. */
export const catalogueRequests = {
  'catalogue.init': defineRequest({
    summary: 'Create a catalogue file (or bring an existing one up to the newest schema)',
    input: z.object({ catalogue: cataloguePath, who }).strict(),
    run: (input) => {
      const cat = openCatalogue(input.catalogue, { create: true, who: input.who });
      try {
        return {
          path: cat.path,
          created: cat.created,
          schemaVersion: cat.schemaVersion(),
          appliedMigrations: cat.migration.applied,
          backupPath: cat.migration.backupPath ?? null,
          specimens: cat.specimens.count(),
        };
      } finally {
        cat.close();
      }
    },
  }),

  'specimens.list': defineRequest({
    summary: 'Every specimen of a catalogue (optionally of one unit, taxon or element), in catalogue order',
    input: z
      .object({ catalogue: cataloguePath, unit: z.string().optional(), taxon: z.string().optional(), element: z.string().optional() })
      .strict(),
    run: (input) =>
      withCatalogue(input.catalogue, (cat) => cat.specimens.list({ unit: input.unit, taxon: input.taxon, element: input.element })),
  }),

  'specimens.get': defineRequest({
    summary: 'One specimen by id or catalogue number, with its derived identifications, scans and joins',
    input: z.object({ catalogue: cataloguePath }).and(specimenRef),
    run: (input) =>
      withCatalogue(input.catalogue, (cat) => {
        const specimen = cat.specimens.require(input.id ?? input.catalogueNo!);
        return {
          specimen,
          derived: cat.derived.list({ specimenId: specimen.id }),
          scans: cat.scans.list({ specimenId: specimen.id }),
          joins: cat.joins.list({ specimenId: specimen.id }),
        };
      }),
  }),

  'specimens.create': defineRequest({
    summary: 'Add one specimen; terms are checked against the vocabulary and stored in canonical form',
    input: z.object({ catalogue: cataloguePath, specimen: specimenValuesSchema, who }).strict(),
    run: (input) =>
      withCatalogue(
        input.catalogue,
        (cat) => {
          const fields = checkSpecimenFields(
            { ...emptySpecimenFields(input.specimen.catalogueNo ?? ''), ...stripUndefined(input.specimen) },
            cat,
          );
          return cat.specimens.insert(fields);
        },
        { who: input.who },
      ),
  }),

  'specimens.update': defineRequest({
    summary: 'Change fields of one specimen; every change is recorded in history',
    input: z.object({ catalogue: cataloguePath, changes: specimenValuesSchema, who }).strict().and(specimenRef),
    run: (input) =>
      withCatalogue(
        input.catalogue,
        (cat) => {
          const current = cat.specimens.require(input.id ?? input.catalogueNo!);
          const patch = checkSpecimenPatch(stripUndefined(input.changes), current, cat);
          if (Object.keys(patch).length === 0 && Object.keys(stripUndefined(input.changes)).length === 0) {
            throw new KnitboneError('bad-input', 'no changes given');
          }
          return cat.specimens.update(current.id, patch);
        },
        { who: input.who },
      ),
  }),

  'specimens.delete': defineRequest({
    summary: 'Remove a specimen entered by mistake (refused while scans or joins refer to it); history keeps the record',
    input: z.object({ catalogue: cataloguePath, who }).strict().and(specimenRef),
    run: (input) =>
      withCatalogue(
        input.catalogue,
        (cat) => cat.specimens.remove(cat.specimens.require(input.id ?? input.catalogueNo!).id),
        { who: input.who },
      ),
  }),

  'specimens.import': defineRequest({
    summary: 'Import specimens from a CSV file, all or nothing; with update, change existing ones (recorded in history)',
    input: z
      .object({
        catalogue: cataloguePath,
        /** Path of the CSV file (CLI), or its text in `csv` (Electron, HTTP). */
        file: z.string().trim().min(1).optional(),
        csv: z.string().optional(),
        fileName: z.string().optional(),
        update: z.boolean().default(false),
        who,
      })
      .strict()
      .refine((r) => (r.file === undefined) !== (r.csv === undefined), { message: 'give either file (a path) or csv (the text)' }),
    run: (input, ctx) =>
      withCatalogue(
        input.catalogue,
        (cat) => {
          let bytes: Uint8Array | string;
          if (input.file !== undefined) {
            try {
              bytes = readFileSync(input.file);
            } catch (err) {
              throw new KnitboneError('not-found', [{ file: input.file, message: `cannot read the file (${(err as NodeJS.ErrnoException).code ?? (err as Error).message})` }]);
            }
          } else bytes = input.csv!;
          const fileName = input.fileName ?? (input.file !== undefined ? basename(input.file) : 'specimens.csv');
          return importSpecimens(cat, bytes, { update: input.update, fileName, onProgress: ctx.onProgress });
        },
        { who: input.who },
      ),
  }),

  'catalogue.export': defineRequest({
    summary: 'Write specimens.csv, joins.csv, history.csv and tally.csv of a catalogue into a folder',
    input: z.object({ catalogue: cataloguePath, out: z.string().trim().min(1, 'give the folder to write to') }).strict(),
    run: (input) => withCatalogue(input.catalogue, (cat) => ({ files: exportCatalogue(cat, input.out, [tallyExport]) })),
  }),

  'history.list': defineRequest({
    summary: "A catalogue's history of edits and decisions, oldest first (optionally of one entity)",
    input: z
      .object({
        catalogue: cataloguePath,
        entity: z.string().optional(),
        entityId: z.union([z.string(), z.number()]).optional(),
        afterId: z.number().int().optional(),
        limit: z.number().int().positive().optional(),
      })
      .strict(),
    run: (input) =>
      withCatalogue(input.catalogue, (cat) =>
        cat.history.list({ entity: input.entity, entityId: input.entityId, afterId: input.afterId, limit: input.limit }),
      ),
  }),
};

function stripUndefined<T extends object>(o: T): Partial<T> {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as Partial<T>;
}
