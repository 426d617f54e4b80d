/**
 * The compact specimen rows the catalogue screen reads (`specimens.table`) carry the same
 * records as `specimens.list`, field for field (timestamps aside).
 */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { Host } from '../../../core/host/host';
import { recordsFromTable } from '../../../renderer/src/app/specimen-list';

describe('specimens.table', () => {
  it('decodes to the records of specimens.list', async () => {
    const catalogue = join(mkdtempSync(join(tmpdir(), 'knitbone-table-')), 'site.sqlite');
    const host = new Host();
    const call = host.callUnchecked.bind(host) as (n: string, i: unknown) => Promise<any>;
    await call('catalogue.init', { catalogue });
    await call('specimens.create', { catalogue, specimen: { catalogueNo: 'KB-2', unit: 'A1', level: '3', x: 1.25, taxon: 'Cervus elaphus', element: 'femur', side: 'left', portion: ['midshaft', 'distal-shaft'], modifications: ['cut'] } });
    await call('specimens.create', { catalogue, specimen: { catalogueNo: 'KB-10', taxon: 'Mammalia', element: 'long bone', sizeClass: 3, notes: 'spiral, "green"' } });
    const list = (await call('specimens.list', { catalogue })) as Array<Record<string, unknown>>;
    const table = await call('specimens.table', { catalogue });
    const strip = ({ createdAt: _c, updatedAt: _u, ...rest }: Record<string, unknown>) => rest;
    expect(recordsFromTable(table)).toEqual(list.map(strip));
    expect(JSON.stringify(table).length).toBeLessThan(JSON.stringify(list).length);
  });
});
