import type { Catalogue } from '../../catalogue/index';
import { defaultIdentificationRule, TAXONOMIC_RANKS, type IdentificationRule } from '../../quant/identified';
import { numberOfSpecimens } from '../../quant/nsp';
import { tally, type Tally } from '../../quant/tally';
import { recordedView, refittedView } from '../../refits/counting-view';
import type { CatalogueRefits } from './refits-of';

/** Catalogue setting: the broadest taxonomic rank that counts as identified in NISP. */
export const IDENTIFICATION_RANK_SETTING = 'nisp.identificationRank';

export interface Counts {
  nsp: number;
  /** Only the analyst's observations, every specimen alone. */
  recorded: Tally;
  /** Derived identifications applied, refit sets and accepted joins taken into account. */
  refitted: Tally;
}

/** The identification threshold of a catalogue (default: family or finer). */
export function identificationRuleOf(cat: Catalogue): IdentificationRule {
  const rank = cat.settings.get<string>(IDENTIFICATION_RANK_SETTING);
  if (typeof rank === 'string' && (TAXONOMIC_RANKS as readonly string[]).includes(rank)) return { rank };
  return defaultIdentificationRule;
}

/** Every count, as recorded and refitted (design.md section 5). */
export function countsOf(refits: CatalogueRefits, rule: IdentificationRule): Counts {
  const refitted = refittedView(refits.state);
  return {
    nsp: numberOfSpecimens(refits.specimens),
    recorded: tally(recordedView(refits.state), refits.vocab, rule),
    refitted: tally(refitted.specimens, refits.vocab, rule, refitted.pairs),
  };
}
