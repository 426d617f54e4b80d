/**
 * What `knitbone propose --exhaustive` would find on a large assemblage, estimated without
 * running it (at 200 fragments it would take hours on two shared cores), to set beside a pruned
 * run of the proposals benchmark:
 *   1. every true join's fragment pair (both pieces present, >= 30% of the break surviving) is
 *      aligned through every face pair, exactly as the exhaustive run would (matchFragments is
 *      deterministic per fragment pair): its best motion, its score s, correct or not;
 *   2. a uniform random sample of the other fragment pairs is aligned the same way: the share
 *      F(s) of such pairs whose best score beats s;
 *   3. a true join is in the top 3 of a piece p when fewer than 3 of p's other pairs beat it:
 *      the true pairs of p exactly, the others as a Poisson count of mean (p's other pairs) x F(s);
 *      found = correct and in the top 3 of either piece (1 - product of the two misses).
 * The expected number exhaustive finds, and the share of it the pruned run found (its stored
 * proposals, the benchmark's criterion: 5 degrees, 5 mm at B's centroid), are printed with the
 * sampling error of F (binomial; the estimate is repeated with F at +-1 standard error).
 * Also the CPU an exhaustive run would spend aligning, from the measured CPU per fragment pair.
 * Usage: npx tsx tests/bench/exhaustive-estimate.ts <generated-dir> <pruned-catalogue> [sampled pairs, default 300]
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { openCatalogue } from '../../core/catalogue/catalogue';
import { cacheDirFor, fragmentKey, readFragment } from '../../core/jobs/fragment-cache';
import { matchFragments, DEFAULT_MATCH_PARAMETERS } from '../../core/geometry/proposals/pairwise-match';
import { prepareFragment, DEFAULT_FPFH_RADIUS_SPACINGS, type PreparedFragment } from '../../core/geometry/proposals/prepared-fragment';
import { invert } from '../../core/geometry/registration/rigid-transform';
import { Random } from '../../demo-data/random';
import { isCorrectMotion } from './correct-motion';

interface TruthJoin { a: string; b: string; type: string; survivingFraction: number; transformBToA: number[] }
const [gen, catalogue, sampleArg = '300'] = process.argv.slice(2);
const truth = JSON.parse(readFileSync(join(gen, 'truth.json'), 'utf8')) as { joins: TruthJoin[] };
const cat = openCatalogue(catalogue);
const spacing = (cat.joins.list({ status: 'proposed' })[0]?.parameters as { sampling: { spacing: number } }).sampling.spacing;
const numbers = new Map(cat.specimens.list().map((s) => [s.id, s.catalogueNo]));
const prepared = new Map<string, PreparedFragment>();
for (const s of cat.scans.list()) {
  const cached = readFragment(cacheDirFor(catalogue), fragmentKey(s.contentHash, s.units, (s.stats as { settings?: unknown }).settings, []));
  if (cached) prepared.set(numbers.get(s.specimenId)!, prepareFragment(cached.input, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS }));
}
const proposals = cat.joins.list({ status: 'proposed' }).map((j) => ({ a: numbers.get(j.specimenA)!, b: numbers.get(j.specimenB)!, score: j.score ?? 0, transform: j.transform! }));
cat.close();
const names = [...prepared.keys()];
const key = (x: string, y: string): string => [x, y].sort().join('|');
const cpu = (): number => { const c = process.cpuUsage(); return (c.user + c.system) / 1e6; };
const correct = (T: number[], j: TruthJoin, bNo: string, aNo: string): boolean => {
  const want = aNo === j.a ? j.transformBToA : invert(j.transformBToA);
  return isCorrectMotion(T, want, prepared.get(bNo)!.centroid);
};
// 1. true joins' fragment pairs, every face pair
const eligible = truth.joins.filter((j) => j.type === 'conjoin' && j.survivingFraction >= 0.3 && prepared.has(j.a) && prepared.has(j.b));
const truePairs = new Map<string, number>(); // best score of each true fragment pair
const outcome: Array<{ j: TruthJoin; ok: boolean; s: number }> = [];
let cpuTrue = 0;
for (const j of eligible) {
  const t0 = cpu();
  const best = matchFragments(prepared.get(j.a)!, prepared.get(j.b)!, DEFAULT_MATCH_PARAMETERS)[0];
  cpuTrue += cpu() - t0;
  const s = best?.score ?? 0;
  truePairs.set(key(j.a, j.b), Math.max(truePairs.get(key(j.a, j.b)) ?? 0, s));
  outcome.push({ j, ok: !!best && correct(best.transform, j, j.b, j.a), s });
}
// 2. a uniform sample of the other fragment pairs
const rnd = new Random('exhaustive-estimate');
const others: Array<[string, string]> = [];
for (let i = 0; i < names.length; i++) for (let k = i + 1; k < names.length; k++) if (!truePairs.has(key(names[i], names[k]))) others.push([names[i], names[k]]);
const m = Math.min(others.length, Number(sampleArg));
const sampled: number[] = [];
let cpuOther = 0;
for (const idx of rnd.fork('pairs').permutation(others.length).slice(0, m)) {
  const [a, b] = others[idx];
  const t0 = cpu();
  sampled.push(matchFragments(prepared.get(a)!, prepared.get(b)!, DEFAULT_MATCH_PARAMETERS)[0]?.score ?? 0);
  cpuOther += cpu() - t0;
}
// 3. top 3 of a piece
const otherPairsOf = (p: string): number => names.length - 1 - [...truePairs.keys()].filter((k) => k.split('|').includes(p)).length;
const estimate = (shift: number): { exh: number; both: number } => {
  const F = (s: number): number => {
    const p = sampled.filter((x) => x > s).length / m;
    // binomial standard error, at least that of one pair in the sample
    return Math.min(1, Math.max(0, p + shift * Math.sqrt(Math.max(p * (1 - p), 1 / m) / m)));
  };
  let exh = 0, both = 0;
  for (const o of outcome) {
    if (!o.ok) continue;
    const inTop = (p: string): number => {
      const trueAbove = [...truePairs.entries()].filter(([k, s]) => k.split('|').includes(p) && k !== key(o.j.a, o.j.b) && s > o.s).length;
      const l = otherPairsOf(p) * F(o.s);
      // P(trueAbove + Poisson(l) < 3)
      let pr = 0;
      for (let n = 0; n < 3 - trueAbove; n++) pr += (Math.exp(-l) * l ** n) / [1, 1, 2][n];
      return trueAbove >= 3 ? 0 : pr;
    };
    const pFound = 1 - (1 - inTop(o.j.a)) * (1 - inTop(o.j.b));
    exh += pFound;
    const p = proposals.find((x) => key(x.a, x.b) === key(o.j.a, o.j.b));
    const top3 = (no: string): typeof proposals => proposals.filter((x) => x.a === no || x.b === no).sort((x, y) => y.score - x.score).slice(0, 3);
    const prunedFound = !!p && correct(p.transform, o.j, p.b, p.a) && (top3(o.j.a).includes(p) || top3(o.j.b).includes(p));
    if (prunedFound) both += pFound;
  }
  return { exh, both };
};
const mid = estimate(0), lo = estimate(1), hi = estimate(-1);
const allPairs = (names.length * (names.length - 1)) / 2;
console.log(`${names.length} fragments, spacing ${spacing}, ${eligible.length} true joins (${truePairs.size} fragment pairs), ${m} of ${others.length} other pairs sampled`);
console.log(`true joins correct as best of their pair (every face pair): ${outcome.filter((o) => o.ok).length}`);
console.log(`exhaustive would find (expected): ${mid.exh.toFixed(1)} (F +1 s.e.: ${lo.exh.toFixed(1)}, -1 s.e.: ${hi.exh.toFixed(1)})`);
console.log(`of which the pruned run found: ${mid.both.toFixed(1)} = ${(mid.both / mid.exh).toFixed(3)} (${(lo.both / lo.exh).toFixed(3)} - ${(hi.both / hi.exh).toFixed(3)})`);
const perOther = cpuOther / Math.max(1, m);
console.log(`CPU s per fragment pair, every face pair: true ${(cpuTrue / eligible.length).toFixed(3)}, others ${perOther.toFixed(3)}; exhaustive aligning estimate ${(cpuTrue + perOther * (allPairs - truePairs.size)).toFixed(0)} CPU s for ${allPairs} fragment pairs (one thread, no preparing)`);
