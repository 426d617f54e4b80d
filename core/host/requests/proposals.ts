import { z } from 'zod';
import { matchScanFiles } from '../proposals/match-files';
import { proposeJoins } from '../proposals/propose-run';
import { refitSetPoses } from '../proposals/refit-poses';
import { defineRequest } from '../request';

const units = z.enum(['mm', 'cm', 'm']);

/** Join proposals: align two scans, propose joins across a catalogue, poses of refit sets. */
export const proposalRequests = {
  'proposals.match': defineRequest({
    summary: 'Align two fragment scans by their break faces and score the join',
    input: z
      .object({
        a: z.string().min(1),
        b: z.string().min(1),
        unitsA: units.default('mm'),
        unitsB: units.default('mm'),
        alternatives: z.number().int().min(0).max(20).default(4),
      })
      .strict(),
    run: (input, ctx) => matchScanFiles(input, ctx),
  }),

  'proposals.run': defineRequest({
    summary: 'Propose joins across every scanned specimen of a catalogue (incremental, resumable)',
    input: z
      .object({
        catalogue: z.string().trim().min(1, 'give the path of a catalogue file'),
        workers: z.number().int().min(1).max(64).optional(),
        exhaustive: z.boolean().default(false),
        k: z.number().int().min(1).max(100).optional(),
        sizeClassMaxDifference: z.number().int().min(0).max(10).nullable().optional(),
        minScore: z.number().min(0).max(1).optional(),
        ransacIterations: z.number().int().min(50).max(100000).optional(),
      })
      .strict(),
    run: (input, ctx) => proposeJoins(input, ctx),
  }),

  'proposals.poses': defineRequest({
    summary: "Every member's pose in one frame for each refit set of accepted conjoins (for the assembled view)",
    input: z.object({ catalogue: z.string().trim().min(1, 'give the path of a catalogue file') }).strict(),
    run: (input) => refitSetPoses(input.catalogue),
  }),
};
