import type Database from 'better-sqlite3';
import type { HistoryRepository } from './history';

/** Per-catalogue settings as JSON values by key (site name, grid origin, analyst...). */
export class SettingsRepository {
  constructor(
    private readonly db: Database.Database,
    private readonly history: HistoryRepository,
    private readonly defaultWho: string,
  ) {}

  get<T = unknown>(key: string): T | undefined {
    const row = this.db.prepare('SELECT value FROM setting WHERE key = ?').get(key) as { value: string } | undefined;
    return row ? (JSON.parse(row.value) as T) : undefined;
  }

  all(): Record<string, unknown> {
    const rows = this.db.prepare('SELECT key, value FROM setting ORDER BY key').all() as { key: string; value: string }[];
    return Object.fromEntries(rows.map((r) => [r.key, JSON.parse(r.value)]));
  }

  set(key: string, value: unknown, who: string = this.defaultWho): void {
    const run = this.db.transaction(() => {
      const before = this.get(key);
      if (JSON.stringify(before) === JSON.stringify(value)) return;
      this.db
        .prepare('INSERT INTO setting (key, value) VALUES (?, ?) ON CONFLICT (key) DO UPDATE SET value = excluded.value')
        .run(key, JSON.stringify(value));
      this.history.record({ who, entity: 'setting', entityId: key, action: before === undefined ? 'insert' : 'update', before, after: value });
    });
    run();
  }
}
