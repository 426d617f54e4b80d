import { closestTerms, termKey } from './normalise';

/**
 * From what someone typed to the canonical term, and "did you mean" suggestions, over a
 * fixed index of spellings (normalised key -> canonical term). Imports repeat the same few
 * spellings thousands of times, so both answers are remembered (up to a bound).
 */
export class TermLookup {
  private readonly resolved = new Map<string, string | undefined>();
  private readonly suggested = new Map<string, string[]>();

  constructor(private readonly byKey: ReadonlyMap<string, string>) {}

  /** The canonical term for what someone typed (any case, spacing, synonym), or undefined. */
  resolve(typed: string): string | undefined {
    if (this.resolved.has(typed)) return this.resolved.get(typed);
    const found = this.byKey.get(termKey(typed));
    if (this.resolved.size < 50_000) this.resolved.set(typed, found);
    return found;
  }

  /** Closest canonical terms to an unknown spelling, for "did you mean" messages. */
  suggest(typed: string, limit = 3): string[] {
    const key = `${limit}\u0000${typed}`;
    let found = this.suggested.get(key);
    if (!found) {
      found = closestTerms(typed, this.byKey.entries(), limit);
      if (this.suggested.size < 10_000) this.suggested.set(key, found);
    }
    return [...found];
  }
}
