/**
 * Precision of a propose run's stored proposals above several score thresholds, against the
 * generator's truth (a proposal is right when its two pieces are a true join, as the proposals
 * bench counts it), with the logit shift that moves each threshold onto 0.8: what a prior-shift
 * correction of the score (Saerens, Latinne & Decaestecker 2002, "Adjusting the outputs of a
 * classifier to new a priori probabilities", Neural Computation 14:21-41) would do to the
 * bench's "precision above 0.8" on a run whose share of true pairs among its candidates differs
 * from the set the score model was fitted on. Ranks within a run do not move under such a shift.
 *   npx tsx tests/bench/precision-thresholds.ts <pruned.sqlite> <truth.json>
 */
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';

const [cat, truthFile] = process.argv.slice(2);
if (!cat || !truthFile) {
  process.stderr.write('usage: npx tsx tests/bench/precision-thresholds.ts <pruned.sqlite> <truth.json>\n');
  process.exit(2);
}
const truth = JSON.parse(readFileSync(truthFile, 'utf8')) as { joins: Array<{ a: string; b: string }> };
const key = (a: string, b: string): string => (a < b ? `${a}|${b}` : `${b}|${a}`);
const trueKeys = new Set(truth.joins.map((j) => key(j.a, j.b)));
const cli = join(import.meta.dirname, '../../bin/knitbone.js');
const ps = JSON.parse(execFileSync('node', [cli, 'joins', cat, '--status', 'proposed', '--json'], { maxBuffer: 1 << 28 }).toString()) as Array<{ a: string; b: string; score: number }>;
const logit = (p: number): number => Math.log(p / (1 - p));
for (const t of [0.8, 0.85, 0.9, 0.93, 0.95, 0.97]) {
  const high = ps.filter((p) => p.score > t);
  const ok = high.filter((p) => trueKeys.has(key(p.a, p.b))).length;
  process.stdout.write(`above ${t} (logit shift ${(logit(0.8) - logit(t)).toFixed(2)}): ${ok}/${high.length} = ${high.length ? (ok / high.length).toFixed(3) : '-'}\n`);
}
