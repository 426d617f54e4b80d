/**
 * Matching what people type to canonical terms: case, accents, spacing, punctuation and
 * separators do not matter ("Cervus  elaphus", "cervus_elaphus", "L.", "prox. end").
 */

/** The key a term is looked up by: NFKC, lower case, '_'/'-'/'.' as spaces, spaces collapsed. */
export function termKey(text: string): string {
  return text
    .normalize('NFKC')
    .toLowerCase()
    .replace(/[\u2010-\u2015]/g, '-')
    .replace(/[_.\-]+/g, ' ')
    .replace(/\s+/g, ' ')
    .trim();
}

/** Optimal string alignment distance (Levenshtein with adjacent transpositions). */
export function editDistance(a: string, b: string): number {
  if (a === b) return 0;
  const n = a.length;
  const m = b.length;
  if (n === 0) return m;
  if (m === 0) return n;
  let prev2 = new Array<number>(m + 1).fill(0);
  let prev = Array.from({ length: m + 1 }, (_, j) => j);
  let cur = new Array<number>(m + 1).fill(0);
  for (let i = 1; i <= n; i++) {
    cur[0] = i;
    for (let j = 1; j <= m; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let v = Math.min(prev[j] + 1, cur[j - 1] + 1, prev[j - 1] + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) v = Math.min(v, prev2[j - 2] + 1);
      cur[j] = v;
    }
    [prev2, prev, cur] = [prev, cur, prev2];
  }
  return prev[m];
}

/**
 * The closest canonical terms to what was typed, best first: by edit distance between
 * keys (against every spelling we know, so "red dear" finds "Cervus elaphus"), with a
 * bonus for a shared prefix. At most `limit`, none further than about a third of the length.
 */
export function closestTerms(typed: string, spellings: Iterable<[key: string, canonical: string]>, limit = 3): string[] {
  const key = termKey(typed);
  if (!key) return [];
  const best = new Map<string, number>();
  const maxD = Math.max(2, Math.ceil(key.length / 3));
  for (const [k, canonical] of spellings) {
    const prefix = k.startsWith(key) || key.startsWith(k);
    // The distance is at least the difference in length: skip what cannot come close.
    if (!prefix && Math.abs(k.length - key.length) > maxD) continue;
    let d = prefix ? Math.abs(k.length - key.length) : editDistance(key, k);
    if (prefix) d = Math.min(d, Math.abs(k.length - key.length) * 0.25 + 0.5);
    const old = best.get(canonical);
    if (old === undefined || d < old) best.set(canonical, d);
  }
  return [...best.entries()]
    .filter(([, d]) => d <= maxD)
    .sort((x, y) => x[1] - y[1] || x[0].localeCompare(y[0]))
    .slice(0, limit)
    .map(([c]) => c);
}
