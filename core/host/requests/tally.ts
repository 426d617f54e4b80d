import { z } from 'zod';
import { withCatalogue } from '../../catalogue/index';
import type { Counts } from '../counting/counts-of';
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
};
