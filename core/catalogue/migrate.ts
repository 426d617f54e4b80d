import { createHash } from 'node:crypto';
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { basename, dirname, extname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type Database from 'better-sqlite3';
import { KnitboneError } from '../host/errors';

/**
 * Schema migrations: numbered SQL files in migrations/ (`0001_catalogue.sql`), applied in
 * order, each in its own transaction, each recorded in `schema_migration` with the SHA-256
 * of its text. A recorded migration whose file has changed since is refused, and so is a
 * catalogue that records a migration this knitbone does not know (written by a newer one).
 */

export interface MigrationFile {
  version: number;
  name: string;
  sql: string;
  checksum: string;
}

export interface MigrationOutcome {
  /** Versions applied by this call, in order. */
  applied: number[];
  /** Version of the catalogue before and after. 0 means empty. */
  from: number;
  to: number;
  /** Where the copy taken before migrating an existing catalogue went, if one was taken. */
  backupPath?: string;
}

export const defaultMigrationsDir = join(dirname(fileURLToPath(import.meta.url)), '../../migrations');

/** Checksum of a migration's text; line endings are normalised so a checkout on any OS agrees. */
export function migrationChecksum(sql: string): string {
  return createHash('sha256').update(sql.replace(/\r\n?/g, '\n'), 'utf8').digest('hex');
}

/** Read every `NNNN_name.sql` in a folder, sorted by number. Two files with one number are refused. */
export function readMigrations(dir: string = defaultMigrationsDir): MigrationFile[] {
  const files = readdirSync(dir).filter((f) => extname(f) === '.sql');
  const out: MigrationFile[] = [];
  const seen = new Map<number, string>();
  for (const f of files) {
    const m = /^(\d{4})_([A-Za-z0-9_.-]+)\.sql$/.exec(f);
    if (!m) {
      throw new KnitboneError('internal', [{ file: f, message: 'migration file names must look like 0001_name.sql' }]);
    }
    const version = Number(m[1]);
    const other = seen.get(version);
    if (other) throw new KnitboneError('internal', [{ file: f, message: `migration number ${m[1]} is also used by ${other}` }]);
    seen.set(version, f);
    const sql = readFileSync(join(dir, f), 'utf8');
    out.push({ version, name: basename(f, '.sql'), sql, checksum: migrationChecksum(sql) });
  }
  return out.sort((a, b) => a.version - b.version);
}

interface AppliedRow {
  version: number;
  name: string;
  checksum: string;
  applied_at: string;
}

const createBookkeeping = `
CREATE TABLE IF NOT EXISTS schema_migration (
  version    INTEGER PRIMARY KEY,
  name       TEXT NOT NULL,
  checksum   TEXT NOT NULL,
  applied_at TEXT NOT NULL
)`;

/** Migrations already recorded in a catalogue (empty for a new file). */
export function appliedMigrations(db: Database.Database): AppliedRow[] {
  const has = db.prepare(`SELECT 1 FROM sqlite_master WHERE type = 'table' AND name = 'schema_migration'`).get();
  if (!has) return [];
  return db.prepare(`SELECT version, name, checksum, applied_at FROM schema_migration ORDER BY version`).all() as AppliedRow[];
}

/**
 * Bring a catalogue up to the newest schema. `catalogueFile` names the file for messages
 * and for the backup copy, taken with VACUUM INTO beside it before the first pending
 * migration is applied to a catalogue that already had a schema.
 */
export function migrate(
  db: Database.Database,
  catalogueFile: string,
  migrations: MigrationFile[] = readMigrations(),
  now: () => Date = () => new Date(),
): MigrationOutcome {
  const applied = appliedMigrations(db);
  const known = new Map(migrations.map((m) => [m.version, m]));
  const problems: { message: string; file?: string }[] = [];
  for (const row of applied) {
    const m = known.get(row.version);
    if (!m) {
      problems.push({
        file: catalogueFile,
        message: `this catalogue was written by a newer knitbone (it has schema migration ${row.name}, unknown here); open it with that version or newer, nothing was changed`,
      });
    } else if (m.checksum !== row.checksum) {
      problems.push({
        file: `migrations/${m.name}.sql`,
        message: `migration ${m.name} was changed after it was applied to ${catalogueFile} (recorded checksum ${row.checksum.slice(0, 12)}, file now ${m.checksum.slice(0, 12)}); restore the file and put schema changes in a new numbered migration`,
      });
    }
  }
  const userVersion = db.pragma('user_version', { simple: true }) as number;
  const newest = migrations.length ? migrations[migrations.length - 1].version : 0;
  if (userVersion > newest && !problems.some((p) => p.message.includes('newer knitbone'))) {
    problems.push({
      file: catalogueFile,
      message: `this catalogue has schema version ${userVersion}, newer than this knitbone knows (${newest}); open it with a newer knitbone, nothing was changed`,
    });
  }
  if (problems.length) throw new KnitboneError('refused', problems);

  const done = new Set(applied.map((r) => r.version));
  const pending = migrations.filter((m) => !done.has(m.version));
  const from = applied.reduce((v, r) => Math.max(v, r.version), 0);
  const outcome: MigrationOutcome = { applied: [], from, to: from };
  if (pending.length === 0) return outcome;

  if (applied.length > 0) outcome.backupPath = backupBeside(db, catalogueFile, from, now());

  db.exec(createBookkeeping);
  const record = db.prepare(`INSERT INTO schema_migration (version, name, checksum, applied_at) VALUES (?, ?, ?, ?)`);
  for (const m of pending) {
    const apply = db.transaction(() => {
      db.exec(m.sql);
      record.run(m.version, m.name, m.checksum, now().toISOString());
      // Areas number their migrations in their own ranges and land at different times, so a
      // lower number may arrive after a higher one was applied: the version is the highest.
      db.pragma(`user_version = ${Math.max(m.version, outcome.to)}`);
    });
    try {
      apply();
    } catch (err) {
      throw new KnitboneError('internal', [
        { file: `migrations/${m.name}.sql`, message: `migration failed and was rolled back: ${(err as Error).message}` },
      ]);
    }
    outcome.applied.push(m.version);
    outcome.to = Math.max(outcome.to, m.version);
  }
  return outcome;
}

/** `site.sqlite` -> `site.before-v0001-20261201T223000Z.sqlite`, never overwriting a file. */
function backupBeside(db: Database.Database, catalogueFile: string, version: number, at: Date): string {
  const stamp = at.toISOString().replace(/[-:]/g, '').replace(/\.\d+Z$/, 'Z');
  const ext = extname(catalogueFile);
  const stem = ext ? catalogueFile.slice(0, -ext.length) : catalogueFile;
  let target = `${stem}.before-v${String(version).padStart(4, '0')}-${stamp}${ext || '.sqlite'}`;
  for (let i = 2; existsSync(target); i++) target = `${stem}.before-v${String(version).padStart(4, '0')}-${stamp}-${i}${ext || '.sqlite'}`;
  db.prepare('VACUUM INTO ?').run(target);
  return target;
}
