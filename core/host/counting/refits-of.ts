import type { Catalogue, Join, Specimen } from '../../catalogue/index';
import { vocabularyOf } from '../../catalogue/catalogue-vocabulary';
import type { CountingVocabulary } from '../../quant/vocabulary';
import type { Observation } from '../../refits/observation';
import { RefitState, type RefitJoin } from '../../refits/refit-state';
import type { RefitVocabulary } from '../../refits/vocabulary';
import { writtenKind } from './join-kind';
import { countingVocabulary } from './vocabulary';

/** A catalogue read for refits and counting: its specimens, accepted joins and refit state. */
export interface CatalogueRefits {
  specimens: Specimen[];
  byId: Map<number, Specimen>;
  byNo: Map<string, Specimen>;
  vocab: RefitVocabulary & CountingVocabulary;
  state: RefitState;
  /** The latest decision time among accepted joins ('' when none): new decisions come after it. */
  lastDecidedAt: string;
}

/** The analyst's own observations of a specimen, as refits reads them. */
export function observationOf(s: Specimen): Observation {
  return {
    specimen: s.catalogueNo,
    taxon: s.taxon,
    element: s.element,
    side: s.side,
    zones: s.portion,
    fusion: s.fusion,
    sizeClass: s.sizeClass,
  };
}

/** An accepted join as refits reads it (untyped accepted joins count as conjoins of unknown break age). */
export function refitJoinOf(j: Join, byId: Map<number, Specimen>): RefitJoin {
  return {
    id: j.id,
    a: byId.get(j.specimenA)!.catalogueNo,
    b: byId.get(j.specimenB)!.catalogueNo,
    type: writtenKind(j) ?? 'conjoin',
  };
}

/** Accepted joins in the order they were decided (time, then id). */
export function acceptedInDecisionOrder(cat: Catalogue): Join[] {
  return cat.joins
    .list({ status: 'accepted' })
    .sort((x, y) => ((x.decidedAt ?? '') < (y.decidedAt ?? '') ? -1 : (x.decidedAt ?? '') > (y.decidedAt ?? '') ? 1 : x.id - y.id));
}

/** Read everything refits needs and build the state from the accepted joins (except `without`). */
export function refitsOf(cat: Catalogue, options: { without?: number } = {}): CatalogueRefits {
  const specimens = cat.specimens.list();
  const byId = new Map(specimens.map((s) => [s.id, s]));
  const byNo = new Map(specimens.map((s) => [s.catalogueNo, s]));
  const vocab = countingVocabulary(vocabularyOf(cat));
  const state = new RefitState(specimens.map(observationOf), vocab);
  let lastDecidedAt = '';
  for (const j of acceptedInDecisionOrder(cat)) {
    if (j.id === options.without) continue;
    state.accept(refitJoinOf(j, byId));
    if (j.decidedAt && j.decidedAt > lastDecidedAt) lastDecidedAt = j.decidedAt;
  }
  return { specimens, byId, byNo, vocab, state, lastDecidedAt };
}
