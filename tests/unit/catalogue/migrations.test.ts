import { createHash } from 'node:crypto';
import { copyFileSync, existsSync, readFileSync, writeFileSync, mkdirSync } from 'node:fs';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { describe, expect, it } from 'vitest';
import { openCatalogue } from '../../../core/catalogue/catalogue';
import { defaultMigrationsDir, readMigrations } from '../../../core/catalogue/migrate';
import { emptySpecimenFields } from '../../../core/catalogue/records';
import { KnitboneError } from '../../../core/host/errors';
import { tempDir } from './helpers';

/**
 * A private copy of the shipped catalogue migrations (0001-0008: other areas' numbers come
 * later and would make the test's 0009 look older than the schema) that a test may extend.
 */
function migrationsCopy(): string {
  const dir = join(tempDir('knitbone-mig-'), 'migrations');
  mkdirSync(dir);
  for (const m of readMigrations().filter((x) => x.version < 9)) copyFileSync(join(defaultMigrationsDir, `${m.name}.sql`), join(dir, `${m.name}.sql`));
  return dir;
}

const newestShipped = () => Math.max(...readMigrations().map((m) => m.version));

function refusal(fn: () => unknown): KnitboneError {
  try {
    fn();
  } catch (err) {
    expect(err).toBeInstanceOf(KnitboneError);
    return err as KnitboneError;
  }
  throw new Error('expected a refusal');
}

describe('catalogue migrations', () => {
  it('creates a fresh catalogue: WAL, foreign keys on, every migration recorded with its SHA-256', () => {
    const file = join(tempDir(), 'site.sqlite');
    const cat = openCatalogue(file, { create: true });
    expect(cat.created).toBe(true);
    expect(cat.db.pragma('journal_mode', { simple: true })).toBe('wal');
    expect(cat.db.pragma('foreign_keys', { simple: true })).toBe(1);
    const rows = cat.db.prepare('SELECT version, name, checksum FROM schema_migration ORDER BY version').all() as {
      version: number; name: string; checksum: string;
    }[];
    const files = readMigrations();
    expect(rows.map((r) => r.version)).toEqual(files.map((f) => f.version));
    // Reference: node:crypto's SHA-256 over the file bytes as stored (LF line endings).
    for (const r of rows) {
      const text = readFileSync(join(defaultMigrationsDir, `${r.name}.sql`), 'utf8').replace(/\r\n?/g, '\n');
      expect(r.checksum).toBe(createHash('sha256').update(text).digest('hex'));
    }
    const tables = (cat.db.prepare(`SELECT name FROM sqlite_master WHERE type = 'table'`).all() as { name: string }[]).map((t) => t.name);
    for (const t of ['specimen', 'scan', 'specimen_join', 'derived_identification', 'history', 'setting', 'vocabulary_term']) {
      expect(tables).toContain(t);
    }
    cat.close();
  });

  it('upgrades an older catalogue after taking a VACUUM INTO copy beside it', () => {
    const dir = migrationsCopy();
    const file = join(tempDir(), 'site.sqlite');
    const v1 = openCatalogue(file, { create: true, migrations: readMigrations(dir) });
    v1.specimens.insert({ ...emptySpecimenFields('KB-1'), unit: 'N12E4' });
    const oldVersion = v1.schemaVersion(); // the newest shipped migration (other areas add theirs)
    v1.close();

    writeFileSync(join(dir, '9990_test_addition.sql'), 'CREATE TABLE test_addition (id INTEGER PRIMARY KEY);\n');
    const v2 = openCatalogue(file, { migrations: readMigrations(dir) });
    expect(v2.migration.applied).toEqual([9990]);
    expect(v2.schemaVersion()).toBe(9990);
    const backup = v2.migration.backupPath!;
    expect(backup).toBeTruthy();
    expect(existsSync(backup)).toBe(true);
    expect(backup.startsWith(file.replace(/\.sqlite$/, ''))).toBe(true);
    v2.close();

    // The copy is the catalogue as it was: old schema version, same specimens, no new table.
    const copy = new Database(backup, { readonly: true });
    expect(copy.pragma('user_version', { simple: true })).toBe(oldVersion);
    expect(copy.prepare('SELECT catalogue_no, unit FROM specimen').all()).toEqual([{ catalogue_no: 'KB-1', unit: 'N12E4' }]);
    expect(copy.prepare(`SELECT count(*) AS n FROM sqlite_master WHERE name = 'test_addition'`).get()).toEqual({ n: 0 });
    copy.close();
  });

  it('refuses a catalogue whose applied migration file was changed since, and changes nothing', () => {
    const dir = migrationsCopy();
    const file = join(tempDir(), 'site.sqlite');
    openCatalogue(file, { create: true, migrations: readMigrations(dir) }).close();
    const first = readMigrations(dir)[0];
    writeFileSync(join(dir, `${first.name}.sql`), first.sql + '\n-- edited afterwards\n');
    const err = refusal(() => openCatalogue(file, { migrations: readMigrations(dir) }));
    expect(err.kind).toBe('refused');
    expect(err.message).toMatch(/was changed after it was applied/);
    const db = new Database(file, { readonly: true });
    expect(db.prepare('SELECT checksum FROM schema_migration WHERE version = ?').get(first.version)).toEqual({ checksum: first.checksum });
    db.close();
  });

  it('refuses a catalogue written by a newer knitbone and leaves it as it was', () => {
    const dir = migrationsCopy();
    writeFileSync(join(dir, '9991_newer.sql'), 'CREATE TABLE newer (id INTEGER PRIMARY KEY);\n');
    const file = join(tempDir(), 'site.sqlite');
    openCatalogue(file, { create: true, migrations: readMigrations(dir) }).close();
    const before = readFileSync(file);
    const err = refusal(() => openCatalogue(file));
    expect(err.kind).toBe('refused');
    expect(err.message).toMatch(/newer knitbone/);
    expect(readFileSync(file).equals(before)).toBe(true);
  });

  it('applies a lower-numbered migration that lands after a higher one, keeping the highest version', () => {
    // Areas own number ranges and land at different times (0040 before 0010, say).
    const dir = migrationsCopy();
    writeFileSync(join(dir, '9995_later_area.sql'), 'CREATE TABLE later_area (id INTEGER PRIMARY KEY);\n');
    const file = join(tempDir(), 'site.sqlite');
    openCatalogue(file, { create: true, migrations: readMigrations(dir) }).close();
    writeFileSync(join(dir, '9993_earlier_area.sql'), 'CREATE TABLE earlier_area (id INTEGER PRIMARY KEY);\n');
    const cat = openCatalogue(file, { migrations: readMigrations(dir) });
    expect(cat.migration.applied).toEqual([9993]);
    expect(cat.schemaVersion()).toBe(9995);
    expect(cat.db.prepare(`SELECT count(*) AS n FROM sqlite_master WHERE name = 'earlier_area'`).get()).toEqual({ n: 1 });
    cat.close();
  });

  it('rolls a failing migration back completely', () => {
    const dir = migrationsCopy();
    const file = join(tempDir(), 'site.sqlite');
    const created = openCatalogue(file, { create: true, migrations: readMigrations(dir) });
    const oldVersion = created.schemaVersion();
    created.close();
    writeFileSync(join(dir, '9992_broken.sql'), 'CREATE TABLE half_done (id INTEGER);\nTHIS IS NOT SQL;\n');
    expect(() => openCatalogue(file, { migrations: readMigrations(dir) })).toThrow(/rolled back/);
    const db = new Database(file, { readonly: true });
    expect(db.pragma('user_version', { simple: true })).toBe(oldVersion);
    expect(db.prepare(`SELECT count(*) AS n FROM sqlite_master WHERE name = 'half_done'`).get()).toEqual({ n: 0 });
    db.close();
  });

  it('refuses a SQLite file that is not a catalogue, and a missing file unless creating', () => {
    const file = join(tempDir(), 'other.sqlite');
    const other = new Database(file);
    other.exec('CREATE TABLE customers (id INTEGER)');
    other.close();
    expect(refusal(() => openCatalogue(file)).message).toMatch(/not a knitbone catalogue/);
    expect(refusal(() => openCatalogue(join(tempDir(), 'missing.sqlite'))).kind).toBe('not-found');
  });
});
