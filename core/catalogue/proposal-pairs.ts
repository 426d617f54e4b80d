import type { Catalogue } from './catalogue';

export interface ProposalPairRecord {
  scanA: number;
  scanB: number;
  parametersHash: string;
  methodVersion: string;
  /**
   * The best motion's score when it reaches the run's minimum score (the proposal's geometry
   * score); null when no motion reached it: a propose worker stops as soon as no motion can
   * (score upper bounds, pairwise-match.ts bestDistinct), so no exact figure is worked out for
   * such a pair. Rows written before 3 Dec 2026 may hold a score below the minimum instead.
   */
  bestScore: number | null;
  joinId: number | null;
  doneAt: string;
}

/**
 * Which scan pairs the matcher has compared, per parameter set (migration 0030). Writes go in
 * the caller's transaction together with the proposal they produced.
 */
export class ProposalPairRepository {
  constructor(private readonly cat: Catalogue) {}

  /**
   * Pairs done with these parameters, as "scanA:scanB" keys (scanA < scanB). A pair stops
   * counting as done when a region of either scan has been corrected since (scan_region_class,
   * migration 0020): the correction changes that scan's break faces, so the pair is aligned
   * again. Nothing is deleted; the next run's record updates the row.
   */
  doneKeys(parametersHash: string): Set<string> {
    const rows = this.cat.db
      .prepare(
        `SELECT p.scan_a, p.scan_b FROM proposal_pair p
         WHERE p.parameters_hash = ?
           AND NOT EXISTS (SELECT 1 FROM scan_region_class c WHERE c.scan_id IN (p.scan_a, p.scan_b) AND c.created_at >= p.done_at)`,
      )
      .all(parametersHash) as Array<{ scan_a: number; scan_b: number }>;
    return new Set(rows.map((r) => `${r.scan_a}:${r.scan_b}`));
  }

  record(r: Omit<ProposalPairRecord, 'doneAt'>): void {
    const [a, b] = r.scanA < r.scanB ? [r.scanA, r.scanB] : [r.scanB, r.scanA];
    this.cat.db
      .prepare(
        `INSERT INTO proposal_pair (scan_a, scan_b, parameters_hash, method_version, best_score, join_id, done_at)
         VALUES (?, ?, ?, ?, ?, ?, ?)
         ON CONFLICT (scan_a, scan_b, parameters_hash) DO UPDATE SET best_score = excluded.best_score, join_id = excluded.join_id, done_at = excluded.done_at`,
      )
      .run(a, b, r.parametersHash, r.methodVersion, r.bestScore, r.joinId, new Date().toISOString());
  }

  count(parametersHash?: string): number {
    const row = (parametersHash
      ? this.cat.db.prepare('SELECT count(*) AS n FROM proposal_pair WHERE parameters_hash = ?').get(parametersHash)
      : this.cat.db.prepare('SELECT count(*) AS n FROM proposal_pair').get()) as { n: number };
    return row.n;
  }
}
