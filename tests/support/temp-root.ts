/**
 * Vitest global setup: every test run writes its temporary folders (os.tmpdir()) under one fresh
 * folder of its own, removed when the run ends, so tests leave nothing behind in the system's
 * temporary folder even when a test forgets to clean up or fails half-way.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

export default function setup(): () => void {
  const root = mkdtempSync(join(tmpdir(), 'knitbone-test-run-'));
  const before = process.env.TMPDIR;
  process.env.TMPDIR = root;
  return () => {
    if (before === undefined) delete process.env.TMPDIR;
    else process.env.TMPDIR = before;
    rmSync(root, { recursive: true, force: true });
  };
}
