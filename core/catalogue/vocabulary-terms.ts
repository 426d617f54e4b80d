import type Database from 'better-sqlite3';
import { KnitboneError } from '../host/errors';
import type { HistoryRepository } from './history';
import type { VocabularyKind, VocabularyTermRecord } from './records';

interface TermRow {
  id: number;
  kind: string;
  term: string;
  parent: string | null;
  details: string;
  source: string | null;
  created_at: string;
}

export interface NewVocabularyTerm {
  kind: VocabularyKind;
  term: string;
  parent?: string | null;
  details?: Record<string, unknown>;
  source?: string | null;
}

/**
 * Terms an analyst added to this catalogue (a taxon or element the built-in vocabulary
 * lacks). Checking them against the built-in hierarchy is core/vocab's job; the
 * catalogue only keeps them.
 */
export class VocabularyTermRepository {
  constructor(
    private readonly db: Database.Database,
    private readonly history: HistoryRepository,
    private readonly defaultWho: string,
  ) {}

  add(t: NewVocabularyTerm, who: string = this.defaultWho): VocabularyTermRecord {
    const run = this.db.transaction((): VocabularyTermRecord => {
      const at = new Date().toISOString();
      try {
        this.db
          .prepare('INSERT INTO vocabulary_term (kind, term, parent, details, source, created_at) VALUES (?, ?, ?, ?, ?, ?)')
          .run(t.kind, t.term, t.parent ?? null, JSON.stringify(t.details ?? {}), t.source ?? null, at);
      } catch (err) {
        if ((err as { code?: string }).code === 'SQLITE_CONSTRAINT_UNIQUE') {
          throw new KnitboneError('conflict', [{ field: 'term', message: `the ${t.kind} "${t.term}" is already in this catalogue's vocabulary` }]);
        }
        throw err;
      }
      const rec = this.list(t.kind).find((r) => r.term === t.term)!;
      this.history.record({ at, who, entity: 'vocabulary_term', entityId: rec.id, action: 'insert', after: rec });
      return rec;
    });
    return run();
  }

  list(kind?: VocabularyKind): VocabularyTermRecord[] {
    const rows = kind === undefined
      ? this.db.prepare('SELECT * FROM vocabulary_term ORDER BY kind, id').all()
      : this.db.prepare('SELECT * FROM vocabulary_term WHERE kind = ? ORDER BY id').all(kind);
    return (rows as TermRow[]).map((r) => ({
      id: r.id,
      kind: r.kind as VocabularyKind,
      term: r.term,
      parent: r.parent,
      details: JSON.parse(r.details) as Record<string, unknown>,
      source: r.source,
      createdAt: r.created_at,
    }));
  }
}
