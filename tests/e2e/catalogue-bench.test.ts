import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { browse, type Browsing } from './harness';
import { newCatalogue, openFromFirstRun } from './fixtures';

// The analyst's first task of the day: log specimens at the bench by keyboard, with the
// provenience carried over, inline problems for what the catalogue would refuse (the same
// rules as import), then find, sort, edit and undo.
let b: Browsing;
let catalogue: Awaited<ReturnType<typeof newCatalogue>>;

const rowsText = () => b.page.locator('[role="grid"] [role="row"]').allInnerTexts();

beforeAll(async () => {
  catalogue = await newCatalogue([
    { catalogueNo: 'KB-0001', unit: 'A1', level: '1', layer: 'I', taxon: 'Cervus elaphus', element: 'femur', side: 'left', portion: ['proximal-end'] },
    { catalogueNo: 'KB-0002', unit: 'A1', level: '2', layer: 'I', taxon: 'Mammalia', element: 'long bone', sizeClass: 3 },
    { catalogueNo: 'KB-0003', unit: 'A2', level: '1', layer: 'II', taxon: 'Bos taurus', element: 'tibia', side: 'right' },
  ]);
  b = await browse({ catalogue: catalogue.path, demoCatalogue: null, recent: [], canPickFiles: false });
  await openFromFirstRun(b.page);
});
afterAll(async () => {
  await b?.close();
});

describe('catalogue at the bench', () => {
  it('lists the catalogue', async () => {
    await b.page.getByText('3 of 3 specimens').waitFor();
    const rows = await rowsText();
    expect(rows.some((r) => r.includes('KB-0002') && r.includes('long bone'))).toBe(true);
    await b.shot('catalogue-open');
  });

  it('logs a specimen by keyboard alone, carrying provenience to the next', async () => {
    const { page } = b;
    await page.locator('body').click({ position: { x: 5, y: 5 } });
    await page.keyboard.press('n');
    expect(await page.evaluate(() => document.activeElement?.id)).toBe('bench-catalogueNo');
    expect(await page.inputValue('#bench-catalogueNo')).toBe('KB-0004');
    // Cat. no. is proposed; Tab through the fields as at the bench.
    await page.keyboard.press('Tab');
    await page.keyboard.type('B4');
    await page.keyboard.press('Tab');
    await page.keyboard.type('3');
    await page.keyboard.press('Tab');
    await page.keyboard.type('III');
    await page.keyboard.press('Tab');
    await page.keyboard.type('12.405');
    await page.keyboard.press('Tab');
    await page.keyboard.type('8.110');
    await page.keyboard.press('Tab');
    await page.keyboard.type('101.32');
    await page.keyboard.press('Tab');
    await page.keyboard.type('red deer');
    await page.keyboard.press('Tab');
    await page.keyboard.type('Femur');
    await page.keyboard.press('Tab');
    await page.keyboard.type('L');
    await page.keyboard.press('Tab');
    await page.keyboard.type('midshaft; distal-shaft');
    await page.keyboard.press('Enter');
    await page.getByText('4 of 4 specimens').waitFor();
    const row = (await rowsText()).find((r) => r.includes('KB-0004'))!;
    // Stored in canonical form: the synonym and abbreviations resolved by the catalogue.
    expect(row).toContain('Cervus elaphus');
    expect(row).toContain('femur');
    expect(row).toContain('left');
    expect(row).toContain('12.405');
    // The strip is ready for the next bag: number stepped on, provenience carried over.
    expect(await page.inputValue('#bench-catalogueNo')).toBe('KB-0005');
    expect(await page.inputValue('#bench-unit')).toBe('B4');
    expect(await page.inputValue('#bench-level')).toBe('3');
    expect(await page.inputValue('#bench-layer')).toBe('III');
    expect(await page.inputValue('#bench-x')).toBe('');
    expect(await page.evaluate(() => document.activeElement?.id)).toBe('bench-catalogueNo');
    await b.shot('catalogue-logged');
  });

  it('shows problems in place before and after saving, and saves nothing bad', async () => {
    const { page } = b;
    await page.fill('#bench-x', '12,4a');
    await expect.poll(() => page.locator('#bench-x-problem').innerText()).toContain('not a number');
    expect(await page.getByRole('button', { name: 'Log specimen' }).isDisabled()).toBe(true);
    await page.fill('#bench-x', '');
    await page.fill('#bench-taxon', 'Cervus elephas');
    await page.focus('#bench-taxon');
    await page.keyboard.press('Enter');
    await expect.poll(() => page.locator('#bench-taxon-problem').innerText()).toContain('closest known: "Cervus elaphus"');
    expect(await page.getAttribute('#bench-taxon', 'aria-invalid')).toBe('true');
    await b.shot('catalogue-inline-problem');
    const list = (await catalogue.call('specimens.list', { catalogue: catalogue.path })) as unknown[];
    expect(list).toHaveLength(4);
  });

  it('finds by any field and by provenience, and sorts by a column', async () => {
    const { page } = b;
    await page.fill('#find-specimens', 'femur');
    await page.getByText('2 of 4 specimens').waitFor();
    await page.fill('#find-specimens', '');
    await page.selectOption('#filter-unit', 'A1');
    await page.getByText('2 of 4 specimens').waitFor();
    await page.selectOption('#filter-unit', '');
    await page.getByRole('columnheader', { name: /Cat\. no\./ }).getByRole('button').click();
    // The table redraws from a deferred value: wait for the sorted rows rather than read at once.
    await expect.poll(async () => (await rowsText())[1] ?? '').toContain('KB-0004');
    expect(await page.getAttribute('[role="columnheader"][aria-sort="descending"]', 'aria-sort')).toBe('descending');
  });

  it('edits a record from the table and undoes the edit', async () => {
    const { page } = b;
    await page.locator('[role="grid"]').focus();
    await page.keyboard.press('Home');
    await page.keyboard.press('e');
    expect(await page.inputValue('#bench-catalogueNo')).toBe('KB-0004');
    await page.fill('#bench-notes', 'spiral fracture, green');
    await page.focus('#bench-notes');
    await page.keyboard.press('Enter');
    await expect.poll(async () => (await rowsText()).find((r) => r.includes('KB-0004')) ?? '').toContain('spiral fracture');
    await page.locator('[role="grid"]').focus();
    await page.keyboard.press('Control+z');
    await expect.poll(async () => (await rowsText()).find((r) => r.includes('KB-0004')) ?? '').not.toContain('spiral fracture');
    expect(b.pageErrors).toEqual([]);
  });
});
