import { BUILT_IN_ELEMENTS, LONG_BONE, type ElementNode } from './elements';
import { Hierarchy } from './hierarchy';
import { TermLookup } from './term-lookup';
import { PORTION_ZONES, type PortionZone } from './portion-zones';
import { SKELETON_COUNTS } from './skeleton-counts';
import { BUILT_IN_TAXA, SKELETON_GROUPS, TAXON_RANKS, type SkeletonGroup, type TaxonNode, type TaxonRank } from './taxa';
import { BREAK_AGE_TERMS, FUSION_TERMS, MODIFICATION_TERMS, SIDE_TERMS, flatIndex, type FlatTerm } from './terms';

/** A term an analyst added to one catalogue (stored in its vocabulary_term table). */
export interface UserTerm {
  kind: 'taxon' | 'element' | 'modification' | 'fusion';
  term: string;
  parent: string | null;
  details: {
    rank?: string;
    sizeClass?: number;
    skeletonGroup?: string;
    specific?: boolean;
    paired?: boolean;
    synonyms?: string[];
  };
  source?: string | null;
}

/** A flat controlled list (sides, break ages, fusion states, modifications). */
export class TermList {
  private readonly lookup: TermLookup;
  readonly terms: readonly string[];

  constructor(readonly kind: string, list: readonly FlatTerm[]) {
    this.lookup = new TermLookup(flatIndex(list));
    this.terms = list.map((t) => t.term);
  }

  resolve(typed: string): string | undefined {
    return this.lookup.resolve(typed);
  }

  suggest(typed: string, limit = 3): string[] {
    return this.lookup.suggest(typed, limit);
  }

  has(term: string): boolean {
    return this.terms.includes(term);
  }
}

/** Every controlled vocabulary of one catalogue: built-in terms plus those its analysts added. */
export interface Vocabulary {
  taxa: Hierarchy<TaxonNode>;
  elements: Hierarchy<ElementNode>;
  sides: TermList;
  breakAges: TermList;
  fusion: TermList;
  modifications: TermList;
}

/**
 * Build the vocabulary from the built-in data and a catalogue's user-added terms. Terms
 * must be added parents first (the catalogue lists them in the order they were added).
 * Pure: no I/O.
 */
export function buildVocabulary(userTerms: readonly UserTerm[] = []): Vocabulary {
  const taxa: TaxonNode[] = [...BUILT_IN_TAXA];
  const elements: ElementNode[] = [...BUILT_IN_ELEMENTS];
  const fusion: FlatTerm[] = [...FUSION_TERMS];
  const modifications: FlatTerm[] = [...MODIFICATION_TERMS];
  for (const u of userTerms) {
    const synonyms = u.details.synonyms ?? [];
    const addedBy = u.source ?? 'added to this catalogue';
    if (u.kind === 'taxon') {
      taxa.push({
        name: u.term,
        parent: u.parent,
        rank: (u.details.rank as TaxonRank) ?? 'species',
        synonyms,
        ...(u.details.sizeClass !== undefined ? { sizeClass: u.details.sizeClass } : {}),
        ...(u.details.skeletonGroup !== undefined ? { skeletonGroup: u.details.skeletonGroup as SkeletonGroup } : {}),
        addedBy,
      });
    } else if (u.kind === 'element') {
      elements.push({ name: u.term, parent: u.parent, synonyms, specific: u.details.specific ?? true, paired: u.details.paired ?? false, addedBy });
    } else if (u.kind === 'fusion') {
      fusion.push({ term: u.term, synonyms });
    } else {
      modifications.push({ term: u.term, synonyms });
    }
  }
  return {
    taxa: new Hierarchy(taxa, 'taxon'),
    elements: new Hierarchy(elements, 'element'),
    sides: new TermList('side', SIDE_TERMS),
    breakAges: new TermList('break age', BREAK_AGE_TERMS),
    fusion: new TermList('fusion', fusion),
    modifications: new TermList('modification', modifications),
  };
}

/** The built-in vocabulary (no user-added terms). */
export const builtInVocabulary: Vocabulary = buildVocabulary();

/**
 * Problems with a term an analyst wants to add (empty when it can be added): a taxon or
 * element needs a known parent and a name not already taken by a term or a synonym.
 */
export function checkUserTerm(vocab: Vocabulary, u: UserTerm): string[] {
  const problems: string[] = [];
  const name = u.term.trim();
  if (!name) return ['the term is empty'];
  if (u.kind === 'taxon' || u.kind === 'element') {
    const h = u.kind === 'taxon' ? vocab.taxa : vocab.elements;
    const taken = h.resolve(name);
    if (taken) problems.push(`"${name}" already means the ${u.kind} "${taken}"`);
    if (u.parent === null || !h.has(u.parent)) {
      const hint = u.parent ? h.suggest(u.parent) : [];
      problems.push(`a new ${u.kind} needs a known parent${u.parent ? `; "${u.parent}" is not one` : ''}${hint.length ? ` (did you mean ${hint.map((s) => `"${s}"`).join(', ')}?)` : ''}`);
    }
    if (u.kind === 'taxon' && u.details.rank !== undefined && !(TAXON_RANKS as readonly string[]).includes(u.details.rank)) {
      problems.push(`rank must be one of ${TAXON_RANKS.join(', ')}`);
    }
    if (u.kind === 'taxon' && u.details.skeletonGroup !== undefined && !(SKELETON_GROUPS as readonly string[]).includes(u.details.skeletonGroup)) {
      problems.push(`skeleton group must be one of ${SKELETON_GROUPS.join(', ')}`);
    }
    if (u.details.sizeClass !== undefined && !(Number.isInteger(u.details.sizeClass) && u.details.sizeClass >= 1 && u.details.sizeClass <= 6)) {
      problems.push('size class must be a whole number from 1 to 6');
    }
    for (const s of u.details.synonyms ?? []) {
      const other = h.resolve(s);
      if (other) problems.push(`the synonym "${s}" already means the ${u.kind} "${other}"`);
    }
  } else {
    const list = u.kind === 'fusion' ? vocab.fusion : vocab.modifications;
    const taken = list.resolve(name);
    if (taken) problems.push(`"${name}" already means the ${u.kind} term "${taken}"`);
  }
  return problems;
}

// ---- Queries the counting, refit and spatial areas use (pure) ----

/** True when taxon `ancestor` is `taxon` or lies above it ("Cervidae" over "Cervus elaphus"). */
export function isTaxonAncestorOrSelf(ancestor: string, taxon: string, vocab: Vocabulary = builtInVocabulary): boolean {
  return vocab.taxa.isAncestorOrSelf(ancestor, taxon);
}

/** True when element `ancestor` is `element` or lies above it ("long bone" over "femur"). */
export function isElementAncestorOrSelf(ancestor: string, element: string, vocab: Vocabulary = builtInVocabulary): boolean {
  return vocab.elements.isAncestorOrSelf(ancestor, element);
}

/** Two taxon observations can describe one animal (null fits anything). */
export function taxaCompatible(a: string | null, b: string | null, vocab: Vocabulary = builtInVocabulary): boolean {
  return vocab.taxa.compatible(a, b);
}

/** Two element observations can describe one bone (null fits anything). */
export function elementsCompatible(a: string | null, b: string | null, vocab: Vocabulary = builtInVocabulary): boolean {
  return vocab.elements.compatible(a, b);
}

/** Most specific taxon consistent with all observations: null if none, undefined on conflict. */
export function mostSpecificTaxon(taxa: readonly (string | null)[], vocab: Vocabulary = builtInVocabulary): string | null | undefined {
  return vocab.taxa.mostSpecificConsistent(taxa);
}

/** Most specific element consistent with all observations: null if none, undefined on conflict. */
export function mostSpecificElement(elements: readonly (string | null)[], vocab: Vocabulary = builtInVocabulary): string | null | undefined {
  return vocab.elements.mostSpecificConsistent(elements);
}

/** Two sides can describe one bone: equal, or either unknown/indeterminate. */
export function sidesCompatible(a: string | null, b: string | null): boolean {
  if (a === null || b === null || a === 'indeterminate' || b === 'indeterminate') return true;
  return a === b;
}

export function taxonRank(taxon: string, vocab: Vocabulary = builtInVocabulary): TaxonRank | undefined {
  return vocab.taxa.get(taxon)?.rank;
}

/** Is the taxon identified to at least this rank ("Cervus elaphus" is to genus and to family)? */
export function isIdentifiedToRank(taxon: string, rank: TaxonRank, vocab: Vocabulary = builtInVocabulary): boolean {
  const r = taxonRank(taxon, vocab);
  return r !== undefined && TAXON_RANKS.indexOf(r) >= TAXON_RANKS.indexOf(rank);
}

/** The group whose skeleton counts apply to a taxon, from the taxon or its nearest ancestor. */
export function skeletonGroupOf(taxon: string, vocab: Vocabulary = builtInVocabulary): SkeletonGroup | undefined {
  for (const t of vocab.taxa.lineage(taxon)) {
    const g = vocab.taxa.get(t)?.skeletonGroup;
    if (g) return g;
  }
  return undefined;
}

/** Typical size class of a taxon (from it or its nearest ancestor that has one). */
export function typicalSizeClass(taxon: string, vocab: Vocabulary = builtInVocabulary): number | undefined {
  for (const t of vocab.taxa.lineage(taxon)) {
    const s = vocab.taxa.get(t)?.sizeClass;
    if (s !== undefined) return s;
  }
  return undefined;
}

/** A specific element ("femur"), not a category ("long bone", "phalanx"). */
export function isSpecificElement(element: string, vocab: Vocabulary = builtInVocabulary): boolean {
  return vocab.elements.get(element)?.specific ?? false;
}

/** Left and right exist for this element. */
export function isPairedElement(element: string, vocab: Vocabulary = builtInVocabulary): boolean {
  return vocab.elements.get(element)?.paired ?? false;
}

/** The element is a long bone or a long-bone category (portion zones apply to it). */
export function isLongBone(element: string, vocab: Vocabulary = builtInVocabulary): boolean {
  return vocab.elements.isAncestorOrSelf(LONG_BONE, element);
}

/**
 * Number of this element in one skeleton of the taxon's group (MAU divisor), or undefined
 * when the group or the count is unknown. `taxonOrGroup` may name a taxon or a group.
 * A category ("metapodial") counts the sum of its specific elements when all are known.
 */
export function countPerSkeleton(element: string, taxonOrGroup: string, vocab: Vocabulary = builtInVocabulary): number | undefined {
  const group = (SKELETON_GROUPS as readonly string[]).includes(taxonOrGroup)
    ? (taxonOrGroup as SkeletonGroup)
    : skeletonGroupOf(taxonOrGroup, vocab);
  if (!group) return undefined;
  const counts = SKELETON_COUNTS[group].counts;
  if (counts[element] !== undefined) return counts[element];
  const node = vocab.elements.get(element);
  if (!node || node.specific) return undefined;
  const specifics = vocab.elements.descendantsOf(element).filter((e) => vocab.elements.get(e)!.specific);
  if (specifics.length === 0 || specifics.some((e) => counts[e] === undefined)) return undefined;
  return specifics.reduce((s, e) => s + counts[e], 0);
}

/** Portion zones of an element in order (long bones and their categories), or null when it has none. */
export function zonesOf(element: string, vocab: Vocabulary = builtInVocabulary): readonly PortionZone[] | null {
  return isLongBone(element, vocab) ? PORTION_ZONES : null;
}

/**
 * An element (or category) of the fore- or hindlimb: long bones, limb girdles, carpals,
 * tarsals, patella, sesamoids and phalanges (common practice).
 */
export function isLimbElement(element: string, vocab: Vocabulary = builtInVocabulary): boolean {
  return ['long bone', 'girdle', 'carpal', 'tarsal', 'patella', 'sesamoid', 'phalanx'].some((root) => vocab.elements.isAncestorOrSelf(root, element));
}
