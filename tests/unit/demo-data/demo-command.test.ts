import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

// The command-line contract of design.md section 9 for `knitbone demo`: exit 2 on usage
// errors, exit 1 with one line per problem on stderr on bad input, nothing overwritten.
const bin = join(import.meta.dirname, '../../../bin/knitbone.js');
const run = (...args: string[]) => spawnSync(process.execPath, [bin, ...args], { encoding: 'utf8' });

describe('knitbone demo', () => {
  it('exits 2 on a bad --fragments value', () => {
    const r = run('demo', join(tmpdir(), 'knitbone-never-made'), '--fragments', 'many');
    expect(r.status).toBe(2);
  });

  it('refuses a folder holding other files, and leaves them alone', () => {
    const dir = mkdtempSync(join(tmpdir(), 'knitbone-demo-cmd-'));
    try {
      writeFileSync(join(dir, 'thesis.txt'), 'keep me');
      const r = run('demo', dir, '--fragments', '2');
      expect(r.status).toBe(1);
      expect(r.stderr).toMatch(/not empty/);
      expect(readFileSync(join(dir, 'thesis.txt'), 'utf8')).toBe('keep me');
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
