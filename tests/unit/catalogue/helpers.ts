import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

/** A fresh temporary folder for one test's catalogue files. */
export function tempDir(prefix = 'knitbone-cat-'): string {
  return mkdtempSync(join(tmpdir(), prefix));
}
