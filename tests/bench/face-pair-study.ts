/**
 * What one aligned face pair costs, stage by stage, and whether the cheap screen keeps the true
 * joins (issue 6, item 6). For one generated assemblage with its truth.json: analyse every scan
 * as `knitbone propose` does (kept between runs in the system temp folder, keyed by the scan's
 * content hash), prepare the fragments at the run's spacing, label each prepared face with the
 * true breaks it lies on, ask the candidate index for face pairs, then for every true face pair
 * and a sample of the others time the screen and the fine step (CPU) and check the motions
 * against the truth.
 *
 *   npx tsx tests/bench/face-pair-study.ts <demo-dir> [k=30] [other pairs sampled=300]
 */
import { mkdirSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parseMeshFile } from '../../core/geometry/parse/index';
import { candidateFacePairs, type IndexedFace } from '../../core/geometry/proposals/candidate-index';
import { fragmentFaceTraits, type ShaftAxisLike } from '../../core/geometry/proposals/face-traits';
import { DEFAULT_MATCH_PARAMETERS, matchFragments, refineFacePair, screenFacePair, type MatchParameters } from '../../core/geometry/proposals/pairwise-match';
import { DEFAULT_FPFH_RADIUS_SPACINGS, prepareFragment, runSpacing, type FragmentInput, type PreparedFragment } from '../../core/geometry/proposals/prepared-fragment';
import { KdTree } from '../../core/geometry/registration/nearest-neighbours';
import { invert, type RigidTransform } from '../../core/geometry/registration/rigid-transform';
import { mulberry32 } from '../../core/geometry/seeded-random';
import { cachedFromLoaded, fragmentKey, readFragment, writeFragment } from '../../core/jobs/fragment-cache';
import { contentHashOf, loadFragment } from '../../core/jobs/fragment-loader';
import { isCorrectMotion } from './correct-motion';

export interface TruthFragment { catalogueNo: string; scanFile: string; triangleLabels: string }
export interface TruthJoin { a: string; b: string; type: string; breakId: number; pattern: string; survivingFraction: number; transformBToA: number[] }

/** Where analysed scans are kept between benchmark runs (content-addressed). */
export function analysisCacheDir(): string {
  const d = join(tmpdir(), 'knitbone-proposals-bench', 'analysed');
  mkdirSync(d, { recursive: true });
  return d;
}

export interface StudiedFragment {
  no: string;
  input: FragmentInput;
  axis: ShaftAxisLike;
  /** Per triangle of the scan file: true break id + 10, or < 10 (generator labels). */
  labels: Buffer;
  filePositions: Float32Array;
  fileTriangles: Uint32Array;
}

/** Read (or take from the cache) one scan's analysis, as a proposal run would make it at import. */
export function studied(dir: string, f: TruthFragment): StudiedFragment | null {
  const file = join(dir, f.scanFile.includes('/') ? f.scanFile : join('scans', f.scanFile));
  const bytes = readFileSync(file);
  const key = fragmentKey(contentHashOf(bytes), 'mm', undefined, []);
  const cache = analysisCacheDir();
  let c = readFragment(cache, key);
  if (!c) {
    try {
      c = cachedFromLoaded(loadFragment(file, 'mm', bytes));
    } catch {
      return null;
    }
    writeFragment(cache, key, c);
  }
  if (c.summary.problem) return null;
  const mesh = parseMeshFile(bytes, f.scanFile).mesh;
  return { no: f.catalogueNo, input: c.input, axis: c.summary.axis, labels: Buffer.from(f.triangleLabels, 'base64'), filePositions: mesh.positions, fileTriangles: mesh.triangles };
}

/** Share of each prepared face's samples on each true break (nearest labelled triangle within 3 spacings). */
export function faceBreaks(s: StudiedFragment, p: PreparedFragment): Array<Map<number, number>> {
  const cents: number[] = [], lab: number[] = [];
  const P = s.filePositions, T = s.fileTriangles;
  for (let t = 0; t < T.length / 3; t++) {
    if (s.labels[t] < 10) continue;
    for (let k = 0; k < 3; k++) cents.push((P[3 * T[3 * t] + k] + P[3 * T[3 * t + 1] + k] + P[3 * T[3 * t + 2] + k]) / 3);
    lab.push(s.labels[t] - 10);
  }
  const tree = new KdTree(Float32Array.from(cents), 3);
  return p.faces.map((face) => {
    const n = face.points.length / 3;
    const count = new Map<number, number>();
    for (let i = 0; i < n; i++) {
      const r = tree.nearestOne([face.points[3 * i], face.points[3 * i + 1], face.points[3 * i + 2]], (3 * p.spacing) ** 2);
      if (r.index >= 0) count.set(lab[r.index], (count.get(lab[r.index]) ?? 0) + 1);
    }
    for (const [k, c] of count) count.set(k, c / n);
    return count;
  });
}

const cpuMs = (t: NodeJS.CpuUsage): number => {
  const d = process.cpuUsage(t);
  return (d.user + d.system) / 1000;
};
const mean = (xs: number[]): number => xs.reduce((a, b) => a + b, 0) / Math.max(1, xs.length);
const q = (xs: number[], p: number): number => (xs.length ? [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor(p * xs.length))] : NaN);

export interface MotionRecord { overlap: number; fineMs: number; score: number; right: boolean }
export interface PairRecord { a: number; b: number; truePair: boolean; trueFragments: boolean; screenMs: number; fineMs: number; screened: number; screenHit: number; fineHit: boolean; score: number; bestOverlap: number; motions: MotionRecord[] }

export function study(dir: string, k: number, others: number, params: MatchParameters = DEFAULT_MATCH_PARAMETERS): { records: PairRecord[]; fragmentPairs: FragmentPairRecord[]; faces: number; candidates: number; spacing: number } {
  const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { fragments: TruthFragment[]; joins: TruthJoin[] };
  const frags = truth.fragments.map((f) => studied(dir, f)).filter((x): x is StudiedFragment => !!x);
  const spacing = runSpacing(frags.flatMap((f) => f.input.faces.map((x) => x.area ?? 0)));
  const prepared = frags.map((f) => prepareFragment(f.input, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS }));
  const breaks = frags.map((f, i) => faceBreaks(f, prepared[i]));
  const faces: IndexedFace[] = [];
  prepared.forEach((p, i) => fragmentFaceTraits(frags[i].input, p, frags[i].axis).forEach((traits, face) => faces.push({ fragment: i, face, traits })));
  const candidates = candidateFacePairs(faces, { k });
  const idx = new Map(frags.map((f, i) => [f.no, i]));
  const joinOf = new Map<string, TruthJoin>();
  for (const j of truth.joins) if (j.type === 'conjoin' && j.survivingFraction >= 0.3 && idx.has(j.a) && idx.has(j.b)) joinOf.set(`${idx.get(j.a)}:${idx.get(j.b)}`, j);
  /** The motion carrying fragment b onto fragment a, when the two faces lie on one true break. */
  const trueMotion = (a: number, fa: number, b: number, fb: number): RigidTransform | null => {
    const j = joinOf.get(`${a}:${b}`) ?? joinOf.get(`${b}:${a}`);
    if (!j) return null;
    if ((breaks[a][fa].get(j.breakId) ?? 0) < 0.3 || (breaks[b][fb].get(j.breakId) ?? 0) < 0.3) return null;
    return idx.get(j.a) === a ? j.transformBToA : invert(j.transformBToA);
  };
  const rnd = mulberry32(5);
  // whole fragment pairs are sampled (every face pair of a fragment pair studied together), plus every truly joined fragment pair
  const fragPairs = new Set(candidates.map((c) => `${c.a}:${c.b}`));
  const share = Math.min(1, (others / Math.max(1, candidates.length)) * 1);
  const chosen = new Set([...fragPairs].filter((k) => joinOf.has(k) || joinOf.has(k.split(':').reverse().join(':')) || rnd() < share));
  const records: PairRecord[] = [];
  const near = isCorrectMotion;
  for (const c of candidates) {
    const want = trueMotion(c.a, c.faceA, c.b, c.faceB);
    if (!chosen.has(`${c.a}:${c.b}`)) continue;
    const A = prepared[c.a], B = prepared[c.b];
    const t0 = process.cpuUsage();
    const screened = screenFacePair(A, c.faceA, B, c.faceB, params);
    const screenMs = cpuMs(t0);
    const t1 = process.cpuUsage();
    const fine = refineFacePair(A, c.faceA, B, c.faceB, screened, params);
    const fineMs = cpuMs(t1);
    const cen = B.faces[c.faceB].centroid;
    const j = joinOf.get(`${c.a}:${c.b}`) ?? joinOf.get(`${c.b}:${c.a}`);
    const wantFrag = j ? (idx.get(j.a) === c.a ? j.transformBToA : invert(j.transformBToA)) : null;
    const motions = screened.map((m) => {
      const t2 = process.cpuUsage();
      const [f] = refineFacePair(A, c.faceA, B, c.faceB, [m], params);
      return { overlap: m.overlap, fineMs: cpuMs(t2), score: f?.score ?? 0, right: !!wantFrag && !!f && near(f.transform, wantFrag, cen) };
    });
    records.push({
      a: c.a,
      b: c.b,
      trueFragments: !!j,
      motions,
      truePair: !!want,
      screenMs,
      fineMs,
      screened: screened.length,
      screenHit: want ? screened.findIndex((s) => near(s.transform, want, cen)) : -1,
      fineHit: !!want && !!fine[0] && near(fine[0].transform, want, cen),
      score: fine[0]?.score ?? 0,
      bestOverlap: screened[0]?.overlap ?? 0,
    });
  }
  // the fragment pairs as propose aligns them (screen every face pair, fine step on the shortlist), against every screened motion refined
  const pairsOf = new Map<string, Array<[number, number]>>();
  for (const c of candidates) if (chosen.has(`${c.a}:${c.b}`)) pairsOf.set(`${c.a}:${c.b}`, [...(pairsOf.get(`${c.a}:${c.b}`) ?? []), [c.faceA, c.faceB]]);
  const fragmentPairs: FragmentPairRecord[] = [];
  for (const [key, facePairs] of pairsOf) {
    const [a, b] = key.split(':').map(Number);
    const j = joinOf.get(`${a}:${b}`) ?? joinOf.get(`${b}:${a}`);
    const want = j ? (idx.get(j.a) === a ? j.transformBToA : invert(j.transformBToA)) : null;
    const t0 = process.cpuUsage();
    const [best] = matchFragments(prepared[a], prepared[b], params, facePairs);
    const ms = cpuMs(t0);
    const all = records.filter((r) => r.a === a && r.b === b).flatMap((r) => r.motions).sort((p, q2) => q2.score - p.score)[0];
    const allMs = records.filter((r) => r.a === a && r.b === b).reduce((s2, r) => s2 + r.screenMs + r.fineMs, 0);
    fragmentPairs.push({ truePair: !!j, ms, allMs, score: best?.score ?? 0, right: !!want && !!best && near(best.transform, want, prepared[b].centroid), allScore: all?.score ?? 0, allRight: !!all?.right });
  }
  return { records, fragmentPairs, faces: faces.length, candidates: candidates.length, spacing };
}

export interface FragmentPairRecord { truePair: boolean; ms: number; allMs: number; score: number; right: boolean; allScore: number; allRight: boolean }

export function summarise(r: ReturnType<typeof study>): string {
  const t = r.records.filter((x) => x.truePair), o = r.records.filter((x) => !x.truePair);
  const ms = (xs: PairRecord[], f: (x: PairRecord) => number): string => `${q(xs.map(f), 0.5).toFixed(1)}/${q(xs.map(f), 0.9).toFixed(1)}`;
  return [
    `spacing ${r.spacing} mm, ${r.faces} faces, ${r.candidates} candidate face pairs (${(r.candidates / r.faces).toFixed(1)}/face); studied ${t.length} true, ${o.length} other`,
    `screen ms med/p90: true ${ms(t, (x) => x.screenMs)}, other ${ms(o, (x) => x.screenMs)}; fine ms med/p90: true ${ms(t, (x) => x.fineMs)}, other ${ms(o, (x) => x.fineMs)}`,
    `mean ms: screen ${mean(r.records.map((x) => x.screenMs)).toFixed(1)}, fine ${mean(r.records.map((x) => x.fineMs)).toFixed(1)} (true ${mean(t.map((x) => x.screenMs)).toFixed(1)} + ${mean(t.map((x) => x.fineMs)).toFixed(1)}, other ${mean(o.map((x) => x.screenMs)).toFixed(1)} + ${mean(o.map((x) => x.fineMs)).toFixed(1)}); motions screened per pair ${mean(r.records.map((x) => x.screened)).toFixed(2)}`,
    `true pairs: screen keeps a motion near the truth ${t.filter((x) => x.screenHit >= 0).length}/${t.length} (first ${t.filter((x) => x.screenHit === 0).length}); fine best is right ${t.filter((x) => x.fineHit).length}/${t.length}`,
    `best overlap med: true ${q(t.map((x) => x.bestOverlap), 0.5).toFixed(2)} (p10 ${q(t.filter((x) => x.fineHit).map((x) => x.bestOverlap), 0.1).toFixed(2)} of right ones), other ${q(o.map((x) => x.bestOverlap), 0.5).toFixed(2)} (p90 ${q(o.map((x) => x.bestOverlap), 0.9).toFixed(2)})`,
    (() => {
      const f = r.fragmentPairs, t2 = f.filter((x) => x.truePair), o2 = f.filter((x) => !x.truePair);
      return `fragment pairs ${f.length} (${t2.length} true): CPU ${(f.reduce((s2, x) => s2 + x.ms, 0) / 1000).toFixed(1)} s with the shortlist, ${(f.reduce((s2, x) => s2 + x.allMs, 0) / 1000).toFixed(1)} s refining every screened motion; true pairs right ${t2.filter((x) => x.right).length} vs ${t2.filter((x) => x.allRight).length}; false pairs above 0.5: ${o2.filter((x) => x.score > 0.5).length} vs ${o2.filter((x) => x.allScore > 0.5).length}`;
    })(),
  ].join('\n');
}

if (process.argv[1]?.endsWith('face-pair-study.ts')) {
  const [dir, k = '30', others = '300'] = process.argv.slice(2);
  const c0 = process.cpuUsage();
  const r = study(dir, Number(k), Number(others));
  console.log(summarise(r));
  console.log(`total CPU ${(cpuMs(c0) / 1000).toFixed(1)} s`);
}
