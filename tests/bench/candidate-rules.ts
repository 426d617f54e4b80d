/**
 * Candidate selection rules compared at an equal budget of face pairs, without aligning: the
 * faces and their traits come from candidate-study.ts (one file per fragment, in
 * `<dir>/candidate-study/`). For every rule, the candidate recall (as candidate-recall.ts) at
 * the number of face pairs the plain k-best union gives at each k.
 *   npx tsx tests/bench/candidate-rules.ts <demo-dir>[,<demo-dir>...] [ks]
 */
import { existsSync, readFileSync } from 'node:fs';
import { sizeClassCompatible } from '../../core/geometry/proposals/candidate-index';
import { join } from 'node:path';
import { describeFace, partnerCost, type FaceDescriptor } from '../../core/geometry/proposals/face-descriptor';
import { readStudy, sizeClassesFromCsv, type TruthJoin } from './candidate-recall';

export interface RuleSet {
  nFaces: number;
  fragOfFace: Int32Array;
  /** per eligible join: the true face pairs (i < j) */
  joins: Array<Array<[number, number]>>;
  reachable: number;
  desc: FaceDescriptor[];
  /** Whether two fragments may pair by their recorded size classes (the folder's specimens.csv; all when absent or KNITBONE_SIZE_CLASS=0). */
  compatible: (fragmentA: number, fragmentB: number) => boolean;
}

export function loadSet(dir: string): RuleSet {
  const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { joins: TruthJoin[] };
  const study = readStudy(dir).filter((f) => f.faces.length > 0);
  const fragOf = new Map(study.map((f, i) => [f.no, i]));
  const fr: number[] = [], breaks: Array<Record<string, number>> = [], desc: FaceDescriptor[] = [];
  study.forEach((f, i) => f.faces.forEach((x) => {
    fr.push(i);
    breaks.push(x.breaks);
    desc.push(describeFace({ ...x.traits, meanFpfh: Float32Array.from(x.traits.meanFpfh) }));
  }));
  const eligible = truth.joins.filter((j) => j.type === 'conjoin' && j.survivingFraction >= 0.3 && fragOf.has(j.a) && fragOf.has(j.b));
  const joins: Array<Array<[number, number]>> = [];
  for (const j of eligible) {
    const ia = fragOf.get(j.a)!, ib = fragOf.get(j.b)!;
    const A: number[] = [], B: number[] = [];
    fr.forEach((f, i) => {
      if ((breaks[i][j.breakId] ?? 0) < 0.3) return;
      if (f === ia) A.push(i);
      if (f === ib) B.push(i);
    });
    const pairs: Array<[number, number]> = [];
    for (const x of A) for (const y of B) pairs.push(x < y ? [x, y] : [y, x]);
    if (pairs.length) joins.push(pairs);
  }
  const classes = process.env.KNITBONE_SIZE_CLASS === '0' || !existsSync(join(dir, 'specimens.csv')) ? undefined : sizeClassesFromCsv(readFileSync(join(dir, 'specimens.csv'), 'utf8'));
  const compatible = classes ? sizeClassCompatible(study.map((f) => classes.get(f.no) ?? null)) : () => true;
  return { nFaces: fr.length, fragOfFace: Int32Array.from(fr), joins, reachable: joins.length, desc, compatible };
}

/** Full cost matrix (row-major, Infinity on a fragment's own faces). */
export function costMatrix(s: RuleSet, cost: (a: FaceDescriptor, b: FaceDescriptor) => number = partnerCost): Float32Array {
  const n = s.nFaces;
  const C = new Float32Array(n * n).fill(Infinity);
  for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) {
    if (s.fragOfFace[i] === s.fragOfFace[j]) continue;
    const c = cost(s.desc[i], s.desc[j]);
    C[i * n + j] = c;
    C[j * n + i] = c;
  }
  return C;
}

/** Each face's candidates sorted by a (possibly asymmetric) score; the union of each face's first k. */
export function kUnion(s: RuleSet, score: Float32Array, k: number): Set<number> {
  const n = s.nFaces;
  const out = new Set<number>();
  const idx = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    const row = score.subarray(i * n, i * n + n);
    for (let j = 0; j < n; j++) idx[j] = j;
    const order = Array.from(idx).filter((j) => Number.isFinite(row[j])).sort((a, b) => row[a] - row[b]);
    for (let m = 0; m < Math.min(k, order.length); m++) {
      const j = order[m];
      out.add(i < j ? i * n + j : j * n + i);
    }
  }
  return out;
}

/** Ranks: R[i*n+j] = rank of j in i's list by score (0 = best). */
export function ranks(s: RuleSet, score: Float32Array): Float32Array {
  const n = s.nFaces;
  const R = new Float32Array(n * n).fill(Infinity);
  for (let i = 0; i < n; i++) {
    const row = score.subarray(i * n, i * n + n);
    const order = Array.from({ length: n }, (_, j) => j).filter((j) => Number.isFinite(row[j])).sort((a, b) => row[a] - row[b]);
    order.forEach((j, r) => { R[i * n + j] = r; });
  }
  return R;
}

/** The `budget` pairs with the smallest symmetric score. */
export function globalBest(s: RuleSet, sym: (i: number, j: number) => number, budget: number): Set<number> {
  const n = s.nFaces;
  const keys: number[] = [], vals: number[] = [];
  for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) {
    if (s.fragOfFace[i] === s.fragOfFace[j]) continue;
    keys.push(i * n + j);
    vals.push(sym(i, j));
  }
  const order = Array.from(keys.keys()).sort((a, b) => vals[a] - vals[b]);
  return new Set(order.slice(0, budget).map((o) => keys[o]));
}

export function recallOf(s: RuleSet, set: Set<number>): number {
  const n = s.nFaces;
  let hit = 0;
  for (const j of s.joins) if (j.some(([x, y]) => set.has(x * n + y))) hit++;
  return hit / s.reachable;
}

if (process.argv[1]?.endsWith('candidate-rules.ts')) {
  const dirs = process.argv[2].split(',');
  const ks = (process.argv[3] ?? '30,60').split(',').map(Number);
  for (const dir of dirs) {
    const s = loadSet(dir);
    const n = s.nFaces;
    const C = costMatrix(s);
    const R = ranks(s, C);
    console.log(`${dir}: ${n} faces, ${s.reachable} reachable joins`);
    for (const k of ks) {
      const base = kUnion(s, C, k);
      const budget = base.size;
      const rows: Array<[string, Set<number>]> = [['k-union', base]];
      rows.push(['rank sum', globalBest(s, (i, j) => R[i * n + j] + R[j * n + i], budget)]);
      rows.push(['rank min', globalBest(s, (i, j) => Math.min(R[i * n + j], R[j * n + i]) + 1e-3 * (R[i * n + j] + R[j * n + i]), budget)]);
      rows.push(['log rank sum', globalBest(s, (i, j) => Math.log1p(R[i * n + j]) + Math.log1p(R[j * n + i]), budget)]);
      for (const K of [5, 10, 30]) {
        const r = new Float64Array(n);
        for (let i = 0; i < n; i++) {
          const row = Array.from(C.subarray(i * n, i * n + n)).filter(Number.isFinite).sort((a, b) => a - b);
          r[i] = row.slice(0, K).reduce((a, b) => a + b, 0) / Math.min(K, row.length);
        }
        rows.push([`CSLS K=${K} global`, globalBest(s, (i, j) => 2 * C[i * n + j] - r[i] - r[j], budget)]);
        const S = new Float32Array(n * n);
        for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) S[i * n + j] = 2 * C[i * n + j] - r[i] - r[j];
        // k-union on CSLS with k adjusted to the budget
        let kk = k, set = kUnion(s, S, kk);
        while (set.size > budget && kk > 1) set = kUnion(s, S, --kk);
        rows.push([`CSLS K=${K} k-union (k ${kk}, ${set.size})`, set]);
      }
      rows.push(['global cost', globalBest(s, (i, j) => C[i * n + j], budget)]);
      for (const [name, set] of rows) console.log(`  k ${k} budget ${budget} (${(budget / n).toFixed(1)}/face)  ${name.padEnd(36)} pairs ${set.size}  recall ${(100 * recallOf(s, set)).toFixed(1)}%`);
    }
  }
}
