import { describe, expect, it } from 'vitest';
import { naturalKey, nextCatalogueNo, queryRows, EMPTY_QUERY, type SpecimenRecord } from '../../../renderer/src/screens/catalogue/specimen-view';

// The specimen table's ordering and finding rules. Natural ordering of catalogue numbers
// ("B-2" before "B-10") is common practice in catalogues; the checks compare against
// JavaScript's own Intl.Collator with numeric collation (ECMA-402), a reference library.
const rec = (catalogueNo: string, extra: Partial<SpecimenRecord> = {}): SpecimenRecord => ({
  id: Number(catalogueNo.replace(/\D/g, '')) || 1, catalogueNo, unit: null, level: null, layer: null, x: null, y: null, z: null,
  taxon: null, element: null, side: null, portion: [], fusion: null, sizeClass: null, breakAge: null, modifications: [], weightG: null, notes: null,
  ...extra,
});

describe('catalogue table rules', () => {
  it('orders catalogue numbers as Intl.Collator with numeric collation does', () => {
    const nos = ['B-10', 'B-2', 'A-100', 'a-20', 'B-1', 'C-03', 'C-3a'];
    const ours = [...nos].sort((a, b) => (naturalKey(a) < naturalKey(b) ? -1 : naturalKey(a) > naturalKey(b) ? 1 : 0));
    const reference = [...nos].sort(new Intl.Collator('en', { numeric: true, sensitivity: 'base' }).compare);
    expect(ours).toEqual(reference);
  });

  it('finds rows where every word appears in some field, within a unit', () => {
    const rows = [
      rec('K-1', { unit: 'A1', taxon: 'Cervus elaphus', element: 'femur' }),
      rec('K-2', { unit: 'A1', taxon: 'Bos taurus', element: 'femur' }),
      rec('K-3', { unit: 'B2', taxon: 'Cervus elaphus', element: 'femur' }),
    ];
    expect(queryRows(rows, { ...EMPTY_QUERY, text: 'femur cervus' }).map((r) => r.catalogueNo)).toEqual(['K-1', 'K-3']);
    expect(queryRows(rows, { ...EMPTY_QUERY, text: 'femur', unit: 'A1' }).map((r) => r.catalogueNo)).toEqual(['K-1', 'K-2']);
  });

  it('sorts numbers numerically with blanks last, either way', () => {
    const rows = [rec('K-1', { z: 99.5 }), rec('K-2'), rec('K-3', { z: 100.25 }), rec('K-4', { z: 98 })];
    const up = queryRows(rows, { ...EMPTY_QUERY, sort: { field: 'z', descending: false } }).map((r) => r.catalogueNo);
    const down = queryRows(rows, { ...EMPTY_QUERY, sort: { field: 'z', descending: true } }).map((r) => r.catalogueNo);
    expect(up).toEqual(['K-4', 'K-1', 'K-3', 'K-2']);
    expect(down).toEqual(['K-3', 'K-1', 'K-4', 'K-2']);
  });

  it('steps the catalogue number on, keeping its width', () => {
    expect(nextCatalogueNo('KB-0009')).toBe('KB-0010');
    expect(nextCatalogueNo('QS-10797')).toBe('QS-10798');
    expect(nextCatalogueNo('12a')).toBe('13a');
    expect(nextCatalogueNo('none')).toBe('none');
  });
});
