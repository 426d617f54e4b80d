/**
 * Fit the join score's logistic model (core/geometry/registration/score-model.ts) on scored
 * motions with known truth, as written by the pairwise benchmark:
 *
 *   KNITBONE_PAIRWISE_DIRS=<demo dirs of development seeds> KNITBONE_PAIRWISE_DUMP=motions.json npm run bench -- pairwise
 *   npx tsx tests/bench/fit-score-model.ts motions.json [more.json ...]
 *
 * Prints the coefficients to paste into score-model.ts. Fit by iteratively reweighted least
 * squares (Newton's method for the logistic log-likelihood) with a small ridge penalty on the
 * slopes, on standardised features. Only development seeds go in here; held-out seeds are for
 * the calibration table of the benchmark.
 */
import { readFileSync } from 'node:fs';
import { FEATURE_NAMES, scoreFeatures } from '../../core/geometry/registration/score-model';

interface Motion { correct: boolean; components: Record<string, number> }

function solve(A: number[][], b: number[]): number[] {
  const n = b.length;
  const M = A.map((r, i) => [...r, b[i]]);
  for (let c = 0; c < n; c++) {
    let p = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(M[r][c]) > Math.abs(M[p][c])) p = r;
    [M[c], M[p]] = [M[p], M[c]];
    for (let r = c + 1; r < n; r++) {
      const f = M[r][c] / M[c][c];
      for (let k = c; k <= n; k++) M[r][k] -= f * M[c][k];
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let r = n - 1; r >= 0; r--) {
    let s = M[r][n];
    for (let k = r + 1; k < n; k++) s -= M[r][k] * x[k];
    x[r] = s / M[r][r];
  }
  return x;
}

const files = process.argv.slice(2);
const motions: Motion[] = files.flatMap((f) => JSON.parse(readFileSync(f, 'utf8')) as Motion[]);
const X = motions.map((m) => scoreFeatures(m.components as never));
const y = motions.map((m) => (m.correct ? 1 : 0));
const d = FEATURE_NAMES.length;
const mean = new Array<number>(d).fill(0), sd = new Array<number>(d).fill(0);
for (const x of X) x.forEach((v, k) => (mean[k] += v / X.length));
for (const x of X) x.forEach((v, k) => (sd[k] += (v - mean[k]) ** 2 / X.length));
for (let k = 0; k < d; k++) sd[k] = Math.sqrt(sd[k]) || 1;
const Z = X.map((x) => [1, ...x.map((v, k) => (v - mean[k]) / sd[k])]);
let w = new Array<number>(d + 1).fill(0);
const lambda = 0.5;
for (let it = 0; it < 50; it++) {
  const H = Array.from({ length: d + 1 }, () => new Array<number>(d + 1).fill(0));
  const g = new Array<number>(d + 1).fill(0);
  Z.forEach((z, i) => {
    const p = 1 / (1 + Math.exp(-z.reduce((s, v, k) => s + v * w[k], 0)));
    const r = y[i] - p, ww = Math.max(p * (1 - p), 1e-6);
    for (let a = 0; a <= d; a++) {
      g[a] += r * z[a];
      for (let b = 0; b <= d; b++) H[a][b] += ww * z[a] * z[b];
    }
  });
  for (let a = 1; a <= d; a++) { H[a][a] += lambda; g[a] -= lambda * w[a]; }
  const step = solve(H, g);
  w = w.map((v, k) => v + step[k]);
  if (Math.hypot(...step) < 1e-8) break;
}
// back to raw feature units
const slopes = FEATURE_NAMES.map((_, k) => w[k + 1] / sd[k]);
const intercept = w[0] - slopes.reduce((s, b, k) => s + b * mean[k], 0);
const positives = y.filter((v) => v === 1).length;
process.stdout.write(`${motions.length} motions (${positives} correct) from ${files.join(', ')}\n`);
process.stdout.write(`intercept: ${intercept.toFixed(4)},\nslopes: { ${FEATURE_NAMES.map((n, k) => `${n}: ${slopes[k].toFixed(4)}`).join(', ')} },\n`);
