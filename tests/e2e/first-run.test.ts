import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { browse, type Browsing } from './harness';

// The first screen an analyst sees: the cautions about proposed joins and human remains,
// and the ways to open an assemblage; every control reachable by keyboard.
let b: Browsing;

beforeAll(async () => {
  b = await browse({ catalogue: null, demoCatalogue: null, recent: [], canPickFiles: false });
});
afterAll(async () => {
  await b?.close();
});

describe('first run', () => {
  it('shows the cautions and the openers, served under its CSP with no page errors', async () => {
    const { page } = b;
    await page.getByRole('heading', { name: 'Before you begin' }).waitFor();
    const text = await page.locator('.cautions').innerText();
    expect(text).toContain('hypotheses');
    expect(text).toContain('Never glue or alter a specimen');
    expect(text).toContain('human remains');
    expect(text).toContain('local law');
    expect(text).toContain('descendant communities');
    await b.shot('first-run-light');
    const response = await page.request.get(b.server.origin + '/');
    expect(response.headers()['content-security-policy']).toContain("script-src 'self'");
    expect(b.pageErrors).toEqual([]);
  });

  it('reaches the catalogue path field and its button by keyboard, and switches theme', async () => {
    const { page } = b;
    await page.locator('body').focus();
    let reached = false;
    for (let i = 0; i < 8 && !reached; i++) {
      await page.keyboard.press('Tab');
      reached = await page.evaluate(() => document.activeElement?.id === 'open-path');
    }
    expect(reached).toBe(true);
    await page.getByRole('button', { name: 'Dark theme' }).click();
    expect(await page.evaluate(() => document.documentElement.dataset.theme)).toBe('dark');
    await b.shot('first-run-dark');
  });
});
