import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from '../../../core/cli/main';
import { catalogueWith, propose } from './helpers';

// The command-line contract of design.md section 9 for the joins and tally commands. Most
// runs go through runCli in this process (the same code the binary runs, much faster on a
// shared machine); one run goes through the real binary.
const bin = join(import.meta.dirname, '../../../bin/knitbone.js');
const spawnRun = (...args: string[]) => spawnSync(process.execPath, [bin, ...args], { encoding: 'utf8' });
let runs: Promise<unknown> = Promise.resolve();
async function run(...args: string[]): Promise<{ status: number; stdout: string; stderr: string }> {
  const out: string[] = [];
  const err: string[] = [];
  const write = (sink: string[]) => ((chunk: string | Uint8Array) => (sink.push(String(chunk)), true)) as typeof process.stdout.write;
  const prev = runs;
  let release!: () => void;
  runs = new Promise<void>((r) => (release = r));
  await prev;
  const [o, e] = [process.stdout.write, process.stderr.write];
  process.stdout.write = write(out);
  process.stderr.write = write(err);
  const exitCode = process.exitCode;
  try {
    const status = await runCli(args);
    return { status, stdout: out.join(''), stderr: err.join('') };
  } finally {
    process.stdout.write = o;
    process.stderr.write = e;
    process.exitCode = exitCode;
    release();
  }
}

const c = catalogueWith([
  { catalogueNo: 'K-1', taxon: 'Mammalia', sizeClass: 3, element: 'long bone', side: 'indeterminate', portion: ['midshaft'] },
  { catalogueNo: 'K-2', taxon: 'Cervus elaphus', element: 'femur', side: 'left', portion: ['distal-end'] },
  { catalogueNo: 'K-3', taxon: 'Bos taurus', element: 'tibia', side: 'right', portion: ['proximal-end'] },
]);
afterAll(() => c.cleanup());

describe('knitbone link, accept, reject, unlink, joins, conflicts, tally', () => {
  it('link --json, joins --json, tally --json, unlink', async () => {
    const link = await run('link', c.path, 'K-1', 'K-2', '--type', 'conjoin-green', '--by', 'A. Analyst', '--json');
    expect(link.status).toBe(0);
    const id = JSON.parse(link.stdout).join.id;
    const joins = await run('joins', c.path, '--status', 'accepted', '--json');
    expect(joins.status).toBe(0);
    expect(JSON.parse(joins.stdout)).toEqual([
      { id, a: 'K-1', b: 'K-2', status: 'accepted', type: 'conjoin-green', score: null, transform: null, decidedBy: 'A. Analyst', decidedAt: expect.any(String) },
    ]);
    const tally = spawnRun('tally', c.path, '--json'); // the real binary, once
    expect(tally.status).toBe(0);
    const t = JSON.parse(tally.stdout);
    expect(Object.keys(t)).toEqual(['nsp', 'recorded', 'refitted']);
    expect(t.nsp).toBe(3);
    expect(Object.keys(t.refitted)).toEqual(['nisp', 'nispFragments', 'identifiedToElement', 'identifiedToTaxon', 'byTaxon', 'byElement']);
    expect(t.refitted.identifiedToElement).toBe(1);
    expect(t.recorded.identifiedToElement).toBeCloseTo(2 / 3, 12);
    const unlink = await run('unlink', c.path, String(id));
    expect(unlink.status).toBe(0);
    expect(unlink.stdout).toMatch(/removed/);
    expect(JSON.parse((await run('joins', c.path, '--json')).stdout)).toEqual([]);
  });

  it('a conflicting link exits 1 with one line per problem; --force records it; conflicts lists it', async () => {
    const r = await run('link', c.path, 'K-2', 'K-3', '--type', 'conjoin-dry');
    expect(r.status).toBe(1);
    expect(r.stdout).toBe('');
    const lines = r.stderr.trim().split('\n');
    expect(lines).toHaveLength(3); // taxon, element, side
    expect(r.stderr).toMatch(/taxon.*Cervus elaphus and Bos taurus/);
    const forced = await run('link', c.path, 'K-2', 'K-3', '--type', 'conjoin-dry', '--force', '--json');
    expect(forced.status).toBe(0);
    const conflicts = JSON.parse((await run('conflicts', c.path, '--json')).stdout);
    expect(conflicts).toHaveLength(1);
    expect(conflicts[0].conflicts.map((x: { field: string }) => x.field).sort()).toEqual(['element', 'side', 'taxon']);
    expect((await run('unlink', c.path, String(JSON.parse(forced.stdout).join.id))).status).toBe(0);
  });

  it('accept and reject proposals; usage errors exit 2; bad values exit 1', async () => {
    const p1 = propose(c.path, 'K-1', 'K-2');
    const p2 = propose(c.path, 'K-1', 'K-3');
    expect((await run('accept', c.path, String(p1), '--type', 'conjoin-dry', '--json')).status).toBe(0);
    const rej = await run('reject', c.path, String(p2), '--json');
    expect(rej.status).toBe(0);
    expect(JSON.parse(rej.stdout).join.status).toBe('rejected');
    expect((await run('accept', c.path, String(p1))).status).toBe(1); // already accepted
    expect((await run('link', c.path, 'K-1', 'K-3')).status).toBe(2); // --type missing
    expect((await run('link', c.path, 'K-1', 'K-3', '--type', 'glued')).status).toBe(1);
    expect((await run('accept', c.path, 'x')).status).toBe(1);
    expect((await run('unlink', c.path, String(p1))).status).toBe(0);
  });

  it('tally --csv writes one table with a row per reading, taxon and element; export writes the same as tally.csv', async () => {
    const r = await run('tally', c.path, '--csv');
    expect(r.status).toBe(0);
    const lines = r.stdout.trim().split('\n');
    expect(lines[0]).toBe('level,reading,taxon,element,nsp,nisp,nisp_fragments,identified_to_element,identified_to_taxon,mni,l_plus_r_minus_p,mne_left,mne_right,mne,mau,percent_mau,pairs');
    expect(lines).toContain('summary,recorded,,,3,2,2,0.6666666666666666,0.6666666666666666,,,,,,,,');
    expect(lines).toContain('element,recorded,Cervus elaphus,femur,,1,,,,,,1,0,1,0.5,100,');
    expect(lines).toContain('taxon,recorded,Bos taurus,,,1,,,,1,,,,,,,');
    const out = join(dirname(c.path), 'export');
    expect((await run('export', c.path, '--out', out)).status).toBe(0);
    expect(readFileSync(join(out, 'tally.csv'), 'utf8')).toBe(r.stdout);
  });
});
