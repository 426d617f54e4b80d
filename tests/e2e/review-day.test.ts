import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { browse, tempDir, type Browsing } from './harness';
import { bunnyPly, linkScan, newCatalogue, openFromFirstRun, proposeJoin } from './fixtures';

// The heart of the analyst's day: review proposed joins, accept a conjoin and watch the
// shaft fragment's derived identification and the MNE change, undo it, reject another,
// and export the counts. The MNE case is issue 3's worked rule (Dobney & Rielly 1988
// zone overlap): a left femur with proximal zones (KB-0001) and one with midshaft and
// distal shaft (KB-0003) make MNE 1; a shaft fragment covering the midshaft (KB-0002),
// raised to "Cervus elaphus, femur, left" by a conjoin with KB-0001, overlaps KB-0003 at
// the midshaft, so MNE of the left femur becomes 2.
let b: Browsing;
let path: string;
const shaft = 'KB-0002';

beforeAll(async () => {
  const made = await newCatalogue([
    { catalogueNo: 'KB-0001', unit: 'A1', level: '1', layer: 'I', taxon: 'Cervus elaphus', element: 'femur', side: 'left', portion: ['proximal-end', 'proximal-shaft'], x: 1.1, y: 2.2, z: 99.9 },
    { catalogueNo: shaft, unit: 'A1', level: '2', layer: 'I', taxon: 'Mammalia', element: 'long bone', sizeClass: 3, portion: ['midshaft'], x: 1.4, y: 2.0, z: 99.7 },
    { catalogueNo: 'KB-0003', unit: 'A2', level: '1', layer: 'I', taxon: 'Cervus elaphus', element: 'femur', side: 'left', portion: ['midshaft', 'distal-shaft'] },
    { catalogueNo: 'KB-0004', unit: 'B1', level: '1', layer: 'II', taxon: 'Bos taurus', element: 'tibia', side: 'right', portion: ['distal-end'] },
    { catalogueNo: 'KB-0005', unit: 'B1', level: '2', layer: 'II', taxon: 'Mammalia', element: 'long bone', sizeClass: 4, portion: ['midshaft'] },
  ]);
  path = made.path;
  const scans = tempDir('scans');
  for (const no of ['KB-0001', shaft]) await linkScan(path, no, await bunnyPly(scans, `${no}.ply`));
  const shifted = [1, 0, 0, 70, 0, 1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1];
  await proposeJoin(path, 'KB-0001', shaft, shifted, 0.91, { contactFraction: 0.72, gapRmsMm: 0.21, penetrationMm: 0.05, outlineAgreement: 0.88 });
  await proposeJoin(path, 'KB-0004', 'KB-0005', shifted, 0.62, { contactFraction: 0.41, gapRmsMm: 0.6, penetrationMm: 0.2, outlineAgreement: 0.5 });
  b = await browse({ catalogue: path, demoCatalogue: null, recent: [], canPickFiles: false });
  await openFromFirstRun(b.page);
  await b.page.keyboard.press('Alt+3');
  await b.page.getByRole('heading', { name: 'Proposed joins' }).waitFor();
});
afterAll(async () => {
  await b?.close();
});

const femurMne = () => b.page.locator('.counts-panel tr[data-element="Cervus elaphus / femur"] [data-testid="panel-mne"]').innerText();

describe('join review', () => {
  it('queues proposals best first and says what accepting would change', async () => {
    const { page } = b;
    const queue = await page.locator('.queue li').allInnerTexts();
    expect(queue[0]).toContain('KB-0001 · KB-0002');
    expect(queue[0]).toContain('0.91');
    expect(queue[1]).toContain('KB-0004 · KB-0005');
    const change = page.locator('.would-change');
    await expect.poll(() => change.innerText()).toContain('KB-0002 becomes Cervus elaphus, femur, left');
    expect(await change.innerText()).toContain('MNE of Cervus elaphus femur, left: 1 → 2');
    expect(await femurMne()).toBe('1');
    await page.locator('.viewer canvas').waitFor({ timeout: 60_000 });
    await page.waitForTimeout(300);
    await b.shot('review-proposal');
  });

  it('pulls the fragments apart from the keyboard', async () => {
    const { page } = b;
    await page.focus('#pull-apart');
    for (let i = 0; i < 25; i++) await page.keyboard.press('ArrowRight');
    expect(await page.inputValue('#pull-apart')).toBe('25');
    await b.shot('review-pulled-apart');
  });

  it('accepts as a green-break conjoin with keys 1 and A; counts follow at once', async () => {
    const { page } = b;
    await page.locator('body').focus();
    await page.keyboard.press('1');
    await page.keyboard.press('a');
    await expect.poll(femurMne).toBe('2');
    await expect.poll(() => page.locator('.queue li').count()).toBe(1);
    await b.shot('review-accepted');
  });

  it('shows the shaft fragment derived as a left red-deer femur, marked, with its join', async () => {
    const { page } = b;
    await page.keyboard.press('Alt+1');
    await page.fill('#find-specimens', shaft);
    // The table filters through a deferred value: wait until the shaft fragment leads it.
    await expect.poll(async () => (await page.locator('[role="grid"] [role="row"]').allInnerTexts())[1] ?? '').toContain(shaft);
    await page.locator('[role="grid"]').focus();
    await page.keyboard.press('Home');
    await page.keyboard.press('Enter');
    await page.getByRole('heading', { name: `Specimen ${shaft}` }).waitFor();
    const element = page.locator('.ident-table tr[data-field="element"]');
    await expect.poll(() => element.innerText()).toContain('femur');
    expect(await element.innerText()).toContain('long bone');
    expect(await element.innerText()).toContain('derived');
    expect(await page.locator('.ident-table tr[data-field="taxon"]').innerText()).toMatch(/Cervus elaphus\s*derived\s*from join #1/);
    await b.shot('specimen-derived');
  });

  it('undoes the acceptance: the derived identification and the MNE go back', async () => {
    const { page } = b;
    await page.keyboard.press('Alt+3');
    await page.getByRole('heading', { name: 'Proposed joins' }).waitFor();
    await page.locator('body').focus();
    await page.keyboard.press('u');
    await expect.poll(femurMne).toBe('1');
    await expect.poll(() => page.locator('.queue li').count()).toBe(2);
    await page.keyboard.press('Alt+2');
    await expect.poll(() => page.locator('.ident-table tr[data-field="element"]').innerText()).not.toContain('femur');
  });

  it('skips to the next proposal and rejects it with R', async () => {
    const { page } = b;
    await page.keyboard.press('Alt+3');
    await page.getByRole('heading', { name: 'Proposed joins' }).waitFor();
    await page.locator('body').focus();
    await page.keyboard.press('s');
    await expect.poll(() => page.locator('.queue button[aria-current="true"]').innerText()).toContain('KB-0004');
    await page.keyboard.press('r');
    await expect.poll(() => page.locator('.queue li').count()).toBe(1);
    expect(await page.locator('.status').innerText()).toContain('Rejected join #2');
  });

  it('shows the counts recorded and with refits, and exports them as CSV and the chart as SVG', async () => {
    const { page } = b;
    await page.keyboard.press('a'); // accept the remaining proposal (KB-0001 + KB-0002) again
    await expect.poll(femurMne).toBe('2');
    await page.keyboard.press('Alt+5');
    await page.getByRole('heading', { name: 'Counts' }).waitFor();
    const femurRow = page.locator('tr[data-element="Cervus elaphus / femur"]');
    await expect.poll(() => femurRow.innerText()).toMatch(/Cervus elaphus\s+femur/);
    expect(await page.locator('[data-testid="rate-element"]').innerText()).toContain('60.0% → 80.0%');
    await page.selectOption('#mau-taxon', 'Cervus elaphus');
    await b.shot('counts');
    const [csvDownload] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Export counts (CSV)' }).click()]);
    const csv = readFileSync((await csvDownload.path())!, 'utf8');
    expect(csv).toContain('element,refitted,Cervus elaphus,femur');
    const [svgDownload] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Save SVG' }).click()]);
    const svg = readFileSync((await svgDownload.path())!, 'utf8');
    expect(svg).toContain('<svg');
    expect(svg).toContain('femur');
    expect(b.pageErrors).toEqual([]);
  });

  it('assembles the refit set in 3D with its members and provenience', async () => {
    const { page } = b;
    await page.keyboard.press('Alt+4');
    await page.getByRole('heading', { name: 'Refit sets' }).waitFor();
    await expect.poll(() => page.locator('.refits-screen h2').first().innerText()).toContain('KB-0001, KB-0002');
    const members = await page.locator('.refits-screen table').innerText();
    expect(members).toContain('A1');
    expect(members).toContain('99.700');
    await page.locator('.refits-screen .viewer canvas').waitFor({ timeout: 60_000 });
    await page.waitForTimeout(300);
    await b.shot('refit-set');
    await page.getByRole('button', { name: 'Dark theme' }).click();
    await page.keyboard.press('Alt+3');
    await page.getByRole('heading', { name: 'Proposed joins' }).waitFor();
    await page.waitForTimeout(500);
    await b.shot('review-dark');
  });
});
