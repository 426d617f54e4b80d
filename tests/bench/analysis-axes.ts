/**
 * The full fitted shaft axis of each scan of a generated assemblage (analyseFragment, default
 * settings: radius, medial segment, elliptic section), written as JSON by catalogue number, for
 * studies that read the match cache (which keeps only the axis line).
 *   npx tsx tests/bench/analysis-axes.ts <demo-dir> <out.json> [shard shards]
 */
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { analyseFragment } from '../../core/geometry/analyse-fragment';
import { parseMeshFile } from '../../core/geometry/parse/index';
import { scanPath, type TruthFragment } from './candidate-study';

const [dir, outFile, shard = '0', shards = '1'] = process.argv.slice(2);
const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { fragments: TruthFragment[] };
const out: Record<string, unknown> = existsSync(outFile) ? JSON.parse(readFileSync(outFile, 'utf8')) : {};
truth.fragments.forEach((f, i) => {
  if (i % Number(shards) !== Number(shard) || out[f.catalogueNo]) return;
  try {
    const a = analyseFragment(parseMeshFile(readFileSync(scanPath(dir, f)), f.scanFile).mesh);
    out[f.catalogueNo] = a.axis;
  } catch (err) {
    out[f.catalogueNo] = { error: String(err) };
  }
  if (i % 20 === 0) writeFileSync(outFile, JSON.stringify(out));
});
writeFileSync(outFile, JSON.stringify(out));
