import { describe, expect, it } from 'vitest';
import { spawn, spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

// `knitbone serve <catalogue> [--port P]` (design.md section 9): prints the address with
// its token, refuses requests without it; a missing catalogue is bad input (exit 1), a
// malformed port a usage error (exit 2).
const bin = join(import.meta.dirname, '../../../bin/knitbone.js');

describe('knitbone serve', () => {
  it('exits 1 with one line for a missing catalogue and 2 for a bad port', () => {
    const missing = spawnSync(process.execPath, [bin, 'serve', join(tmpdir(), 'no-such-knitbone.sqlite')], { encoding: 'utf8' });
    expect(missing.status).toBe(1);
    expect(missing.stderr.trim().split('\n')).toHaveLength(1);
    expect(missing.stderr).toContain('knitbone init');
    const port = spawnSync(process.execPath, [bin, 'serve', 'x.sqlite', '--port', 'eighty'], { encoding: 'utf8' });
    expect(port.status).toBe(2);
  });

  it('prints a loopback address with a token and refuses requests without it', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'knitbone-serve-'));
    const file = join(dir, 'a.sqlite');
    writeFileSync(file, '');
    const child = spawn(process.execPath, [bin, 'serve', file], { stdio: ['ignore', 'pipe', 'pipe'] });
    try {
      const url = await new Promise<string>((resolve, reject) => {
        let out = '';
        child.stdout.on('data', (c: Buffer) => {
          out += c.toString();
          const m = /open (http:\/\/127\.0\.0\.1:\d+\/\?token=\S+)/.exec(out);
          if (m) resolve(m[1]);
        });
        child.on('exit', (code) => reject(new Error(`serve exited ${code}`)));
      });
      const origin = new URL(url).origin;
      expect((await fetch(`${origin}/api/session`)).status).toBe(401);
      const token = new URL(url).searchParams.get('token')!;
      const s = await fetch(`${origin}/api/session`, { headers: { 'X-Knitbone-Token': token } });
      expect(s.status).toBe(200);
      expect(((await s.json()) as { result: { catalogue: string } }).result.catalogue).toBe(file);
    } finally {
      child.kill('SIGTERM');
    }
  });
});
