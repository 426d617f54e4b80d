/**
 * Join proposals, measured (issue 6, items 5-7): `npm run bench -- proposals`.
 *
 *  1. One true join of the committed sample recovered with B turned into each octant.
 *  2. Whole assemblages from the generator, through the real command line (`knitbone import
 *     scans`, then `knitbone propose --workers 2`), pruned and `--exhaustive` side by side:
 *     recall of true joins (both pieces present, at least 30% of the break surviving) in the
 *     top 3 proposals of either piece, per break pattern; precision of proposals scoring above
 *     0.8; rotation and translation errors of correct proposals; wall and CPU time with the
 *     machine's load average; peak memory; face pairs aligned.
 *     2e: where the pruned run loses each true join (no face on the break, pruning, nothing
 *     stored, a wrong motion, ranked outside both top 3s), counted at the first step that lost it.
 *  3. Candidate recall against face pairs (no alignment): how many true joins the pruning lets
 *     through to the expensive step for several k, against every pair (what --exhaustive aligns).
 *
 * Environment:
 *   KNITBONE_BENCH_SIZES           fragments per assemblage, comma separated (default "30,100,200"; add 1000 for the largest)
 *   KNITBONE_BENCH_SEEDS           generator seeds (default "4242", held out: never used while developing)
 *   KNITBONE_BENCH_EXHAUSTIVE_MAX  run --exhaustive for real up to this many fragments (default 30);
 *                                  above it the exhaustive time is estimated from the measured CPU
 *                                  time per aligned face pair, and marked "est."
 *   KNITBONE_BENCH_K               k values for section 3 (default "10,20,30,40,60")
 *   KNITBONE_BENCH_ALIGN=0         print only the import and section 3 (no --exhaustive run; one pruned propose
 *                                  run still goes, since section 3 reads its sampling and k from it)
 *   KNITBONE_BENCH_WORKERS         workers for propose (default 2)
 *   KNITBONE_BENCH_DIR             where generated assemblages are kept and reused (default: the system temp folder)
 *   KNITBONE_BENCH_POINT_SPACING   scanner point spacing of the generated scans (mm; default: the generator's)
 *   KNITBONE_BENCH_SIZE_CLASS=0    leave the recorded size classes out (by default each run's catalogue gets the
 *                                  generator's size_class column, `import specimens --update`, and the pruning
 *                                  uses it as a propose run does; nothing else of specimens.csv is imported)
 *
 * Generated assemblages and imported catalogues (with the analysis import stores for matching)
 * are kept between runs, named by a hash of what they are made from (generator options and
 * source; the generated scans and the analysis source), so a repeat run only proposes again
 * and a changed generator or analysis never reuses stale files. Progress goes to stderr.
 */
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { cpSync, existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { openCatalogue } from '../../core/catalogue/catalogue';
import { cacheDirFor, fragmentKey, readFragment } from '../../core/jobs/fragment-cache';
import { ANALYSIS_FOLDERS, sourceHash } from './source-hash';
import { candidateRecall, sizeClassesFromCsv, trueJoinKey, type TruthJoin as StudyJoin } from './candidate-recall';
import { studyFromCache, type StudyFragment } from './candidate-study';
import { join } from 'node:path';
import { generateAssemblage } from '../../demo-data/generate';
import { matchFragments } from '../../core/geometry/proposals/pairwise-match';
import { prepareFragment, type FragmentInput } from '../../core/geometry/proposals/prepared-fragment';
import { applyToDirections, applyToPoints, compose, displacementAt, invert, rotationAboutAxis, rotationErrorDegrees, transformFrom } from '../../core/geometry/registration/rigid-transform';
import { loadFragment } from '../../core/jobs/fragment-loader';
import { parseMeshFile } from '../../core/geometry/parse';
import { withinCorrectTolerance } from './correct-motion';

const root = join(import.meta.dirname, '../..');
const bin = join(root, 'bin/knitbone.js');

interface TruthJoin { a: string; b: string; type: string; breakId: number; breakAge: string; damaged: boolean; pattern: string; survivingFraction: number; transformBToA: number[] }
interface Truth { fragments: Array<{ catalogueNo: string; scanFile: string; triangleLabels: string }>; joins: TruthJoin[] }
interface Proposal { a: string; b: string; score: number; transform: number[] }

function table(rows: Array<Record<string, string | number>>): void {
  if (!rows.length) return;
  const cols = Object.keys(rows[0]);
  const w = cols.map((c) => Math.max(c.length, ...rows.map((r) => String(r[c]).length)));
  process.stdout.write(cols.map((c, i) => c.padEnd(w[i])).join('  ') + '\n');
  for (const r of rows) process.stdout.write(cols.map((c, i) => String(r[c]).padEnd(w[i])).join('  ') + '\n');
}

const q = (xs: number[], p: number): number => (xs.length ? [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor(p * xs.length))] : NaN);
const f = (x: number, d = 2): string => (Number.isFinite(x) ? x.toFixed(d) : '-');

function octants(): void {
  const sample = join(root, 'demo-data/sample');
  const truth = JSON.parse(readFileSync(join(sample, 'truth.json'), 'utf8')) as Truth;
  const [a, b] = ['QS-10081', 'QS-10797'];
  const j = truth.joins.find((x) => x.a === a && x.b === b)!;
  const sampling = { spacing: 1.05, fpfhRadiusSpacings: 5 };
  const A = prepareFragment(loadFragment(join(sample, 'scans', `${a}.ply`)).input, sampling);
  const inputB = loadFragment(join(sample, 'scans', `${b}.ply`)).input;
  const rows: Array<Record<string, string | number>> = [];
  for (const sx of [1, -1]) for (const sy of [1, -1]) for (const sz of [1, -1]) {
    const turn = transformFrom(rotationAboutAxis([sx, sy, sz], (135 * Math.PI) / 180), [30 * sx, -20 * sy, 10 * sz]);
    const moved: FragmentInput = {
      positions: applyToPoints(turn, inputB.positions) as Float32Array,
      triangles: inputB.triangles,
      faces: inputB.faces.map((x) => ({ ...x, points: applyToPoints(turn, x.points) as Float32Array, normals: applyToDirections(turn, x.normals), outline: x.outline ? (applyToPoints(turn, x.outline) as Float32Array) : undefined })),
    };
    const t0 = Date.now();
    const B = prepareFragment(moved, sampling);
    const [best] = matchFragments(A, B);
    const want = compose(j.transformBToA, invert(turn));
    rows.push({
      octant: `${sx > 0 ? '+' : '-'}${sy > 0 ? '+' : '-'}${sz > 0 ? '+' : '-'}`,
      'rotation error deg': f(best ? rotationErrorDegrees(best.transform, want) : NaN),
      'translation error mm': f(best ? displacementAt(best.transform, want, B.centroid) : NaN),
      score: f(best?.score ?? NaN, 3),
      seconds: f((Date.now() - t0) / 1000, 1),
    });
  }
  process.stdout.write(`\n1. ${a} + ${b} (sample), B turned 135 degrees about (+-1, +-1, +-1)\n`);
  table(rows);
}

interface Timed { status: number | null; stdout: string; stderr: string; wall: number; cpu: number; maxRssMb: number; load: string }

/** Run the command line under /usr/bin/time: wall and CPU seconds (user + system, all threads), peak RSS, load average before/after. */
function cli(args: string[]): Timed {
  const l0 = loadavg()[0];
  const t0 = Date.now();
  const r = spawnSync('/usr/bin/time', ['-f', 'TIMES %U %S %M', process.execPath, bin, ...args], { encoding: 'utf8', maxBuffer: 1 << 28 });
  const m = /TIMES ([\d.]+) ([\d.]+) (\d+)/.exec(r.stderr ?? '');
  return {
    status: r.status,
    stdout: r.stdout,
    stderr: r.stderr,
    wall: (Date.now() - t0) / 1000,
    cpu: m ? Number(m[1]) + Number(m[2]) : NaN,
    maxRssMb: m ? Number(m[3]) / 1024 : NaN,
    load: `${l0.toFixed(1)}/${loadavg()[0].toFixed(1)}`,
  };
}

function must(r: Timed, what: string): Timed {
  if (r.status !== 0) throw new Error(`${what} failed (exit ${r.status}): ${r.stderr.split('\n').slice(0, 3).join(' ')}`);
  return r;
}

const key = (x: string, y: string): string => [x, y].sort().join('|');

/** Progress on stderr, with the time of day. */
function progress(message: string): void {
  process.stderr.write(`[${new Date().toISOString().slice(11, 19)}] ${message}\n`);
}

/** A generated assemblage with its catalogue and scans imported (kept between runs of the benchmark, named by content). */
async function assemblage(n: number, seed: string): Promise<{ dir: string; gen: string; truth: Truth; importRow: Record<string, string | number> }> {
  const base = join(process.env.KNITBONE_BENCH_DIR ?? tmpdir(), 'knitbone-bench-proposals');
  const pointSpacing = process.env.KNITBONE_BENCH_POINT_SPACING ? Number(process.env.KNITBONE_BENCH_POINT_SPACING) : undefined;
  const genKey = createHash('sha256').update(JSON.stringify({ n, seed, pointSpacing, generator: sourceHash('demo-data') })).digest('hex').slice(0, 16);
  const gen = join(base, `generated-${seed}-${n}-${genKey}`);
  if (!existsSync(join(gen, 'generated.ready'))) {
    rmSync(gen, { recursive: true, force: true });
    mkdirSync(gen, { recursive: true });
    progress(`seed ${seed}, ${n} fragments: generating the assemblage (${gen})`);
    await generateAssemblage({ outDir: gen, fragments: n, seed, workers: 2, ...(pointSpacing ? { pointSpacing } : {}) });
    writeFileSync(join(gen, 'generated.ready'), '');
  }
  const truthText = readFileSync(join(gen, 'truth.json'));
  const truth = JSON.parse(truthText.toString('utf8')) as Truth;
  // the imported catalogue depends on the scans (truth.json holds every scan's labels and pose) and on the analysis code
  // (and on the describing of break faces that importing does for the next proposal run)
  const importKey = createHash('sha256').update(truthText).update(sourceHash(...ANALYSIS_FOLDERS, 'core/catalogue')).update(readFileSync(join(root, 'core/host/proposals/describe-faces.ts'))).update(readFileSync(join(root, 'core/host/requests/scans.ts'))).digest('hex').slice(0, 16);
  const dir = join(gen, `imported-${importKey}`);
  let importRow: Record<string, string | number> = { fragments: n, seed, step: 'import scans', note: 'reused from an earlier run' };
  if (!existsSync(join(dir, 'catalogue.ready'))) {
    rmSync(dir, { recursive: true, force: true });
    mkdirSync(dir, { recursive: true });
    writeFileSync(join(dir, 'numbers.csv'), 'catalogue_no\n' + truth.fragments.map((x) => x.catalogueNo).join('\n') + '\n');
    const cat = join(dir, 'base.sqlite');
    must(cli(['init', cat]), 'init');
    must(cli(['import', 'specimens', cat, join(dir, 'numbers.csv')]), 'import specimens');
    progress(`seed ${seed}, ${n} fragments: importing and analysing the scans`);
    const r = cli(['import', 'scans', cat, join(gen, 'scans'), '--skip-bad']);
    importRow = { fragments: n, seed, step: 'import scans', 'wall s': f(r.wall, 1), 'CPU s': f(r.cpu, 1), 'load 1 min (before/after)': r.load, 'max RSS MB': f(r.maxRssMb, 0) };
    progress(`  imported: ${importRow['wall s']} s wall, ${importRow['CPU s']} s CPU, load ${r.load}`);
    writeFileSync(join(dir, 'catalogue.ready'), '');
  }
  // truth.json and the scans stay in the generated folder: the rest of the benchmark reads them there
  return { dir, gen, truth, importRow };
}

interface Proposal { a: string; b: string; score: number; transform: number[] }

/** Mean of a scan's vertices (where translation errors are measured: issue 6, item 5, "at the fragment centroid"). */
const centroids = new Map<string, [number, number, number]>();
function scanCentroid(gen: string, no: string): [number, number, number] {
  const file = join(gen, 'scans', `${no}.ply`);
  let c = centroids.get(file);
  if (!c) {
    const p = parseMeshFile(readFileSync(file), file).mesh.positions;
    const n = p.length / 3;
    c = [0, 0, 0];
    for (let i = 0; i < n; i++) for (let k = 0; k < 3; k++) c[k] += p[3 * i + k] / n;
    centroids.set(file, c);
  }
  return c;
}

/** Size classes recorded in the generated specimens.csv, unless KNITBONE_BENCH_SIZE_CLASS=0. */
function sizeClassesOf(gen: string): Map<string, number | null> | undefined {
  if (process.env.KNITBONE_BENCH_SIZE_CLASS === '0' || !existsSync(join(gen, 'specimens.csv'))) return undefined;
  return sizeClassesFromCsv(readFileSync(join(gen, 'specimens.csv'), 'utf8'));
}

/** One propose run on a fresh copy of the imported catalogue; the figures of the table. */
function proposeRun(dir: string, gen: string, truth: Truth, n: number, seed: string, mode: 'pruned' | 'exhaustive'): { rows: Array<Record<string, string | number>>; found: Set<string>; fate: Map<string, JoinFate>; cpuPerFacePair: number; catalogue: string } {
  const cat = join(dir, `${mode}.sqlite`);
  for (const suffix of ['', '-wal', '-shm']) rmSync(cat + suffix, { force: true });
  rmSync(cacheDirFor(cat), { recursive: true, force: true });
  writeFileSync(cat, readFileSync(join(dir, 'base.sqlite')));
  // what importing the scans stored for matching goes with the catalogue, as it would for a user
  if (existsSync(cacheDirFor(join(dir, 'base.sqlite')))) cpSync(cacheDirFor(join(dir, 'base.sqlite')), cacheDirFor(cat), { recursive: true });
  // the size classes an analyst records (size class may prune, issue 6 item 3); never provenience
  const classes = sizeClassesOf(gen);
  if (classes) {
    const file = join(dir, `${mode}-size-classes.csv`);
    writeFileSync(file, 'catalogue_no,size_class\n' + [...classes].map(([no, c]) => `${no},${c ?? ''}`).join('\n') + '\n');
    must(cli(['import', 'specimens', cat, file, '--update']), 'import size classes');
  }
  const workers = process.env.KNITBONE_BENCH_WORKERS ?? '2';
  progress(`seed ${seed}, ${n} fragments: knitbone propose --workers ${workers}${mode === 'exhaustive' ? ' --exhaustive' : ''}`);
  const r = must(cli(['propose', cat, '--workers', workers, ...(mode === 'exhaustive' ? ['--exhaustive'] : [])]), `propose ${mode}`);
  progress(`  done: ${f(r.wall, 1)} s wall, ${f(r.cpu, 1)} s CPU, ${f(r.maxRssMb, 0)} MB, load ${r.load}; ${r.stdout.split('\n').filter((l) => /break faces|candidate face pairs/.test(l)).join(' ')}`);
  const proposals = JSON.parse(must(cli(['joins', cat, '--status', 'proposed', '--json']), 'joins').stdout) as Proposal[];
  const stats = /(\d+) scans, (\d+) break faces, (\d+) candidate pairs.*\n\((\d+) scans analysed.*?(\d+) candidate face pairs, (\d+) aligned; reading ([\d.]+) s, describing ([\d.]+) s, aligning ([\d.]+) s/.exec(r.stdout) ?? [];
  const workerStats = /while aligning: (\d+) fragments prepared by the workers; workers busy ([\d. /-]+) s of/.exec(r.stdout) ?? [];
  const present = new Set(truth.fragments.map((x) => x.catalogueNo));
  const top3 = (no: string): Proposal[] => proposals.filter((p) => p.a === no || p.b === no).sort((p, q2) => q2.score - p.score).slice(0, 3);
  const trueKeys = new Set(truth.joins.map((j) => key(j.a, j.b)));
  const eligible = truth.joins.filter((j) => j.type === 'conjoin' && j.survivingFraction >= 0.3 && present.has(j.a) && present.has(j.b));
  const groups = new Map<string, TruthJoin[]>([['all', eligible], ['green, undamaged', eligible.filter((j) => j.breakAge === 'fresh' && !j.damaged)]]);
  for (const j of eligible) groups.set(j.pattern, [...(groups.get(j.pattern) ?? []), j]);
  const found = new Set<string>();
  const fate = new Map<string, JoinFate>();
  const rows: Array<Record<string, string | number>> = [];
  const alignedFacePairs = Number(stats[6] ?? NaN);
  for (const [group, list] of groups) {
    let hit = 0;
    const rot: number[] = [], tr: number[] = [];
    for (const j of list) {
      const p = proposals.find((x) => key(x.a, x.b) === key(j.a, j.b));
      const all = group === 'all';
      if (!p) { if (all) fate.set(trueJoinKey(j), 'no proposal'); continue; }
      const want = p.a === j.a ? j.transformBToA : invert(j.transformBToA);
      const re = rotationErrorDegrees(p.transform, want);
      const te = displacementAt(p.transform, want, scanCentroid(gen, p.b));
      if (!withinCorrectTolerance(re, te)) { if (all) fate.set(trueJoinKey(j), 'wrong motion'); continue; }
      if (!top3(j.a).includes(p) && !top3(j.b).includes(p)) { if (all) fate.set(trueJoinKey(j), 'outside both top 3'); continue; }
      if (all) fate.set(trueJoinKey(j), 'top 3');
      hit++;
      rot.push(re);
      tr.push(te);
      if (group === 'all') found.add(key(j.a, j.b));
    }
    const high = proposals.filter((p) => p.score > 0.8);
    const highTrue = high.filter((p) => trueKeys.has(key(p.a, p.b)));
    const all = group === 'all';
    rows.push({
      fragments: n,
      seed,
      mode,
      'break type': group,
      'true joins': list.length,
      'recall top3': list.length ? `${f(hit / list.length)} (${hit})` : '-',
      'precision >0.8': all ? (high.length ? `${f(highTrue.length / high.length)} (${highTrue.length}/${high.length})` : '- (0)') : '',
      'rot med/p95 deg': `${f(q(rot, 0.5))}/${f(q(rot, 0.95))}`,
      'trans med/p95 mm': `${f(q(tr, 0.5))}/${f(q(tr, 0.95))}`,
      faces: all ? (stats[2] ?? '-') : '',
      'face pairs aligned': all ? (stats[6] ?? '-') : '',
      'wall s': all ? f(r.wall, 1) : '',
      'CPU s': all ? f(r.cpu, 1) : '',
      'load 1 min': all ? r.load : '',
      'max RSS MB': all ? f(r.maxRssMb, 0) : '',
      'stages read/describe/align s': all ? `${stats[7] ?? '-'}/${stats[8] ?? '-'}/${stats[9] ?? '-'}` : '',
      'prepared while aligning': all ? (workerStats[1] ?? '-') : '',
      'workers busy s': all ? (workerStats[2] ?? '-') : '',
    });
  }
  const alignSeconds = Number(stats[9] ?? NaN);
  // CPU per aligned face pair: the CPU of the aligning stage is not separated, so take the
  // run's CPU share of wall time for that stage (an estimate; exact when reading took no time)
  const cpuPerFacePair = alignedFacePairs > 0 ? (r.cpu * (alignSeconds / Math.max(r.wall, 1e-9))) / alignedFacePairs : NaN;
  return { rows, found, fate, cpuPerFacePair, catalogue: cat };
}

/** What became of a true join in a propose run (group 'all'). */
type JoinFate = 'top 3' | 'outside both top 3' | 'wrong motion' | 'no proposal';

/**
 * Section 3 from the analysis the pruned run stored: candidate recall for several k, no
 * alignment; also which true joins could be reached at all and which the run's own k reached.
 */
function candidateSection(dir: string, truth: Truth, catalogue: string, ks: number[]): { rows: Array<Record<string, string | number>>; reachable?: Set<string>; reachedAtRunK?: Set<string>; runK?: number } {
  const cat = openCatalogue(catalogue);
  const parameters = cat.joins.list({ status: 'proposed' })[0]?.parameters as { sampling?: { spacing: number }; pruning?: { k: number } } | undefined;
  const spacing = parameters?.sampling?.spacing, runK = parameters?.pruning?.k;
  const scans = cat.scans.list();
  const numbers = new Map(cat.specimens.list().map((s) => [s.id, s.catalogueNo]));
  cat.close();
  if (!spacing) return { rows: [] };
  const byNo = new Map(truth.fragments.map((x) => [x.catalogueNo, x]));
  const studied: StudyFragment[] = [];
  for (const s of scans) {
    const fr = byNo.get(numbers.get(s.specimenId) ?? '');
    if (!fr) continue;
    const cached = readFragment(cacheDirFor(catalogue), fragmentKey(s.contentHash, s.units, (s.stats as { settings?: unknown }).settings, []));
    if (!cached) continue;
    studied.push(studyFromCache(dir, fr, { input: cached.input, axis: cached.summary.axis }, spacing));
  }
  const r = candidateRecall(studied, truth.joins as unknown as StudyJoin[], runK !== undefined && !ks.includes(runK) ? [...ks, runK] : ks, sizeClassesOf(dir));
  const rows = r.rows.filter((x) => x.k === 'all' || ks.includes(x.k)).map((x) => ({
    fragments: r.fragments,
    faces: r.faces,
    k: x.k === 'all' ? 'every pair' : x.k,
    'face pairs': x.facePairs,
    'per face': f(x.perFace, 1),
    'true joins reachable': x.reachable,
    'reached': x.found,
    'candidate recall': f(x.recall, 3),
    'fewer pairs than all': x.k === 'all' ? '1x' : `${f(r.rows[0].facePairs / Math.max(1, x.facePairs), 1)}x`,
    'index ms': f(x.ms, 0),
  }));
  return { rows, reachable: r.rows[0]?.reached, reachedAtRunK: r.rows.find((x) => x.k === runK)?.reached, runK };
}

/**
 * Section 2e: each true join (group 'all') counted once, at the first step that lost it. A join
 * in a top 3 counts as found even when no single face holds 30% of its break on both sides.
 */
function lossRow(n: number, seed: string, fate: Map<string, JoinFate>, c: ReturnType<typeof candidateSection>): Record<string, string | number> {
  const tally = { found: 0, unreachable: 0, pruned: 0, none: 0, wrong: 0, outside: 0 };
  for (const [k2, x] of fate) {
    if (x === 'top 3') tally.found++;
    else if (c.reachable && !c.reachable.has(k2)) tally.unreachable++;
    else if (c.reachedAtRunK && !c.reachedAtRunK.has(k2)) tally.pruned++;
    else if (x === 'no proposal') tally.none++;
    else if (x === 'wrong motion') tally.wrong++;
    else tally.outside++;
  }
  const share = (v: number): string => `${v} (${f(fate.size ? v / fate.size : NaN)})`;
  return {
    fragments: n, seed, 'true joins': fate.size,
    'in a top 3': share(tally.found),
    'no face >= 30% on the break (segmentation)': c.reachable ? share(tally.unreachable) : '-',
    [`not a candidate at k ${c.runK ?? '?'} (pruning)`]: c.reachedAtRunK ? share(tally.pruned) : '-',
    'candidate, nothing stored': share(tally.none),
    'stored with a wrong motion': share(tally.wrong),
    'correct, outside both top 3': share(tally.outside),
  };
}

export default async function run(): Promise<void> {
  if (process.env.KNITBONE_BENCH_OCTANTS !== '0') octants();
  const sizes = (process.env.KNITBONE_BENCH_SIZES ?? '30,100,200').split(',').map(Number).filter((x) => x > 0);
  const seeds = (process.env.KNITBONE_BENCH_SEEDS ?? '4242').split(',').map((x) => x.trim()).filter(Boolean);
  const exhaustiveMax = Number(process.env.KNITBONE_BENCH_EXHAUSTIVE_MAX ?? 30);
  const ks = (process.env.KNITBONE_BENCH_K ?? '10,20,30,40,60').split(',').map(Number).filter((x) => x > 0);
  const align = process.env.KNITBONE_BENCH_ALIGN !== '0';
  const imports: Array<Record<string, string | number>> = [];
  const rows: Array<Record<string, string | number>> = [];
  const side: Array<Record<string, string | number>> = [];
  const recall: Array<Record<string, string | number>> = [];
  const losses: Array<Record<string, string | number>> = [];
  for (const seed of seeds) for (const n of sizes) {
    const { dir, gen, truth, importRow } = await assemblage(n, seed);
    imports.push(importRow);
    const pruned = proposeRun(dir, gen, truth, n, seed, 'pruned');
    if (align) rows.push(...pruned.rows);
    const exhaustiveFacePairs = (() => {
      const c = candidateSection(gen, truth, pruned.catalogue, ks);
      recall.push(...c.rows.map((x) => ({ seed, ...x })));
      if (align) losses.push(lossRow(n, seed, pruned.fate, c));
      return Number(c.rows[0]?.['face pairs'] ?? NaN);
    })();
    const prunedAll = pruned.rows[0];
    if (n <= exhaustiveMax && align) {
      const ex = proposeRun(dir, gen, truth, n, seed, 'exhaustive');
      rows.push(...ex.rows);
      const both = [...ex.found].filter((k2) => pruned.found.has(k2)).length;
      const exAll = ex.rows[0];
      side.push({
        fragments: n, seed,
        'exhaustive finds': ex.found.size, 'pruned finds of those': `${both} (${f(ex.found.size ? both / ex.found.size : NaN)})`,
        'face pairs pruned/exhaustive': `${prunedAll['face pairs aligned']}/${exAll['face pairs aligned']}`,
        'CPU s pruned/exhaustive': `${prunedAll['CPU s']}/${exAll['CPU s']}`,
        'wall s pruned/exhaustive': `${prunedAll['wall s']}/${exAll['wall s']}`,
        'load 1 min': `${prunedAll['load 1 min']}, ${exAll['load 1 min']}`,
        speedup: f(Number(exAll['CPU s']) / Number(prunedAll['CPU s']), 1) + 'x (CPU)',
      });
    } else if (align) {
      const est = exhaustiveFacePairs * pruned.cpuPerFacePair;
      side.push({
        fragments: n, seed,
        'exhaustive finds': 'not run',
        'pruned finds of those': `candidate recall at this k: see section 3`,
        'face pairs pruned/exhaustive': `${prunedAll['face pairs aligned']}/${exhaustiveFacePairs}`,
        'CPU s pruned/exhaustive': `${prunedAll['CPU s']}/${f(est, 0)} est.`,
        'wall s pruned/exhaustive': `${prunedAll['wall s']}/-`,
        'load 1 min': `${prunedAll['load 1 min']}`,
        speedup: `${f(est / Number(prunedAll['CPU s']), 1)}x est. (exhaustive CPU = every face pair x ${f(pruned.cpuPerFacePair * 1000, 0)} ms measured per aligned pair)`,
      });
    }
  }
  process.stdout.write(`\n2a. Importing scans (segmentation; done once per catalogue), 1-minute load average before/after, ${process.env.KNITBONE_BENCH_WORKERS ?? 2} workers\n`);
  table(imports);
  if (align) {
    process.stdout.write('\n2b. knitbone propose --workers 2 (true joins: conjoins with both pieces present and >= 30% of the break surviving; a proposal is correct within 5 degrees and 5 mm at the centroid of B)\n');
    table(rows);
    process.stdout.write('\n2c. Pruned against --exhaustive\n');
    table(side);
  }
  if (align) {
    process.stdout.write('\n2d. Growth with the assemblage (pruned runs): CPU per break face stays flat when the work is near-linear in the number of faces\n');
    table(rows.filter((r) => r.mode === 'pruned' && r['break type'] === 'all').map((r) => ({
      seed: r.seed,
      fragments: r.fragments,
      faces: r.faces,
      'face pairs aligned': r['face pairs aligned'],
      'pairs per face': f(Number(r['face pairs aligned']) / Number(r.faces), 1),
      'wall s': r['wall s'],
      'CPU s': r['CPU s'],
      'CPU ms per face': f((1000 * Number(r['CPU s'])) / Number(r.faces), 0),
      'load 1 min': r['load 1 min'],
      'max RSS MB': r['max RSS MB'],
      'prepared while aligning': r['prepared while aligning'],
      'workers busy s': r['workers busy s'],
      'recall top3': r['recall top3'],
      'precision >0.8': r['precision >0.8'],
    })));
  }
  if (align) {
    process.stdout.write('\n2e. Where the pruned runs lose true joins (all break types; each join counted once, at the first step that lost it)\n');
    table(losses);
  }
  process.stdout.write('\n3. Candidate recall (true joins with a candidate face pair on both sides of the break, each face >= 30% on it) against face pairs, no alignment\n');
  table(recall);
}
