/**
 * Catalogue benchmark: import of a generated 10,000-specimen CSV (all-or-nothing import with
 * full checking and history) and a query of the full specimen list. Targets (issue 2):
 * import under 2 s, full list under 100 ms. Prints a table; not a pass/fail test.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { cpus, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { openCatalogue } from '../../core/catalogue/catalogue';
import { specimensCsv } from '../../core/catalogue/export';
import { importSpecimens } from '../../core/catalogue/import-specimens';
import { mulberry32 } from '../../core/geometry/seeded-random';

/** An invented specimen list: units on a 1 m grid, mostly unidentified shaft fragments. */
export function generateSpecimenCsv(n: number, seed = 7): string {
  const r = mulberry32(seed);
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(r() * xs.length)];
  const taxa = ['', '', '', 'Cervus elaphus', 'Cervidae', 'Bos taurus', 'Caprini', 'Sus scrofa', 'Equus ferus', 'Lepus europaeus', 'Vulpes vulpes'];
  const elements = ['long bone', 'long bone', 'upper limb long bone', 'femur', 'tibia', 'humerus', 'radius', 'metatarsal', 'rib', 'cranium', 'first phalanx'];
  const zones = ['proximal-end', 'proximal-shaft', 'midshaft', 'distal-shaft', 'distal-end'];
  const lines = ['catalogue_no,unit,level,layer,x,y,z,taxon,element,side,portion,fusion,size_class,break_age,modifications,weight_g,notes'];
  for (let i = 1; i <= n; i++) {
    const e = r() < 0.1 ? '' : pick(elements);
    const long = ['long bone', 'upper limb long bone', 'femur', 'tibia', 'humerus', 'radius', 'metatarsal'].includes(e);
    const start = Math.floor(r() * 5);
    const portion = long ? zones.slice(start, start + 1 + Math.floor(r() * 2)).join(';') : '';
    const ux = Math.floor(r() * 8);
    const uy = Math.floor(r() * 8);
    lines.push([
      `TB-${String(i).padStart(5, '0')}`, `N${uy}E${ux}`, String(1 + Math.floor(r() * 6)), pick(['A', 'B', 'C']),
      (ux + r()).toFixed(3), (uy + r()).toFixed(3), (-0.2 - r() * 1.5).toFixed(3), pick(taxa), e,
      e === '' || e === 'long bone' ? '' : pick(['left', 'right', 'indeterminate']), portion, pick(['', '', 'fused', 'unfused']),
      r() < 0.5 ? String(1 + Math.floor(r() * 4)) : '', pick(['fresh', 'dry', 'modern', '']), r() < 0.2 ? 'cut-mark' : '',
      (r() * 40).toFixed(1), r() < 0.05 ? '"refit candidate, check"' : '',
    ].join(','));
  }
  return lines.join('\n') + '\n';
}

/** Wall time and this process's CPU time (user + system) of fn, in ms: on a shared, busy
 * machine the CPU figure shows what the work itself costs. */
function timed<T>(fn: () => T): { value: T; wall: number; cpu: number } {
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  const value = fn();
  const wall = performance.now() - t0;
  const c = process.cpuUsage(c0);
  return { value, wall, cpu: (c.user + c.system) / 1000 };
}

const ms = (t: { wall: number; cpu: number }, digits = 0) => `${t.wall.toFixed(digits)} ms (cpu ${t.cpu.toFixed(digits)})`;

export default async function bench(): Promise<void> {
  const dir = mkdtempSync(join(tmpdir(), 'knitbone-bench-'));
  try {
    const rows: [string, string, string][] = [];
    const t0 = performance.now();
    const csv = generateSpecimenCsv(10_000);
    rows.push(['generate 10,000-row CSV', `${(performance.now() - t0).toFixed(0)} ms`, `${(csv.length / 1024).toFixed(0)} KiB`]);
    rows.push(['machine load (1-minute average)', '', `${loadavg()[0].toFixed(1)} on ${cpus().length} cores`]);

    const cat = openCatalogue(join(dir, 'bench.sqlite'), { create: true, who: 'bench' });
    const imp = timed(() => importSpecimens(cat, csv, { fileName: 'bench.csv' }));
    rows.push(['import 10,000 specimens', ms(imp), `target < 2000 ms; ${imp.value.inserted} inserted`]);

    const lists: { wall: number; cpu: number; value: number }[] = [];
    for (let i = 0; i < 7; i++) lists.push(timed(() => cat.specimens.list().length));
    const mid = [...lists].sort((a, b) => a.wall - b.wall)[3];
    rows.push(['full specimen list (median of 7)', ms(mid, 1), `target < 100 ms; ${mid.value} specimens; fastest ${Math.min(...lists.map((l) => l.wall)).toFixed(1)} ms`]);

    const exp = timed(() => specimensCsv(cat));
    rows.push(['specimens.csv export', ms(exp), `${(exp.value.length / 1024).toFixed(0)} KiB`]);

    const bad = csv.replace('TB-05000,', 'TB-00001,');
    const refused = timed(() => {
      try {
        importSpecimens(cat, bad, { fileName: 'bad.csv' });
        return 0;
      } catch (err) {
        return (err as { problems: unknown[] }).problems.length;
      }
    });
    rows.push(['refused re-import (all rows duplicate)', ms(refused), `${refused.value} problems reported`]);

    const upd = timed(() => importSpecimens(cat, csv.replace(/,N3E4,/g, ',N3E4b,'), { fileName: 'edit.csv', update: true }));
    rows.push(['--update re-import', ms(upd), `${upd.value.updated} updated, ${upd.value.unchanged} unchanged`]);
    cat.close();

    const w = [Math.max(...rows.map((x) => x[0].length)), Math.max(...rows.map((x) => x[1].length))];
    process.stdout.write(`${'measure'.padEnd(w[0])}  ${'time'.padStart(w[1])}  notes\n`);
    for (const [a, b, c] of rows) process.stdout.write(`${a.padEnd(w[0])}  ${b.padStart(w[1])}  ${c}\n`);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
