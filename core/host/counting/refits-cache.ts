import { statSync } from 'node:fs';
import { changeCount } from '../../catalogue/change-counter';
import type { Catalogue } from '../../catalogue/index';
import type { IdentificationRule } from '../../quant/identified';
import { numberOfSpecimens } from '../../quant/nsp';
import { tally, TallyBook, type Tally } from '../../quant/tally';
import type { RefitState } from '../../refits/refit-state';
import { recordedView, refittedView } from '../../refits/counting-view';
import { identificationRuleOf, type Counts } from './counts-of';
import { refitsOf, type CatalogueRefits } from './refits-of';

/**
 * Keeps the last reading of each open catalogue (specimens, refit state, counts) in memory
 * so that accepting a join and recounting stays interactive in a long-running shell (the
 * app, the loopback server). An entry is valid while the catalogue's stamp is unchanged:
 * the file (its inode) and its change counter (migration 0010: triggers count every change
 * to specimens, joins, vocabulary terms and settings, by any program). Our own decisions
 * update the entry in place and take the new stamp after they commit; any other change
 * makes the next request read afresh.
 */
interface Entry {
  stamp: string;
  refits: CatalogueRefits;
  rule: IdentificationRule;
  recorded?: Tally;
  /** The refitted counts, and the state and revision they were last brought to. */
  book?: { tally: TallyBook; state: RefitState; revision: number };
}

const entries = new Map<string, Entry>();
const MAX_ENTRIES = 4;

function stampOf(cat: Catalogue): string {
  return `${statSync(cat.path).ino}/${changeCount(cat)}`;
}

/** The catalogue's refits, read afresh only when something changed since the last call. */
export function refitsFor(cat: Catalogue): CatalogueRefits {
  const stamp = stampOf(cat);
  const e = entries.get(cat.path);
  if (e && e.stamp === stamp) return e.refits;
  const refits = refitsOf(cat);
  if (!e && entries.size >= MAX_ENTRIES) entries.delete(entries.keys().next().value!);
  entries.set(cat.path, { stamp, refits, rule: identificationRuleOf(cat) });
  return refits;
}

/**
 * After a decision of ours committed: `refits` matches the catalogue as it now is. The
 * counts as recorded do not depend on joins and are kept; those refitted are recounted.
 */
export function remember(cat: Catalogue, refits: CatalogueRefits): void {
  const old = entries.get(cat.path);
  const sameSpecimens = old?.refits.specimens === refits.specimens;
  entries.set(cat.path, {
    stamp: stampOf(cat),
    refits,
    rule: old?.rule ?? identificationRuleOf(cat),
    ...(sameSpecimens && old?.recorded ? { recorded: old.recorded } : {}),
    ...(sameSpecimens && old?.book ? { book: old.book } : {}),
  });
}

/** Drop what we keep of a catalogue (after a failed decision that may have touched it). */
export function forget(cat: Catalogue): void {
  entries.delete(cat.path);
}

/** Every count, as recorded and refitted, recounted only when something changed. */
export function countsFor(cat: Catalogue): Counts {
  const refits = refitsFor(cat);
  const e = entries.get(cat.path)!;
  if (!e.recorded) e.recorded = tally(recordedView(refits.state), refits.vocab, e.rule);
  const { state } = refits;
  if (!e.book) {
    const view = refittedView(state);
    e.book = { tally: new TallyBook(view.specimens, refits.vocab, e.rule, view.pairs), state, revision: state.revision };
  } else if (e.book.state !== state || e.book.revision !== state.revision) {
    const view = refittedView(state);
    e.book.tally.update(view.specimens, view.pairs);
    e.book.state = state;
    e.book.revision = state.revision;
  }
  return { nsp: numberOfSpecimens(refits.specimens), recorded: structuredClone(e.recorded), refitted: e.book.tally.result() };
}
