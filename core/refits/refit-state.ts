import { carriedBy, isConjoin, type RefitJoinType } from './join-type';
import type { Conflict } from './conflict';
import { mostSpecific } from './most-specific';
import type { Observation, Side } from './observation';
import { UnionFind } from './union-find';
import type { RefitVocabulary } from './vocabulary';

export type JoinId = number | string;

/** An accepted (or proposed) join between two specimens, by catalogue number. */
export interface RefitJoin {
  id: JoinId;
  a: string;
  b: string;
  type: RefitJoinType;
}

/** What propagation concluded for one specimen, field by field, and from which joins. */
export interface DerivedIdentification {
  specimen: string;
  taxon: { value: string; joins: JoinId[] } | null;
  element: { value: string; joins: JoinId[] } | null;
  side: { value: 'left' | 'right' | 'axial'; joins: JoinId[] } | null;
}

/** The identification to count with: the analyst's own, raised by any derived value. */
export interface EffectiveIdentification {
  taxon: string | null;
  element: string | null;
  side: Side | null;
}

// Side codes: 0 unknown, 1 left, 2 right, 3 axial. A left/right code is stored relative to
// the component root; a member with parity 1 has the opposite side (pairs flip side).
const UNKNOWN = 0;
const LEFT = 1;
const RIGHT = 2;
const AXIAL = 3;
const sideCode = (s: Side | null): number => (s === 'left' ? LEFT : s === 'right' ? RIGHT : s === 'axial' ? AXIAL : UNKNOWN);
const sideName = (code: number): 'left' | 'right' | 'axial' | null =>
  code === LEFT ? 'left' : code === RIGHT ? 'right' : code === AXIAL ? 'axial' : null;
const flip = (code: number, parity: number): number => (parity && (code === LEFT || code === RIGHT) ? 3 - code : code);

/**
 * Refit sets and identification propagation (design.md section 6).
 *
 * A refit set is a connected component of accepted conjoins (Lyman 1994, 2008: conjoins
 * refit pieces of one specimen). Each identification field (taxon, element, side, size)
 * has its own components, joined only through joins that carry that field and do not
 * conflict in it, so a forced join never propagates through its conflicting field. Joins
 * are applied in decision order; undoing one rebuilds from the remaining accepted joins,
 * which restores exactly the state before it was accepted.
 */
export class RefitState {
  readonly observations: readonly Observation[];
  private readonly vocab: RefitVocabulary;
  private readonly index = new Map<string, number>();

  /** Refit sets: every accepted conjoin, conflicting or not (the pieces do fit). */
  private readonly sets: UnionFind;
  /** Fragments joined across modern breaks (one specimen by common practice). */
  private readonly modern: UnionFind;
  /** Every accepted join of any type: nothing derived flows outside these components. */
  private readonly linked: UnionFind;
  private readonly taxa: UnionFind;
  private readonly elements: UnionFind;
  private readonly sides: UnionFind;
  private readonly sizes: UnionFind;

  private readonly taxonAt: (string | null)[];
  private readonly elementAt: (string | null)[];
  private readonly sideAt: Uint8Array;
  private readonly sizeMin: Float64Array;
  private readonly sizeMax: Float64Array;
  private readonly zonesAt: (Set<string> | null)[];
  private readonly taxonJoins: (JoinId[] | null)[];
  private readonly elementJoins: (JoinId[] | null)[];
  private readonly sideJoins: (JoinId[] | null)[];

  private readonly accepted: RefitJoin[] = [];
  /** Goes up by one with every join applied, so readers can tell the state moved on. */
  revision = 0;
  private readonly conflictsByJoin = new Map<JoinId, Conflict[]>();

  constructor(observations: readonly Observation[], vocab: RefitVocabulary) {
    this.observations = observations;
    this.vocab = vocab;
    const n = observations.length;
    this.sets = new UnionFind(n);
    this.modern = new UnionFind(n);
    this.linked = new UnionFind(n);
    this.taxa = new UnionFind(n);
    this.elements = new UnionFind(n);
    this.sides = new UnionFind(n);
    this.sizes = new UnionFind(n);
    this.taxonAt = new Array(n);
    this.elementAt = new Array(n);
    this.sideAt = new Uint8Array(n);
    this.sizeMin = new Float64Array(n);
    this.sizeMax = new Float64Array(n);
    this.zonesAt = new Array(n).fill(null);
    this.taxonJoins = new Array(n).fill(null);
    this.elementJoins = new Array(n).fill(null);
    this.sideJoins = new Array(n).fill(null);
    observations.forEach((o, i) => {
      this.index.set(o.specimen, i);
      this.taxonAt[i] = o.taxon;
      this.elementAt[i] = o.element;
      this.sideAt[i] = sideCode(o.side);
      // The recorded size class, else the typical one of the recorded taxon (a red deer
      // bone is size 3 even when no size was written down).
      const size = o.sizeClass ?? (o.taxon && vocab.typicalSizeClass ? vocab.typicalSizeClass(o.taxon) : null);
      this.sizeMin[i] = size ?? Infinity;
      this.sizeMax[i] = size ?? -Infinity;
      if (o.zones.length) this.zonesAt[i] = new Set(o.zones);
    });
  }

  /** Build the state for a list of accepted joins, applied in decision order. */
  static build(observations: readonly Observation[], accepted: readonly RefitJoin[], vocab: RefitVocabulary): RefitState {
    const state = new RefitState(observations, vocab);
    for (const j of accepted) state.accept(j);
    return state;
  }

  has(specimen: string): boolean {
    return this.index.has(specimen);
  }

  private indexOf(specimen: string): number {
    const i = this.index.get(specimen);
    if (i === undefined) throw new Error(`no specimen "${specimen}" in this catalogue`);
    return i;
  }

  private sideOf(i: number): number {
    return flip(this.sideAt[this.sides.find(i)], this.sides.parityOf(i));
  }

  private sizeRange(i: number): [number, number] {
    const r = this.sizes.find(i);
    return [this.sizeMin[r], this.sizeMax[r]];
  }

  /**
   * The conflicts a join would raise against the current state, without changing it.
   * Each side is read at the level of its components: a join to any member of a set is
   * checked against everything the set already asserts.
   */
  check(join: RefitJoin): Conflict[] {
    const ia = this.indexOf(join.a);
    const ib = this.indexOf(join.b);
    const conflicts: Conflict[] = [];
    if (ia === ib) {
      conflicts.push({ field: 'specimen', reason: `a specimen cannot join itself (${join.a})` });
      return conflicts;
    }
    const { vocab } = this;
    const ea = this.elementAt[this.elements.find(ia)];
    const eb = this.elementAt[this.elements.find(ib)];
    const carried = carriedBy(join.type, ea !== null && eb !== null && vocab.isLimbElement(ea) && vocab.isLimbElement(eb));

    if (carried.taxon && !this.taxa.same(ia, ib)) {
      const ta = this.taxonAt[this.taxa.find(ia)];
      const tb = this.taxonAt[this.taxa.find(ib)];
      if (mostSpecific(vocab.taxa, ta, tb) === undefined) {
        conflicts.push({ field: 'taxon', reason: `${ta} and ${tb} are on different branches of the taxonomy` });
      }
    }
    if (carried.element) {
      if (!this.elements.same(ia, ib) && mostSpecific(vocab.elements, ea, eb) === undefined) {
        conflicts.push({ field: 'element', reason: `${ea} and ${eb} are different elements` });
      } else if (join.type === 'pair') {
        const e = mostSpecific(vocab.elements, ea, eb);
        if (e && vocab.isSpecificElement(e) && !vocab.isPairedElement(e)) {
          conflicts.push({ field: 'element', reason: `${e} has no left and right, so it cannot form a pair` });
        }
      }
    }
    if (carried.side !== 'none') {
      const relation = carried.side === 'opposite' ? 1 : 0;
      const sa = this.sideOf(ia);
      const sb = this.sideOf(ib);
      if (this.sides.same(ia, ib)) {
        if ((this.sides.parityOf(ia) ^ this.sides.parityOf(ib)) !== relation) {
          conflicts.push({
            field: 'side',
            reason: relation
              ? `${join.a} and ${join.b} are already joined as one side, so they cannot be a left and right pair`
              : `${join.a} and ${join.b} are already paired as opposite sides`,
          });
        }
      } else if (sa === AXIAL || sb === AXIAL) {
        if (relation === 1) conflicts.push({ field: 'side', reason: `an axial element has no left and right, so it cannot form a pair` });
        else if ((sa === LEFT || sa === RIGHT) || (sb === LEFT || sb === RIGHT)) {
          conflicts.push({ field: 'side', reason: `${sideName(sa)} against ${sideName(sb)}` });
        }
      } else if (sa !== UNKNOWN && sb !== UNKNOWN) {
        if (relation === 0 && sa !== sb) conflicts.push({ field: 'side', reason: `${sideName(sa)} against ${sideName(sb)}` });
        if (relation === 1 && sa === sb) conflicts.push({ field: 'side', reason: `both are ${sideName(sa)}; a pair is a left and a right` });
      }
    }
    if (carried.size && !this.sizes.same(ia, ib)) {
      const [amin, amax] = this.sizeRange(ia);
      const [bmin, bmax] = this.sizeRange(ib);
      const lo = Math.min(amin, bmin);
      const hi = Math.max(amax, bmax);
      if (Number.isFinite(lo) && Number.isFinite(hi) && hi - lo > 1) {
        conflicts.push({ field: 'size', reason: `size classes ${lo} and ${hi} are more than one apart` });
      }
    }
    if (carried.zones && !this.sets.same(ia, ib)) {
      const za = this.zonesAt[this.sets.find(ia)];
      const zb = this.zonesAt[this.sets.find(ib)];
      if (za && zb) {
        const shared = [...za].filter((z) => zb.has(z));
        if (shared.length) {
          conflicts.push({
            field: 'zones',
            reason: `both pieces cover more than half of ${shared.join(', ')}, which one bone cannot hold twice`,
          });
        }
      }
    }
    return conflicts;
  }

  /**
   * Apply an accepted join. Returns its conflicts; a conflicting join (accepted with force)
   * still joins the pieces into a refit set but carries nothing through a conflicting field.
   */
  accept(join: RefitJoin): Conflict[] {
    const conflicts = this.check(join);
    this.revision++;
    this.accepted.push(join);
    this.conflictsByJoin.set(join.id, conflicts);
    const ia = this.indexOf(join.a);
    const ib = this.indexOf(join.b);
    if (ia === ib) return conflicts;
    this.linked.union(ia, ib);
    const bad = new Set(conflicts.map((c) => c.field));
    const { vocab } = this;
    const ea = this.elementAt[this.elements.find(ia)];
    const eb = this.elementAt[this.elements.find(ib)];
    const carried = carriedBy(join.type, ea !== null && eb !== null && vocab.isLimbElement(ea) && vocab.isLimbElement(eb));

    if (isConjoin(join.type)) {
      const ra = this.sets.find(ia);
      const rb = this.sets.find(ib);
      const u = this.sets.union(ia, ib);
      if (u.absorbed !== null) this.zonesAt[u.root] = mergeSets(this.zonesAt[ra], this.zonesAt[rb]);
      if (join.type === 'conjoin-modern') this.modern.union(ia, ib);
    }
    if (carried.taxon && !bad.has('taxon') && !this.taxa.same(ia, ib)) {
      const v = mostSpecific(vocab.taxa, this.taxonAt[this.taxa.find(ia)], this.taxonAt[this.taxa.find(ib)]) ?? null;
      const joins = concatJoins(this.taxonJoins[this.taxa.find(ia)], this.taxonJoins[this.taxa.find(ib)], join.id);
      const r = this.taxa.union(ia, ib).root;
      this.taxonAt[r] = v;
      this.taxonJoins[r] = joins;
    }
    if (carried.element && !bad.has('element') && !this.elements.same(ia, ib)) {
      const v = mostSpecific(vocab.elements, ea, eb) ?? null;
      const joins = concatJoins(this.elementJoins[this.elements.find(ia)], this.elementJoins[this.elements.find(ib)], join.id);
      const r = this.elements.union(ia, ib).root;
      this.elementAt[r] = v;
      this.elementJoins[r] = joins;
    }
    if (carried.side !== 'none' && !bad.has('side') && !this.sides.same(ia, ib)) {
      const sa = this.sideOf(ia);
      const sb = this.sideOf(ib);
      const joins = concatJoins(this.sideJoins[this.sides.find(ia)], this.sideJoins[this.sides.find(ib)], join.id);
      const r = this.sides.union(ia, ib, carried.side === 'opposite' ? 1 : 0).root;
      // Store the known side relative to the new root.
      let code = UNKNOWN;
      if (sa !== UNKNOWN) code = flip(sa, this.sides.parityOf(ia));
      else if (sb !== UNKNOWN) code = flip(sb, this.sides.parityOf(ib));
      this.sideAt[r] = code;
      this.sideJoins[r] = joins;
    }
    if (carried.size && !bad.has('size') && !this.sizes.same(ia, ib)) {
      const [amin, amax] = this.sizeRange(ia);
      const [bmin, bmax] = this.sizeRange(ib);
      const r = this.sizes.union(ia, ib).root;
      this.sizeMin[r] = Math.min(amin, bmin);
      this.sizeMax[r] = Math.max(amax, bmax);
    }
    return conflicts;
  }

  /** Accepted joins in the order they were applied. */
  acceptedJoins(): readonly RefitJoin[] {
    return this.accepted;
  }

  /** Conflicts recorded when each accepted join was applied (empty list: none). */
  conflictsOf(id: JoinId): readonly Conflict[] {
    return this.conflictsByJoin.get(id) ?? [];
  }

  /** Accepted joins that conflict, with their reasons. */
  conflictingJoins(): Array<{ join: RefitJoin; conflicts: Conflict[] }> {
    return this.accepted
      .map((join) => ({ join, conflicts: this.conflictsByJoin.get(join.id) ?? [] }))
      .filter((x) => x.conflicts.length > 0);
  }

  /** Refit set and modern-break group of the specimen at a position in `observations`. */
  groupsAt(i: number): { set: number; modernGroup: number } {
    return { set: this.sets.find(i), modernGroup: this.modern.find(i) };
  }

  /** Index of the refit set of a specimen: equal for every member of one set. */
  setIndexOf(specimen: string): number {
    return this.sets.find(this.indexOf(specimen));
  }

  /** Index of the group of fragments joined across modern breaks. */
  modernGroupIndexOf(specimen: string): number {
    return this.modern.find(this.indexOf(specimen));
  }

  /**
   * Every specimen linked to this one through accepted joins of any type. Derived values
   * depend only on this component, so accepting or undoing a join between two specimens
   * can change derived values only within their components.
   */
  linkedMembers(specimen: string): string[] {
    const root = this.linked.find(this.indexOf(specimen));
    if (this.linked.sizeOf(root) === 1) return [specimen];
    const out: string[] = [];
    this.observations.forEach((o, i) => {
      if (this.linked.find(i) === root) out.push(o.specimen);
    });
    return out;
  }

  /** Refit sets with more than one member, each as sorted catalogue numbers. */
  refitSets(): string[][] {
    const groups = new Map<number, string[]>();
    this.observations.forEach((o, i) => {
      const r = this.sets.find(i);
      const g = groups.get(r);
      if (g) g.push(o.specimen);
      else groups.set(r, [o.specimen]);
    });
    return [...groups.values()].filter((g) => g.length > 1).map((g) => g.sort());
  }

  /** What propagation concluded for a specimen beyond its own observation (null fields: nothing). */
  derivedFor(specimen: string): DerivedIdentification {
    const i = this.indexOf(specimen);
    const o = this.observations[i];
    const tr = this.taxa.find(i);
    const er = this.elements.find(i);
    const sr = this.sides.find(i);
    const taxon = this.taxonAt[tr];
    const element = this.elementAt[er];
    const side = sideName(this.sideOf(i));
    const ownSide = o.side === 'indeterminate' ? null : o.side;
    return {
      specimen,
      taxon: taxon !== null && taxon !== o.taxon ? { value: taxon, joins: [...(this.taxonJoins[tr] ?? [])] } : null,
      element: element !== null && element !== o.element ? { value: element, joins: [...(this.elementJoins[er] ?? [])] } : null,
      side: side !== null && ownSide === null ? { value: side, joins: [...(this.sideJoins[sr] ?? [])] } : null,
    };
  }

  /** Every specimen that has a derived value, in catalogue order. */
  derivedIdentifications(): DerivedIdentification[] {
    const out: DerivedIdentification[] = [];
    for (const o of this.observations) {
      const d = this.derivedFor(o.specimen);
      if (d.taxon || d.element || d.side) out.push(d);
    }
    return out;
  }

  /** The identification to count with: own observation raised by what was derived. */
  effective(specimen: string): EffectiveIdentification {
    return this.effectiveAt(this.indexOf(specimen));
  }

  /** As effective(), by position in `observations`. */
  effectiveAt(i: number): EffectiveIdentification {
    const o = this.observations[i];
    const side = sideName(this.sideOf(i));
    return {
      taxon: this.taxonAt[this.taxa.find(i)],
      element: this.elementAt[this.elements.find(i)],
      side: o.side !== null && o.side !== 'indeterminate' ? o.side : (side ?? o.side),
    };
  }
}

function mergeSets(a: Set<string> | null, b: Set<string> | null): Set<string> | null {
  if (!a) return b;
  if (!b) return a;
  const [big, small] = a.size >= b.size ? [a, b] : [b, a];
  for (const z of small) big.add(z);
  return big;
}

function concatJoins(a: JoinId[] | null, b: JoinId[] | null, id: JoinId): JoinId[] {
  const out = a ? (b && b.length > a.length ? b : a) : (b ?? []);
  const other = out === a ? b : a;
  const merged = out === a || out === b ? out : [...out];
  if (other) for (const j of other) merged.push(j);
  merged.push(id);
  return merged;
}
