import { z } from 'zod';
import { withCatalogue } from '../../catalogue/index';
import { TAXON_RANKS } from '../../vocab/index';
import { IDENTIFICATION_RANK_SETTING, identificationRuleOf, type Counts } from '../counting/counts-of';
import { countsFor } from '../counting/refits-cache';
import { defineRequest } from '../request';

const cataloguePath = z.string().trim().min(1, 'give the path of a catalogue file');

/** Requests that count: NSP, NISP, MNE, MNI, MAU as recorded and refitted. */
export const tallyRequests = {
  'tally.counts': defineRequest({
    summary: 'NSP, and NISP, identification rates, MNE, MNI, MAU and %MAU as recorded and refitted',
    input: z.object({ catalogue: cataloguePath }).strict(),
    run: (input) => withCatalogue(input.catalogue, (cat): Counts => countsFor(cat)),
  }),

  'tally.identificationRank': defineRequest({
    summary: 'The broadest taxonomic rank that counts as identified in NISP (default family); give rank to change it',
    input: z.object({ catalogue: cataloguePath, rank: z.enum(TAXON_RANKS).optional(), by: z.string().trim().min(1).optional() }).strict(),
    run: (input) =>
      withCatalogue(input.catalogue, (cat) => {
        if (input.rank) cat.settings.set(IDENTIFICATION_RANK_SETTING, input.rank, input.by ?? cat.who);
        return { rank: identificationRuleOf(cat).rank };
      }),
  }),
};
