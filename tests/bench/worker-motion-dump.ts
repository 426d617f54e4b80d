/**
 * Scored motions with known truth as a propose worker makes them, for refitting the score model
 * (fit-score-model.ts reads the output like a pairwise benchmark dump): on a folder studied by
 * candidate-restudy.ts (its `candidate-study/` labels, `candidate-cache/` analysis and prepared
 * parts; nothing is analysed again), the candidate face pairs are chosen as a run chooses them
 * (k 30, whole faces offered, size classes from specimens.csv) and every candidate fragment pair
 * is aligned with `matchFragments(..., keep, 0)`: its best `keep` motions (polished, as a worker
 * returns them), each marked correct when the pair is a true join and the motion lies within
 * 5 degrees and 5 mm of the truth (correct-motion.ts). The pairwise benchmark's dump instead
 * refines every face pair of the true joins on its own, which a run never does.
 *   npx tsx tests/bench/worker-motion-dump.ts <studied-dir> <out.jsonl> [keep]
 * One JSON line per motion, appended. KNITBONE_DUMP_STRIDE=s,i: every true pair but only the other
 * candidate fragment pairs i, i + s, ... of a fixed shuffled order (a uniform sample; each line
 * carries `weight` s for those, 1 for true pairs, so a fit can count each sampled motion s times).
 * Make a JSON array of the lines for fit-score-model.ts; the folder name is the set.
 */
import { appendFileSync, readFileSync } from 'node:fs';
import { basename, join } from 'node:path';
import { WHOLE_FACE_PARTNERS } from '../../core/geometry/proposals/candidate-index';
import { DEFAULT_MATCH_PARAMETERS, matchFragments } from '../../core/geometry/proposals/pairwise-match';
import { displacementAt, invert, rotationErrorDegrees } from '../../core/geometry/registration/rigid-transform';
import { readStudiedFolder } from './studied-folder';
import { isCorrectMotion } from './correct-motion';

interface Join { a: string; b: string; type: string; survivingFraction: number; transformBToA: number[] }
const [dir, out, keepArg] = process.argv.slice(2);
const keep = Number(keepArg ?? 5);
const [stride, start] = (process.env.KNITBONE_DUMP_STRIDE ?? '1,0').split(',').map(Number);
const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { joins: Join[] };
const { study, fragOf, pairsOf, prep } = readStudiedFolder(dir, { k: 30, wholeFacePartners: WHOLE_FACE_PARTNERS, keepFragments: 80 });
// the true motion of each fragment pair, B onto A in the pair's order (the first conjoin of the two pieces)
const trueMotion = new Map<string, number[]>();
for (const j of truth.joins) {
  if (j.type !== 'conjoin' || !fragOf.has(j.a) || !fragOf.has(j.b)) continue;
  const ia = fragOf.get(j.a)!, ib = fragOf.get(j.b)!;
  const key = ia < ib ? `${ia}:${ib}` : `${ib}:${ia}`;
  if (!trueMotion.has(key)) trueMotion.set(key, ia < ib ? j.transformBToA : invert(j.transformBToA));
}
// a fixed shuffle (multiplicative stride through the sorted keys), so any stride of it is spread over the assemblage
const keys = [...pairsOf.keys()].sort();
const step = 7919 % keys.length === 0 ? 7907 : 7919;
const order = keys.map((_, k) => keys[(k * step) % keys.length]);
const set = basename(dir);
let cpu = 0, n = 0;
// every true pair, and the other pairs i, i + s, ... of the shuffled order
const chosen = order.filter((key, k) => trueMotion.has(key) || (k >= start && (k - start) % stride === 0));
for (const key of chosen) {
  const [ia, ib] = key.split(':').map(Number);
  const want = trueMotion.get(key);
  const t0 = process.cpuUsage();
  const A = prep(ia), B = prep(ib);
  const got = matchFragments(A, B, DEFAULT_MATCH_PARAMETERS, pairsOf.get(key)!, keep, 0);
  const d = process.cpuUsage(t0);
  cpu += (d.user + d.system) / 1e6;
  const lines = got.map((m, rank) => {
    const { score, transform, faceA, faceB, ...components } = m;
    void faceA; void faceB;
    return JSON.stringify({ set, weight: want ? 1 : stride, a: study[ia].no, b: study[ib].no, trueJoin: !!want, correct: !!want && isCorrectMotion(transform, want, B.centroid), rank, score, rotErr: want ? rotationErrorDegrees(transform, want) : null, transErr: want ? displacementAt(transform, want, B.centroid) : null, components });
  });
  if (lines.length) appendFileSync(out, lines.join('\n') + '\n');
  if (++n % 200 === 0) console.error(`${n} fragment pairs, ${cpu.toFixed(0)} CPU s`);
}
console.error(`done: ${n} fragment pairs, ${cpu.toFixed(1)} CPU s`);
