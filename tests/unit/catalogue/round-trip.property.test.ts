import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { openCatalogue, type Catalogue } from '../../../core/catalogue/catalogue';
import { specimensCsv } from '../../../core/catalogue/export';
import { importSpecimens } from '../../../core/catalogue/import-specimens';
import type { SpecimenFields } from '../../../core/catalogue/records';
import { builtInVocabulary, PORTION_ZONES } from '../../../core/vocab';
import { tempDir } from './helpers';

// Property: any catalogue content in canonical form survives export -> import unchanged, and
// a second export is byte-for-byte the first. Text is generated as the import itself leaves it
// (trimmed, \n line endings), numbers over the whole range of finite doubles.

const text = fc
  .string({ unit: 'grapheme', maxLength: 12 })
  .map((s) => s.replace(/\r\n?/g, '\n').trim())
  .map((s) => (s === '' ? null : s));
const coordinate = fc.option(fc.double({ noNaN: true, noDefaultInfinity: true }).map((x) => (Object.is(x, -0) ? 0 : x)));
const long = builtInVocabulary.elements.all().filter((e) => builtInVocabulary.elements.isAncestorOrSelf('long bone', e.name)).map((e) => e.name);
const others = builtInVocabulary.elements.all().map((e) => e.name).filter((e) => !long.includes(e));

const specimen = (catalogueNo: string): fc.Arbitrary<SpecimenFields> =>
  fc
    .record({
      unit: text, level: text, layer: text, x: coordinate, y: coordinate, z: coordinate,
      taxon: fc.option(fc.constantFrom(...builtInVocabulary.taxa.all().map((t) => t.name))),
      longBone: fc.boolean(),
      longElement: fc.constantFrom(...long),
      otherElement: fc.option(fc.constantFrom(...others)),
      zones: fc.subarray([...PORTION_ZONES]),
      side: fc.option(fc.constantFrom('left', 'right', 'axial', 'indeterminate' as const)),
      fusion: fc.option(fc.constantFrom(...builtInVocabulary.fusion.terms)),
      sizeClass: fc.option(fc.integer({ min: 1, max: 6 })),
      breakAge: fc.option(fc.constantFrom('fresh', 'dry', 'modern', 'indeterminate' as const)),
      modifications: fc.uniqueArray(fc.constantFrom(...builtInVocabulary.modifications.terms), { maxLength: 3 }),
      weightG: fc.option(fc.double({ min: 0, max: 1e6, noNaN: true }).map((x) => (Object.is(x, -0) ? 0 : x))),
      notes: text,
    })
    .map((r) => ({
      catalogueNo, unit: r.unit, level: r.level, layer: r.layer, x: r.x, y: r.y, z: r.z, taxon: r.taxon,
      element: r.longBone ? r.longElement : r.otherElement, side: r.side,
      portion: r.longBone ? r.zones : [], fusion: r.fusion, sizeClass: r.sizeClass, breakAge: r.breakAge,
      modifications: r.modifications, weightG: r.weightG, notes: r.notes,
    }));

const catalogueNos = fc.uniqueArray(
  fc.string({ minLength: 1, maxLength: 8 }).map((s) => s.replace(/\s+/g, ' ').trim()).filter((s) => s.length > 0),
  { minLength: 1, maxLength: 6 },
);

describe('export -> import round trip (property)', () => {
  it('gives back every specimen exactly, and the same specimens.csv', () => {
    const dir = tempDir();
    const a = openCatalogue(join(dir, 'a.sqlite'), { create: true });
    const b = openCatalogue(join(dir, 'b.sqlite'), { create: true });
    // Each run uses its own catalogue numbers (prefixed with the run) in the same two catalogues.
    const ofRun = (cat: Catalogue, prefix: string) => cat.specimens.list().filter((s) => s.catalogueNo.startsWith(prefix));
    const content = (cat: Catalogue, prefix: string) => ofRun(cat, prefix).map(({ id: _i, createdAt: _c, updatedAt: _u, ...rest }) => rest);
    let n = 0;
    try {
      fc.assert(
        fc.property(catalogueNos.chain((nos) => fc.tuple(...nos.map(specimen))), (list) => {
          const prefix = `run${++n}/`;
          a.specimens.insertMany(list.map((s) => ({ ...s, catalogueNo: prefix + s.catalogueNo })));
          const csv = specimensCsv(a, ofRun(a, prefix));
          importSpecimens(b, csv);
          expect(content(b, prefix)).toEqual(content(a, prefix));
          expect(specimensCsv(b, ofRun(b, prefix))).toBe(csv);
        }),
        { numRuns: 80 },
      );
    } finally {
      a.close();
      b.close();
    }
  });
});
