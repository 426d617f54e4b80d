/**
 * The pairwise step of join proposals, measured (issue 6, items 5-7): `npm run bench -- pairwise`.
 *
 * On generated assemblages with known truth (truth.json), every candidate face pair the
 * candidate index suggests (DEFAULT_K per face, as `knitbone propose` does) plus every face pair of every
 * true join is aligned and scored. Prints:
 *   - CPU milliseconds per face pair (median, p90, mean) beside the machine's load,
 *   - rotation and translation errors of the best motion of each true join that is found,
 *   - recall of true joins as the best motion of their fragment pair and in the top 3 of a piece,
 *   - calibration: predicted score against the observed share of correct motions, in bins,
 *   - precision of motions scoring above 0.8.
 * A motion is correct when within 5 degrees and 5 mm (at B's centroid) of the truth.
 *
 * Assemblages: KNITBONE_PAIRWISE_DIRS (comma separated folders written by `knitbone demo`), or
 * else generated here from seeds KNITBONE_PAIRWISE_SEEDS (default "4242,777"; these seeds are
 * never used to fit the score) with KNITBONE_PAIRWISE_FRAGMENTS fragments (default 30).
 * KNITBONE_PAIRWISE_SPACING fixes the sample spacing (mm) instead of the rung the face areas pick.
 * KNITBONE_PAIRWISE_PARAMS='{"axisPeaks": 3}' overrides matching parameters; KNITBONE_PAIRWISE_LIMIT caps
 * the face pairs aligned per assemblage (true joins first); KNITBONE_PAIRWISE_TRUE_ONLY=1 aligns only the
 * true joins' fragment pairs (a quick check of "found (best of pair)" and classes a-c; top 3 and d
 * need the other pairs).
 * KNITBONE_PAIRWISE_DUMP=<file.json> writes every scored motion with its components and whether
 * it is correct (the input of tests/bench/fit-score-model.ts).
 * KNITBONE_PAIRWISE_JOINS=<file.json> writes one record per true join for the study of misses
 * and prints the missed joins by cause (missCause): its class, how much of the break each
 * piece's best-holding face carries and how pure that face is (truth labels), and for joins
 * lost in ranking the winning motion's components beside the best correct one's and the
 * pieces' top 3.
 */
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir, loadavg } from 'node:os';
import { join } from 'node:path';
import { deserialize, serialize } from 'node:v8';
import { generateAssemblage } from '../../demo-data/generate';
import { candidateFacePairs, DEFAULT_K, type IndexedFace } from '../../core/geometry/proposals/candidate-index';
import { fragmentFaceTraits } from '../../core/geometry/proposals/face-traits';
import { matchFacePair, distinctBest, polishRanked, faceOverlapUnder, DEFAULT_MATCH_PARAMETERS, type FaceMatch, type MatchTrace } from '../../core/geometry/proposals/pairwise-match';
import { prepareFragment, spacingForFaces, DEFAULT_FPFH_RADIUS_SPACINGS, type FragmentInput, type PreparedFragment } from '../../core/geometry/proposals/prepared-fragment';
import { displacementAt, rotationErrorDegrees, type RigidTransform } from '../../core/geometry/registration/rigid-transform';
import { loadFragment } from '../../core/jobs/fragment-loader';
import { reliability } from './calibration';
import { faceBreaks, type StudiedFragment } from './face-pair-study';
import { parseMeshFile } from '../../core/geometry/parse/index';
import { ANALYSIS_FOLDERS, sourceHash } from './source-hash';
import { withinCorrectTolerance } from './correct-motion';

interface TruthJoin { a: string; b: string; type: string; breakId?: number; pattern: string; survivingFraction: number; contactAreaMm2?: number; transformBToA: number[] }
interface Truth { fragments: Array<{ catalogueNo: string; boneId: string; scanFile?: string; triangleLabels?: string }>; joins: TruthJoin[] }

/**
 * Classes of a true join's outcome, by the first stage that lost the truth: a, no coarse
 * hypothesis within 10 degrees and 5 mm; b, a coarse one was but ICP (short or fine) drifted
 * away; c2, refined correctly but dropped by the overlap ranking before the fine step; c,
 * refined correctly but outscored by a wrong motion of the same pair; d, best of its pair but
 * not in the top 3 of either piece; e, under the true motion no face pair overlaps or holds a
 * fair share of the surviving break (the break is not held by one segmented face on each side).
 */
const FAILURE_CLASSES = ['found', 'a no coarse hypothesis', 'b coarse ICP drifted', 'c2 dropped by overlap', 'b fine step drifted', 'c outscored in pair', 'd outranked by other pairs', 'e break not in one face', 'not run (limit)'];
const TRUTH_OVERLAP_MIN = 0.2;
/** ... or when the face pair that holds the most of the break holds less than this share of its surviving area. */
const TRUTH_AREA_MIN = 0.3;

const SPACING_LADDER = [0.3, 0.42, 0.6, 0.85, 1.2, 1.7, 2.4, 3.4];

function table(rows: Array<Record<string, string | number>>): void {
  if (!rows.length) return;
  const cols = Object.keys(rows[0]);
  const w = cols.map((c) => Math.max(c.length, ...rows.map((r) => String(r[c] ?? '').length)));
  process.stdout.write(cols.map((c, i) => c.padEnd(w[i])).join('  ') + '\n');
  for (const r of rows) process.stdout.write(cols.map((c, i) => String(r[c] ?? '').padEnd(w[i])).join('  ') + '\n');
}
const q = (xs: number[], p: number): number => (xs.length ? [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor(p * xs.length))] : NaN);
const f = (x: number, d = 2): string => (Number.isFinite(x) ? x.toFixed(d) : '-');

let analysisCode: string | undefined;

/**
 * Analysed fragments are cached in the temporary folder (analysis is not what is measured here),
 * named by the scan's content and the analysis code, so neither a changed scan nor changed code
 * reuses a stale analysis.
 */
export function loadCached(file: string): FragmentInput {
  const dir = join(tmpdir(), 'knitbone-pairwise-cache');
  mkdirSync(dir, { recursive: true });
  analysisCode ??= sourceHash(...ANALYSIS_FOLDERS);
  const key = join(dir, createHash('sha256').update(readFileSync(file)).update(analysisCode).digest('hex').slice(0, 32) + '.v8');
  if (existsSync(key)) return deserialize(readFileSync(key)) as FragmentInput;
  const input = loadFragment(file).input;
  writeFileSync(key, serialize(input));
  return input;
}

export interface ScoredMotion {
  set: string;
  a: string;
  b: string;
  trueJoin: boolean;
  correct: boolean;
  rank: number;
  score: number;
  components: Record<string, number>;
  rotErr: number;
  transErr: number;
}

async function assemblageDirs(): Promise<string[]> {
  if (process.env.KNITBONE_PAIRWISE_DIRS) return process.env.KNITBONE_PAIRWISE_DIRS.split(',');
  const seeds = (process.env.KNITBONE_PAIRWISE_SEEDS ?? '4242,777').split(',');
  const n = Number(process.env.KNITBONE_PAIRWISE_FRAGMENTS ?? 30);
  const dirs: string[] = [];
  for (const seed of seeds) {
    const dir = join(tmpdir(), `knitbone-pairwise-${n}-${seed}`);
    if (!existsSync(join(dir, 'truth.json'))) await generateAssemblage({ outDir: dir, fragments: n, seed: Number.isFinite(Number(seed)) ? Number(seed) : seed });
    dirs.push(dir);
  }
  return dirs;
}

export default async function main(): Promise<void> {
  const dirs = await assemblageDirs();
  const limit = Number(process.env.KNITBONE_PAIRWISE_LIMIT ?? Infinity);
  const params = { ...DEFAULT_MATCH_PARAMETERS, ...(JSON.parse(process.env.KNITBONE_PAIRWISE_PARAMS ?? '{}') as object) };
  const motions: ScoredMotion[] = [];
  const cpuMs: number[] = [];
  // params.polishBest: each fragment pair's best motions also refined from the other side (pairwise-match.ts polishRanked)
  let polishMs = 0;
  const origin = new Map<FaceMatch, [number, number]>();
  const summary: Array<Record<string, string | number>> = [];
  const breakdown: Array<Record<string, string | number>> = [];
  const joinRecords: Array<Record<string, unknown>> = [];
  for (const dir of dirs) {
    const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as Truth;
    const names = truth.fragments.map((x) => x.catalogueNo);
    const inputs = new Map<string, FragmentInput>();
    for (const no of names) {
      try {
        inputs.set(no, loadCached(join(dir, 'scans', `${no}.ply`)));
      } catch {
        // refused scans (no break face, too small) take no part
      }
    }
    const raw = spacingForFaces([...inputs.values()].flatMap((x) => x.faces.map((y) => y.area ?? 0)));
    // KNITBONE_PAIRWISE_SPACING fixes the spacing (to compare segmentations whose face areas would pick different rungs)
    const spacing = Number(process.env.KNITBONE_PAIRWISE_SPACING) || SPACING_LADDER.reduce((best, v) => (Math.abs(Math.log(v / raw)) < Math.abs(Math.log(best / raw)) ? v : best), SPACING_LADDER[0]);
    const prepared = new Map<string, PreparedFragment>();
    const usable = [...inputs.keys()];
    for (const no of usable) prepared.set(no, prepareFragment(inputs.get(no)!, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS }));
    const faces: IndexedFace[] = [];
    usable.forEach((no, fi) => {
      const p = prepared.get(no)!;
      const axis = p.axis ? { direction: p.axis.direction, point: p.axis.point, support: 1 } : undefined;
      fragmentFaceTraits(inputs.get(no)!, p, axis).forEach((traits, face) => faces.push({ fragment: fi, face, traits }));
    });
    const cands = candidateFacePairs(faces, { k: DEFAULT_K });
    if (process.env.KNITBONE_PAIRWISE_JOINS) for (const no of usable) holderInputs.set(`${dir}|${no}`, prepared.get(no)!);
    const key = (x: string, y: string): string => (x < y ? `${x}|${y}` : `${y}|${x}`);
    const truthOf = new Map(truth.joins.filter((j) => j.type === 'conjoin').map((j) => [key(j.a, j.b), j]));
    // face pairs per fragment pair: candidates, plus every face pair of true joins
    const work = new Map<string, { a: string; b: string; pairs: Set<string> }>();
    const addPair = (a: string, b: string, fa: number, fb: number): void => {
      // one entry per fragment pair, whichever way round it was first met (else a true join's face
      // pairs and the candidates' would be aligned as two entries, the later overwriting the first)
      if (work.has(`${b}|${a}`)) return addPair(b, a, fb, fa);
      const k = `${a}|${b}`;
      let w = work.get(k);
      if (!w) work.set(k, (w = { a, b, pairs: new Set() }));
      w.pairs.add(`${fa},${fb}`);
    };
    for (const c of cands) addPair(usable[c.a], usable[c.b], c.faceA, c.faceB);
    const eligible = truth.joins.filter((j) => j.type === 'conjoin' && j.survivingFraction >= 0.3 && prepared.has(j.a) && prepared.has(j.b));
    for (const j of eligible) {
      const [a, b] = usable.indexOf(j.a) < usable.indexOf(j.b) ? [j.a, j.b] : [j.b, j.a];
      const A = prepared.get(a)!, B = prepared.get(b)!;
      for (let i = 0; i < A.faces.length; i++) for (let k = 0; k < B.faces.length; k++) addPair(a, b, i, k);
    }
    let done = 0;
    const traces = new Map<string, { truthOverlap: number; truthArea: number; coarseNear: boolean; refinedCorrect: boolean; keptCorrect: boolean; fineCorrect: boolean; bestCorrect?: FaceMatch; winner?: FaceMatch; winnerErr?: [number, number]; coarseBest: [number, number]; refinedBest: { rot: number; trans: number; overlap: number; bestOverlap: number } }>();
    const best = new Map<string, FaceMatch & { correct: boolean }>();
    // true joins first, so a limited run still measures accuracy
    const ordered = [...work.values()].sort((x, y) => Number(truthOf.has(key(y.a, y.b))) - Number(truthOf.has(key(x.a, x.b))));
    for (const w of ordered) {
      if (done >= limit) break;
      const A = prepared.get(w.a)!, B = prepared.get(w.b)!;
      const tj = truthOf.get(key(w.a, w.b));
      if (process.env.KNITBONE_PAIRWISE_TRUE_ONLY && !tj) continue;
      const want = tj ? (tj.a === w.a ? tj.transformBToA : undefined) : undefined;
      const wantInv = tj && !want ? tj.transformBToA : undefined; // truth maps A(=tj.a) <- B; here a is tj.b
      const all: FaceMatch[] = [];
      origin.clear();
      const t = want ?? (wantInv ? invertRigid(wantInv) : undefined);
      const traced = t ? { coarse: [], refined: [], kept: [] } as MatchTrace : undefined;
      let truthOverlap = 0, truthArea = 0;
      for (const p of w.pairs) {
        const [fa, fb] = p.split(',').map(Number);
        if (t) {
          const o = faceOverlapUnder(A, fa, B, fb, t);
          truthOverlap = Math.max(truthOverlap, o.share);
          truthArea = Math.max(truthArea, o.areaMm2);
        }
        const c0 = process.cpuUsage();
        for (const m of matchFacePair(A, fa, B, fb, params, traced)) {
          origin.set(m, [fa, fb]);
          all.push(m);
        }
        const c1 = process.cpuUsage(c0);
        cpuMs.push((c1.user + c1.system) / 1000);
        done++;
      }
      let ranked = distinctBest(all, 2 * spacing);
      if (params.polishBest > 0) {
        const c0 = process.cpuUsage();
        ranked = polishRanked(A, B, ranked, origin, params, spacing);
        const c1 = process.cpuUsage(c0);
        polishMs += (c1.user + c1.system) / 1000;
      }
      const list = ranked.slice(0, 5);
      if (t && traced) {
        const near = (m: RigidTransform, deg: number, mm: number): boolean => rotationErrorDegrees(m, t) < deg && displacementAt(m, t, B.centroid) < mm;
        traces.set(key(w.a, w.b), {
          truthOverlap,
          truthArea,
          coarseNear: traced.coarse.some((m) => near(m, 10, 5)),
          refinedCorrect: traced.refined.some((r) => near(r.transform, 5, 5)),
          keptCorrect: traced.kept.some((m) => near(m, 5, 5)),
          fineCorrect: ranked.some((m) => near(m.transform, 5, 5)),
          bestCorrect: ranked.find((m) => near(m.transform, 5, 5)),
          winner: ranked[0],
          winnerErr: ranked[0] ? [rotationErrorDegrees(ranked[0].transform, t), displacementAt(ranked[0].transform, t, B.centroid)] : undefined,
          coarseBest: traced.coarse.map((m): [number, number] => [rotationErrorDegrees(m, t), displacementAt(m, t, B.centroid)]).sort((p, q) => p[0] / 5 + p[1] / 5 - q[0] / 5 - q[1] / 5)[0] ?? [NaN, NaN],
          refinedBest: (() => {
            const r = traced.refined.map((x) => ({ rot: rotationErrorDegrees(x.transform, t), trans: displacementAt(x.transform, t, B.centroid), overlap: x.overlap })).sort((p, q) => p.rot / 5 + p.trans / 5 - q.rot / 5 - q.trans / 5)[0];
            return { ...(r ?? { rot: NaN, trans: NaN, overlap: NaN }), bestOverlap: Math.max(0, ...traced.refined.map((x) => x.overlap)) };
          })(),
        });
      }
      list.forEach((m, rank) => {
        let rotErr = NaN, transErr = NaN;
        if (want || wantInv) {
          // compare in B -> A of this pair
          const t = want ?? invertRigid(wantInv!);
          rotErr = rotationErrorDegrees(m.transform, t);
          transErr = displacementAt(m.transform, t, B.centroid);
        }
        const correct = withinCorrectTolerance(rotErr, transErr);
        const { transform: _t, faceA: _fa, faceB: _fb, score: _s, ...components } = m;
        motions.push({ set: dir, a: w.a, b: w.b, trueJoin: !!tj, correct, rank, score: m.score, rotErr, transErr, components });
        if (rank === 0) best.set(key(w.a, w.b), { ...m, correct });
      });
    }
    // recall: true join correct as the best motion of its pair, and in the top 3 of either piece
    let asBest = 0, top3 = 0;
    const pieceTop = (no: string): string[] => [...best.entries()].filter(([k]) => k.split('|').includes(no)).sort((x, y) => y[1].score - x[1].score).slice(0, 3).map(([k]) => k);
    const classes = new Map<string, number>(FAILURE_CLASSES.map((c) => [c, 0]));
    for (const j of eligible) {
      const k = key(j.a, j.b);
      const m = best.get(k);
      const tr = traces.get(k);
      let cls: string;
      if (m && m.correct) {
        asBest++;
        if (pieceTop(j.a).includes(k) || pieceTop(j.b).includes(k)) {
          top3++;
          cls = 'found';
        } else cls = 'd outranked by other pairs';
      } else if (!tr) cls = 'not run (limit)';
      else if (tr.fineCorrect) cls = 'c outscored in pair';
      else if (tr.keptCorrect) cls = 'b fine step drifted';
      else if (tr.refinedCorrect) cls = 'c2 dropped by overlap';
      else if (tr.coarseNear) cls = 'b coarse ICP drifted';
      else if (tr.truthOverlap < TRUTH_OVERLAP_MIN || tr.truthArea < TRUTH_AREA_MIN * (j.contactAreaMm2 ?? 0) * j.survivingFraction) cls = 'e break not in one face';
      else cls = 'a no coarse hypothesis';
      classes.set(cls, (classes.get(cls) ?? 0) + 1);
      if (process.env.KNITBONE_PAIRWISE_JOINS) {
        const comp = (m?: FaceMatch): Record<string, number> | undefined => {
          if (!m) return undefined;
          const { transform: _t, ...rest } = m;
          return rest as unknown as Record<string, number>;
        };
        const rivals = (no: string): Array<{ pair: string; score: number; trueJoin: boolean; correct: boolean }> => pieceTop(no).map((pk) => ({ pair: pk, score: best.get(pk)!.score, trueJoin: truthOf.has(pk), correct: best.get(pk)!.correct }));
        joinRecords.push({
          set: dir.split(/[\\/]/).pop(), pair: k, breakId: j.breakId, pattern: j.pattern, contactAreaMm2: j.contactAreaMm2, survivingFraction: j.survivingFraction, cls,
          truthOverlap: tr?.truthOverlap, truthAreaMm2: tr?.truthArea, coarseBest: tr?.coarseBest, refinedBest: tr?.refinedBest,
          holders: { a: breakHolder(dir, truth, j.a, j.breakId), b: breakHolder(dir, truth, j.b, j.breakId) },
          bestCorrect: comp(tr?.bestCorrect), winner: comp(tr?.winner), winnerErr: tr?.winnerErr, rivalsA: rivals(j.a), rivalsB: rivals(j.b),
        });
      }
      if (process.env.KNITBONE_PAIRWISE_VERBOSE) process.stdout.write(`${k} ${j.pattern} area ${j.contactAreaMm2} surv ${j.survivingFraction} truthOverlap ${f(tr?.truthOverlap ?? NaN)} held ${f(tr?.truthArea ?? NaN, 0)} mm2 -> ${cls}${m ? ` best score ${f(m.score)}` : ''}\n`);
    }
    breakdown.push({ assemblage: dir.split(/[\\/]/).pop()!, ...Object.fromEntries(classes) });
    summary.push({ assemblage: dir.split(/[\\/]/).pop()!, fragments: usable.length, spacing, 'fragment pairs': work.size, 'face pairs': done, 'true joins': eligible.length, 'found (best of pair)': asBest, 'in top 3 of a piece': top3 });
  }
  const load = loadavg()[0];
  process.stdout.write(`\nPairwise alignment: CPU ms per face pair (load average ${load.toFixed(2)})\n`);
  table([{ 'face pairs': cpuMs.length, median: f(q(cpuMs, 0.5), 1), p90: f(q(cpuMs, 0.9), 1), mean: f(cpuMs.reduce((s, x) => s + x, 0) / Math.max(1, cpuMs.length), 1), max: f(Math.max(...cpuMs), 1) }]);
  if (params.polishBest > 0) process.stdout.write(`polishing the best ${params.polishBest} motions of each fragment pair from the other side: ${f(polishMs / 1000, 1)} CPU s in all, ${f(polishMs / Math.max(1, cpuMs.length), 2)} ms per face pair\n`);
  process.stdout.write('\nRecall\n');
  table(summary);
  process.stdout.write(`\nWhy true joins are missed (first stage that lost the truth; e: under the true motion no face pair overlaps ${TRUTH_OVERLAP_MIN} or holds ${TRUTH_AREA_MIN} of the surviving break)\n`);
  table(breakdown);
  const ok = motions.filter((m) => m.correct && m.rank === 0);
  process.stdout.write('\nAccuracy of correct best motions (geodesic rotation; translation at B\'s centroid)\n');
  table([{ n: ok.length, 'rot median deg': f(q(ok.map((m) => m.rotErr), 0.5)), 'rot p95 deg': f(q(ok.map((m) => m.rotErr), 0.95)), 'trans median mm': f(q(ok.map((m) => m.transErr), 0.5)), 'trans p95 mm': f(q(ok.map((m) => m.transErr), 0.95)) }]);
  const cal = reliability(motions.map((m) => m.score), motions.map((m) => (m.correct ? 1 : 0)));
  process.stdout.write(`\nCalibration of the score (every motion ranked 1-5 of its fragment pair): Brier score ${f(cal.brier, 4)} (reliability ${f(cal.rel, 4)}, resolution ${f(cal.res, 4)}, uncertainty ${f(cal.unc, 4)}; Murphy 1973)\n`);
  table(cal.rows);
  const high = motions.filter((m) => m.score > 0.8);
  process.stdout.write(`\nPrecision of motions scoring above 0.8: ${high.length ? f(high.filter((m) => m.correct).length / high.length, 3) : '-'} (${high.filter((m) => m.correct).length}/${high.length})\n`);
  if (process.env.KNITBONE_PAIRWISE_DUMP) writeFileSync(process.env.KNITBONE_PAIRWISE_DUMP, JSON.stringify(motions));
  if (process.env.KNITBONE_PAIRWISE_JOINS) {
    writeFileSync(process.env.KNITBONE_PAIRWISE_JOINS, JSON.stringify(joinRecords));
    process.stdout.write('\nMissed true joins by cause (truth labels; surviving contact = contact area x surviving fraction)\n');
    const rows = new Map<string, number[]>();
    for (const r of joinRecords) {
      const c = missCause(r as unknown as JoinRecord);
      if (c === 'found') continue;
      rows.set(c, [...(rows.get(c) ?? []), (r.contactAreaMm2 as number) * (r.survivingFraction as number)]);
    }
    table([...rows.entries()].sort((x, y) => y[1].length - x[1].length).map(([c, xs]) => ({ cause: c, joins: xs.length, 'surviving contact median mm2': f(q(xs, 0.5), 0), 'under 60 mm2': xs.filter((x) => x < 60).length })));
  }
}

interface Holder { breakAreaMm2: number; faces: number; faceAreaMm2: number; purity: number; coverage: number }
interface JoinRecord { cls: string; truthOverlap?: number; holders: { a?: Holder; b?: Holder } }

/**
 * A missed join's cause, finer than its class: the piece's best-holding face covers under half
 * of its part of the break (segmentation split or lost it); no face pair has a fifth of a face
 * in contact under the true motion (a sliver of contact: the faces merge several breaks, purity
 * under one half, or the break meets several partners); else the stage that lost it.
 */
function missCause(r: JoinRecord): string {
  if (r.cls === 'found' || r.cls === 'not run (limit)') return r.cls;
  const ha = r.holders.a, hb = r.holders.b;
  if (ha && hb && Math.min(ha.coverage, hb.coverage) < 0.5) return 'segmentation: break not held by one face';
  if ((r.truthOverlap ?? 0) < TRUTH_OVERLAP_MIN || r.cls.startsWith('e')) return ha && hb && Math.min(ha.purity, hb.purity) < 0.5 ? 'sliver contact: face holds several breaks' : 'sliver contact: break meets several partners';
  if (r.cls.startsWith('a')) return 'screen: no coarse motion near the truth';
  if (r.cls.startsWith('b')) return 'ICP drifted from a near coarse motion';
  if (r.cls.startsWith('c2')) return 'screen ranking dropped the correct motion';
  if (r.cls.startsWith('c')) return 'score: wrong motion of the same pair ranked first';
  return 'score: other fragment pairs ranked above';
}

function invertRigid(m: number[]): number[] {
  const tx = m[3], ty = m[7], tz = m[11];
  return [m[0], m[4], m[8], -(m[0] * tx + m[4] * ty + m[8] * tz), m[1], m[5], m[9], -(m[1] * tx + m[5] * ty + m[9] * tz), m[2], m[6], m[10], -(m[2] * tx + m[6] * ty + m[10] * tz), 0, 0, 0, 1];
}

const holderInputs = new Map<string, PreparedFragment>();

/**
 * How one piece's prepared faces hold a true break (truth triangle labels): the true break's area
 * on the scan, the face with the most samples on it, that face's area (samples x spacing^2), its
 * purity (share of its samples on this break) and the share of the break's area it covers.
 */
function breakHolder(dir: string, truth: Truth, no: string, breakId: number | undefined): { breakAreaMm2: number; faces: number; faceAreaMm2: number; purity: number; coverage: number } | undefined {
  const p = holderInputs.get(`${dir}|${no}`);
  const fr = truth.fragments.find((x) => x.catalogueNo === no);
  if (!p || !fr?.triangleLabels || breakId === undefined) return undefined;
  const file = join(dir, fr.scanFile ?? join('scans', `${no}.ply`));
  const mesh = parseMeshFile(readFileSync(file), file).mesh;
  const labels = Buffer.from(fr.triangleLabels, 'base64');
  const P = mesh.positions, T = mesh.triangles;
  let breakArea = 0;
  for (let t = 0; t < T.length / 3; t++) {
    if (labels[t] !== breakId + 10) continue;
    const [i, j, k] = [T[3 * t], T[3 * t + 1], T[3 * t + 2]];
    const u = [P[3 * j] - P[3 * i], P[3 * j + 1] - P[3 * i + 1], P[3 * j + 2] - P[3 * i + 2]];
    const v = [P[3 * k] - P[3 * i], P[3 * k + 1] - P[3 * i + 1], P[3 * k + 2] - P[3 * i + 2]];
    breakArea += 0.5 * Math.hypot(u[1] * v[2] - u[2] * v[1], u[2] * v[0] - u[0] * v[2], u[0] * v[1] - u[1] * v[0]);
  }
  const s: StudiedFragment = { no, input: undefined as unknown as FragmentInput, axis: null as unknown as StudiedFragment['axis'], labels, filePositions: P, fileTriangles: T };
  const shares = faceBreaks(s, p);
  let bestFace = -1, bestCount = 0;
  shares.forEach((m, fi) => {
    const c = (m.get(breakId) ?? 0) * (p.faces[fi].points.length / 3);
    if (c > bestCount) { bestCount = c; bestFace = fi; }
  });
  if (bestFace < 0) return { breakAreaMm2: breakArea, faces: p.faces.length, faceAreaMm2: 0, purity: 0, coverage: 0 };
  const n = p.faces[bestFace].points.length / 3;
  return { breakAreaMm2: breakArea, faces: p.faces.length, faceAreaMm2: n * p.spacing * p.spacing, purity: shares[bestFace].get(breakId) ?? 0, coverage: Math.min(1, (bestCount * p.spacing * p.spacing) / Math.max(1e-9, breakArea)) };
}
