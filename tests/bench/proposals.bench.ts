/**
 * Join proposals, measured (issue 6, items 5-7): `npm run bench -- proposals`.
 *
 *  1. One true join of the committed sample recovered with B turned into each octant.
 *  2. Whole assemblages from the generator (seeds used nowhere else), through the real command
 *     line (`knitbone propose --workers 2`), pruned and `--exhaustive` side by side: recall of
 *     true joins (both pieces present, at least 30% of the break surviving) in the top 3
 *     proposals of either piece, per break pattern; precision of proposals scoring above 0.8;
 *     rotation and translation errors of correct proposals; time; peak memory.
 * Sizes: KNITBONE_BENCH_SIZES (comma separated, default "12,24"); exhaustive runs only up to
 * KNITBONE_BENCH_EXHAUSTIVE_MAX fragments (default 24).
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { generateAssemblage } from '../../demo-data/generate';
import { matchFragments } from '../../core/geometry/proposals/pairwise-match';
import { prepareFragment, type FragmentInput } from '../../core/geometry/proposals/prepared-fragment';
import { applyToDirections, applyToPoints, compose, displacementAt, invert, rotationAboutAxis, rotationErrorDegrees, transformFrom } from '../../core/geometry/registration/rigid-transform';
import { loadFragment } from '../../core/jobs/fragment-loader';

const root = join(import.meta.dirname, '../..');
const bin = join(root, 'bin/knitbone.js');

interface TruthJoin { a: string; b: string; type: string; pattern: string; survivingFraction: number; transformBToA: number[] }
interface Truth { fragments: Array<{ catalogueNo: string }>; joins: TruthJoin[] }
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

function cli(args: string[]): { status: number | null; stdout: string; stderr: string; seconds: number; maxRssMb: number } {
  const t0 = Date.now();
  const r = spawnSync('/usr/bin/time', ['-f', 'MAXRSS %M', process.execPath, bin, ...args], { encoding: 'utf8', maxBuffer: 1 << 28 });
  const rss = /MAXRSS (\d+)/.exec(r.stderr ?? '');
  return { status: r.status, stdout: r.stdout, stderr: r.stderr, seconds: (Date.now() - t0) / 1000, maxRssMb: rss ? Number(rss[1]) / 1024 : NaN };
}

async function assemblage(n: number, exhaustiveMax: number): Promise<Array<Record<string, string | number>>> {
  const dir = mkdtempSync(join(tmpdir(), `knitbone-bench-${n}-`));
  await generateAssemblage({ outDir: dir, fragments: n, seed: `bench-${n}-proposals-71` });
  const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as Truth;
  writeFileSync(join(dir, 'numbers.csv'), 'catalogue_no\n' + truth.fragments.map((x) => x.catalogueNo).join('\n') + '\n');
  const rows: Array<Record<string, string | number>> = [];
  const modes: Array<[string, string[]]> = [['pruned', []]];
  if (n <= exhaustiveMax) modes.push(['exhaustive', ['--exhaustive']]);
  const found: Record<string, Set<string>> = {};
  for (const [mode, extra] of modes) {
    const cat = join(dir, `${mode}.sqlite`);
    cli(['init', cat]);
    cli(['import', 'specimens', cat, join(dir, 'numbers.csv')]);
    cli(['import', 'scans', cat, join(dir, 'scans'), '--skip-bad']);
    const r = cli(['propose', cat, '--workers', '2', '--json', ...extra]);
    if (r.status !== 0) {
      rows.push({ fragments: n, mode, pattern: 'all', error: r.stderr.split('\n')[0] });
      continue;
    }
    const proposals = JSON.parse(r.stdout) as Proposal[];
    const present = new Set(truth.fragments.map((x) => x.catalogueNo));
    const top3 = (no: string): Proposal[] => proposals.filter((p) => p.a === no || p.b === no).sort((p, q2) => q2.score - p.score).slice(0, 3);
    const key = (x: string, y: string): string => [x, y].sort().join('|');
    const trueKeys = new Set(truth.joins.map((j) => key(j.a, j.b)));
    const eligible = truth.joins.filter((j) => j.type === 'conjoin' && j.survivingFraction >= 0.3 && present.has(j.a) && present.has(j.b));
    const byPattern = new Map<string, TruthJoin[]>([['all', eligible]]);
    for (const j of eligible) byPattern.set(j.pattern, [...(byPattern.get(j.pattern) ?? []), j]);
    found[mode] = new Set();
    const rot: number[] = [], tr: number[] = [];
    const correct = (j: TruthJoin, p: Proposal): boolean => {
      const want = p.a === j.a ? j.transformBToA : invert(j.transformBToA);
      const re = rotationErrorDegrees(p.transform, want);
      const te = displacementAt(p.transform, want, [0, 0, 0]);
      return re < 5 && te < 5;
    };
    for (const [pattern, list] of byPattern) {
      let hit = 0;
      for (const j of list) {
        const p = proposals.find((x) => key(x.a, x.b) === key(j.a, j.b));
        if (!p || !correct(j, p)) continue;
        if (!top3(j.a).includes(p) && !top3(j.b).includes(p)) continue;
        hit++;
        if (pattern === 'all') {
          found[mode].add(key(j.a, j.b));
          const want = p.a === j.a ? j.transformBToA : invert(j.transformBToA);
          rot.push(rotationErrorDegrees(p.transform, want));
          tr.push(displacementAt(p.transform, want, [0, 0, 0]));
        }
      }
      const high = proposals.filter((p) => p.score > 0.8);
      const highTrue = high.filter((p) => trueKeys.has(key(p.a, p.b)));
      const summary = /(\d+) scans, (\d+) break faces, (\d+) candidate pairs/.exec(r.stdout) ?? [];
      rows.push({
        fragments: n,
        mode,
        pattern,
        'true joins': list.length,
        'recall top3': list.length ? f(hit / list.length) : '-',
        'precision >0.8': pattern === 'all' ? (high.length ? `${f(highTrue.length / high.length)} (${highTrue.length}/${high.length})` : '- (0)') : '',
        'rot med/p95 deg': pattern === 'all' ? `${f(q(rot, 0.5))}/${f(q(rot, 0.95))}` : '',
        'trans med/p95 mm': pattern === 'all' ? `${f(q(tr, 0.5))}/${f(q(tr, 0.95))}` : '',
        faces: pattern === 'all' ? (summary[2] ?? '-') : '',
        'pairs aligned': pattern === 'all' ? (summary[3] ?? '-') : '',
        seconds: pattern === 'all' ? f(r.seconds, 1) : '',
        'max RSS MB': pattern === 'all' ? f(r.maxRssMb, 0) : '',
      });
    }
  }
  if (found.pruned && found.exhaustive) {
    const both = [...found.exhaustive].filter((k) => found.pruned.has(k)).length;
    process.stdout.write(`${n} fragments: pruning finds ${both} of the ${found.exhaustive.size} joins exhaustive finds\n`);
  }
  return rows;
}

export default async function run(): Promise<void> {
  octants();
  const sizes = (process.env.KNITBONE_BENCH_SIZES ?? '12,24').split(',').map(Number).filter((x) => x > 0);
  const exhaustiveMax = Number(process.env.KNITBONE_BENCH_EXHAUSTIVE_MAX ?? 24);
  const rows: Array<Record<string, string | number>> = [];
  for (const n of sizes) rows.push(...(await assemblage(n, exhaustiveMax)));
  process.stdout.write('\n2. Generated assemblages, knitbone propose --workers 2 (true joins: conjoins with both pieces present and >= 30% of the break surviving)\n');
  table(rows);
}
