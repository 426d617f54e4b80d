/**
 * Regenerate the committed sample (demo-data/sample): about 30 fragments of a few deer- and
 * cattle-sized bones at a coarse 1.5 mm point spacing, small enough for the repository and
 * fast tests. `npx tsx demo-data/make-sample.ts`
 */
import { rmSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { generateAssemblage } from './generate';

export const SAMPLE_OPTIONS = { fragments: 36, bones: 4, seed: process.argv[2] ?? 'qs-3', pointSpacing: 1.5, elements: [0, 1, 2, 5, 6] } as const;

const out = join(dirname(fileURLToPath(import.meta.url)), 'sample');
rmSync(out, { recursive: true, force: true });
const summary = await generateAssemblage({ outDir: out, ...SAMPLE_OPTIONS });
process.stderr.write(`sample: ${JSON.stringify(summary)}\n`);
