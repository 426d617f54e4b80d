import { buildVocabulary, type UserTerm, type Vocabulary } from '../vocab/vocabulary';
import type { Catalogue } from './catalogue';

/** The vocabulary of one catalogue: the built-in terms plus the ones its analysts added. */
export function vocabularyOf(cat: Catalogue): Vocabulary {
  const terms: UserTerm[] = cat.vocabulary.list().map((r) => ({
    kind: r.kind,
    term: r.term,
    parent: r.parent,
    details: r.details as UserTerm['details'],
    source: r.source,
  }));
  // Added in order, so parents come before children; sort by id to be sure.
  return buildVocabulary(terms);
}
