/** The catalogue's public surface: open a catalogue, its repositories and record types. */
export { Catalogue, openCatalogue, withCatalogue, defaultWho, KNITBONE_APPLICATION_ID, type OpenOptions } from './catalogue';
export * from './records';
export type { NewJoin, JoinPatch, JoinFilter } from './joins';
export type { NewScan } from './scans';
export type { RegionClassCorrection, RegionSurfaceClass } from './region-classes';
export type { SpecimenFilter, SpecimenUpdate } from './specimens';
export type { NewHistoryEntry, HistoryFilter } from './history';
export type { NewVocabularyTerm } from './vocabulary-terms';
export { readMigrations, migrate, migrationChecksum, type MigrationFile, type MigrationOutcome } from './migrate';
