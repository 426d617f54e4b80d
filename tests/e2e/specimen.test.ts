import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { browse, tempDir, type Browsing } from './harness';
import { bunnyPly, linkScan, newCatalogue, openFromFirstRun } from './fixtures';

// The specimen screen: the record, observed identification (no derived value yet), and its
// scan drawn by three.js in headless Chromium on software WebGL. The scan is the Stanford
// bunny from the npm package `bunny` (open data), standing in for a bone fragment.
let b: Browsing;

beforeAll(async () => {
  const { path } = await newCatalogue([
    { catalogueNo: 'KB-0001', unit: 'A1', level: '1', layer: 'I', taxon: 'Cervus elaphus', element: 'femur', side: 'left', portion: ['proximal-end'], x: 1.25, y: 2.5, z: 99.8 },
  ]);
  await linkScan(path, 'KB-0001', await bunnyPly(tempDir('scans'), 'KB-0001.ply'));
  b = await browse({ catalogue: path, demoCatalogue: null, recent: [], canPickFiles: false });
  await openFromFirstRun(b.page);
});
afterAll(async () => {
  await b?.close();
});

describe('specimen screen', () => {
  it('opens from the table with Enter and shows the record and the observed identification', async () => {
    const { page } = b;
    await page.locator('[role="grid"]').focus();
    await page.keyboard.press('Home');
    await page.keyboard.press('Enter');
    await page.getByRole('heading', { name: 'Specimen KB-0001' }).waitFor();
    const taxonRow = await page.locator('.ident-table tr[data-field="taxon"]').innerText();
    expect(taxonRow).toContain('Cervus elaphus');
    expect(await page.locator('.record').innerText()).toContain('1.250, 2.500, 99.800');
  });

  it('draws the scan with software WebGL', async () => {
    const { page } = b;
    const canvas = page.locator('.viewer canvas');
    await canvas.waitFor({ timeout: 60_000 });
    await page.waitForTimeout(500);
    const png = await canvas.screenshot();
    // Not a blank canvas: the drawn bone and the background differ in many pixels.
    const { inflateSync } = await import('node:zlib');
    expect(png.length).toBeGreaterThan(5000);
    expect(inflateSync).toBeDefined();
    const distinct = await page.evaluate(() => {
      const c = document.querySelector('.viewer canvas') as HTMLCanvasElement;
      const gl = c.getContext('webgl2') as WebGL2RenderingContext;
      const px = new Uint8Array(c.width * c.height * 4);
      gl.readPixels(0, 0, c.width, c.height, gl.RGBA, gl.UNSIGNED_BYTE, px);
      const seen = new Set<number>();
      for (let i = 0; i < px.length; i += 4 * 7) seen.add((px[i] << 16) | (px[i + 1] << 8) | px[i + 2]);
      return seen.size;
    });
    expect(distinct).toBeGreaterThan(50);
    await canvas.focus();
    await page.keyboard.press('ArrowLeft');
    await page.keyboard.press('ArrowLeft');
    await b.shot('specimen-scan');
    expect(b.pageErrors).toEqual([]);
  });
});
