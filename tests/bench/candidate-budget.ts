/**
 * Selection rules for the candidate index compared at one budget of face pairs (the number the
 * plain union of each face's k best gives), without aligning: faces and traits from
 * candidate-study.ts, recall as candidate-recall.ts (a true join counts when one of its face
 * pairs, both faces at least 30% on the break, is kept). Built for large assemblages (1,000
 * fragments, 6,500 faces): one cost matrix, each face's full ranking once, per-face quotas.
 * Rules: per-face quotas by face size (samples^a) or by how crowded the face's neighbourhood is;
 * ranks taken both ways (global rank sum, each face's k best by the sum of the two ranks, the
 * union of the k/2 best topped up by the rank sum); hubness corrections (CSLS, local scaling).
 *   npx tsx tests/bench/candidate-budget.ts <demo-dir>[,<demo-dir>...] [ks]
 */
import { readStudy } from './candidate-recall';
import { costMatrix, loadSet, type RuleSet } from './candidate-rules';

/** Each row's columns sorted by score (finite only; the rest -1), and ranks (n where not finite). */
export function fullOrder(n: number, score: Float32Array): { order: Int32Array; rank: Int32Array; finite: Int32Array } {
  const order = new Int32Array(n * n).fill(-1);
  const rank = new Int32Array(n * n).fill(n);
  const finite = new Int32Array(n);
  const idx = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    const row = score.subarray(i * n, i * n + n);
    let m = 0;
    for (let j = 0; j < n; j++) if (Number.isFinite(row[j])) idx[m++] = j;
    const part = idx.slice(0, m).sort((a, b) => row[a] - row[b]);
    order.set(part, i * n);
    for (let r = 0; r < m; r++) rank[i * n + part[r]] = r;
    finite[i] = m;
  }
  return { order, rank, finite };
}

/** Union of each face's first quota[i] columns of its order (pair keys i*n+j, i < j). */
export function quotaUnion(n: number, order: Int32Array, finite: Int32Array, quota: ArrayLike<number>): Set<number> {
  const out = new Set<number>();
  for (let i = 0; i < n; i++) {
    // a fractional quota is dithered by a fixed per-face offset, so budgets match closely
    const q = Math.min(finite[i], Math.max(0, Math.floor(quota[i] + ((i * 0.6180339887) % 1))));
    for (let r = 0; r < q; r++) {
      const j = order[i * n + r];
      out.add(i < j ? i * n + j : j * n + i);
    }
  }
  return out;
}

/** Scale the per-face weights so that the union holds about `budget` pairs (bisection on the scale). */
export function matchBudget(n: number, order: Int32Array, finite: Int32Array, weight: ArrayLike<number>, budget: number): Set<number> {
  let lo = 0, hi = 1;
  const at = (s: number): Set<number> => quotaUnion(n, order, finite, Array.from(weight, (w) => s * w));
  while (at(hi).size < budget) hi *= 2;
  for (let it = 0; it < 30; it++) {
    const mid = (lo + hi) / 2;
    if (at(mid).size < budget) lo = mid;
    else hi = mid;
  }
  return at(hi);
}

function recallOf(s: RuleSet, n: number, set: Set<number>): number {
  let hit = 0;
  for (const j of s.joins) if (j.some(([x, y]) => set.has(x * n + y))) hit++;
  return hit / s.reachable;
}

/** The `budget` pairs of least symmetric integer score (ties broken by pair order). */
function globalIntBest(n: number, finite: (i: number, j: number) => boolean, value: (i: number, j: number) => number, max: number, budget: number): Set<number> {
  const hist = new Float64Array(max + 2);
  for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) if (finite(i, j)) hist[Math.min(max + 1, value(i, j))]++;
  let t = 0, acc = 0;
  while (t <= max && acc + hist[t] <= budget) acc += hist[t++];
  const out = new Set<number>();
  for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) if (finite(i, j) && value(i, j) < t) out.add(i * n + j);
  for (let i = 0; i < n && out.size < budget; i++) for (let j = i + 1; j < n && out.size < budget; j++) if (finite(i, j) && value(i, j) === t) out.add(i * n + j);
  return out;
}

if (process.argv[1]?.endsWith('candidate-budget.ts')) {
  const dirs = process.argv[2].split(',');
  const ks = (process.argv[3] ?? '30').split(',').map(Number);
  for (const dir of dirs) {
    const c0 = process.cpuUsage();
    const s = loadSet(dir);
    const n = s.nFaces;
    const samples = Float64Array.from(readStudy(dir).filter((f) => f.faces.length > 0).flatMap((f) => f.faces.map((x) => x.samples)));
    const C = costMatrix(s);
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) {
      const a = s.fragOfFace[i], b = s.fragOfFace[j];
      if (a !== b && !s.compatible(Math.min(a, b), Math.max(a, b))) C[i * n + j] = Infinity;
    }
    const { order, rank, finite } = fullOrder(n, C);
    console.log(`${dir}: ${n} faces, ${s.reachable} reachable joins (${((process.cpuUsage(c0).user) / 1e6).toFixed(1)} CPU s to rank)`);
    const ok = (i: number, j: number): boolean => Number.isFinite(C[i * n + j]);
    // neighbourhood figures: cost of the 10th and 30th nearest, mean of the 10 nearest
    const c10 = new Float64Array(n), c30 = new Float64Array(n), m10 = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const at = (r: number): number => C[i * n + order[i * n + Math.min(r, finite[i] - 1)]];
      c10[i] = at(9);
      c30[i] = at(29);
      let t = 0;
      for (let r = 0; r < 10; r++) t += at(r);
      m10[i] = t / 10;
    }
    for (const k of ks) {
      const base = quotaUnion(n, order, finite, new Float64Array(n).fill(k));
      const budget = base.size;
      const rows: Array<[string, Set<number>]> = [['k-union', base]];
      for (const a of [0.25, 0.5, 0.75]) rows.push([`quota ~ samples^${a}`, matchBudget(n, order, finite, Array.from(samples, (x) => x ** a), budget)]);
      for (const b of [-1, -0.5, 0.5, 1]) {
        // crowding: the 30th nearest's cost against the median face's (small: a crowded neighbourhood)
        const med = Float64Array.from(c30).sort()[n >> 1];
        rows.push([`quota ~ (c30/median)^${b}`, matchBudget(n, order, finite, Array.from(c30, (x) => (x / med) ** b), budget)]);
      }
      rows.push(['rank sum, global', globalIntBest(n, ok, (i, j) => rank[i * n + j] + rank[j * n + i], 2 * n, budget)]);
      // each face's k best by the rank sum
      {
        const S = new Float32Array(n * n).fill(Infinity);
        for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) if (ok(i, j)) S[i * n + j] = rank[i * n + j] + rank[j * n + i] + 1e-4 * rank[i * n + j];
        const o = fullOrder(n, S);
        rows.push(['rank sum, per face', matchBudget(n, o.order, o.finite, new Float64Array(n).fill(1), budget)]);
        const L = new Float32Array(n * n).fill(Infinity);
        for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) if (ok(i, j)) L[i * n + j] = Math.log1p(rank[i * n + j]) + Math.log1p(rank[j * n + i]) + 1e-4 * rank[i * n + j];
        const lo = fullOrder(n, L);
        rows.push(['log rank sum, per face', matchBudget(n, lo.order, lo.finite, new Float64Array(n).fill(1), budget)]);
        for (const w of [0.5, 1, 2]) {
          const M = new Float32Array(n * n).fill(Infinity);
          for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) if (ok(i, j)) M[i * n + j] = Math.log1p(rank[i * n + j]) + w * Math.log1p(rank[j * n + i]);
          // the union is symmetric in effect: pair kept when either side keeps it
          const mo = fullOrder(n, M);
          rows.push([`log rank + ${w} log reverse rank, per face`, matchBudget(n, mo.order, mo.finite, new Float64Array(n).fill(1), budget)]);
        }
        // half by the own ranking, the rest by the rank sum
        for (const share of [0.5, 0.75]) {
          const half = quotaUnion(n, order, finite, new Float64Array(n).fill(Math.round(share * k)));
          const extra = globalIntBest(n, (i, j) => ok(i, j) && !half.has(i * n + j), (i, j) => rank[i * n + j] + rank[j * n + i], 2 * n, budget - half.size);
          rows.push([`k-union ${Math.round(share * k)} + rank sum fill`, new Set([...half, ...extra])]);
        }
      }
      for (const [name, corr] of [['CSLS 10', m10], ['local scaling 10', c10]] as const) {
        const S = new Float32Array(n * n).fill(Infinity);
        for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) {
          if (!ok(i, j)) continue;
          S[i * n + j] = name.startsWith('CSLS') ? 2 * C[i * n + j] - corr[i] - corr[j] : C[i * n + j] / Math.sqrt(Math.max(1e-6, corr[i] * corr[j]));
        }
        const o = fullOrder(n, S);
        rows.push([`${name}, per face`, matchBudget(n, o.order, o.finite, new Float64Array(n).fill(1), budget)]);
      }
      for (const [name, set] of rows) console.log(`  k ${k} budget ${budget} (${(budget / n).toFixed(1)}/face)  ${name.padEnd(40)} pairs ${String(set.size).padStart(7)}  recall ${(100 * recallOf(s, n, set)).toFixed(1)}%`);
    }
    console.log(`  ${((process.cpuUsage(c0).user) / 1e6).toFixed(1)} CPU s`);
  }
}
