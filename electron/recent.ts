import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname } from 'node:path';
import { z } from 'zod';

const RecentFile = z.array(z.string().max(4096)).max(50);

/** Catalogues opened recently, newest first, kept in the user's app data folder. */
export class RecentCatalogues {
  constructor(private readonly file: string) {}

  list(): string[] {
    try {
      const parsed = RecentFile.safeParse(JSON.parse(readFileSync(this.file, 'utf8')));
      return parsed.success ? parsed.data.filter((p) => existsSync(p)) : [];
    } catch {
      return [];
    }
  }

  add(path: string): void {
    const next = [path, ...this.list().filter((p) => p !== path)].slice(0, 10);
    mkdirSync(dirname(this.file), { recursive: true });
    writeFileSync(this.file, JSON.stringify(next, null, 2));
  }
}
