import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';

// The command-line contract of design.md section 9: exit 0 on success, 2 on usage errors,
// and --json prints one JSON document on stdout and nothing else there.
const bin = join(import.meta.dirname, '../../../bin/knitbone.js');
const run = (...args: string[]) => spawnSync(process.execPath, [bin, ...args], { encoding: 'utf8' });

describe('knitbone command line', () => {
  it('prints one JSON document for --json', () => {
    const r = run('about', '--json');
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout)).toMatchObject({ name: 'knitbone' });
  });

  it('exits 2 on an unknown command', () => {
    const r = run('no-such-command');
    expect(r.status).toBe(2);
    expect(r.stdout).toBe('');
  });
});
