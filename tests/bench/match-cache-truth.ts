/**
 * The generator's truth for the candidate pairs of an imported bench catalogue's match cache
 * (match-cache-pairs.ts): each cached fragment's catalogue number (through the catalogue's scans),
 * the true joins' motions (both ways round, conjoins with at least 30% of the break surviving, as
 * the proposals bench counts them; truth.json of the generated folder two levels above the
 * catalogue), and the fragment pairs to study: every `maxPairs`-th of all, evenly strided, and
 * every true pair besides.
 */
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { openCatalogue } from '../../core/catalogue/catalogue';
import { fragmentKey } from '../../core/jobs/fragment-cache';
import { invert } from '../../core/geometry/registration/rigid-transform';
import { matchCachePairs, type CachePairs } from './match-cache-pairs';

export interface CacheTruth extends CachePairs {
  /** Catalogue number of each cached fragment. */
  nos: string[];
  /** "A|B" (catalogue numbers) -> the true motion of B onto A. */
  joins: Map<string, number[]>;
  /** The studied fragment pairs (strided, and every true pair). */
  studied: CachePairs['grouped'];
}

export function matchCacheTruth(dir: string, maxPairs: number): CacheTruth {
  const catalogue = dir.replace(/\.match-cache\/?$/, '');
  interface Join { a: string; b: string; type: string; survivingFraction: number; transformBToA: number[] }
  const truth = JSON.parse(readFileSync(join(dirname(dirname(catalogue)), 'truth.json'), 'utf8')) as { joins: Join[] };
  const cat = openCatalogue(catalogue);
  const numbers = new Map(cat.specimens.list().map((s) => [s.id, s.catalogueNo]));
  const noOfKey = new Map(cat.scans.list().map((s) => [fragmentKey(s.contentHash, s.units, (s.stats as { settings?: unknown }).settings, []), numbers.get(s.specimenId) ?? '']));
  cat.close();
  const pairs = matchCachePairs(dir, Infinity);
  const nos = pairs.cached.map((c) => noOfKey.get(c.key) ?? '');
  const joins = new Map<string, number[]>();
  for (const j of truth.joins) if (j.type === 'conjoin' && j.survivingFraction >= 0.3) {
    joins.set(`${j.a}|${j.b}`, j.transformBToA);
    joins.set(`${j.b}|${j.a}`, invert(j.transformBToA));
  }
  const all = pairs.grouped;
  const stride = Math.max(1, Math.floor(all.length / Math.min(maxPairs, all.length)));
  const studied = all.filter((l, i) => i % stride === 0 || joins.has(`${nos[l[0].a]}|${nos[l[0].b]}`));
  return { ...pairs, nos, joins, studied };
}
