/**
 * Disjoint sets over specimen indices 0..n-1, with path halving and union by size
 * (Tarjan 1975). A refit set is a connected component of accepted conjoins (design.md
 * section 6), so union-find is the natural structure: near-constant time per join.
 *
 * Each element also carries a parity bit relative to its root, used for sides: a conjoin
 * says "same side" (parity 0), a pair says "opposite side" (parity 1). Components without
 * that use leave every parity at 0.
 */
export class UnionFind {
  private readonly parent: Int32Array;
  private readonly size: Int32Array;
  /** Parity of each element relative to its parent (after find: relative to its root). */
  private readonly parity: Uint8Array;

  constructor(n: number) {
    this.parent = new Int32Array(n);
    this.size = new Int32Array(n).fill(1);
    this.parity = new Uint8Array(n);
    for (let i = 0; i < n; i++) this.parent[i] = i;
  }

  get length(): number {
    return this.parent.length;
  }

  /** Root of i's component; compresses the path and keeps parities relative to the root. */
  find(i: number): number {
    let root = i;
    let p = 0;
    while (this.parent[root] !== root) {
      p ^= this.parity[root];
      root = this.parent[root];
    }
    // Second pass: point every node on the path straight at the root with its full parity.
    let node = i;
    let acc = p;
    while (this.parent[node] !== node) {
      const next = this.parent[node];
      const own = this.parity[node];
      this.parent[node] = root;
      this.parity[node] = acc;
      acc ^= own;
      node = next;
    }
    return root;
  }

  /** Parity of i relative to its root (0 when unused). */
  parityOf(i: number): number {
    this.find(i);
    return this.parent[i] === i ? 0 : this.parity[i];
  }

  same(a: number, b: number): boolean {
    return this.find(a) === this.find(b);
  }

  /**
   * Join the components of a and b so that parity(a) xor parity(b) === relation.
   * Returns the new root and the old root that was absorbed (or null when already joined).
   */
  union(a: number, b: number, relation: 0 | 1 = 0): { root: number; absorbed: number | null; flipped: boolean } {
    const ra = this.find(a);
    const rb = this.find(b);
    if (ra === rb) return { root: ra, absorbed: null, flipped: false };
    const pa = this.parityOf(a);
    const pb = this.parityOf(b);
    // parity of the absorbed root relative to the kept root
    const rootParity = (pa ^ pb ^ relation) as 0 | 1;
    let keep = ra;
    let absorb = rb;
    if (this.size[ra] < this.size[rb]) {
      keep = rb;
      absorb = ra;
    }
    this.parent[absorb] = keep;
    this.parity[absorb] = rootParity;
    this.size[keep] += this.size[absorb];
    return { root: keep, absorbed: absorb, flipped: rootParity === 1 };
  }

  sizeOf(i: number): number {
    return this.size[this.find(i)];
  }
}
