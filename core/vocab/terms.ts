import { termKey } from './normalise';

/**
 * Flat controlled lists: side, break age, fusion and surface modifications, each with the
 * spellings and abbreviations accepted on input. Canonical terms are what the catalogue stores.
 */
export interface FlatTerm {
  term: string;
  synonyms: readonly string[];
  /** Where the term is defined, when it comes from a publication. */
  source?: string;
}

/** Side of a paired element; axial for unpaired ones (common practice). */
export const SIDE_TERMS: readonly FlatTerm[] = [
  { term: 'left', synonyms: ['l', 'lt', 'sin', 'sinister'] },
  { term: 'right', synonyms: ['r', 'rt', 'dex', 'dexter'] },
  { term: 'axial', synonyms: ['ax', 'a', 'midline', 'median', 'unpaired'] },
  { term: 'indeterminate', synonyms: ['i', 'ind', 'indet', 'unknown', 'unk', '?', 'u', 'undetermined', 'l/r', 'l or r'] },
];

/**
 * Age of a break. Fresh (green) versus dry breaks by fracture outline, angle and surface
 * (Villa & Mahieu 1991); modern: during or after excavation (common practice).
 */
export const BREAK_AGE_TERMS: readonly FlatTerm[] = [
  { term: 'fresh', synonyms: ['green', 'f', 'perimortem', 'peri-mortem'], source: 'Villa & Mahieu 1991' },
  { term: 'dry', synonyms: ['d', 'old', 'postdepositional', 'post-depositional'], source: 'Villa & Mahieu 1991' },
  { term: 'modern', synonyms: ['m', 'recent', 'new', 'excavation', 'excavation damage', 'mod'] },
  { term: 'indeterminate', synonyms: ['i', 'ind', 'indet', 'unknown', 'unk', '?'] },
];

/** State of epiphyseal fusion (common practice). Users may add finer states to a catalogue. */
export const FUSION_TERMS: readonly FlatTerm[] = [
  { term: 'fused', synonyms: ['f', 'fu', 'fus', 'ossified'] },
  { term: 'fusing', synonyms: ['fg', 'partly fused', 'partially fused', 'part fused', 'line visible', 'fusion line'] },
  { term: 'unfused', synonyms: ['u', 'uf', 'unf', 'nf', 'not fused'] },
  { term: 'indeterminate', synonyms: ['i', 'ind', 'indet', 'unknown', '?'] },
];

/**
 * Surface modifications. Weathering stages 0-5 after Behrensmeyer 1978 (Paleobiology 4:
 * 150-162); the rest are the usual categories of bone-surface modification (Fisher 1995;
 * Lyman 1994), from memory.
 */
export const MODIFICATION_TERMS: readonly FlatTerm[] = [
  { term: 'cut-mark', synonyms: ['cut', 'cutmark', 'cut marks', 'cutmarks', 'cm', 'slicing mark'] },
  { term: 'chop-mark', synonyms: ['chop', 'chopmark', 'chop marks', 'hack mark'] },
  { term: 'scrape-mark', synonyms: ['scrape', 'scraping', 'scrape marks'] },
  { term: 'percussion-notch', synonyms: ['notch', 'percussion notch', 'impact notch'] },
  { term: 'percussion-pit', synonyms: ['pit', 'percussion pit', 'percussion mark', 'pm'] },
  { term: 'carnivore-tooth-mark', synonyms: ['tooth mark', 'tooth marks', 'toothmark', 'tm', 'tooth pit', 'tooth score'] },
  { term: 'carnivore-gnawing', synonyms: ['gnawed', 'gnawing', 'gnaw', 'carnivore gnawed', 'cg', 'furrowing'] },
  { term: 'rodent-gnawing', synonyms: ['rodent gnawed', 'rodent', 'rg'] },
  { term: 'digested', synonyms: ['digestion', 'acid etched', 'dig'] },
  { term: 'burnt', synonyms: ['burned', 'charred', 'carbonised', 'carbonized', 'b', 'blackened'] },
  { term: 'calcined', synonyms: ['calc', 'white burnt', 'cal'] },
  { term: 'root-etching', synonyms: ['root etching', 'root etched', 'rootlet', 'rootlet etching', 're', 'roots'] },
  { term: 'trampling', synonyms: ['trampled', 'trample marks', 'tr'] },
  { term: 'abrasion', synonyms: ['abraded', 'rounded', 'polish', 'polished'] },
  { term: 'manganese-staining', synonyms: ['manganese', 'mn', 'mn staining', 'mn stain'] },
  ...[0, 1, 2, 3, 4, 5].map((s) => ({
    term: `weathering-${s}`,
    synonyms: [`weathering ${s}`, `w${s}`, `ws${s}`, `weathering stage ${s}`, `ws ${s}`, `w ${s}`],
    source: 'Behrensmeyer 1978',
  })),
];

/** A lookup table from spelling key to canonical term; canonical terms win over synonyms. */
export function flatIndex(terms: readonly FlatTerm[]): Map<string, string> {
  const m = new Map<string, string>();
  for (const t of terms) m.set(termKey(t.term), t.term);
  for (const t of terms) for (const s of t.synonyms) if (!m.has(termKey(s))) m.set(termKey(s), t.term);
  return m;
}
