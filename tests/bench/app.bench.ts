/**
 * `npm run bench -- app`: the app in Debian's Chromium through the loopback server.
 *
 * 1. The catalogue screen with 10,000 specimens (KNITBONE_BENCH_SPECIMENS): time to open it
 *    (click to first row shown), time per scroll update and per filter update (to the second
 *    animation frame after the table shows the change). Targets (issue 7): open under 1 s;
 *    scroll and filter under 100 ms per update.
 * 2. A scan of about 200,000 triangles (KNITBONE_BENCH_TRIANGLES) in the specimen screen's 3D
 *    view, drawn with software WebGL (SwiftShader): time to first frame and frame times while
 *    orbiting.
 *
 * Wall times on a shared machine grow with its load, so each line also gives the page's
 * main-thread CPU time (Chromium's ThreadTime metric) and the machine's load average.
 * A measurement, not a test.
 */
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import type { CDPSession, Page } from 'playwright-core';
import { Host } from '../../core/host/host';
import { browse } from '../e2e/harness';
import { linkScan } from '../e2e/fixtures';
import { brokenTube } from '../unit/geometry/broken-tube';
import { plyBinary } from '../unit/geometry/mesh-writers';

const N = Number(process.env.KNITBONE_BENCH_SPECIMENS ?? 10_000);
const TRIANGLES = Number(process.env.KNITBONE_BENCH_TRIANGLES ?? 200_000);
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

const load = (): string => loadavg().map((x) => x.toFixed(1)).join(' ');

/** Main-thread CPU time of the page (ms) spent while `fn` runs. */
async function pageCpu<T>(cdp: CDPSession, fn: () => Promise<T>): Promise<{ value: T; cpuMs: number }> {
  const metric = async (): Promise<number> => {
    const m = (await cdp.send('Performance.getMetrics')) as { metrics: Array<{ name: string; value: number }> };
    return (m.metrics.find((x) => x.name === 'ThreadTime')?.value ?? NaN) * 1000;
  };
  const before = await metric();
  const value = await fn();
  return { value, cpuMs: (await metric()) - before };
}

/**
 * CPU seconds used so far by Chromium's processes of one profile, by process type (from
 * /proc/<pid>/stat: user + system clock ticks, 100 per second on Linux). SwiftShader draws in
 * the GPU process, so this is where software WebGL's cost shows.
 */
function chromiumCpu(profile: string): Map<string, number> {
  const out = new Map<string, number>();
  for (const pid of readdirSync('/proc').filter((x) => /^\d+$/.test(x))) {
    try {
      // Chromium rewrites its children's command lines into one space-separated string.
      const args = readFileSync(`/proc/${pid}/cmdline`, 'utf8').replace(/\0/g, ' ');
      if (!args.includes(`--user-data-dir=${profile} `) && !args.endsWith(`--user-data-dir=${profile}`)) continue;
      const type = /--type=(\S+)/.exec(args)?.[1] ?? 'browser';
      const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
      const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
      out.set(type, (out.get(type) ?? 0) + (Number(fields[11]) + Number(fields[12])) / 100);
    } catch {
      // the process ended meanwhile
    }
  }
  return out;
}

const FRAME = 'const frame = () => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(() => r())));';

async function catalogueFigures(page: Page, cdp: CDPSession, importMs: number): Promise<string[]> {
  const lines: string[] = [];
  await page.getByRole('button', { name: 'Open catalogue' }).waitFor();
  const open = await pageCpu(cdp, async () => {
    const t = performance.now();
    await page.getByRole('button', { name: 'Open catalogue' }).click();
    await page.getByText(`${N.toLocaleString('en-US')} of ${N.toLocaleString('en-US')} specimens`).waitFor({ timeout: 60_000 });
    await page.locator('[role="row"][aria-rowindex="2"]').waitFor();
    return performance.now() - t;
  });
  const rowsInPage = await page.locator('.table-body [role="row"]').count();
  await page.waitForTimeout(500);

  const idle = await page.evaluate<number[]>(`(async () => { ${FRAME}
    const times = [];
    for (let i = 1; i <= 10; i++) { const t0 = performance.now(); await frame(); times.push(performance.now() - t0); }
    return times; })()`);
  const jumps = await pageCpu(cdp, () =>
    page.evaluate<number[]>(`(async () => { ${FRAME}
      const el = document.querySelector('.table-scroll');
      const times = [];
      for (let i = 1; i <= 30; i++) {
        const t0 = performance.now();
        el.scrollTop = (el.scrollHeight * i) / 31;
        await frame();
        times.push(performance.now() - t0);
      }
      return times; })()`),
  );
  const wheel = await pageCpu(cdp, () =>
    page.evaluate<number[]>(`(async () => { ${FRAME}
      const el = document.querySelector('.table-scroll');
      el.scrollTop = 0;
      await frame();
      const times = [];
      for (let i = 1; i <= 30; i++) {
        const t0 = performance.now();
        el.scrollTop += 120;
        await frame();
        times.push(performance.now() - t0);
      }
      return times; })()`),
  );
  // A filter update ends when the table shows the filtered rows (it follows the field in a
  // deferred render), then two frames for them to reach the screen.
  const edits = ['f', 'fe', 'fem', 'femur', 'femur left', 'femur left B3', '', 'tibia', 'Cervus', ''];
  const filter = await pageCpu(cdp, () =>
    page.evaluate<number[]>(`(async () => { ${FRAME}
      const input = document.getElementById('find-specimens');
      const grid = document.querySelector('[role="grid"]');
      const setter = Object.getOwnPropertyDescriptor(HTMLInputElement.prototype, 'value').set;
      const times = [];
      for (const text of ${JSON.stringify(edits)}) {
        const t0 = performance.now();
        setter.call(input, text);
        input.dispatchEvent(new Event('input', { bubbles: true }));
        while (grid.getAttribute('data-shown-query') !== text) await new Promise((r) => requestAnimationFrame(r));
        await frame();
        times.push(performance.now() - t0);
      }
      return times; })()`),
  );
  const sort = await pageCpu(cdp, () =>
    page.evaluate<number[]>(`(async () => { ${FRAME}
      const times = [];
      for (const label of ['Taxon', 'Taxon', 'z (m)', 'Cat. no.']) {
        const btn = [...document.querySelectorAll('[role="columnheader"] button')].find((x) => x.textContent?.startsWith(label));
        const t0 = performance.now();
        btn.click();
        await frame();
        times.push(performance.now() - t0);
      }
      return times; })()`),
  );
  const per = (cpu: number, n: number): string => `${(cpu / n).toFixed(1)} ms CPU each`;
  lines.push(
    `specimens                     ${N}`,
    `import (host, 1 CSV)          ${importMs.toFixed(0)} ms`,
    `open catalogue screen         ${open.value.toFixed(0)} ms wall, ${open.cpuMs.toFixed(0)} ms page CPU   (target < 1000 ms; click to first row shown)`,
    `rows in the page              ${rowsInPage}   (virtualised)`,
    `two idle frames (baseline)    ${stats(idle)}`,
    `scroll update (30 jumps)      ${stats(jumps.value)}; ${per(jumps.cpuMs, 30)}   (target < 100 ms; every row new)`,
    `scroll update (30 x 4 rows)   ${stats(wheel.value)}; ${per(wheel.cpuMs, 30)}   (target < 100 ms; like a mouse wheel)`,
    `filter update (10 edits)      ${stats(filter.value)}; ${per(filter.cpuMs, 10)}   (target < 100 ms; until the table shows it)`,
    `sort update (4 clicks)        ${stats(sort.value)}; ${per(sort.cpuMs, 4)}`,
  );
  return lines;
}

async function scanFigures(page: Page, cdp: CDPSession, profile: string, host: Host, catalogue: string, triangles: number): Promise<string[]> {
  const call = host.callUnchecked.bind(host) as (n: string, i: unknown) => Promise<unknown>;
  const [specimen] = (await call('specimens.list', { catalogue })) as Array<{ id: number }>;
  // Segment the scan once in the host (the loopback server shares its cache), so the page's
  // figures are about drawing, not segmentation.
  const c0 = process.cpuUsage();
  let t = performance.now();
  await call('viewer.mesh', { catalogue, specimenId: specimen.id });
  const segmentWall = performance.now() - t;
  const c = process.cpuUsage(c0);
  t = performance.now();
  const payload = JSON.stringify(await call('viewer.mesh', { catalogue, specimenId: specimen.id }));
  const warmMs = performance.now() - t;

  await page.evaluate(() => performance.clearMarks());
  await page.keyboard.press('Alt+1');
  await page.locator('[role="grid"]').focus();
  await page.keyboard.press('Home');
  const gpu0 = chromiumCpu(profile).get('gpu-process') ?? NaN;
  const first = await pageCpu(cdp, async () => {
    const t0 = performance.now();
    await page.keyboard.press('Enter');
    await page.waitForFunction(() => performance.getEntriesByName('knitbone:scan-drawn').length > 0, undefined, { timeout: 120_000, polling: 'raf' });
    // Make the GPU (SwiftShader) finish the frame before the clock stops.
    await page.evaluate(() => {
      const c = document.querySelector('.viewer canvas') as HTMLCanvasElement;
      const gl = c.getContext('webgl2')!;
      gl.readPixels(0, 0, 1, 1, gl.RGBA, gl.UNSIGNED_BYTE, new Uint8Array(4));
    });
    return performance.now() - t0;
  });
  // (Page functions as strings: the TypeScript runner adds helpers the page does not have.)
  const marks = await page.evaluate<{ received: number; drawn: number }>(`(() => {
    const at = (n) => performance.getEntriesByName(n)[0]?.startTime ?? NaN;
    return { received: at('knitbone:scan-received'), drawn: at('knitbone:scan-drawn') };
  })()`);
  const gpu1 = chromiumCpu(profile).get('gpu-process') ?? NaN;
  const canvas = page.locator('.viewer canvas');
  const size = await canvas.evaluate((c: HTMLCanvasElement) => `${c.width} x ${c.height}`);
  await canvas.focus();
  // Orbit: 48 steps of 7.5 degrees about the vertical, then 12 up and down; each frame is
  // drawn and read back (readPixels waits for SwiftShader), then shown (two animation frames).
  const orbit = await pageCpu(cdp, () =>
    page.evaluate<{ draw: number[]; shown: number[] }>(`(async () => { ${FRAME}
      const c = document.querySelector('.viewer canvas');
      const gl = c.getContext('webgl2');
      const px = new Uint8Array(4);
      const draw = [], shown = [];
      const keys = [...Array(48).fill('ArrowRight'), ...Array(6).fill('ArrowUp'), ...Array(6).fill('ArrowDown')];
      for (const key of keys) {
        const t0 = performance.now();
        c.dispatchEvent(new KeyboardEvent('keydown', { key, bubbles: true }));
        gl.readPixels(0, 0, 1, 1, gl.RGBA, gl.UNSIGNED_BYTE, px);
        draw.push(performance.now() - t0);
        await frame();
        shown.push(performance.now() - t0);
      }
      return { draw, shown }; })()`),
  );
  const gpu2 = chromiumCpu(profile).get('gpu-process') ?? NaN;
  const frames = orbit.value.draw.length;
  return [
    `scan                          ${triangles.toLocaleString('en-US')} triangles (broken tube, binary PLY), canvas ${size} px, software WebGL (SwiftShader)`,
    `segmentation in the host      ${segmentWall.toFixed(0)} ms wall, ${((c.user + c.system) / 1000).toFixed(0)} ms CPU (once per scan and settings; cached)`,
    `scan sent again (cached)      ${warmMs.toFixed(0)} ms, ${(payload.length / 1e6).toFixed(1)} MB of JSON`,
    `time to first frame           ${first.value.toFixed(0)} ms wall, ${first.cpuMs.toFixed(0)} ms page CPU, ${((gpu1 - gpu0) * 1000).toFixed(0)} ms GPU-process CPU (Enter on the row to the frame finished)`,
    `  of which scan arrived->drawn ${(marks.drawn - marks.received).toFixed(0)} ms (decode, colour, upload, first draw)`,
    `orbit frame, drawn            ${stats(orbit.value.draw)}   (${frames} frames, each read back)`,
    `orbit frame, on screen        ${stats(orbit.value.shown)}; ${(orbit.cpuMs / frames).toFixed(1)} ms page CPU, ${(((gpu2 - gpu1) * 1000) / frames).toFixed(0)} ms GPU-process CPU each`,
  ];
}

export default async function appBench(): Promise<void> {
  const dir = mkdtempSync(join(tmpdir(), 'knitbone-appbench-'));
  const catalogue = join(dir, 'big.sqlite');
  const csv = join(dir, 'specimens.csv');
  writeFileSync(csv, inventedCsv());
  const host = new Host();
  const call = host.callUnchecked.bind(host) as (n: string, i: unknown) => Promise<unknown>;
  await call('catalogue.init', { catalogue });
  const t = performance.now();
  await call('specimens.import', { catalogue, file: csv });
  const importMs = performance.now() - t;

  // A shaft-like scan of about the wanted size (edge length adjusted to the triangle count).
  mkdirSync(join(dir, 'scans'));
  let edge = 0.28;
  let tube = await brokenTube({ cuts: [{ normal: [0, 0, 1], offset: -30 }, { baseZ: -45, baseRadius: 50, halfAngleDeg: 45 }], edgeLength: edge });
  for (let i = 0; i < 4 && Math.abs(tube.mesh.triangles.length / 3 / TRIANGLES - 1) > 0.04; i++) {
    edge *= Math.sqrt(tube.mesh.triangles.length / 3 / TRIANGLES);
    tube = await brokenTube({ cuts: [{ normal: [0, 0, 1], offset: -30 }, { baseZ: -45, baseRadius: 50, halfAngleDeg: 45 }], edgeLength: edge });
  }
  const scanPath = join(dir, 'scans', 'B-00001.ply');
  writeFileSync(scanPath, plyBinary(tube.mesh, true));
  await linkScan(catalogue, 'B-00001', scanPath);

  const b = await browse({ catalogue, demoCatalogue: null, recent: [], canPickFiles: false });
  try {
    const cdp = await b.context.newCDPSession(b.page);
    await cdp.send('Performance.enable');
    const loadBefore = load();
    const lines = await catalogueFigures(b.page, cdp, importMs);
    lines.push(`load average                  ${loadBefore} before, ${load()} after (1, 5, 15 min)`, '');
    const loadScan = load();
    lines.push(...(await scanFigures(b.page, cdp, b.profile, host, catalogue, tube.mesh.triangles.length / 3)));
    lines.push(`load average                  ${loadScan} before, ${load()} after (1, 5, 15 min)`, '');
    await b.shot('bench-large-scan');
    process.stdout.write(lines.join('\n') + '\n');
  } finally {
    await b.close();
  }
}
