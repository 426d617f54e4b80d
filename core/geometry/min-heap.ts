/**
 * A binary min-heap of (item, key) pairs with the smallest key on top, for Dijkstra searches
 * over mesh vertices (ridges.ts, face-corner-split.ts). Keys and items live in two parallel
 * arrays; `pop` returns the item and leaves its key in `lastKey`, so a search allocates nothing
 * per step.
 */
export class MinHeap {
  private keys: number[] = [];
  private items: number[] = [];
  /** Key of the item `pop` returned last. */
  lastKey = NaN;

  get size(): number {
    return this.items.length;
  }

  clear(): void {
    this.keys.length = 0;
    this.items.length = 0;
  }

  push(item: number, key: number): void {
    const items = this.items, keys = this.keys;
    let i = items.length;
    items.push(item);
    keys.push(key);
    while (i > 0) {
      const up = (i - 1) >> 1;
      if (keys[up] <= key) break;
      items[i] = items[up];
      keys[i] = keys[up];
      i = up;
    }
    items[i] = item;
    keys[i] = key;
  }

  /** Removes and returns the item with the smallest key (its key in `lastKey`). */
  pop(): number {
    const items = this.items, keys = this.keys;
    const top = items[0];
    this.lastKey = keys[0];
    const lastItem = items.pop()!, lastKey = keys.pop()!;
    const n = items.length;
    if (n) {
      let i = 0;
      for (;;) {
        const l = 2 * i + 1, r = l + 1;
        let m = -1, mk = lastKey;
        if (l < n && keys[l] < mk) { m = l; mk = keys[l]; }
        if (r < n && keys[r] < mk) { m = r; mk = keys[r]; }
        if (m < 0) break;
        items[i] = items[m];
        keys[i] = mk;
        i = m;
      }
      items[i] = lastItem;
      keys[i] = lastKey;
    }
    return top;
  }
}
