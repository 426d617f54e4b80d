import type { CDPSession, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { browse, tempDir, type Browsing } from './harness';
import { bunnyPly, linkScan, newCatalogue, openFromFirstRun, proposeJoin } from './fixtures';

// Every screen, in the light and the dark theme: each control is reached with the Tab key
// (radio groups count once: arrows move inside them, as in every browser), and everything a
// screen reader announces as a control has a name (Chromium's accessibility tree, WAI-ARIA
// roles). Screenshots of each screen in both themes are saved to look at.
let b: Browsing;
let cdp: CDPSession;

beforeAll(async () => {
  const made = await newCatalogue([
    { catalogueNo: 'KB-0001', unit: 'A1', level: '1', layer: 'I', taxon: 'Cervus elaphus', element: 'femur', side: 'left', portion: ['proximal-end'], x: 1.1, y: 2.2, z: 99.9 },
    { catalogueNo: 'KB-0002', unit: 'A1', level: '2', layer: 'I', taxon: 'Mammalia', element: 'long bone', sizeClass: 3, portion: ['midshaft'], x: 1.4, y: 2.0, z: 99.7 },
    { catalogueNo: 'KB-0003', unit: 'B2', level: '1', layer: 'II', taxon: 'Bos taurus', element: 'tibia', side: 'right', portion: ['distal-end'] },
  ]);
  const scans = tempDir('a11y-scans');
  for (const no of ['KB-0001', 'KB-0002']) await linkScan(made.path, no, await bunnyPly(scans, `${no}.ply`));
  const shifted = [1, 0, 0, 70, 0, 1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1];
  const accepted = await proposeJoin(made.path, 'KB-0001', 'KB-0002', shifted, 0.9, { contactFraction: 0.7, gapRmsMm: 0.2, penetrationMm: 0.05, outlineAgreement: 0.8 });
  await made.call('joins.accept', { catalogue: made.path, id: accepted, type: 'conjoin-green' });
  await proposeJoin(made.path, 'KB-0002', 'KB-0003', shifted, 0.6, { contactFraction: 0.4, gapRmsMm: 0.6, penetrationMm: 0.2, outlineAgreement: 0.5 });
  b = await browse({ catalogue: made.path, demoCatalogue: null, recent: [], canPickFiles: false });
  cdp = await b.context.newCDPSession(b.page);
});
afterAll(async () => {
  await b?.close();
});

/**
 * Tab through the page from the top; report the controls never reached. A control is what
 * a mouse can use: links, buttons, fields, and anything with a tab index of 0 or more.
 */
async function unreachedByTab(page: Page): Promise<string[]> {
  const total = await page.evaluate(`(() => {
    const all = [...document.querySelectorAll('a[href], button, input:not([type="hidden"]), select, textarea, [tabindex]')];
    let n = 0;
    for (const el of all) {
      const box = el.getBoundingClientRect();
      const hidden = box.width === 0 || box.height === 0 || getComputedStyle(el).visibility === 'hidden';
      if (hidden || el.matches(':disabled') || el.closest('[inert]') || el.getAttribute('tabindex') === '-1') continue;
      el.setAttribute('data-a11y', String(n++));
    }
    return n;
  })()`);
  await page.evaluate(() => (document.activeElement as HTMLElement | null)?.blur());
  await page.mouse.click(2, 2);
  const seen = new Set<string>();
  const radioGroups = new Set<string>();
  for (let i = 0; i < (total as number) + 10; i++) {
    await page.keyboard.press('Tab');
    const at = await page.evaluate(`(() => { const el = document.activeElement; return el ? [el.getAttribute('data-a11y'), el.type === 'radio' ? el.name : null] : [null, null]; })()`);
    const [id, group] = at as [string | null, string | null];
    if (id !== null) seen.add(id);
    if (group) radioGroups.add(group);
  }
  return page.evaluate(`(() => {
    const seen = new Set(${JSON.stringify([...seen])});
    const groups = new Set(${JSON.stringify([...radioGroups])});
    const out = [];
    for (const el of document.querySelectorAll('[data-a11y]')) {
      if (!seen.has(el.getAttribute('data-a11y')) && !(el.type === 'radio' && groups.has(el.name))) out.push(el.outerHTML.slice(0, 120));
      el.removeAttribute('data-a11y');
    }
    return out;
  })()`) as Promise<string[]>;
}

const NAMED_ROLES = new Set(['button', 'link', 'textbox', 'searchbox', 'combobox', 'listbox', 'checkbox', 'radio', 'slider', 'spinbutton', 'switch', 'tab', 'menuitem', 'grid', 'img', 'table', 'form', 'group', 'radiogroup', 'navigation', 'region', 'search']);

/** Controls (and images, tables, landmarks) that a screen reader would announce without a name. */
async function unnamed(): Promise<string[]> {
  const { nodes } = (await cdp.send('Accessibility.getFullAXTree')) as { nodes: Array<{ ignored: boolean; role?: { value: string }; name?: { value: string } }> };
  return nodes
    .filter((n) => !n.ignored && n.role && NAMED_ROLES.has(n.role.value) && !(n.name?.value ?? '').trim())
    // A group or form without a name is only a box; those with one are checked above.
    .filter((n) => !['group', 'form', 'region', 'table'].includes(n.role!.value))
    .map((n) => n.role!.value);
}

const SCREENS = [
  { key: '1', heading: 'Catalogue', name: 'catalogue' },
  { key: '2', heading: 'Specimen KB-0001', name: 'specimen' },
  { key: '3', heading: 'Proposed joins', name: 'review' },
  { key: '4', heading: 'Refit sets', name: 'refits' },
  { key: '5', heading: 'Counts', name: 'counts' },
  { key: '6', heading: 'Site map', name: 'site' },
] as const;

describe('accessibility of every screen', () => {
  it('the first screen: every control by keyboard, every control named', async () => {
    const { page } = b;
    await page.getByRole('button', { name: 'Open catalogue' }).waitFor();
    expect(await unreachedByTab(page)).toEqual([]);
    expect(await unnamed()).toEqual([]);
    await openFromFirstRun(page);
    // The specimen screen shows the first specimen: open it from the table.
    await page.locator('[role="grid"]').focus();
    await page.keyboard.press('Home');
    await page.keyboard.press('Enter');
    await page.getByRole('heading', { name: 'Specimen KB-0001' }).waitFor();
    await page.locator('.regions button').first().waitFor({ timeout: 90_000 });
  });

  for (const theme of ['light', 'dark'] as const) {
    for (const s of SCREENS) {
      it(`${s.name} (${theme}): every control by keyboard, every control named`, async () => {
        const { page } = b;
        if ((await page.evaluate(() => document.documentElement.dataset.theme)) !== theme) {
          await page.getByRole('button', { name: theme === 'dark' ? 'Dark theme' : 'Light theme' }).click();
        }
        await page.keyboard.press(`Alt+${s.key}`);
        await page.getByRole('heading', { name: s.heading, level: 1 }).waitFor();
        if (s.name === 'specimen') {
          // With a region chosen, its class editor is on screen too.
          await page.locator('.regions button').first().click();
          await page.locator('.region-editor').waitFor();
        }
        if (s.name === 'review') await page.locator('.queue li').first().waitFor();
        if (s.name === 'refits') await page.locator('.viewer canvas').waitFor({ timeout: 90_000 });
        await page.waitForTimeout(300);
        expect(await unreachedByTab(page)).toEqual([]);
        expect(await unnamed()).toEqual([]);
        await page.evaluate(() => (document.activeElement as HTMLElement | null)?.blur());
        await b.shot(`a11y-${s.name}-${theme}`);
      });
    }
  }

  it('saw no page errors', () => {
    expect(b.pageErrors).toEqual([]);
  });
});
