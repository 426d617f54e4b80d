import { existsSync, statSync } from 'node:fs';
import { userInfo } from 'node:os';
import { resolve } from 'node:path';
import Database from 'better-sqlite3';
import { KnitboneError } from '../host/errors';
import { DerivedIdentificationRepository } from './derived';
import { HistoryRepository } from './history';
import { JoinRepository } from './joins';
import { migrate, readMigrations, type MigrationFile, type MigrationOutcome } from './migrate';
import { RegionClassRepository } from './region-classes';
import { ScanRepository } from './scans';
import { SettingsRepository } from './settings';
import { SpecimenRepository } from './specimens';
import { VocabularyTermRepository } from './vocabulary-terms';

/** Marks a SQLite file as a knitbone catalogue (PRAGMA application_id; "KNBN" in ASCII). */
export const KNITBONE_APPLICATION_ID = 0x4b4e424e;

export interface OpenOptions {
  /** Create the file if it does not exist (knitbone init). Default false: a missing file is 'not-found'. */
  create?: boolean;
  /** Who is working, for history entries. Default: the KNITBONE_ANALYST variable, else the OS user name. */
  who?: string;
  /** Migrations to apply (tests use their own folder); default: migrations/ of this checkout. */
  migrations?: MigrationFile[];
  readonly?: boolean;
}

/**
 * One open assemblage catalogue: a SQLite file in WAL mode with foreign keys on, at the
 * newest schema, with a repository per record kind. Close it when done.
 *
 *   const cat = openCatalogue('site.sqlite');
 *   cat.specimens.insert({...emptySpecimenFields('KB-1'), taxon: 'Cervus elaphus'});
 *   cat.transaction(() => { ...several writes, all or none... });
 *   cat.close();
 */
export class Catalogue {
  readonly history: HistoryRepository;
  readonly specimens: SpecimenRepository;
  readonly scans: ScanRepository;
  /** The analyst's corrections of scan region classes (scans area, migration 0020). */
  readonly regionClasses: RegionClassRepository;
  readonly joins: JoinRepository;
  readonly derived: DerivedIdentificationRepository;
  readonly settings: SettingsRepository;
  readonly vocabulary: VocabularyTermRepository;

  constructor(
    /** The SQLite connection, for code inside core/catalogue only. */
    readonly db: Database.Database,
    readonly path: string,
    readonly who: string,
    /** What opening did to the schema. */
    readonly migration: MigrationOutcome,
    readonly created: boolean,
  ) {
    this.history = new HistoryRepository(db);
    this.specimens = new SpecimenRepository(db, this.history, who);
    this.scans = new ScanRepository(db, this.history, who);
    this.regionClasses = new RegionClassRepository(db, this.history, who);
    this.joins = new JoinRepository(db, this.history, who);
    this.derived = new DerivedIdentificationRepository(db, this.history, who);
    this.settings = new SettingsRepository(db, this.history, who);
    this.vocabulary = new VocabularyTermRepository(db, this.history, who);
  }

  /** Run fn in one transaction (nested calls become savepoints): all its writes or none. */
  transaction<T>(fn: () => T): T {
    return this.db.transaction(fn)();
  }

  /** Schema version (highest applied migration number). */
  schemaVersion(): number {
    return this.db.pragma('user_version', { simple: true }) as number;
  }

  close(): void {
    if (this.db.open) this.db.close();
  }
}

export function defaultWho(): string {
  const env = process.env.KNITBONE_ANALYST?.trim();
  if (env) return env;
  try {
    return userInfo().username || 'unknown';
  } catch {
    return 'unknown';
  }
}

/**
 * Open (or with `create`, create) a catalogue and bring its schema up to date. Refuses a
 * file that is not a knitbone catalogue, one written by a newer knitbone, and one whose
 * applied migrations were edited since. Before migrating a catalogue that already had a
 * schema it takes a VACUUM INTO copy beside it (see Catalogue.migration.backupPath).
 */
export function openCatalogue(path: string, options: OpenOptions = {}): Catalogue {
  const file = resolve(path);
  const existed = existsSync(file);
  if (!existed && !options.create) {
    throw new KnitboneError('not-found', [{ file: path, message: 'no catalogue here; create one with `knitbone init <catalogue.sqlite>`' }]);
  }
  if (existed && statSync(file).isDirectory()) {
    throw new KnitboneError('bad-input', [{ file: path, message: 'this is a folder; give the path of a catalogue file' }]);
  }
  let db: Database.Database;
  try {
    db = new Database(file, { readonly: options.readonly ?? false, fileMustExist: !options.create });
  } catch (err) {
    throw new KnitboneError('bad-input', [{ file: path, message: `cannot open: ${(err as Error).message}` }]);
  }
  try {
    db.pragma('busy_timeout = 5000');
    let appId: number;
    let tableCount: number;
    try {
      appId = db.pragma('application_id', { simple: true }) as number;
      tableCount = (db.prepare(`SELECT count(*) AS n FROM sqlite_master WHERE type = 'table'`).get() as { n: number }).n;
    } catch (err) {
      throw new KnitboneError('bad-input', [{ file: path, message: `not a knitbone catalogue (${(err as Error).message})` }]);
    }
    if (tableCount > 0 && appId !== KNITBONE_APPLICATION_ID) {
      throw new KnitboneError('refused', [{ file: path, message: 'this SQLite file is not a knitbone catalogue; nothing was changed' }]);
    }
    if (!options.readonly) {
      db.pragma('journal_mode = WAL');
      if (appId !== KNITBONE_APPLICATION_ID) db.pragma(`application_id = ${KNITBONE_APPLICATION_ID}`);
    }
    db.pragma('foreign_keys = ON');
    const migrations = options.migrations ?? readMigrations();
    const outcome = options.readonly
      ? { applied: [], from: db.pragma('user_version', { simple: true }) as number, to: db.pragma('user_version', { simple: true }) as number }
      : migrate(db, path, migrations);
    return new Catalogue(db, file, options.who?.trim() || defaultWho(), outcome, !existed || tableCount === 0);
  } catch (err) {
    db.close();
    throw err;
  }
}

/** Open, run fn, close (also when fn throws). For host requests that work on one catalogue. */
export async function withCatalogue<T>(path: string, fn: (cat: Catalogue) => T | Promise<T>, options: OpenOptions = {}): Promise<T> {
  const cat = openCatalogue(path, options);
  try {
    return await fn(cat);
  } finally {
    cat.close();
  }
}
