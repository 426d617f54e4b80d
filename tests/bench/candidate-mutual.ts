/**
 * The candidate index's mutual-rank rule (mutual-rank-partners.ts) against the plain union of
 * each face's k best, without aligning: for each k and depth, face pairs per face and candidate
 * recall (as candidate-recall.ts; pieces of different recorded size classes not paired), beside
 * the plain union at several k, so the two curves of recall against face pairs can be compared.
 *   npx tsx tests/bench/candidate-mutual.ts <demo-dir>[,<demo-dir>...] [ks] [depths] [plain ks]
 */
import { mutualRankPartners } from '../../core/geometry/proposals/mutual-rank-partners';
import { costMatrix, loadSet } from './candidate-rules';
import { fullOrder, quotaUnion } from './candidate-budget';

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
