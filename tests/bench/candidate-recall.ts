/**
 * Candidate recall against the number of face pairs, without aligning anything: for every
 * true join (both pieces present, at least 30% of the break surviving) is there a candidate
 * face pair (core/geometry/proposals/candidate-index.ts) whose faces both lie at least 30% on
 * that break? The faces and their traits come from candidate-study.ts (one file per fragment).
 * "reachable" counts the joins exhaustive pairing could reach at all (segmentation limits it).
 * With the recorded size classes (the folder's specimens.csv) pieces of different classes are
 * not paired, as in a propose run (KNITBONE_SIZE_CLASS=0 leaves them out). The index's second
 * stage (candidate-index.ts CANDIDATE_RERANK) is in force unless KNITBONE_RERANK=0, distinct whole
 * faces (DISTINCT_WHOLE_FACES) unless KNITBONE_DISTINCT=0 (or =each for 'each list'); the lean
 * reading's error per piece (LEAN_PIECE_ERROR) by KNITBONE_LEAN_PIECE_ERROR.
 *   npx tsx tests/bench/candidate-recall.ts <demo-dir> [ks]
 */
import { existsSync, readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { candidateFacePairs, sizeClassCompatible, type IndexedFace } from '../../core/geometry/proposals/candidate-index';
import type { StudyFragment } from './candidate-study';

export interface TruthJoin { a: string; b: string; type: string; breakId: number; pattern: string; survivingFraction: number }

export interface RecallRow { k: number | 'all'; facePairs: number; perFace: number; reachable: number; found: number; recall: number; ms: number;
  /** The true joins counted in `found`, by trueJoinKey. */
  reached: Set<string> }

/** The key of one true join: its two fragments either way round and its break (two pieces may share two breaks). */
export function trueJoinKey(j: { a: string; b: string; breakId: number }): string {
  return `${j.a < j.b ? `${j.a}|${j.b}` : `${j.b}|${j.a}`}#${j.breakId}`;
}

export function readStudy(dir: string): StudyFragment[] {
  return readdirSync(join(dir, 'candidate-study'))
    .filter((f) => f.endsWith('.json'))
    .map((f) => JSON.parse(readFileSync(join(dir, 'candidate-study', f), 'utf8')) as StudyFragment);
}

/**
 * Recorded size classes by catalogue number from a specimen CSV (the generator's specimens.csv):
 * what a propose run prunes by (candidate-index.ts `sizeClassCompatible`).
 */
export function sizeClassesFromCsv(csvText: string): Map<string, number | null> {
  const rows = csvText.trim().split(/\r?\n/).map((l) => l.split(','));
  const no = rows[0].indexOf('catalogue_no'), sc = rows[0].indexOf('size_class');
  return new Map(rows.slice(1).map((r) => [r[no], sc >= 0 && r[sc] ? Number(r[sc]) : null]));
}

/** `sizeClasses` (by catalogue number): prune by them as a propose run does; absent: no size class recorded. */
export function candidateRecall(studied: StudyFragment[], joins: TruthJoin[], ks: number[], sizeClasses?: Map<string, number | null>): { fragments: number; faces: number; eligible: number; rows: RecallRow[] } {
  const truth = { joins };
  const study = studied.filter((f) => f.faces.length > 0);
  const fragOf = new Map(study.map((f, i) => [f.no, i]));
  const faces: IndexedFace[] = [];
  const breaksOf: Array<Record<string, number>> = [];
  study.forEach((f, i) => f.faces.forEach((x, face) => {
    // a part knows its whole face (the first face of its analysed face), as in a propose run
    faces.push({ fragment: i, face, whole: f.faces.findIndex((y) => y.parent === x.parent), traits: { ...x.traits, meanFpfh: Float32Array.from(x.traits.meanFpfh) } });
    breaksOf.push(x.breaks);
  }));
  const faceIndex = new Map(faces.map((f, i) => [`${f.fragment}:${f.face}`, i]));
  const eligible = truth.joins.filter((j) => j.type === 'conjoin' && j.survivingFraction >= 0.3 && fragOf.has(j.a) && fragOf.has(j.b));
  const on = (fi: number, breakId: number): boolean => (breaksOf[fi][breakId] ?? 0) >= 0.3;
  const count = (pairs: Set<string> | null): Set<string> => {
    const hit = new Set<string>();
    for (const j of eligible) {
      const ia = fragOf.get(j.a)!, ib = fragOf.get(j.b)!;
      const sideA = faces.map((f, i) => i).filter((i) => faces[i].fragment === ia && on(i, j.breakId));
      const sideB = faces.map((f, i) => i).filter((i) => faces[i].fragment === ib && on(i, j.breakId));
      if (sideA.some((x) => sideB.some((y) => !pairs || pairs.has(x < y ? `${x}:${y}` : `${y}:${x}`)))) hit.add(trueJoinKey(j));
    }
    return hit;
  };
  const reachableKeys = count(null);
  const reachable = reachableKeys.size;
  let total = 0;
  for (let i = 0; i < faces.length; i++) for (let j = i + 1; j < faces.length; j++) if (faces[i].fragment !== faces[j].fragment) total++;
  const rows: RecallRow[] = [{ k: 'all', facePairs: total, perFace: total / faces.length, reachable, found: reachable, recall: 1, ms: 0, reached: reachableKeys }];
  for (const k of ks) {
    const t0 = performance.now();
    const compatible = sizeClasses ? sizeClassCompatible(study.map((f) => sizeClasses.get(f.no) ?? null)) : undefined;
    const c = candidateFacePairs(faces, { k, compatible, ...(process.env.KNITBONE_LEAN_PIECE_ERROR ? { leanPieceError: Number(process.env.KNITBONE_LEAN_PIECE_ERROR) } : {}), ...(process.env.KNITBONE_RERANK === '0' ? { rerank: null } : {}), ...(process.env.KNITBONE_DISTINCT === '0' ? { distinctWholeFaces: null } : process.env.KNITBONE_DISTINCT === 'each' ? { distinctWholeFaces: 'each list' as const } : {}) });
    const ms = performance.now() - t0;
    const set = new Set(c.map((p) => {
      const x = faceIndex.get(`${p.a}:${p.faceA}`)!, y = faceIndex.get(`${p.b}:${p.faceB}`)!;
      return x < y ? `${x}:${y}` : `${y}:${x}`;
    }));
    const reached = count(set);
    const found = reached.size;
    rows.push({ k, facePairs: set.size, perFace: set.size / faces.length, reachable, found, recall: reachable ? found / reachable : NaN, ms, reached });
  }
  return { fragments: study.length, faces: faces.length, eligible: eligible.length, rows };
}

if (process.argv[1]?.endsWith('candidate-recall.ts')) {
  const [dir, ks = '10,20,30,40,60'] = process.argv.slice(2);
  const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { joins: TruthJoin[] };
  // KNITBONE_SIZE_CLASS=0: leave the recorded size classes (specimens.csv) out, as a catalogue without them
  const classes = process.env.KNITBONE_SIZE_CLASS === '0' || !existsSync(join(dir, 'specimens.csv')) ? undefined : sizeClassesFromCsv(readFileSync(join(dir, 'specimens.csv'), 'utf8'));
  const r = candidateRecall(readStudy(dir), truth.joins, ks.split(',').map(Number), classes);
  console.log(classes ? 'pruned by the recorded size classes (specimens.csv)' : 'size classes not used');
  console.log(`${r.fragments} fragments, ${r.faces} faces, ${r.eligible} true joins`);
  for (const x of r.rows) console.log(`k ${String(x.k).padStart(3)}  face pairs ${String(x.facePairs).padStart(7)} (${x.perFace.toFixed(1)}/face)  reached ${x.found}/${x.reachable} = ${(100 * x.recall).toFixed(1)}%  ${x.ms.toFixed(0)} ms`);
}
