import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { browse, type Browsing } from './harness';
import { newCatalogue, openFromFirstRun } from './fixtures';

// Site map: the refit figures and distances of issue 8 on a screen. The join is the
// hand-worked case of that issue: from (0, 0, 1.20) to (3, 4, 1.05) is 5.00 m horizontal
// and 0.15 m vertical (Pythagoras).
let b: Browsing;

beforeAll(async () => {
  const made = await newCatalogue([
    { catalogueNo: 'KB-0101', unit: 'A1', level: '1', layer: 'I', taxon: 'Cervus elaphus', element: 'tibia', side: 'left', portion: ['distal-end'], x: 0, y: 0, z: 1.2 },
    { catalogueNo: 'KB-0102', unit: 'D5', level: '3', layer: 'II', taxon: 'Mammalia', element: 'long bone', sizeClass: 3, portion: ['midshaft'], x: 3, y: 4, z: 1.05 },
  ]);
  await made.call('joins.link', { catalogue: made.path, a: 'KB-0101', b: 'KB-0102', type: 'conjoin-dry' });
  b = await browse({ catalogue: made.path, demoCatalogue: null, recent: [], canPickFiles: false });
  await openFromFirstRun(b.page);
  await b.page.keyboard.press('Alt+6');
  await b.page.getByRole('heading', { name: 'Site map' }).waitFor();
});
afterAll(async () => {
  await b?.close();
});

describe('site map', () => {
  it('shows the distances of the accepted join and draws it on the plan', async () => {
    const { page } = b;
    const cards = page.locator('.site-map-screen .summary-cards');
    await expect.poll(() => cards.innerText()).toContain('5.00 m');
    expect(await cards.innerText()).toContain('0.15 m');
    expect(await page.locator('[data-testid="spatial-count"] strong').innerText()).toBe('1');
    const figure = page.locator('[data-testid="site-figure"] svg');
    await figure.waitFor();
    // one refit line per join on the plan (the figure's own convention, tested in tests/unit/spatial)
    expect(await figure.locator('line').count()).toBe(1);
    expect(await figure.getAttribute('role')).toBe('img');
    await b.shot('site-map-plan');
  });

  it('switches to the rose of directions and the section', async () => {
    const { page } = b;
    await page.getByRole('radio', { name: 'Directions' }).check();
    await expect.poll(() => page.locator('[data-testid="site-figure"] svg').getAttribute('aria-label')).toContain('Directions');
    await page.getByRole('radio', { name: 'Section' }).check();
    await expect.poll(() => page.locator('[data-testid="site-figure"] svg').getAttribute('aria-label')).toContain('Section');
    await b.shot('site-map-section');
  });
});
