import { copyFileSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openCatalogue } from '../../core/catalogue/catalogue';
import { browse, tempDir, type Browsing } from './harness';
import { newCatalogue, openFromFirstRun } from './fixtures';

// The analyst's day on real scans: two fragments of the generated sample assemblage
// (demo-data/sample) that truly join (truth.json: the same bone, one break between them) and
// a third from another bone. Find joins from the app and see the true pair first in the review
// queue (how well the matcher poses the pieces is measured by `npm run bench -- proposals`); then
// correct a surface region's class in the specimen's 3D view, reload, and find it kept, with
// the correction in the history. Small fragments keep the run short.
const sample = join(import.meta.dirname, '../../demo-data/sample');
const truth = JSON.parse(readFileSync(join(sample, 'truth.json'), 'utf8')) as {
  fragments: Array<{ catalogueNo: string; boneId: string }>;
  joins: Array<{ a: string; b: string; transformBToA: number[] }>;
};
const pair = ['QS-10512', 'QS-10837'];
/** A third small fragment, of another bone: it joins neither. */
const stranger = 'QS-10130';
let b: Browsing;
let catalogue: Awaited<ReturnType<typeof newCatalogue>>;
let scanFolder: string;

beforeAll(async () => {
  catalogue = await newCatalogue();
  const dir = tempDir('sample-scans');
  mkdirSync(join(dir, 'scans'));
  const csv = readFileSync(join(sample, 'specimens.csv'), 'utf8').split('\n');
  writeFileSync(join(dir, 'specimens.csv'), [csv[0], ...csv.filter((l) => [...pair, stranger].some((no) => l.startsWith(`${no},`)))].join('\n') + '\n');
  for (const no of [...pair, stranger]) copyFileSync(join(sample, 'scans', `${no}.ply`), join(dir, 'scans', `${no}.ply`));
  await catalogue.call('specimens.import', { catalogue: catalogue.path, file: join(dir, 'specimens.csv') });
  scanFolder = join(dir, 'scans');
  b = await browse({ catalogue: catalogue.path, demoCatalogue: null, recent: [], canPickFiles: false });
  await openFromFirstRun(b.page);
});
afterAll(async () => {
  await b?.close();
});

describe('linking a folder of scans from the catalogue screen', () => {
  it('reads the three scans, names each fragment and reports what it linked', async () => {
    const { page } = b;
    await page.keyboard.press('Alt+1');
    await page.getByRole('button', { name: 'Link scans...' }).click();
    await page.fill('#scan-folder', scanFolder);
    await page.getByRole('button', { name: 'Read and link scans' }).click();
    await page.getByText('3 scans linked').waitFor({ timeout: 120_000 });
    await b.shot('scans-linked');
    const stored = openCatalogue(catalogue.path);
    const scans = stored.scans.list();
    stored.close();
    expect(scans.map((s) => s.path.replace(/^.*[\\/]/, '')).sort()).toEqual([...pair, stranger].map((no) => `${no}.ply`).sort());
    // A second run reads nothing again: the files are recognised by their content.
    await page.getByRole('button', { name: 'Read and link scans' }).click();
    await page.getByText('0 scans linked, 3 already in the catalogue').waitFor({ timeout: 60_000 });
    await page.getByRole('button', { name: 'Link scans...' }).click();
  });
});

describe('finding joins from the app', () => {
  it('runs the proposals with progress and queues the true join first', async () => {
    const { page } = b;
    // Both pieces come from one bone in the generator's record.
    const bone = (no: string) => truth.fragments.find((f) => f.catalogueNo === no)!.boneId;
    expect(bone(pair[0])).toBe(bone(pair[1]));
    expect(bone(stranger)).not.toBe(bone(pair[0]));
    expect(truth.joins.some((j) => [j.a, j.b].includes(stranger) && [j.a, j.b].some((x) => pair.includes(x)))).toBe(false);
    await page.keyboard.press('Alt+3');
    await page.getByRole('heading', { name: 'Proposed joins' }).waitFor();
    expect(await page.locator('.review-empty').innerText()).toContain('No proposals wait');
    // Record every progress line the screen shows while the run goes.
    await page.evaluate(() => {
      const w = window as unknown as { progressSeen: string[] };
      w.progressSeen = [];
      new MutationObserver(() => {
        const t = document.querySelector('.review-screen .screen-head [role="status"]')?.textContent;
        if (t && w.progressSeen[w.progressSeen.length - 1] !== t) w.progressSeen.push(t);
      }).observe(document.body, { subtree: true, childList: true, characterData: true });
    });
    await page.getByRole('button', { name: 'Find joins in the scans' }).click();
    await page.locator('.queue li').first().waitFor({ timeout: 150_000 });
    const seen = await page.evaluate(() => (window as unknown as { progressSeen: string[] }).progressSeen);
    expect(seen.some((t) => /\d+ of \d+/.test(t))).toBe(true);
    const queue = await page.locator('.queue li').allInnerTexts();
    // Best score first: the true pair leads the queue.
    expect(queue[0]).toMatch(/QS-10512 · QS-10837|QS-10837 · QS-10512/);
    expect(await page.locator('.status').innerText()).toContain('Proposal run finished');

    await page.locator('.viewer canvas').waitFor({ timeout: 60_000 });
    await page.waitForTimeout(300);
    await b.shot('sample-proposal');
  });
});

describe("correcting a region's class in the 3D view", () => {
  const regionButtons = () => b.page.locator('.regions button');

  async function openSpecimen(no: string): Promise<void> {
    const { page } = b;
    await page.keyboard.press('Alt+1');
    await page.fill('#find-specimens', no);
    await page.getByText(/^1 of 3 specimens/).waitFor();
    await page.locator('[role="grid"]').focus();
    await page.keyboard.press('Home');
    await page.keyboard.press('Enter');
    await page.getByRole('heading', { name: `Specimen ${no}` }).waitFor();
    await regionButtons().first().waitFor({ timeout: 60_000 });
  }

  it('selects a region by clicking the scan', async () => {
    const { page } = b;
    await openSpecimen(pair[1]);
    const canvas = page.locator('.viewer canvas');
    const box = (await canvas.boundingBox())!;
    await canvas.click({ position: { x: box.width / 2, y: box.height / 2 } });
    await expect.poll(() => page.locator('.regions button[aria-pressed="true"]').count()).toBe(1);
    await page.locator('.region-editor').waitFor();
    await b.shot('specimen-region-clicked');
  });

  it('records a new class from the keyboard, shows it at once, and keeps it after a reload', async () => {
    const { page } = b;
    // The largest fracture region becomes medullary surface.
    const fracture = regionButtons().filter({ hasText: 'fracture face' }).first();
    const region = await fracture.getAttribute('data-region');
    const trianglesInFaces = () => page.locator('.regions button[data-class="fracture"]').count();
    const fracturesBefore = await trianglesInFaces();
    await fracture.focus();
    await page.keyboard.press('Enter');
    await page.getByRole('radio', { name: 'Medullary surface' }).focus();
    await page.keyboard.press('Space');
    await page.getByRole('button', { name: 'Record correction' }).focus();
    await page.keyboard.press('Enter');
    const button = page.locator(`.regions button[data-region="${region}"]`);
    await expect.poll(() => button.getAttribute('data-class'), { timeout: 60_000 }).toBe('medullary');
    expect(await button.innerText()).toContain('corrected');
    expect(await trianglesInFaces()).toBe(fracturesBefore - 1);
    await expect.poll(() => page.locator('.history').innerText()).toContain(`region ${region} of scan`);
    expect(await page.locator('.history').innerText()).toContain('fracture face → medullary surface');
    await page.waitForTimeout(300);
    await b.shot('specimen-region-corrected');

    await page.reload();
    await page.getByRole('heading', { name: 'Catalogue', level: 1 }).or(page.getByRole('button', { name: 'Open catalogue' })).first().waitFor();
    if (await page.getByRole('button', { name: 'Open catalogue' }).isVisible()) await openFromFirstRun(page);
    await openSpecimen(pair[1]);
    const again = page.locator(`.regions button[data-region="${region}"]`);
    expect(await again.getAttribute('data-class')).toBe('medullary');
    expect(await again.innerText()).toContain('corrected');
    expect(await page.locator('.history').innerText()).toContain('fracture face → medullary surface');
    // Stored through the host, append-only: one correction row.
    const listed = (await catalogue.call('specimens.list', { catalogue: catalogue.path })) as Array<{ id: number; catalogueNo: string }>;
    const id = listed.find((s) => s.catalogueNo === pair[1])!.id;
    const scan = ((await catalogue.call('specimens.get', { catalogue: catalogue.path, id })) as { scans: Array<{ id: number }> }).scans[0];
    const stored = (await catalogue.call('scans.get', { catalogue: catalogue.path, scanId: scan.id })) as { corrections: Array<{ regionId: number; surfaceClass: string }> };
    expect(stored.corrections).toEqual([expect.objectContaining({ regionId: Number(region), surfaceClass: 'medullary' })]);
    expect(b.pageErrors).toEqual([]);
  });
});
