/**
 * Candidate study (candidate-study.ts) that keeps what takes time, so that changed face traits
 * (face-traits.ts) can be measured again in a minute: each fragment's analysis and prepared
 * parts are read from a propose run's match cache (`--catalogue <sqlite>`: the catalogue is only
 * read for its scans' cache keys; copy it first, the match cache folder beside the original is
 * only read) or, without one, analysed once and kept under `<out>/candidate-cache-<hash of the
 * analysis sources>/`. The study
 * files are written again every time under `<out>/candidate-study/`. `--generator-axis`: the
 * traits about the generator's shaft axis (generator-axis.ts; the fitted support kept), to see
 * what the fitted axis costs the traits that read it; `--generator-axis=direction` only its
 * direction (through the fitted point), `--generator-axis=centre` only its point (the fitted direction).
 * `--trait-centre=<name>`: the traits about a centre of trait-centre-estimators.ts (the fitted direction).
 *   npx tsx tests/bench/candidate-restudy.ts <demo-dir> [--out <dir>] [--spacing 1.2] [--catalogue <copy.sqlite> --cache <match-cache-dir>]
 */
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { analyseFragment } from '../../core/geometry/analyse-fragment';
import { parseMeshFile } from '../../core/geometry/parse/index';
import { fragmentFromAnalysis } from '../../core/geometry/proposals/fragment-from-analysis';
import { assemblePrepared, prepareFragment, preparedParts, type SamplingParameters } from '../../core/geometry/proposals/prepared-fragment';
import { readFragment, readPrepared, writeFragment, writePrepared, type CachedFragment } from '../../core/jobs/fragment-cache';
import { scanPath, studyFragment, type TruthFragment } from './candidate-study';
import { ANALYSIS_FOLDERS, sourceHash } from './source-hash';
import { catalogueFragmentKeys } from './catalogue-fragment-keys';
import { generatorAxis, type TruthFragment as AxisTruthFragment } from './generator-axis';
import { TRAIT_CENTRE_ESTIMATORS } from './trait-centre-estimators';

const args = process.argv.slice(2);
const opt = (name: string): string | undefined => {
  const i = args.indexOf(name);
  return i >= 0 ? args[i + 1] : undefined;
};
const dir = args[0];
const out = opt('--out') ?? dir;
const sampling: SamplingParameters = { spacing: Number(opt('--spacing') ?? 1.2), fpfhRadiusSpacings: 5 };
const catalogue = opt('--catalogue');
// our own cache is named by a hash of the analysis sources, so a changed segmentation analyses again
const cacheDir = opt('--cache') ?? join(out, `candidate-cache-${sourceHash(...ANALYSIS_FOLDERS)}`);
mkdirSync(join(out, 'candidate-study'), { recursive: true });
mkdirSync(cacheDir, { recursive: true });
const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { fragments: TruthFragment[] };
// the cache key of each fragment: the catalogue's scan keys, or the catalogue number in our own cache
const keyOf = catalogue ? catalogueFragmentKeys(catalogue) : new Map<string, string>();
const c0 = process.cpuUsage();
let done = 0, missing = 0;
for (const f of truth.fragments) {
  const key = catalogue ? keyOf.get(f.catalogueNo) : f.catalogueNo;
  if (!key) { missing++; continue; }
  const file = join(out, 'candidate-study', `${f.catalogueNo}.json`);
  try {
    const mesh = parseMeshFile(readFileSync(scanPath(dir, f)), f.scanFile).mesh;
    let cached: CachedFragment | undefined = readFragment(cacheDir, key);
    if (!cached) {
      if (catalogue) { missing++; continue; }
      const analysis = analyseFragment(mesh);
      const a = analysis.axis;
      cached = { input: fragmentFromAnalysis(analysis), summary: { faceAreas: [], diagonalMm: 0, centroid: [0, 0, 0], axis: { direction: a.direction, point: a.point, support: a.support } } };
      writeFragment(cacheDir, key, cached);
    }
    let parts = readPrepared(cacheDir, key, sampling);
    if (!parts) {
      parts = preparedParts(prepareFragment(cached.input, sampling));
      // --write-prepared: keep them in the match cache too (only on a copy of it)
      if (!catalogue || args.includes('--write-prepared')) writePrepared(cacheDir, key, sampling, parts);
    }
    const prepared = assemblePrepared(cached.input, parts);
    const fitted = cached.summary.axis;
    const mode = args.find((x) => x.startsWith('--generator-axis'))?.split('=')[1] ?? (args.includes('--generator-axis') ? 'both' : undefined);
    const g = mode ? generatorAxis(f as unknown as AxisTruthFragment, mesh) : undefined;
    // 'direction': the generator's direction through the fitted point; 'centre': the fitted direction through the generator's point
    let axis = g ? { direction: mode === 'centre' ? fitted.direction : g.direction, point: mode === 'direction' ? fitted.point : g.point, support: fitted.support } : fitted;
    // --trait-centre=<name>: the traits about another centre (trait-centre-estimators.ts), the fitted direction kept
    const centre = args.find((x) => x.startsWith('--trait-centre='))?.split('=')[1];
    if (centre && !g && fitted.support >= 0.5) axis = TRAIT_CENTRE_ESTIMATORS[centre](cached.input, fitted);
    writeFileSync(file, JSON.stringify(studyFragment(f, mesh, cached.input, axis, sampling.spacing, undefined, prepared)));
  } catch (err) {
    if (!existsSync(file)) writeFileSync(file, JSON.stringify({ no: f.catalogueNo, spacing: sampling.spacing, faces: [], cpuMs: 0, error: String(err) }));
  }
  if (++done % 50 === 0) process.stderr.write(`${done} fragments\n`);
}
console.log(`${done} fragments studied, ${missing} without a cached analysis; ${(process.cpuUsage(c0).user / 1e6).toFixed(1)} CPU s`);
