import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { browse, tempDir, type Browsing } from './harness';
import { newCatalogue, openFromFirstRun } from './fixtures';

// Importing the lab's specimen list from the menu: all or nothing, every bad row reported
// by line and column (the catalogue's import rules); then the catalogue exported as CSV.
let b: Browsing;
let catalogue: Awaited<ReturnType<typeof newCatalogue>>;

const header = 'catalogue_no,unit,level,layer,x,y,z,taxon,element,side,portion,fusion,size_class,break_age,modifications,weight_g,notes';

beforeAll(async () => {
  catalogue = await newCatalogue([{ catalogueNo: 'KB-0001', unit: 'A1' }]);
  b = await browse({ catalogue: catalogue.path, demoCatalogue: null, recent: [], canPickFiles: false });
  await openFromFirstRun(b.page);
});
afterAll(async () => {
  await b?.close();
});

async function importText(name: string, text: string): Promise<void> {
  await b.page.locator('input[type="file"]').setInputFiles({ name, mimeType: 'text/csv', buffer: Buffer.from(text) });
}

describe('CSV in and out', () => {
  it('refuses a file with bad rows, lists each by line and column, and imports nothing', async () => {
    await importText(
      'bad.csv',
      [header, 'KB-0100,B1,1,I,1.0,2.0,3.0,Cervus elaphus,femur,left,,,,,,,', 'KB-0101,B1,1,I,abc,2.0,3.0,Cervus elaphus,femur,sideways,,,,,,,'].join('\n'),
    );
    const box = b.page.locator('.import-problems');
    await box.waitFor();
    const text = await box.innerText();
    expect(text).toContain('line 3');
    expect(text).toMatch(/abc/);
    expect(text).toMatch(/sideways/);
    await b.shot('import-refused');
    expect(((await catalogue.call('specimens.list', { catalogue: catalogue.path })) as unknown[]).length).toBe(1);
    await b.page.getByRole('button', { name: 'Dismiss' }).click();
  });

  it('imports a good file and shows its rows', async () => {
    await importText(
      'good.csv',
      [
        header,
        'KB-0100,B1,1,I,1.0,2.0,3.0,Cervus elaphus,femur,L,proximal-end;proximal-shaft,,,fresh,,12.5,',
        'KB-0101,B1,2,I,1.5,2.5,2.9,Mammalia,long bone,,midshaft,,3,fresh,cut,4.1,',
        'KB-0102,B2,1,II,3.0,1.0,2.8,Bos taurus,tibia,R,distal-end,,,dry,,30,',
      ].join('\n'),
    );
    await b.page.getByText('4 of 4 specimens').waitFor();
    expect(await b.page.locator('.status').innerText()).toContain('Imported 3 specimens from good.csv');
  });

  it('exports the catalogue to a folder', async () => {
    const out = join(tempDir('export'), 'out');
    await b.page.getByRole('button', { name: 'Export...' }).click();
    await b.page.fill('#export-folder', out);
    await b.page.getByRole('button', { name: 'Export', exact: true }).click();
    await expect.poll(() => b.page.locator('.status').innerText()).toContain('Exported');
    const csv = readFileSync(join(out, 'specimens.csv'), 'utf8');
    expect(csv).toContain('KB-0102');
    expect(existsSync(join(out, 'history.csv'))).toBe(true);
    expect(b.pageErrors).toEqual([]);
  });
});
