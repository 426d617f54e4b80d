import type { CountingSpecimen, PairLink } from './counting-specimen';
import { elementUnits, unitKeyOf } from './element-unit';
import { isIdentified, isIdentifiedToElement, isIdentifiedToTaxon, type IdentificationRule } from './identified';
import { lPlusRMinusP } from './lrp';
import { minimumAnimalUnits, percentMau } from './mau';
import { minimumNumberOfElements } from './mne';
import { mniFromElement } from './mni';
import { nispByElement } from './nisp';
import type { CountingVocabulary } from './vocabulary';

export interface TaxonTally {
  taxon: string;
  nisp: number;
  mni: number;
  /** L + R - P (Lyman 2008), only where pair joins link units of this taxon. */
  lrp?: number;
}

export interface ElementTally {
  taxon: string;
  element: string;
  nisp: number;
  mneLeft: number;
  mneRight: number;
  mne: number;
  /** null when the count of this element per skeleton of the taxon is not known. */
  mau: number | null;
  percentMau: number | null;
  /** Pairs matched between left and right units of this element, where any exist. */
  pairs?: number;
}

export interface Tally {
  nisp: number;
  nispFragments: number;
  identifiedToElement: number;
  identifiedToTaxon: number;
  byTaxon: TaxonTally[];
  byElement: ElementTally[];
}

/**
 * Every count of one way of reading the catalogue (as recorded, or refitted): NISP
 * (Grayson 1984; Lyman 2008), identification rates, MNE by zone overlap (Dobney & Rielly
 * 1988; Marean et al. 2001), MNI (Lyman 2008), MAU and %MAU (Binford 1984).
 * `pairs` are accepted pair joins; pass none for the count as recorded.
 */
export function tally(
  specimens: readonly CountingSpecimen[],
  vocab: CountingVocabulary,
  rule: IdentificationRule,
  pairs: readonly PairLink[] = [],
): Tally {
  return new TallyBook(specimens, vocab, rule, pairs).result();
}

/** What one taxon and element contributes, kept between recounts. */
interface ElementRow {
  row: ElementTally;
  nispFragments: number;
  mni: number;
  lrp: number | null;
}

const groupKey = (taxon: string, element: string) => `${taxon}\u0000${element}`;

/**
 * The tally kept up to date as specimens change: after a join is accepted or undone only
 * the specimens whose identification or refit set changed are compared, and only the
 * taxon-element groups they leave or enter are counted again. `tally()` is the same book
 * read once, so both always agree.
 */
export class TallyBook {
  private specimens: CountingSpecimen[];
  private pairs: readonly PairLink[];
  private readonly identified: boolean[];
  private toElement = 0;
  private toTaxon = 0;
  /** Members (positions) of each identified taxon-element group. */
  private readonly groups = new Map<string, Set<number>>();
  private readonly rows = new Map<string, ElementRow>();
  private readonly decided = new Map<string, boolean>();
  private readonly bySpecimen = new Map<string, number>();

  constructor(
    specimens: readonly CountingSpecimen[],
    private readonly vocab: CountingVocabulary,
    private readonly rule: IdentificationRule,
    pairs: readonly PairLink[] = [],
  ) {
    this.specimens = [...specimens];
    this.pairs = pairs;
    this.identified = new Array(specimens.length).fill(false);
    specimens.forEach((s, i) => {
      this.bySpecimen.set(s.specimen, i);
      this.add(i);
    });
    for (const key of this.groups.keys()) this.recount(key);
  }

  private isIdentified(s: CountingSpecimen): boolean {
    // Many specimens share an identification: decide each pair of taxon and element once.
    const key = `${s.taxon}\u0000${s.element}`;
    let yes = this.decided.get(key);
    if (yes === undefined) this.decided.set(key, (yes = isIdentified(s, this.vocab, this.rule)));
    return yes;
  }

  private add(i: number): string | null {
    const s = this.specimens[i];
    if (isIdentifiedToElement(s.element, this.vocab)) this.toElement++;
    if (isIdentifiedToTaxon(s.taxon, this.vocab, this.rule)) this.toTaxon++;
    const yes = this.isIdentified(s);
    this.identified[i] = yes;
    if (!yes) return null;
    const key = groupKey(s.taxon!, s.element!);
    let g = this.groups.get(key);
    if (!g) this.groups.set(key, (g = new Set()));
    g.add(i);
    return key;
  }

  private remove(i: number): string | null {
    const s = this.specimens[i];
    if (isIdentifiedToElement(s.element, this.vocab)) this.toElement--;
    if (isIdentifiedToTaxon(s.taxon, this.vocab, this.rule)) this.toTaxon--;
    if (!this.identified[i]) return null;
    const key = groupKey(s.taxon!, s.element!);
    this.groups.get(key)!.delete(i);
    return key;
  }

  /**
   * Bring the book to a new reading of the same specimens (same order) and pair joins.
   * Returns how many specimens changed.
   */
  update(specimens: readonly CountingSpecimen[], pairs: readonly PairLink[] = []): number {
    if (specimens.length !== this.specimens.length) throw new RangeError('a tally book counts a fixed list of specimens');
    const dirty = new Set<string>();
    let changed = 0;
    for (let i = 0; i < specimens.length; i++) {
      const a = this.specimens[i];
      const b = specimens[i];
      if (a.taxon === b.taxon && a.element === b.element && a.side === b.side && a.set === b.set && a.modernGroup === b.modernGroup && a.fusion === b.fusion && a.zones === b.zones) continue;
      changed++;
      const before = this.remove(i);
      if (before) dirty.add(before);
      this.specimens[i] = b;
      const after = this.add(i);
      if (after) dirty.add(after);
    }
    // Pair joins that appeared or went away touch the groups of their specimens.
    const pairKey = (p: PairLink) => `${p.a}\u0000${p.b}`;
    const oldPairs = new Set(this.pairs.map(pairKey));
    const newPairs = new Set(pairs.map(pairKey));
    for (const p of [...this.pairs.filter((p) => !newPairs.has(pairKey(p))), ...pairs.filter((p) => !oldPairs.has(pairKey(p)))]) {
      for (const no of [p.a, p.b]) {
        const i = this.bySpecimen.get(no);
        if (i !== undefined && this.identified[i]) dirty.add(groupKey(this.specimens[i].taxon!, this.specimens[i].element!));
      }
    }
    this.pairs = pairs;
    for (const key of dirty) this.recount(key);
    return changed;
  }

  /** Count one taxon and element again from its members. */
  private recount(key: string): void {
    const members = this.groups.get(key);
    if (!members || members.size === 0) {
      this.groups.delete(key);
      this.rows.delete(key);
      return;
    }
    const list = [...members].map((i) => this.specimens[i]);
    const [n] = nispByElement(list);
    const units = elementUnits(list);
    const scheme = this.vocab.zonesOf(n.element);
    const paired = this.vocab.isPairedElement(n.element);
    const count = this.vocab.countPerSkeleton(n.element, n.taxon);
    const mne = minimumNumberOfElements(units, scheme, paired);
    const row: ElementTally = {
      taxon: n.taxon,
      element: n.element,
      nisp: n.nisp,
      ...mne,
      mau: count ? minimumAnimalUnits(mne.mne, count) : null,
      percentMau: null,
    };
    let lrp: number | null = null;
    if (paired && this.pairs.length) {
      const p = this.pairsWithin(list);
      if (p > 0) {
        row.pairs = p;
        lrp = lPlusRMinusP(mne.mneLeft, mne.mneRight, Math.min(p, mne.mneLeft, mne.mneRight));
      }
    }
    this.rows.set(key, { row, nispFragments: n.nispFragments, mni: mniFromElement(units, scheme, paired, count), lrp });
  }

  /** Distinct left-right unit pairs linked by pair joins among these members. */
  private pairsWithin(members: readonly CountingSpecimen[]): number {
    const inGroup = new Map(members.map((s) => [s.specimen, s]));
    const seen = new Set<string>();
    for (const p of this.pairs) {
      const a = inGroup.get(p.a);
      const b = inGroup.get(p.b);
      if (!a || !b) continue;
      if (!((a.side === 'left' && b.side === 'right') || (a.side === 'right' && b.side === 'left'))) continue;
      const ka = unitKeyOf(a);
      const kb = unitKeyOf(b);
      seen.add(ka < kb ? `${ka}\u0001${kb}` : `${kb}\u0001${ka}`);
    }
    return seen.size;
  }

  /** The tally as it stands (a fresh object each time). */
  result(): Tally {
    const rows = [...this.rows.values()].sort((a, b) => cmp(a.row.taxon, b.row.taxon) || cmp(a.row.element, b.row.element));
    const byElement = rows.map((r) => ({ ...r.row }));
    const byTaxon: TaxonTally[] = [];
    let start = 0;
    for (let i = 1; i <= rows.length; i++) {
      if (i < rows.length && rows[i].row.taxon === rows[start].row.taxon) continue;
      const group = rows.slice(start, i);
      const elements = byElement.slice(start, i);
      const known = elements.filter((r) => r.mau !== null);
      const pct = percentMau(known.map((r) => r.mau as number));
      known.forEach((r, k) => (r.percentMau = pct[k]));
      const t: TaxonTally = {
        taxon: group[0].row.taxon,
        nisp: group.reduce((s, r) => s + r.row.nisp, 0),
        mni: Math.max(...group.map((r) => r.mni)),
      };
      const lrps = group.filter((r) => r.lrp !== null).map((r) => r.lrp as number);
      if (lrps.length) t.lrp = Math.max(...lrps);
      byTaxon.push(t);
      start = i;
    }
    const n = this.specimens.length;
    return {
      nisp: rows.reduce((s, r) => s + r.row.nisp, 0),
      nispFragments: rows.reduce((s, r) => s + r.nispFragments, 0),
      identifiedToElement: n ? this.toElement / n : 0,
      identifiedToTaxon: n ? this.toTaxon / n : 0,
      byTaxon,
      byElement,
    };
  }
}

const cmp = (a: string, b: string): number => (a < b ? -1 : a > b ? 1 : 0);
