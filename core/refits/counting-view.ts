import type { CountingSpecimen, PairLink } from '../quant/counting-specimen';
import type { RefitState } from './refit-state';

/**
 * The two readings of a catalogue that counting compares (design.md section 5):
 * - recorded: only the analyst's observations, every specimen alone;
 * - refitted: derived identifications applied, conjoined pieces grouped into refit sets,
 *   fragments joined across modern breaks grouped, and accepted pair joins listed.
 */
export function recordedView(state: RefitState): CountingSpecimen[] {
  return state.observations.map((o, i) => ({
    specimen: o.specimen,
    taxon: o.taxon,
    element: o.element,
    side: o.side,
    zones: o.zones,
    fusion: o.fusion,
    set: i,
    modernGroup: i,
  }));
}

export function refittedView(state: RefitState): { specimens: CountingSpecimen[]; pairs: PairLink[] } {
  const specimens = state.observations.map((o, i) => {
    const id = state.effectiveAt(i);
    const groups = state.groupsAt(i);
    return {
      specimen: o.specimen,
      taxon: id.taxon,
      element: id.element,
      side: id.side,
      zones: o.zones,
      fusion: o.fusion,
      set: groups.set,
      modernGroup: groups.modernGroup,
    };
  });
  const pairs = state
    .acceptedJoins()
    .filter((j) => j.type === 'pair')
    .map((j) => ({ a: j.a, b: j.b }));
  return { specimens, pairs };
}
