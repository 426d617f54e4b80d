import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it, vi } from 'vitest';
import { runCli } from '../../../core/cli/main';
import { readMigrations } from '../../../core/catalogue/migrate';
import { tempDir } from './helpers';

// The command-line contract (design.md section 9) for init, import specimens and export:
// exit 0 on success, 1 with one line per problem on stderr, 2 on usage errors; --json
// prints exactly one JSON document on stdout.
const bin = join(import.meta.dirname, '../../../bin/knitbone.js');
const run = (...args: string[]) => spawnSync(process.execPath, [bin, ...args], { encoding: 'utf8', env: { ...process.env, KNITBONE_ANALYST: 'cli tester' } });

describe('knitbone init, import specimens, export', () => {
  it('creates a catalogue, imports, refuses a bad file line by line, and exports', () => {
    const dir = tempDir();
    const cat = join(dir, 'site.sqlite');
    const init = run('init', cat, '--json');
    expect(init.status).toBe(0);
    expect(JSON.parse(init.stdout)).toMatchObject({ created: true, schemaVersion: Math.max(...readMigrations().map((m) => m.version)) });

    writeFileSync(join(dir, 'good.csv'), 'catalogue_no;taxon;element;side\nK-1;red deer;Fem;L\nK-2;;long bone;\n');
    const ok = run('import', 'specimens', cat, join(dir, 'good.csv'), '--json');
    expect(ok.status).toBe(0);
    expect(JSON.parse(ok.stdout)).toMatchObject({ rows: 2, inserted: 2, delimiter: ';' });

    writeFileSync(join(dir, 'bad.csv'), 'catalogue_no,x,side\nK-3,east,left\nK-1,,up\n');
    const bad = run('import', 'specimens', cat, join(dir, 'bad.csv'));
    expect(bad.status).toBe(1);
    expect(bad.stdout).toBe('');
    const lines = bad.stderr.trim().split('\n');
    expect(lines).toHaveLength(3);
    expect(lines[0]).toMatch(/bad\.csv, line 2, column x: "east" is not a number/);
    expect(lines[1]).toMatch(/line 3, column side: "up" is not a side/);
    expect(lines[2]).toMatch(/line 3, column catalogue_no: .*already in the catalogue/);

    const out = join(dir, 'out');
    const exp = run('export', cat, '--out', out, '--json');
    expect(exp.status).toBe(0);
    // specimens.csv, joins.csv, history.csv and the counting area's tally.csv
    expect(JSON.parse(exp.stdout).files.map((f: { name: string }) => f.name).sort()).toEqual(['history.csv', 'joins.csv', 'specimens.csv', 'tally.csv']);
    expect(readFileSync(join(out, 'specimens.csv'), 'utf8')).toMatch(/^catalogue_no,unit,level,layer,x,y,z,taxon,element,side,portion/);
    expect(readFileSync(join(out, 'history.csv'), 'utf8')).toMatch(/cli tester/);
  });

  it('exits 2 on usage errors and 1 for a missing catalogue (in-process, same entry point)', async () => {
    const dir = tempDir();
    const quiet = vi.spyOn(process.stderr, 'write').mockImplementation(() => true);
    try {
      expect(await runCli(['import', 'specimens', join(dir, 'x.sqlite')])).toBe(2);
      expect(await runCli(['export', join(dir, 'x.sqlite')])).toBe(2);
      expect(await runCli(['export', join(dir, 'missing.sqlite'), '--out', join(dir, 'o')])).toBe(1);
      expect(quiet.mock.calls.map((c) => String(c[0])).join('')).toMatch(/no catalogue here/);
    } finally {
      quiet.mockRestore();
    }
    expect(existsSync(join(dir, 'missing.sqlite'))).toBe(false);
  });
});
