/**
 * Accepting or undoing one join and recounting everything must stay interactive (issue 3:
 * under 50 ms per accept-and-recount). Generated, invented catalogue: 10,000 specimens with
 * 2,000 accepted conjoins; then we time link + tally and unlink + tally through the host.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { emptySpecimenFields, openCatalogue, type SpecimenFields } from '../../core/catalogue/index';
import { countsOf, identificationRuleOf } from '../../core/host/counting/counts-of';
import { refitsOf } from '../../core/host/counting/refits-of';
import { syncDerived } from '../../core/host/counting/sync-derived';
import { Host } from '../../core/host/host';

const SPECIMENS = 10_000;
const JOINS = 2_000;
const TRIALS = Number(process.env.TRIALS ?? 15);
const TAXA = ['Cervus elaphus', 'Bos taurus', 'Sus scrofa', 'Equus caballus', 'Capreolus capreolus'];
const ELEMENTS = ['femur', 'humerus', 'tibia', 'radius', 'metatarsal', 'metacarpal'];
const ZONES = ['proximal-end', 'proximal-shaft', 'midshaft', 'distal-shaft', 'distal-end'];

function rng(seed: number) {
  let s = seed >>> 0;
  return () => ((s = (s * 1664525 + 1013904223) >>> 0) / 2 ** 32);
}

function generate(seed = 7): { specimens: SpecimenFields[]; joins: Array<[number, number]>; free: Array<[number, number]> } {
  const r = rng(seed);
  const pick = <T>(xs: readonly T[]) => xs[Math.floor(r() * xs.length)];
  const specimens: SpecimenFields[] = [];
  const joins: Array<[number, number]> = [];
  const add = (f: Partial<SpecimenFields>) => {
    specimens.push({ ...emptySpecimenFields(`GEN-${String(specimens.length + 1).padStart(5, '0')}`), unit: `U${1 + Math.floor(r() * 12)}`, ...f });
    return specimens.length - 1;
  };
  // Broken bones: one diagnostic piece and 1-3 shaft fragments, each piece its own zone.
  while (joins.length < JOINS) {
    const taxon = pick(TAXA);
    const element = pick(ELEMENTS);
    const side = r() < 0.5 ? 'left' : 'right';
    const n = Math.min(2 + Math.floor(r() * 3), JOINS - joins.length + 1);
    const zones = [...ZONES].sort(() => r() - 0.5);
    let prev = add({ taxon, element, side, portion: [zones[0]], fusion: r() < 0.8 ? 'fused' : 'unfused' });
    for (let k = 1; k < n; k++) {
      const next = add({ taxon: 'Mammalia', sizeClass: 3, element: 'long bone', side: 'indeterminate', portion: [zones[k]] });
      joins.push([prev, next]);
      prev = next;
    }
  }
  // The rest: lone specimens, a third identified, the others shaft fragments.
  const free: Array<[number, number]> = [];
  while (specimens.length < SPECIMENS) {
    if (r() < 0.33) add({ taxon: pick(TAXA), element: pick(ELEMENTS), side: r() < 0.5 ? 'left' : 'right', portion: [pick(ZONES)] });
    else {
      const a = add({ taxon: 'Mammalia', element: 'long bone', portion: ['proximal-shaft'] });
      if (specimens.length < SPECIMENS) {
        const b = add({ taxon: 'Cervidae', element: 'femur', side: 'left', portion: ['distal-end'] });
        free.push([a, b]);
      }
    }
  }
  return { specimens, joins, free };
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

export default async function main(): Promise<void> {
  const dir = mkdtempSync(join(tmpdir(), 'knitbone-bench-counting-'));
  const path = join(dir, 'bench.sqlite');
  try {
    const t0 = performance.now();
    const { specimens, joins, free } = generate();
    const cat = openCatalogue(path, { create: true, who: 'bench' });
    const inserted = cat.specimens.insertMany(specimens);
    cat.transaction(() => {
      let i = 0;
      for (const [a, b] of joins) {
        cat.joins.insert({
          specimenA: inserted[a].id, specimenB: inserted[b].id, status: 'accepted', type: 'conjoin',
          breakAge: i++ % 3 === 0 ? 'modern' : 'fresh', decidedBy: 'bench', decidedAt: new Date(Date.UTC(2026, 0, 1, 0, 0, i)).toISOString(),
        });
      }
      syncDerived(cat, refitsOf(cat), 'bench');
    });
    const tSetup = performance.now() - t0;

    // Parts of one recount, measured apart.
    const load: number[] = [];
    const count: number[] = [];
    for (let k = 0; k < 5; k++) {
      const a = performance.now();
      const refits = refitsOf(cat);
      const b = performance.now();
      countsOf(refits, identificationRuleOf(cat));
      const c = performance.now();
      load.push(b - a);
      count.push(c - b);
    }
    cat.close();

    const host = new Host();
    const accept: number[] = [];
    const undo: number[] = [];
    const acceptCpu: number[] = [];
    const undoCpu: number[] = [];
    const cpu = () => {
      const u = process.cpuUsage();
      return (u.user + u.system) / 1000;
    };
    let refitted = 0;
    for (let k = 0; k < TRIALS; k++) {
      const [a, b] = free[k];
      const s = performance.now();
      const cs = cpu();
      const d = await host.call('joins.link', { catalogue: path, a: specimens[a].catalogueNo, b: specimens[b].catalogueNo, type: 'conjoin-green' });
      const t = await host.call('tally.counts', { catalogue: path });
      const m = performance.now();
      const cm = cpu();
      await host.call('joins.unlink', { catalogue: path, id: d.join.id });
      await host.call('tally.counts', { catalogue: path });
      const e = performance.now();
      const ce = cpu();
      accept.push(m - s);
      undo.push(e - m);
      acceptCpu.push(cm - cs);
      undoCpu.push(ce - cm);
      refitted = t.refitted.nisp;
    }
    const rows = [
      ['specimens', String(SPECIMENS)],
      ['accepted joins', String(JOINS)],
      ['setup (generate, insert, first propagation) ms', tSetup.toFixed(0)],
      ['read catalogue + build refit state ms (median)', median(load).toFixed(1)],
      ['tally recorded + refitted ms (median)', median(count).toFixed(1)],
      ['link + tally ms (median)', median(accept).toFixed(1)],
      ['link + tally ms (max)', Math.max(...accept).toFixed(1)],
      ['link + tally CPU ms (median)', median(acceptCpu).toFixed(1)],
      ['unlink + tally ms (median)', median(undo).toFixed(1)],
      ['unlink + tally CPU ms (median)', median(undoCpu).toFixed(1)],
      ['machine load average (1 min, 2 cores)', loadavg()[0].toFixed(1)],
      ['refitted NISP after one link', String(refitted)],
      ['target ms per accept-and-recount', '50'],
    ];
    const w = Math.max(...rows.map((r) => r[0].length));
    for (const [k, v] of rows) process.stdout.write(`${k.padEnd(w)}  ${v}\n`);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
