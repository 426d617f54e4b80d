import { termKey } from './normalise';
import { TermLookup } from './term-lookup';

/** One term of a hierarchy (a taxon or a skeletal element). */
export interface HierarchyNode {
  /** The canonical spelling, stored in the catalogue. */
  name: string;
  /** Canonical name of the parent; null for a root. */
  parent: string | null;
  /** Other spellings and abbreviations that mean this term. */
  synonyms: readonly string[];
}

/**
 * A tree of terms with the queries every area needs: ancestry, compatibility of two
 * observations, the most specific term consistent with several, and lookup of what a
 * person typed. Immutable and pure (no I/O); built from data by buildVocabulary().
 *
 * Compatibility: two terms are compatible when one is the other or its ancestor ("Cervidae"
 * and "Cervus elaphus"; "long bone" and "femur"); the more specific one then describes both.
 * A missing observation (null) is compatible with anything.
 */
export class Hierarchy<N extends HierarchyNode = HierarchyNode> {
  private readonly nodes = new Map<string, N>();
  private readonly byKey = new Map<string, string>();
  private readonly depthOf = new Map<string, number>();
  private readonly lookup = new TermLookup(this.byKey);

  constructor(nodes: readonly N[], readonly kind: string) {
    for (const n of nodes) {
      if (this.nodes.has(n.name)) throw new Error(`${kind} "${n.name}" is defined twice`);
      this.nodes.set(n.name, n);
    }
    for (const n of nodes) {
      if (n.parent !== null && !this.nodes.has(n.parent)) throw new Error(`${kind} "${n.name}" has unknown parent "${n.parent}"`);
    }
    for (const n of nodes) {
      this.depth(n.name);
      this.addSpelling(n.name, n.name);
    }
    // Synonyms after names, so a canonical name always wins over someone else's synonym.
    for (const n of nodes) for (const s of n.synonyms) this.addSpelling(s, n.name);
  }

  private addSpelling(spelling: string, canonical: string): void {
    const k = termKey(spelling);
    if (k && !this.byKey.has(k)) this.byKey.set(k, canonical);
  }

  private depth(name: string, seen: Set<string> = new Set()): number {
    const known = this.depthOf.get(name);
    if (known !== undefined) return known;
    if (seen.has(name)) throw new Error(`${this.kind} "${name}" is its own ancestor`);
    seen.add(name);
    const parent = this.nodes.get(name)!.parent;
    const d = parent === null ? 0 : this.depth(parent, seen) + 1;
    this.depthOf.set(name, d);
    return d;
  }

  has(name: string): boolean {
    return this.nodes.has(name);
  }

  get(name: string): N | undefined {
    return this.nodes.get(name);
  }

  all(): N[] {
    return [...this.nodes.values()];
  }

  /** The canonical term for what someone typed (any case, spacing, synonym), or undefined. */
  resolve(typed: string): string | undefined {
    return this.lookup.resolve(typed);
  }

  /** Closest canonical terms to an unknown spelling, for "did you mean" messages. */
  suggest(typed: string, limit = 3): string[] {
    return this.lookup.suggest(typed, limit);
  }

  parentOf(name: string): string | null {
    return this.nodes.get(name)?.parent ?? null;
  }

  /** From the term itself up to its root. */
  lineage(name: string): string[] {
    const out: string[] = [];
    for (let n: string | null = name; n !== null && this.nodes.has(n); n = this.nodes.get(n)!.parent) out.push(n);
    return out;
  }

  childrenOf(name: string): string[] {
    return this.all().filter((n) => n.parent === name).map((n) => n.name);
  }

  /** Every term under `name` (not including it). */
  descendantsOf(name: string): string[] {
    return this.all().filter((n) => n.name !== name && this.isAncestorOrSelf(name, n.name)).map((n) => n.name);
  }

  /** Steps from the root (a root is 0). */
  depthOfTerm(name: string): number {
    return this.depthOf.get(name) ?? -1;
  }

  /** True when `ancestor` is `name` or lies above it. Unknown terms are never ancestors. */
  isAncestorOrSelf(ancestor: string, name: string): boolean {
    if (!this.nodes.has(ancestor) || !this.nodes.has(name)) return false;
    for (let n: string | null = name; n !== null; n = this.nodes.get(n)!.parent) if (n === ancestor) return true;
    return false;
  }

  /** Two observations can describe one thing: one is the other or an ancestor of it (null fits anything). */
  compatible(a: string | null, b: string | null): boolean {
    if (a === null || b === null) return true;
    return this.isAncestorOrSelf(a, b) || this.isAncestorOrSelf(b, a);
  }

  /** The more specific of two compatible terms; undefined when they conflict. */
  moreSpecific(a: string | null, b: string | null): string | null | undefined {
    if (a === null) return b;
    if (b === null) return a;
    if (this.isAncestorOrSelf(a, b)) return b;
    if (this.isAncestorOrSelf(b, a)) return a;
    return undefined;
  }

  /**
   * The most specific term consistent with every observation (nulls ignored): null when
   * there is none, undefined when two of them conflict.
   */
  mostSpecificConsistent(terms: readonly (string | null)[]): string | null | undefined {
    let acc: string | null = null;
    for (const t of terms) {
      const next = this.moreSpecific(acc, t);
      if (next === undefined) return undefined;
      acc = next;
    }
    return acc;
  }

  /** The lowest common ancestor: the most specific term that covers both (null if none). */
  lowestCommonAncestor(a: string, b: string): string | null {
    const above = new Set(this.lineage(a));
    for (const n of this.lineage(b)) if (above.has(n)) return n;
    return null;
  }

  /** Extend with more nodes (e.g. terms an analyst added to a catalogue); returns a new hierarchy. */
  extend(extra: readonly N[]): Hierarchy<N> {
    return new Hierarchy([...this.nodes.values(), ...extra], this.kind);
  }
}
