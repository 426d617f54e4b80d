/**
 * Extra places in a fragment pair's fine shortlist for face pairs that have none (pairwise-match.ts
 * fineShortlist, MatchParameters.fineFacePairPlaces). The shortlist ranks screened motions by
 * overlap share, so on fragment pairs with many faces the places fill with wrong turns of one or
 * two face pairs that cover a face well, while the face pair that meets under the truth ranks
 * 25th-35th or under fineRatio of the best (a partial contact covers less of its face). A
 * motion of a face pair nobody else speaks for is then never refined, and the fragment pair
 * stores nothing (dev s340 at 200 fragments: 5 of 68 "nothing stored" joins; DEVELOPERS.md).
 */

/**
 * `shortlist` with up to `places` more motions: the best-ranked one of each face pair (`i`, `j`)
 * with none in it yet, taken in the order of `ranked` (every screened motion that may enter the
 * fine step, best first), whatever rank ratio or repeat rule left it out.
 */
export function withFacePairPlaces<T extends { i: number; j: number }>(shortlist: T[], ranked: T[], places: number): T[] {
  if (!(places > 0)) return shortlist;
  const out = [...shortlist];
  const has = new Set(out.map((s) => `${s.i},${s.j}`));
  for (const s of ranked) {
    if (out.length >= shortlist.length + places) break;
    const key = `${s.i},${s.j}`;
    if (has.has(key)) continue;
    has.add(key);
    out.push(s);
  }
  return out;
}
