/**
 * A mutual-rank rule for the candidate index (mutualRankPartners below: each face keeps its k
 * partners of least mutual rank) against the plain union of each face's k best (candidate-index.ts), without aligning: for each k and depth, face pairs per face and candidate
 * recall (as candidate-recall.ts; pieces of different recorded size classes not paired), beside
 * the plain union at several k, so the two curves of recall against face pairs can be compared.
 *   npx tsx tests/bench/candidate-mutual.ts <demo-dir>[,<demo-dir>...] [ks] [depths] [plain ks]
 */
import { costMatrix, loadSet } from './candidate-rules';
import { fullOrder, quotaUnion } from './candidate-budget';

/**
 * Each item's best partners by mutual rank: the geometric mean of the rank each of two items
 * gives the other in its own list, sorted by cost (1 = its cheapest), as the mutual rank of
 * coexpressed genes (Obayashi & Kinoshita 2009, DNA Research 16:249-260: MR(a, b) =
 * sqrt(rank of b among a's partners x rank of a among b's)). A pair both sides rank well beats a
 * pair only one side ranks well, which matters when the lists crowd: in a large assemblage a
 * face that looks like many faces (a hub) sits high in many lists without each of those faces
 * sitting high in its own. Ranks are read from each item's `depth` cheapest partners; an item
 * beyond another's `depth` is given rank depth + 1 there (a lower bound).
 */

export interface RankedPartner {
  /** The partner's index. */
  j: number;
  /** cost(i, j). */
  cost: number;
  /** Rank of j in i's list and of i in j's (1 = cheapest; depth + 1 when beyond the depth). */
  rank: number;
  reverseRank: number;
}

/**
 * For each of `n` items, its `k` partners of least mutual rank (ties: the cheaper first), from a
 * symmetric cost (not finite where two items may not pair).
 */
export function mutualRankPartners(n: number, cost: (i: number, j: number) => number, k: number, depth: number): RankedPartner[][] {
  const d = Math.max(1, Math.floor(depth));
  // each item's `d` cheapest partners, sorted by cost (a bounded max-heap, then sorted)
  const listJ: Int32Array[] = [], listC: Float64Array[] = [];
  const heapC = new Float64Array(d), heapJ = new Int32Array(d);
  for (let i = 0; i < n; i++) {
    let size = 0;
    for (let j = 0; j < n; j++) {
      if (j === i) continue;
      const c = cost(i, j);
      if (!Number.isFinite(c)) continue;
      if (size < d) {
        // sift up
        let p = size++;
        while (p > 0) {
          const q = (p - 1) >> 1;
          if (heapC[q] >= c) break;
          heapC[p] = heapC[q]; heapJ[p] = heapJ[q]; p = q;
        }
        heapC[p] = c; heapJ[p] = j;
      } else if (c < heapC[0]) {
        // replace the root and sift down
        let p = 0;
        for (;;) {
          const l = 2 * p + 1, r = l + 1;
          let m = p, mc = c;
          if (l < size && heapC[l] > mc) { m = l; mc = heapC[l]; }
          if (r < size && heapC[r] > mc) { m = r; mc = heapC[r]; }
          if (m === p) break;
          heapC[p] = heapC[m]; heapJ[p] = heapJ[m]; p = m;
        }
        heapC[p] = c; heapJ[p] = j;
      }
    }
    const order = Array.from({ length: size }, (_, x) => x).sort((a, b) => heapC[a] - heapC[b] || heapJ[a] - heapJ[b]);
    listJ.push(Int32Array.from(order, (x) => heapJ[x]));
    listC.push(Float64Array.from(order, (x) => heapC[x]));
  }
  // rank of a cost in an item's list: 1 + how many of its partners are cheaper (depth + 1 beyond its list)
  const rankIn = (j: number, c: number): number => {
    const L = listC[j];
    if (L.length === d && c > L[d - 1]) return d + 1;
    let lo = 0, hi = L.length;
    while (lo < hi) {
      const m = (lo + hi) >> 1;
      if (L[m] < c) lo = m + 1;
      else hi = m;
    }
    return lo + 1;
  };
  const out: RankedPartner[][] = [];
  for (let i = 0; i < n; i++) {
    const J = listJ[i], Cs = listC[i];
    const rows: RankedPartner[] = [];
    for (let p = 0; p < J.length; p++) rows.push({ j: J[p], cost: Cs[p], rank: rankIn(i, Cs[p]), reverseRank: rankIn(J[p], Cs[p]) });
    // the list is already sorted by cost, and sort is stable: ties in mutual rank keep the cheaper first
    rows.sort((a, b) => a.rank * a.reverseRank - b.rank * b.reverseRank);
    out.push(rows.slice(0, Math.max(0, Math.floor(k))));
  }
  return out;
}


if (process.argv[1]?.endsWith('candidate-mutual.ts')) {
  const dirs = process.argv[2].split(',');
  const ks = (process.argv[3] ?? '20,25,30,35').split(',').map(Number);
  const depths = (process.argv[4] ?? '100,300').split(',').map(Number);
  const plain = (process.argv[5] ?? '25,30,35').split(',').map(Number);
  for (const dir of dirs) {
    const s = loadSet(dir);
    const n = s.nFaces;
    const C = costMatrix(s);
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) {
      const a = s.fragOfFace[i], b = s.fragOfFace[j];
      if (a !== b && !s.compatible(Math.min(a, b), Math.max(a, b))) C[i * n + j] = Infinity;
    }
    const recall = (set: Set<number>): number => s.joins.filter((j) => j.some(([x, y]) => set.has(x * n + y))).length / s.reachable;
    console.log(`${dir}: ${n} faces, ${s.reachable} reachable joins`);
    const { order, finite } = fullOrder(n, C);
    for (const k of plain) {
      const set = quotaUnion(n, order, finite, new Float64Array(n).fill(k));
      console.log(`  plain k ${k}: ${(set.size / n).toFixed(2)} pairs/face, recall ${(100 * recall(set)).toFixed(1)}%`);
    }
    for (const depth of depths) {
      const c0 = process.cpuUsage();
      const lists = mutualRankPartners(n, (i, j) => C[i * n + j], Math.max(...ks), depth);
      const cpu = process.cpuUsage(c0).user / 1e6;
      for (const k of ks) {
        const set = new Set<number>();
        lists.forEach((l, i) => l.slice(0, k).forEach(({ j }) => set.add(i < j ? i * n + j : j * n + i)));
        console.log(`  mutual rank k ${k} depth ${depth}: ${(set.size / n).toFixed(2)} pairs/face, recall ${(100 * recall(set)).toFixed(1)}% (${cpu.toFixed(1)} CPU s)`);
      }
    }
  }
}
