/**
 * Coordinate search for the weights and scales of the candidate cost (face-descriptor.ts
 * DESCRIPTOR_FIGURES, TEXTURE_WEIGHT) on the candidate recall at k = 30 and 60 (the mean over
 * the given assemblages), without aligning: faces and traits from candidate-study.ts. Each
 * round tries, for each figure in turn, its weight x0, x0.5, x0.7, x1.4, x2 (0.5, 1, 2 when it
 * is 0) and its scale x0.5, x2, keeping any change that raises the recall. Prints the recall
 * and face pairs per face before and after on every assemblage (pieces of different recorded
 * size classes not paired, as in a propose run; KNITBONE_SIZE_CLASS=0: without); `CANDIDATE_WEIGHTS='<json>'`
 * only reports the given parameters (to check a fit on an assemblage it was not fitted on).
 *   npx tsx tests/bench/candidate-weights.ts <demo-dir>[,<demo-dir>...] [rounds]
 */
import { cappedCauchyLoss } from '../../core/geometry/proposals/capped-cauchy-loss';
import { DESCRIPTOR_FIGURES, TEXTURE_WEIGHT } from '../../core/geometry/proposals/face-descriptor';
import { loadSet, type RuleSet } from './candidate-rules';

const MISSING = Math.log(2);
export interface CostParameters { w: number[]; sc: number[]; tw: number }
interface Parts { s: RuleSet; n: number; diff: Float32Array[]; texture: Float32Array }

/** Per figure, the signed difference (or sum, for `opposite`) of every two faces; and the texture distance. */
function parts(s: RuleSet): Parts {
  const n = s.nFaces, F = DESCRIPTOR_FIGURES.length;
  const diff = Array.from({ length: F }, () => new Float32Array(n * n));
  const texture = new Float32Array(n * n);
  for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) {
    const a = s.desc[i], b = s.desc[j];
    for (let c = 0; c < F; c++) {
      const x = a.figures[c], y = b.figures[c];
      const v = Number.isNaN(x) || Number.isNaN(y) ? NaN : DESCRIPTOR_FIGURES[c].opposite ? x + y : x - y;
      diff[c][i * n + j] = v;
      diff[c][j * n + i] = v;
    }
    let d = 0;
    for (let k = 0; k < a.mirrored.length; k++) d += (a.mirrored[k] - b.fpfh[k]) ** 2;
    texture[i * n + j] = texture[j * n + i] = Math.sqrt(d);
  }
  return { s, n, diff, texture };
}

/** The cost matrix partnerCost would give with these parameters (Infinity within a fragment). */
function cost(p: Parts, q: CostParameters): Float32Array {
  const { n } = p;
  const C = new Float32Array(n * n);
  for (let x = 0; x < n * n; x++) C[x] = q.tw * p.texture[x];
  q.w.forEach((w, c) => {
    if (!w) return;
    const D = p.diff[c], s = q.sc[c];
    for (let x = 0; x < n * n; x++) {
      const v = D[x];
      C[x] += Number.isNaN(v) ? w * MISSING : w * cappedCauchyLoss(v / s, DESCRIPTOR_FIGURES[c].cap);
    }
  });
  // faces of one fragment, and fragments of different recorded size classes, never pair
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) {
    const a = p.s.fragOfFace[i], b = p.s.fragOfFace[j];
    if (a === b || !p.s.compatible(Math.min(a, b), Math.max(a, b))) C[i * n + j] = Infinity;
  }
  return C;
}

/** Recall and face pairs of the union of each face's k best (a pair is kept when it is within either face's k best). */
export function unionRecall(p: Parts, C: Float32Array, k: number): { recall: number; pairs: number } {
  const { n, s } = p;
  const t = new Float32Array(n);
  for (let i = 0; i < n; i++) t[i] = Float32Array.from(C.subarray(i * n, i * n + n)).sort()[Math.min(k, n) - 1];
  let hit = 0;
  for (const j of s.joins) if (j.some(([x, y]) => C[x * n + y] <= t[x] || C[x * n + y] <= t[y])) hit++;
  let pairs = 0;
  for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) if (C[i * n + j] <= t[i] || C[i * n + j] <= t[j]) pairs++;
  return { recall: hit / s.reachable, pairs };
}

/**
 * Coordinate search over the cost parameters: each round tries, for each figure in turn (and the
 * texture weight), its weight x0, x0.5, x0.7, x1.4, x2 (0.5, 1, 2 when it is 0) and its scale
 * x0.5, x2, keeping any change that raises `score`; prints each step.
 */
export function coordinateSearch(start: CostParameters, score: (q: CostParameters) => number, rounds: number): CostParameters {
  let best = start, bestScore = score(best);
  const copy = (q: CostParameters): CostParameters => ({ w: [...q.w], sc: [...q.sc], tw: q.tw });
  for (let round = 0; round < rounds; round++) {
    for (let c = 0; c <= best.w.length; c++) {
      const tries: CostParameters[] = [];
      const w0 = c < best.w.length ? best.w[c] : best.tw;
      for (const m of w0 === 0 ? [0.5, 1, 2] : [0, 0.5, 0.7, 1.4, 2]) {
        const q = copy(best);
        if (c < q.w.length) q.w[c] = w0 === 0 ? m : w0 * m;
        else q.tw = w0 * m;
        tries.push(q);
      }
      if (c < best.w.length && best.w[c] > 0) for (const m of [0.5, 2]) { const q = copy(best); q.sc[c] *= m; tries.push(q); }
      for (const q of tries) {
        const v = score(q);
        if (v > bestScore + 1e-9) {
          best = q;
          bestScore = v;
          console.log(`  round ${round + 1}, ${c < best.w.length ? DESCRIPTOR_FIGURES[c].name : 'texture'}: ${(100 * v).toFixed(2)}% ${JSON.stringify({ w: best.w, sc: best.sc.map((x) => +x.toFixed(4)), tw: +best.tw.toFixed(4) })}`);
        }
      }
    }
  }
  return best;
}

/** The command lines' end: report the given parameters (CANDIDATE_WEIGHTS), or fit from `current` and report and print the fit. */
export function fitOrReport(current: CostParameters, score: (q: CostParameters) => number, report: (q: CostParameters, label: string) => void, rounds: number): void {
  report(current, 'current');
  if (process.env.CANDIDATE_WEIGHTS) {
    report(JSON.parse(process.env.CANDIDATE_WEIGHTS) as CostParameters, 'given');
    return;
  }
  const best = coordinateSearch(current, score, rounds);
  report(best, 'fitted');
  console.log(JSON.stringify({ w: best.w, sc: best.sc.map((x) => +x.toFixed(4)), tw: +best.tw.toFixed(4) }));
}

if (process.argv[1]?.endsWith('candidate-weights.ts')) {
  const dirs = process.argv[2].split(',');
  const rounds = Number(process.argv[3] ?? 2);
  const sets = dirs.map((d) => parts(loadSet(d)));
  const current: CostParameters = { w: DESCRIPTOR_FIGURES.map((f) => f.weight), sc: DESCRIPTOR_FIGURES.map((f) => f.scale), tw: TEXTURE_WEIGHT };
  const score = (q: CostParameters): number => {
    let v = 0;
    for (const p of sets) {
      const C = cost(p, q);
      v += unionRecall(p, C, 30).recall + unionRecall(p, C, 60).recall;
    }
    return v / sets.length / 2;
  };
  const report = (q: CostParameters, label: string): void => sets.forEach((p, i) => {
    const C = cost(p, q);
    const a = unionRecall(p, C, 30), b = unionRecall(p, C, 60);
    console.log(`${label} ${dirs[i]}: ${p.n} faces, ${p.s.reachable} reachable joins; k 30: ${(100 * a.recall).toFixed(1)}% (${(a.pairs / p.n).toFixed(1)} pairs/face), k 60: ${(100 * b.recall).toFixed(1)}% (${(b.pairs / p.n).toFixed(1)} pairs/face)`);
  });
  fitOrReport(current, score, report, rounds);
}
