import type { CountingSpecimen, PairLink } from './counting-specimen';
import { elementUnits, unitKeyOf, type ElementUnit } from './element-unit';
import { identificationRates } from './identification-rate';
import { isIdentified, type IdentificationRule } from './identified';
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
  const identified = specimens.filter((s) => isIdentified(s, vocab, rule));
  const nisps = nispByElement(identified);
  const units = elementUnits(identified);
  const unitsByElement = groupBy(units, (u) => `${u.taxon}\u0000${u.element}`);
  const pairCounts = countPairs(specimens, pairs, units);

  const byElement: ElementTally[] = [];
  const mniByTaxon = new Map<string, number>();
  const lrpByTaxon = new Map<string, number>();
  for (const n of nisps) {
    const key = `${n.taxon}\u0000${n.element}`;
    const us = unitsByElement.get(key) ?? [];
    const scheme = vocab.zonesOf(n.element);
    const paired = vocab.isPairedElement(n.element);
    const count = vocab.countPerSkeleton(n.element, n.taxon);
    const mne = minimumNumberOfElements(us, scheme, paired);
    const row: ElementTally = {
      taxon: n.taxon,
      element: n.element,
      nisp: n.nisp,
      ...mne,
      mau: count ? minimumAnimalUnits(mne.mne, count) : null,
      percentMau: null,
    };
    const p = pairCounts.get(key);
    if (p !== undefined && paired) {
      row.pairs = p;
      const lrp = lPlusRMinusP(mne.mneLeft, mne.mneRight, Math.min(p, mne.mneLeft, mne.mneRight));
      lrpByTaxon.set(n.taxon, Math.max(lrpByTaxon.get(n.taxon) ?? 0, lrp));
    }
    byElement.push(row);
    const mni = mniFromElement(us, scheme, paired, count);
    mniByTaxon.set(n.taxon, Math.max(mniByTaxon.get(n.taxon) ?? 0, mni));
  }
  byElement.sort((a, b) => cmp(a.taxon, b.taxon) || cmp(a.element, b.element));
  for (const rows of groupBy(byElement, (r) => r.taxon).values()) {
    const known = rows.filter((r) => r.mau !== null);
    const pct = percentMau(known.map((r) => r.mau as number));
    known.forEach((r, i) => (r.percentMau = pct[i]));
  }

  const byTaxon: TaxonTally[] = [];
  for (const [taxon, rows] of groupBy(byElement, (r) => r.taxon)) {
    const t: TaxonTally = { taxon, nisp: rows.reduce((s, r) => s + r.nisp, 0), mni: mniByTaxon.get(taxon) ?? 0 };
    const lrp = lrpByTaxon.get(taxon);
    if (lrp !== undefined) t.lrp = lrp;
    byTaxon.push(t);
  }
  byTaxon.sort((a, b) => cmp(a.taxon, b.taxon));

  return {
    nisp: nisps.reduce((s, n) => s + n.nisp, 0),
    nispFragments: nisps.reduce((s, n) => s + n.nispFragments, 0),
    ...identificationRates(specimens, vocab, rule),
    byTaxon,
    byElement,
  };
}

/** Distinct left-right unit pairs linked by pair joins, per taxon and element. */
function countPairs(specimens: readonly CountingSpecimen[], pairs: readonly PairLink[], units: readonly ElementUnit[]): Map<string, number> {
  const out = new Map<string, number>();
  if (pairs.length === 0) return out;
  const unitKeys = new Set(units.map((u) => u.key));
  const bySpecimen = new Map(specimens.map((s) => [s.specimen, s]));
  const seen = new Set<string>();
  for (const p of pairs) {
    const a = bySpecimen.get(p.a);
    const b = bySpecimen.get(p.b);
    if (!a || !b || a.taxon !== b.taxon || a.element !== b.element) continue;
    const sides = new Set([a.side, b.side]);
    if (!(sides.has('left') && sides.has('right'))) continue;
    const ka = unitKeyOf(a);
    const kb = unitKeyOf(b);
    if (!unitKeys.has(ka) || !unitKeys.has(kb)) continue;
    const pairKey = ka < kb ? `${ka}\u0001${kb}` : `${kb}\u0001${ka}`;
    if (seen.has(pairKey)) continue;
    seen.add(pairKey);
    const key = `${a.taxon}\u0000${a.element}`;
    out.set(key, (out.get(key) ?? 0) + 1);
  }
  return out;
}

function groupBy<T>(items: readonly T[], keyOf: (t: T) => string): Map<string, T[]> {
  const m = new Map<string, T[]>();
  for (const t of items) {
    const k = keyOf(t);
    const g = m.get(k);
    if (g) g.push(t);
    else m.set(k, [t]);
  }
  return m;
}

const cmp = (a: string, b: string): number => (a < b ? -1 : a > b ? 1 : 0);
