import { z } from 'zod';
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
};

function stripUndefined<T extends object>(o: T): Partial<T> {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as Partial<T>;
}
