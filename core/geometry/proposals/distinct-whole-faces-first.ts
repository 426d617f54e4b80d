/**
 * A candidate list with its places going to distinct whole faces first (candidate-index.ts,
 * DISTINCT_WHOLE_FACES 'each list'): the list in its order, except that an item of a group (the
 * whole break face a face or part belongs to) already met moves behind every item that is not,
 * stable otherwise, so the first places go to as many groups as there are. A merged break face is
 * indexed as the whole and its parts, which look alike and would otherwise take several places.
 */
export function distinctWholeFacesFirst<T>(list: readonly T[], group: (item: T) => string): T[] {
  const seen = new Set<string>();
  const first: T[] = [], later: T[] = [];
  for (const item of list) {
    const g = group(item);
    (seen.has(g) ? later : first).push(item);
    seen.add(g);
  }
  return first.concat(later);
}
