/**
 * Fit the join score's logistic model (core/geometry/registration/score-model.ts) on scored
 * motions with known truth, as written by the pairwise benchmark, and check its calibration:
 *
 *   KNITBONE_PAIRWISE_DIRS=<demo dirs> KNITBONE_PAIRWISE_DUMP=motions.json npm run bench -- pairwise
 *   npx tsx tests/bench/fit-score-model.ts --fit s11,s12,s13 motions.json [more.json ...]
 *
 * `--fixture <file.json>` also writes the checked sets' motions (components and truth) for
 * tests/unit/geometry/registration/score-calibration.test.ts.
 * `--fit` names the assemblages (folder names) the model is fitted on; every other assemblage
 * in the files is only checked. Only development seeds go in here; held-out seeds are for the
 * calibration table of the benchmark. Prints the coefficients to paste into score-model.ts, then
 * for the fitted sets and the checked sets, the new model beside the score the benchmark recorded
 * (the model in use when the motions were written): a reliability table (predicted probability
 * in bins against the observed share of correct motions) and the Brier score with Murphy's
 * decomposition into reliability, resolution and uncertainty (Brier 1950; Murphy 1973, from
 * memory: BS = REL - RES + UNC over the bins, exact when every motion in a bin has the bin's
 * mean forecast, close otherwise).
 *
 * Fit: iteratively reweighted least squares (Newton's method for the logistic log-likelihood)
 * with a small ridge penalty on the slopes of standardised features. Deterministic: the same
 * files give the same coefficients.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { reliability, table } from './calibration';
import { FEATURE_NAMES, SCORE_MODEL, scoreFeatures, scoreProbability, type ScoreComponents, type ScoreModel } from '../../core/geometry/registration/score-model';

/** The score components a fixture keeps (ScoreComponents, in this order). */
export const COMPONENT_FIELDS = ['contactFraction', 'contactFractionOther', 'contactAreaMm2', 'gapRmsMm', 'contactGapRmsMm', 'penetrationMm', 'outlineAgreement', 'interlock', 'axesCompared', 'axisOffset', 'axisAngleDeg', 'axisSide', 'radiusRatio'] as const satisfies ReadonlyArray<keyof ScoreComponents>;

/** `weight` (optional, default 1): how many motions this one stands for (a dump that sampled the other fragment pairs, worker-motion-dump.ts); the motion is counted that many times. */
export interface Motion { set: string; a: string; b: string; trueJoin: boolean; correct: boolean; score: number; components: Record<string, number>; weight?: number }

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

/** Logistic regression by IRLS with ridge penalty `lambda` on standardised slopes; returns raw-unit intercept and slopes. */
export function fitLogistic(X: number[][], y: number[], lambda = 0.5): { intercept: number; slopes: number[]; standardised: number[] } {
  const d = X[0].length;
  const mean = new Array<number>(d).fill(0), sd = new Array<number>(d).fill(0);
  for (const x of X) x.forEach((v, k) => (mean[k] += v / X.length));
  for (const x of X) x.forEach((v, k) => (sd[k] += (v - mean[k]) ** 2 / X.length));
  for (let k = 0; k < d; k++) sd[k] = Math.sqrt(sd[k]) || 1;
  const Z = X.map((x) => [1, ...x.map((v, k) => (v - mean[k]) / sd[k])]);
  let w = new Array<number>(d + 1).fill(0);
  for (let it = 0; it < 100; it++) {
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
    if (Math.hypot(...step) < 1e-9) break;
  }
  const slopes = Array.from({ length: d }, (_, k) => w[k + 1] / sd[k]);
  const intercept = w[0] - slopes.reduce((s, b, k) => s + b * mean[k], 0);
  return { intercept, slopes, standardised: w.slice(1) };
}

function report(title: string, p: number[], y: number[]): void {
  const r = reliability(p, y);
  const high = p.map((v, i) => (v > 0.8 ? y[i] : -1)).filter((v) => v >= 0);
  process.stdout.write(`\n${title}: ${p.length} motions, ${y.filter((v) => v).length} correct; Brier ${r.brier.toFixed(4)} (reliability ${r.rel.toFixed(4)}, resolution ${r.res.toFixed(4)}, uncertainty ${r.unc.toFixed(4)}); above 0.8: ${high.filter((v) => v).length}/${high.length} correct\n`);
  table(r.rows);
}

/**
 * Ranking on the dumped motions under a scoring: of the true fragment pairs that have a correct
 * motion among their dumped ones, how many have it first in the pair (else class c of the
 * benchmark, outscored in its pair), and of those how many are in the top 3 pairs of either
 * piece by best score (else class d, outranked by other pairs), and of those how many score at
 * least `minScore`, the propose run's minimum (default 0.05; a pair whose best scores under it
 * stores nothing, the proposals benchmark's "nothing stored"). An estimate from the dump (each
 * pair's ranks 1-5 only); the benchmark re-run gives the real counts.
 */
export function ranking(list: Motion[], scores: number[], minScore = 0.05): { pairs: number; firstInPair: number; top3: number; top3Stored: number } {
  const best = new Map<string, { score: number; correct: boolean; trueJoin: boolean; a: string; b: string; set: string; anyCorrect: boolean }>();
  list.forEach((m, i) => {
    const k = `${m.set}|${m.a}|${m.b}`;
    const cur = best.get(k);
    if (!cur) best.set(k, { score: scores[i], correct: m.correct, trueJoin: m.trueJoin, a: m.a, b: m.b, set: m.set, anyCorrect: m.correct });
    else {
      cur.anyCorrect ||= m.correct;
      if (scores[i] > cur.score) Object.assign(cur, { score: scores[i], correct: m.correct });
    }
  });
  const byPiece = new Map<string, number[]>();
  for (const v of best.values()) for (const p of [v.a, v.b]) {
    const k = `${v.set}|${p}`;
    if (!byPiece.has(k)) byPiece.set(k, []);
    byPiece.get(k)!.push(v.score);
  }
  for (const l of byPiece.values()) l.sort((x, y) => y - x);
  let pairs = 0, firstInPair = 0, top3 = 0, top3Stored = 0;
  for (const v of best.values()) {
    if (!v.trueJoin || !v.anyCorrect) continue;
    pairs++;
    if (!v.correct) continue;
    firstInPair++;
    const third = (p: string): number => byPiece.get(`${v.set}|${p}`)![Math.min(2, byPiece.get(`${v.set}|${p}`)!.length - 1)];
    if (v.score >= third(v.a) || v.score >= third(v.b)) {
      top3++;
      if (v.score >= minScore) top3Stored++;
    }
  }
  return { pairs, firstInPair, top3, top3Stored };
}

function rankingLine(title: string, list: Motion[], scores: number[]): void {
  const r = ranking(list, scores);
  process.stdout.write(`${title}: ${r.pairs} true pairs with a correct motion dumped; correct first in its pair ${r.firstInPair} (c: ${r.pairs - r.firstInPair}); of those in the top 3 of a piece ${r.top3} (d: ${r.firstInPair - r.top3}), ${r.top3Stored} of them scoring at least the run's minimum 0.05\n`);
}

function main(): void {
  const args = process.argv.slice(2);
  const at = args.indexOf('--fit');
  const fitSets = at >= 0 ? args.splice(at, 2)[1].split(',') : undefined;
  const fx = args.indexOf('--fixture');
  const fixture = fx >= 0 ? args.splice(fx, 2)[1] : undefined;
  const files = args;
  const setName = (s: string): string => s.split(/[\\/]/).pop()!;
  const motions: Motion[] = files.flatMap((f) => JSON.parse(readFileSync(f, 'utf8')) as Motion[]).flatMap((m) => new Array<Motion>(Math.max(1, Math.round(m.weight ?? 1))).fill(m));
  const fitted = motions.filter((m) => !fitSets || fitSets.includes(setName(m.set)));
  const checked = motions.filter((m) => fitSets && !fitSets.includes(setName(m.set)));
  // inputs as the model in score-model.ts reads them (its interlock cap)
  const X = fitted.map((m) => scoreFeatures(m.components as unknown as ScoreComponents));
  const y = fitted.map((m) => (m.correct ? 1 : 0));
  const fit = fitLogistic(X, y);
  const sets = [...new Set(fitted.map((m) => setName(m.set)))];
  process.stdout.write(`fitted on ${sets.join(', ')}: ${fitted.length} motions (${y.filter((v) => v).length} correct) from ${files.join(', ')}\n`);
  process.stdout.write(`  fittedOn: '... seeds ${sets.join(', ')}: ${fitted.length} motions (ranks 1-5 of every candidate and true fragment pair), ${y.filter((v) => v).length} correct (within 5 degrees and 5 mm)',\n`);
  process.stdout.write(`  interlockCap: ${SCORE_MODEL.interlockCap},\n  intercept: ${fit.intercept.toFixed(4)},\n  slopes: { ${FEATURE_NAMES.map((n, k) => `${n}: ${fit.slopes[k].toFixed(4)}`).join(', ')} },\n`);
  process.stdout.write(`standardised slopes (per standard deviation of the feature): ${FEATURE_NAMES.map((n, k) => `${n} ${fit.standardised[k].toFixed(2)}`).join(', ')}\n`);
  const model: ScoreModel = { methodVersion: '', fittedOn: '', interlockCap: SCORE_MODEL.interlockCap, intercept: fit.intercept, slopes: Object.fromEntries(FEATURE_NAMES.map((n, k) => [n, fit.slopes[k]])) as ScoreModel['slopes'] };
  const predict = (list: Motion[]): number[] => list.map((m) => scoreProbability(m.components as unknown as ScoreComponents, model));
  const truth = (list: Motion[]): number[] => list.map((m) => (m.correct ? 1 : 0));
  report('Fitted sets, score as recorded', fitted.map((m) => m.score), truth(fitted));
  report('Fitted sets, new model', predict(fitted), truth(fitted));
  if (checked.length) {
    const names = [...new Set(checked.map((m) => setName(m.set)))];
    report(`Checked sets (${names.join(', ')}; not fitted), score as recorded`, checked.map((m) => m.score), truth(checked));
    report(`Checked sets (${names.join(', ')}; not fitted), new model`, predict(checked), truth(checked));
  }
  if (fixture && checked.length) {
    // the checked sets' motions for tests/unit/geometry/registration/score-calibration.test.ts; a wrong
    // motion that both the recorded score and the new model put under 0.001 is left out (it adds
    // under 1e-6 to either Brier score), which keeps the file small
    const p = predict(checked);
    const keep = checked.filter((m, i) => m.correct || m.score >= 1e-3 || p[i] >= 1e-3);
    const r = (x: number): number => Number(x.toPrecision(5));
    writeFileSync(fixture, JSON.stringify({
      source: `pairwise benchmark dump of development sets ${[...new Set(checked.map((m) => setName(m.set)))].join(', ')} (not fitted): motions ranked 1-5 of every candidate and true fragment pair; left out: ${checked.length - keep.length} wrong motions scoring under 0.001 under both the recorded and the new model`,
      fields: [...COMPONENT_FIELDS, 'correct'],
      motions: keep.map((m) => [...COMPONENT_FIELDS.map((k) => r(m.components[k])), m.correct ? 1 : 0]),
    }) + '\n');
    process.stdout.write(`\nwrote ${keep.length} of ${checked.length} checked motions to ${fixture}\n`);
  }
  process.stdout.write('\nRanking estimated from the dump (benchmark classes c and d)\n');
  rankingLine('  fitted sets, score as recorded', fitted, fitted.map((m) => m.score));
  rankingLine('  fitted sets, new model', fitted, predict(fitted));
  if (checked.length) {
    rankingLine('  checked sets, score as recorded', checked, checked.map((m) => m.score));
    rankingLine('  checked sets, new model', checked, predict(checked));
  }
}

if (process.argv[1]?.endsWith('fit-score-model.ts')) main();
