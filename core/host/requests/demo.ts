import { existsSync, readdirSync, readFileSync, rmSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { z } from 'zod';
import { DEMO_TRUTH_FORMAT, generateAssemblage } from '../../../demo-data/generate';
import { SITE_DEFINITIONS_FILE } from '../../../demo-data/site-definitions';
import { KnitboneError } from '../errors';
import { defineRequest } from '../request';

/** What a previous demo leaves in its folder (and nothing else may be there). */
const DEMO_FILES = new Set(['scans', 'specimens.csv', 'truth.json', SITE_DEFINITIONS_FILE]);

/**
 * Refuse a folder that holds anything but a previous demo, and a previous demo whose
 * catalogue exists (it may hold someone's practice decisions); clear an earlier demo's
 * generated files otherwise, so stale scans do not mix with new ones.
 */
function prepareFolder(dir: string): void {
  if (!existsSync(dir)) return;
  if (!statSync(dir).isDirectory()) throw new KnitboneError('bad-input', [{ file: dir, message: 'is a file, not a folder: give a new or empty folder' }]);
  const entries = readdirSync(dir);
  if (entries.length === 0) return;
  if (entries.some((e) => e.startsWith('demo.sqlite'))) {
    throw new KnitboneError('conflict', [{ file: join(dir, 'demo.sqlite'), message: 'a demo catalogue is already here; delete it (and its folder) or choose another folder' }]);
  }
  let isDemo = false;
  try {
    isDemo = readFileSync(join(dir, 'truth.json'), 'utf8').slice(0, 200).includes(`"format": "${DEMO_TRUTH_FORMAT}"`);
  } catch {
    isDemo = false;
  }
  if (!isDemo || entries.some((e) => !DEMO_FILES.has(e))) {
    throw new KnitboneError('conflict', [{ file: dir, message: 'the folder is not empty and does not hold an earlier demo; give a new or empty folder' }]);
  }
  for (const e of entries) rmSync(join(dir, e), { recursive: true, force: true });
}

/** Requests about the invented demo assemblage (demo-data/). */
export const demoRequests = {
  'demo.generate': defineRequest({
    summary: 'Generate an invented assemblage of broken long bones with known truth: scans, specimens.csv, truth.json',
    input: z
      .object({
        dir: z.string().trim().min(1, 'give the folder to write into'),
        fragments: z.number().int().min(1).max(100_000).default(60),
        seed: z.union([z.string().min(1), z.number()]).default('quarnel'),
        pointSpacing: z.number().min(0.1).max(3).optional(),
        /** Worker threads (default: one per core); the files are the same whatever the number. */
        workers: z.number().int().min(1).max(64).optional(),
      })
      .strict(),
    run: async (input, ctx) => {
      prepareFolder(input.dir);
      const summary = await generateAssemblage(
        { outDir: input.dir, fragments: input.fragments, seed: input.seed, pointSpacing: input.pointSpacing, workers: input.workers, signal: ctx.signal },
        (e) => ctx.onProgress(e),
      );
      return {
        dir: input.dir,
        specimensCsv: join(input.dir, 'specimens.csv'),
        scansFolder: join(input.dir, 'scans'),
        truthJson: join(input.dir, 'truth.json'),
        siteJson: join(input.dir, SITE_DEFINITIONS_FILE),
        ...summary,
      };
    },
  }),
};
