/**
 * `npm run bench -- app`: the catalogue screen with 10,000 specimens in Debian's Chromium
 * through the loopback server. Prints the time to open the catalogue (click to table shown),
 * the time per scroll update and per filter update (in the page, to the second animation
 * frame after the change). Targets (issue 7): open under 1 s; scroll and filter under
 * 100 ms per update. A measurement, not a test.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Host } from '../../core/host/host';
import { browse } from '../e2e/harness';

const N = 10_000;
const TAXA = ['Cervus elaphus', 'Bos taurus', 'Capreolus capreolus', 'Sus scrofa', 'Mammalia', 'Equus ferus'];
const ELEMENTS = ['femur', 'tibia', 'humerus', 'radius', 'long bone', 'metacarpal'];

function inventedCsv(): string {
  const lines = ['catalogue_no,unit,level,layer,x,y,z,taxon,element,side,portion,size_class,break_age,weight_g'];
  for (let i = 1; i <= N; i++) {
    const unit = `${String.fromCharCode(65 + (i % 8))}${1 + (i % 6)}`;
    const taxon = TAXA[i % TAXA.length];
    const element = ELEMENTS[(i * 7) % ELEMENTS.length];
    const side = element === 'long bone' ? '' : i % 2 ? 'left' : 'right';
    const size = taxon === 'Mammalia' ? '3' : '';
    lines.push(
      `B-${String(i).padStart(5, '0')},${unit},${1 + (i % 12)},${['I', 'II', 'III'][i % 3]},${(i % 97) / 10},${(i % 89) / 10},${100 - (i % 50) / 100},${taxon},${element},${side},midshaft,${size},fresh,${(i % 40) + 1}`,
    );
  }
  return lines.join('\n') + '\n';
}

function stats(xs: number[]): string {
  const s = [...xs].sort((a, b) => a - b);
  const q = (p: number): number => s[Math.min(s.length - 1, Math.floor(p * s.length))];
  return `median ${q(0.5).toFixed(1)} ms, p95 ${q(0.95).toFixed(1)} ms, max ${s[s.length - 1].toFixed(1)} ms`;
}

export default async function appBench(): Promise<void> {
  const dir = mkdtempSync(join(tmpdir(), 'knitbone-appbench-'));
  const catalogue = join(dir, 'big.sqlite');
  const csv = join(dir, 'specimens.csv');
  writeFileSync(csv, inventedCsv());
  const host = new Host();
  const call = host.callUnchecked.bind(host) as (n: string, i: unknown) => Promise<unknown>;
  await call('catalogue.init', { catalogue });
  let t = performance.now();
  await call('specimens.import', { catalogue, file: csv });
  const importMs = performance.now() - t;

  const b = await browse({ catalogue, demoCatalogue: null, recent: [], canPickFiles: false });
  try {
    const { page } = b;
    await page.getByRole('button', { name: 'Open catalogue' }).waitFor();
    t = performance.now();
    await page.getByRole('button', { name: 'Open catalogue' }).click();
    await page.getByText(`${N.toLocaleString('en-US')} of ${N.toLocaleString('en-US')} specimens`).waitFor({ timeout: 60_000 });
    await page.locator('[role="row"][aria-rowindex="2"]').waitFor();
    const openMs = performance.now() - t;
    const rowsInPage = await page.locator('.table-body [role="row"]').count();

    const scroll = await page.evaluate<number[]>(`(async () => {
      const el = document.querySelector('.table-scroll') ;
      const frame = () => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(() => r())));
      const times = [];
      for (let i = 1; i <= 30; i++) {
        const t0 = performance.now();
        el.scrollTop = (el.scrollHeight * i) / 31;
        await frame();
        times.push(performance.now() - t0);
      }
      return times;})()`);

    const wheel = await page.evaluate<number[]>(`(async () => {
      const el = document.querySelector('.table-scroll');
      el.scrollTop = 0;
      const frame = () => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(() => r())));
      await frame();
      const times = [];
      for (let i = 1; i <= 30; i++) {
        const t0 = performance.now();
        el.scrollTop += 120;
        await frame();
        times.push(performance.now() - t0);
      }
      return times;
    })()`);
    const idle = await page.evaluate<number[]>(`(async () => {
      const frame = () => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(() => r())));
      const times = [];
      for (let i = 1; i <= 10; i++) {
        const t0 = performance.now();
        await frame();
        times.push(performance.now() - t0);
      }
      return times;
    })()`);

    const filter = await page.evaluate<number[]>(`(async () => {
      const input = document.getElementById('find-specimens') ;
      const setter = Object.getOwnPropertyDescriptor(HTMLInputElement.prototype, 'value').set;
      const frame = () => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(() => r())));
      const times = [];
      for (const text of ['f', 'fe', 'fem', 'femur', 'femur left', 'femur left B3', '', 'tibia', 'Cervus', '']) {
        const t0 = performance.now();
        setter.call(input, text);
        input.dispatchEvent(new Event('input', { bubbles: true }));
        await frame();
        times.push(performance.now() - t0);
      }
      return times;})()`);

    const sort = await page.evaluate<number[]>(`(async () => {
      const frame = () => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(() => r())));
      const times = [];
      for (const label of ['Taxon', 'Taxon', 'z (m)', 'Cat. no.']) {
        const btn = [...document.querySelectorAll('[role="columnheader"] button')].find((x) => x.textContent?.startsWith(label)) ;
        const t0 = performance.now();
        btn.click();
        await frame();
        times.push(performance.now() - t0);
      }
      return times;})()`);

    process.stdout.write(
      [
        `specimens                     ${N}`,
        `import (host, 1 CSV)          ${importMs.toFixed(0)} ms`,
        `open catalogue screen         ${openMs.toFixed(0)} ms   (target < 1000 ms; click to first row shown)`,
        `rows in the page              ${rowsInPage}   (virtualised)`,
        `two idle frames (baseline)    ${stats(idle)}`,
        `scroll update (30 jumps)      ${stats(scroll)}   (target < 100 ms; every row new)`,
        `scroll update (30 x 4 rows)   ${stats(wheel)}   (target < 100 ms; like a mouse wheel)`,
        `filter update (10 edits)      ${stats(filter)}   (target < 100 ms)`,
        `sort update (4 clicks)        ${stats(sort)}`,
        '',
      ].join('\n'),
    );
  } finally {
    await b.close();
  }
}
