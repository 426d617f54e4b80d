import { join } from 'node:path';
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { openCatalogue } from '../../../core/catalogue/catalogue';
import { importSpecimens } from '../../../core/catalogue/import-specimens';
import { KnitboneError } from '../../../core/host/errors';
import { tempDir } from './helpers';

// Property: an import either succeeds completely or leaves the catalogue exactly as it was
// (same specimens, same history), and every failure is a reported bad-input problem, never
// a crash. Checked over random well-formed, slightly broken and thoroughly broken CSVs.

const columns = ['catalogue_no', 'unit', 'x', 'z', 'taxon', 'element', 'side', 'portion', 'size_class', 'modifications', 'notes', 'taxn'];
const cellValue = fc.oneof(
  fc.constantFrom('', 'N1E1', '12.5', '-0.75', 'abc', 'Cervus elaphus', 'red deer', 'Bos taurus', 'Cervus elaphis', 'femur', 'Fem', 'cranium',
    'long bone', 'L', 'R', 'west', 'midshaft', 'PS;MS', 'elbow', '3', '9', 'cut;W2', 'gnawed', 'a "quoted" note', 'line\nbreak', 'semi;colon', 'comma, inside'),
  fc.string({ maxLength: 6 }),
);
const catalogueNo = fc.oneof(fc.constantFrom('P-1', 'P-2', 'P-3', 'OLD-1', ''), fc.stringMatching(/^[A-Z]{1,2}-[0-9]{1,4}$/));

function quote(cell: string, delimiter: string): string {
  return /["\n\r]/.test(cell) || cell.includes(delimiter) ? `"${cell.replace(/"/g, '""')}"` : cell;
}

const wellFormed = fc
  .record({
    delimiter: fc.constantFrom(',', ';'),
    bom: fc.boolean(),
    header: fc.shuffledSubarray(columns.slice(1), { minLength: 0, maxLength: 6 }),
    rows: fc.array(fc.tuple(catalogueNo, fc.array(cellValue, { minLength: 6, maxLength: 6 })), { maxLength: 8 }),
  })
  .map(({ delimiter, bom, header, rows }) => {
    const cols = ['catalogue_no', ...header];
    const lines = [cols.join(delimiter), ...rows.map(([no, cells]) => [no, ...cells.slice(0, header.length)].map((c) => quote(c, delimiter)).join(delimiter))];
    return (bom ? '\uFEFF' : '') + lines.join('\n') + '\n';
  });

const broken = fc.oneof(
  fc.string({ maxLength: 200 }),
  fc.string({ unit: 'binary', maxLength: 120 }),
  wellFormed.chain((text) =>
    fc.tuple(fc.nat({ max: Math.max(0, text.length - 1) }), fc.constantFrom('"', ',', ';', '\n', '\uFFFD', '')).map(([i, ch]) => text.slice(0, i) + ch + text.slice(i + 1)),
  ),
);

describe('import is all or nothing (property)', () => {
  const cat = openCatalogue(join(tempDir(), 'site.sqlite'), { create: true, who: 'tester' });
  cat.specimens.insert({ catalogueNo: 'OLD-1', unit: null, level: null, layer: null, x: null, y: null, z: null, taxon: null, element: null, side: null, portion: [], fusion: null, sizeClass: null, breakAge: null, modifications: [], weightG: null, notes: null });
  afterAll(() => cat.close());

  const snapshot = () => JSON.stringify({ specimens: cat.specimens.list(), history: cat.history.list() });

  it('leaves the catalogue unchanged after every failed import', () => {
    let failed = 0;
    let succeeded = 0;
    fc.assert(
      fc.property(fc.oneof(wellFormed, broken), fc.boolean(), (text, update) => {
        const before = snapshot();
        const count = cat.specimens.count();
        try {
          const r = importSpecimens(cat, text, { update });
          succeeded++;
          expect(cat.specimens.count()).toBe(count + r.inserted);
        } catch (err) {
          failed++;
          expect(err).toBeInstanceOf(KnitboneError);
          expect((err as KnitboneError).kind).toBe('bad-input');
          expect(snapshot()).toBe(before);
        }
      }),
      { numRuns: 300 },
    );
    // Both outcomes must actually have been exercised.
    expect(failed).toBeGreaterThan(20);
    expect(succeeded).toBeGreaterThan(5);
  });
});
