import { z } from 'zod';
import { generateAssemblage } from '../../../demo-data/generate';
import { defineRequest } from '../request';

/** Requests about the invented demo assemblage (demo-data/). */
export const demoRequests = {
  'demo.generate': defineRequest({
    summary: 'Generate an invented assemblage of broken long bones with known truth: scans, specimens.csv, truth.json',
    input: z
      .object({
        dir: z.string().min(1),
        fragments: z.number().int().min(1).max(100_000).default(60),
        seed: z.union([z.string().min(1), z.number()]).default('quarnel'),
        pointSpacing: z.number().min(0.1).max(3).optional(),
      })
      .strict(),
    run: async (input, ctx) => {
      const summary = await generateAssemblage(
        { outDir: input.dir, fragments: input.fragments, seed: input.seed, pointSpacing: input.pointSpacing },
        (e) => ctx.onProgress(e),
      );
      return { dir: input.dir, ...summary };
    },
  }),
};
