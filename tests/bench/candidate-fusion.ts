/**
 * Selection rules on top of the candidate index's second stage (candidate-index.ts
 * CANDIDATE_RERANK: each face's `shortlist` cheapest partners by the trait cost, ranked again by
 * trait cost + weight x FPFH-word cost), compared at the budget of face pairs the index gives at
 * k, without aligning. Faces, traits and words from candidate-study.ts; recall as
 * candidate-recall.ts (size classes from the folder's specimens.csv prune as in a propose run).
 * Prints where the missed true joins rank (the best of the two sides over the join's face pairs,
 * by the trait cost alone, by the second stage's score over all partners, and by the word cost
 * alone), then each rule's recall at the same face pairs (a dithered fractional quota per face,
 * candidate-budget.ts). Rules: the second stage as wired; its score over every partner (no
 * shortlist); mutual rank on that score (log rank + w log reverse rank, Obayashi & Kinoshita
 * 2009); distinct-partner slots (a second face of the same whole face, or of the same fragment,
 * moved behind the rest of the list); quotas by the fragment's number of faces.
 *   npx tsx tests/bench/candidate-fusion.ts <demo-dir> [k] [shortlist] [weight]
 */
import { CANDIDATE_RERANK } from '../../core/geometry/proposals/candidate-index';
import { wordContainmentCost } from '../../core/geometry/proposals/word-containment-cost';
import { matchBudget, quotaUnion, fullOrder } from './candidate-budget';
import { readStudy } from './candidate-recall';
import { costMatrix, loadSet } from './candidate-rules';

if (process.argv[1]?.endsWith('candidate-fusion.ts')) {
  const [dir, kArg = '30', lArg = String(CANDIDATE_RERANK.shortlist), wArg = String(CANDIDATE_RERANK.weight)] = process.argv.slice(2);
  const k = Number(kArg), L = Number(lArg), weight = Number(wArg);
  const only = (process.env.RULES ?? '').split(',').filter(Boolean);
  const want = (name: string): boolean => only.length === 0 || only.some((o) => name.startsWith(o));
  const c0 = process.cpuUsage();
  const s = loadSet(dir);
  const n = s.nFaces;
  const study = readStudy(dir).filter((f) => f.faces.length > 0);
  const faces = study.flatMap((f) => f.faces);
  const parent = Int32Array.from(faces.map((x) => x.parent));
  const facesOfFragment = new Int32Array(study.length);
  for (let i = 0; i < n; i++) facesOfFragment[s.fragOfFace[i]]++;
  const C = costMatrix(s);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) {
    const a = s.fragOfFace[i], b = s.fragOfFace[j];
    if (a !== b && !s.compatible(Math.min(a, b), Math.max(a, b))) C[i * n + j] = Infinity;
  }
  // the word cost as the index reads it for face i's list: i's mirrored words against j's words
  const W = new Float32Array(n * n).fill(Infinity);
  for (let i = 0; i < n; i++) {
    const a = faces[i].traits.fpfhWordsMirrored;
    for (let j = 0; j < n; j++) {
      if (!Number.isFinite(C[i * n + j])) continue;
      const b = faces[j].traits.fpfhWords;
      W[i * n + j] = a && b ? wordContainmentCost(a, b) : 1;
    }
  }
  const S = new Float32Array(n * n);
  for (let x = 0; x < n * n; x++) S[x] = C[x] + weight * W[x];
  const byC = fullOrder(n, C);
  const byS = fullOrder(n, S);
  const byW = fullOrder(n, W);
  // the second stage as wired: the shortlist by C, ordered by S
  const wired = { order: new Int32Array(n * n).fill(-1), finite: new Int32Array(n) };
  for (let i = 0; i < n; i++) {
    const m = Math.min(L, byC.finite[i]);
    const list = Array.from(byC.order.subarray(i * n, i * n + m)).sort((a, b) => S[i * n + a] - S[i * n + b]);
    wired.order.set(list, i * n);
    wired.finite[i] = m;
  }
  const base = quotaUnion(n, wired.order, wired.finite, new Float64Array(n).fill(k));
  const budget = base.size;
  const hit = (set: Set<number>): boolean[] => s.joins.map((j) => j.some(([x, y]) => set.has(x * n + y)));
  const baseHit = hit(base);
  console.log(`${dir}: ${n} faces, ${s.reachable} reachable joins; second stage shortlist ${L} weight ${weight}, k ${k}: ${budget} face pairs (${(budget / n).toFixed(2)}/face), reached ${baseHit.filter(Boolean).length} (${(process.cpuUsage(c0).user / 1e6).toFixed(1)} CPU s)`);

  // where the missed joins rank: best over face pairs of the smaller of the two sides' ranks
  const bestRank = (rank: Int32Array, pairs: Array<[number, number]>): number => Math.min(...pairs.map(([x, y]) => Math.min(rank[x * n + y], rank[y * n + x])));
  const edges = [30, 60, 90, 150, 300, 600, 1200, Infinity];
  const histo = (rs: number[]): string => {
    const counts = edges.map(() => 0);
    for (const r of rs) counts[edges.findIndex((e) => r < e)]++;
    return edges.map((e, i) => `<${e === Infinity ? 'inf' : e} ${counts[i]}`).join('  ');
  };
  const missed = s.joins.filter((_, i) => !baseHit[i]);
  const kept = s.joins.filter((_, i) => baseHit[i]);
  console.log(`  missed ${missed.length}: best rank by trait cost   ${histo(missed.map((p) => bestRank(byC.rank, p)))}`);
  console.log(`  missed ${missed.length}: best rank by stage score  ${histo(missed.map((p) => bestRank(byS.rank, p)))}`);
  console.log(`  missed ${missed.length}: best rank by words alone  ${histo(missed.map((p) => bestRank(byW.rank, p)))}`);
  console.log(`  kept ${kept.length}: best rank by trait cost      ${histo(kept.map((p) => bestRank(byC.rank, p)))}`);
  // the missed joins' face pairs: is the best one's C or W cost the reason? (their mean cost beside the k-th partner's)
  {
    let dc = 0, dw = 0, m = 0;
    for (const p of missed) {
      let best: [number, number] = p[0], br = Infinity;
      for (const [x, y] of p) {
        const r = Math.min(byS.rank[x * n + y], byS.rank[y * n + x]);
        if (r < br) { br = r; best = [x, y]; }
      }
      const [x, y] = byS.rank[best[0] * n + best[1]] <= byS.rank[best[1] * n + best[0]] ? best : [best[1], best[0]];
      const kth = wired.order[x * n + Math.min(k, wired.finite[x]) - 1];
      dc += C[x * n + y] - C[x * n + kth];
      dw += weight * (W[x * n + y] - W[x * n + kth]);
      m++;
    }
    console.log(`  missed joins' best face pair against the k-th partner of the nearer side: trait cost +${(dc / m).toFixed(2)}, weighted word cost +${(dw / m).toFixed(2)}`);
  }

  const rows: Array<[string, Set<number>]> = [];
  const add = (name: string, make: () => Set<number>): void => { if (want(name)) rows.push([name, make()]); };
  const uniform = new Float64Array(n).fill(1);
  add('wired (fractional quota)', () => matchBudget(n, wired.order, wired.finite, uniform, budget));
  add('plain trait cost', () => matchBudget(n, byC.order, byC.finite, uniform, budget));
  add('stage score, no shortlist', () => matchBudget(n, byS.order, byS.finite, uniform, budget));
  // mutual rank on the stage score: wired ranks within the shortlist, full ranks beyond
  for (const w of [0.25, 0.5, 1]) {
    add(`log rank + ${w} log reverse rank`, () => {
      const M = new Float32Array(n * n).fill(Infinity);
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) if (Number.isFinite(S[i * n + j])) M[i * n + j] = Math.log1p(byS.rank[i * n + j]) + w * Math.log1p(byS.rank[j * n + i]) + 1e-4 * byS.rank[i * n + j];
      const o = fullOrder(n, M);
      return matchBudget(n, o.order, o.finite, uniform, budget);
    });
  }
  // distinct slots: a partner whose whole face (or fragment) is already in the list moves behind the rest
  const wholeGroup = (j: number): number => s.fragOfFace[j] * 1000 + parent[j], fragmentGroup = (j: number): number => s.fragOfFace[j];
  for (const [name, group, m] of [['distinct whole faces', wholeGroup, 1], ['distinct whole faces, 2 each', wholeGroup, 2], ['distinct fragments', fragmentGroup, 1], ['distinct fragments, 2 each', fragmentGroup, 2], ['distinct fragments, 3 each', fragmentGroup, 3]] as const) {
    add(name, () => {
      const order = new Int32Array(n * n).fill(-1);
      for (let i = 0; i < n; i++) {
        const seen = new Map<number, number>();
        const first: number[] = [], later: number[] = [];
        for (let r = 0; r < wired.finite[i]; r++) {
          const j = wired.order[i * n + r];
          const g = group(j);
          const c = seen.get(g) ?? 0;
          seen.set(g, c + 1);
          if (c >= m) later.push(j);
          else first.push(j);
        }
        order.set([...first, ...later], i * n);
      }
      return matchBudget(n, order, wired.finite, uniform, budget);
    });
  }
  // tiers: a new fragment first, then a new whole face of a fragment already listed, then the rest
  add('tiers: new fragment, new whole face, rest', () => {
    const order = new Int32Array(n * n).fill(-1);
    for (let i = 0; i < n; i++) {
      const seenF = new Set<number>(), seenW = new Set<number>();
      const tiers: number[][] = [[], [], []];
      for (let r = 0; r < wired.finite[i]; r++) {
        const j = wired.order[i * n + r];
        const f = fragmentGroup(j), w = wholeGroup(j);
        tiers[!seenF.has(f) ? 0 : !seenW.has(w) ? 1 : 2].push(j);
        seenF.add(f);
        seenW.add(w);
      }
      order.set(tiers.flat(), i * n);
    }
    return matchBudget(n, order, wired.finite, uniform, budget);
  });
  // soft: each earlier partner of the same whole face (fragment) adds a penalty to the stage score
  for (const [name, group] of [['whole face', wholeGroup], ['fragment', fragmentGroup]] as const) {
    for (const pen of [1, 2, 4, 8]) {
      add(`soft ${name} penalty ${pen}`, () => {
        const order = new Int32Array(n * n).fill(-1);
        for (let i = 0; i < n; i++) {
          const seen = new Map<number, number>();
          const rows: Array<[number, number]> = [];
          for (let r = 0; r < wired.finite[i]; r++) {
            const j = wired.order[i * n + r];
            const g = group(j), c = seen.get(g) ?? 0;
            seen.set(g, c + 1);
            rows.push([j, S[i * n + j] + pen * c]);
          }
          rows.sort((a, b) => a[1] - b[1]);
          order.set(rows.map((x) => x[0]), i * n);
        }
        return matchBudget(n, order, wired.finite, uniform, budget);
      });
    }
  }
  // both sides: a face takes a partner only when no face pair of the same two whole faces is kept yet (faces in turn, rank by rank)
  add('distinct whole-face pairs', () => {
    const at = (scale: number): Set<number> => {
      const out = new Set<number>();
      const covered = new Set<number>();
      const taken = new Int32Array(n), pos = new Int32Array(n);
      const quota = Array.from({ length: n }, (_, i) => Math.min(wired.finite[i], Math.max(0, Math.floor(scale + ((i * 0.6180339887) % 1)))));
      // rounds: each face takes its next partner whose whole-face pair is new, so no face's list runs ahead
      for (let round = 0, busy = true; busy; round++) {
        busy = false;
        for (let i = 0; i < n; i++) {
          if (taken[i] >= quota[i]) continue;
          busy = true;
          while (pos[i] < wired.finite[i]) {
            const j = wired.order[i * n + pos[i]++];
            const gi = wholeGroup(i), gj = wholeGroup(j);
            const g = gi < gj ? gi * 1e6 + gj : gj * 1e6 + gi;
            if (covered.has(g)) continue;
            covered.add(g);
            out.add(i < j ? i * n + j : j * n + i);
            break;
          }
          taken[i]++;
        }
      }
      return out;
    };
    let lo = 0, hi = 1;
    while (at(hi).size < budget && hi < 1e4) hi *= 2;
    for (let it = 0; it < 20; it++) {
      const mid = (lo + hi) / 2;
      if (at(mid).size < budget) lo = mid;
      else hi = mid;
    }
    return at(hi);
  });
  for (const a of [-0.5, -0.25, 0.25]) add(`quota ~ fragment's faces^${a}`, () => matchBudget(n, wired.order, wired.finite, Array.from(s.fragOfFace, (f) => facesOfFragment[f] ** a), budget));
  for (const [name, set] of rows) {
    const h = hit(set);
    const gained = h.filter((x, i) => x && !baseHit[i]).length, lost = h.filter((x, i) => !x && baseHit[i]).length;
    console.log(`  ${name.padEnd(36)} pairs ${String(set.size).padStart(7)}  reached ${h.filter(Boolean).length} (+${gained} -${lost})`);
  }
  console.log(`  ${(process.cpuUsage(c0).user / 1e6).toFixed(1)} CPU s`);
}
