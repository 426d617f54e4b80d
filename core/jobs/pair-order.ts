/**
 * An order for the fragment pairs of a proposal run that keeps each worker's cache of prepared
 * fragments useful when there are more fragments than it holds: number the fragments so that
 * candidate partners get nearby numbers (reverse Cuthill-McKee, Cuthill & McKee 1969; George
 * 1971: breadth-first from a low-degree fragment, neighbours by increasing degree, reversed),
 * then take the pairs by their smaller number, then their larger. The pairs then sweep along a
 * narrow band, so a fragment is prepared about once per worker instead of once per pair.
 */

/** Position of each node (0..n-1) in the reverse Cuthill-McKee order of the graph given by its edges. */
export function reverseCuthillMcKee(n: number, edges: Array<[number, number]>): Int32Array {
  const adj: number[][] = Array.from({ length: n }, () => []);
  for (const [a, b] of edges) {
    if (a === b) continue;
    adj[a].push(b);
    adj[b].push(a);
  }
  const degree = adj.map((l) => l.length);
  for (const l of adj) l.sort((p, q) => degree[p] - degree[q] || p - q);
  const seen = new Uint8Array(n);
  const order: number[] = [];
  // every connected part, each from its lowest-degree node
  const starts = Array.from({ length: n }, (_, i) => i).sort((p, q) => degree[p] - degree[q] || p - q);
  for (const s of starts) {
    if (seen[s]) continue;
    seen[s] = 1;
    let head = order.length;
    order.push(s);
    while (head < order.length) {
      const v = order[head++];
      for (const w of adj[v]) if (!seen[w]) { seen[w] = 1; order.push(w); }
    }
  }
  const position = new Int32Array(n);
  order.reverse().forEach((v, i) => (position[v] = i));
  return position;
}

/** Sort pairs of nodes so that the pairs sweep along the band of the reverse Cuthill-McKee order. */
export function bandOrder<T>(items: T[], pairOf: (item: T) => [number, number], n: number): T[] {
  const position = reverseCuthillMcKee(n, items.map(pairOf));
  const key = (t: T): [number, number] => {
    const [a, b] = pairOf(t);
    const pa = position[a], pb = position[b];
    return pa < pb ? [pa, pb] : [pb, pa];
  };
  return items
    .map((t) => ({ t, k: key(t) }))
    .sort((p, q) => p.k[0] - q.k[0] || p.k[1] - q.k[1])
    .map((x) => x.t);
}
