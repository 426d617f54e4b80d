/**
 * Which inputs the join score's logistic model should read: fits the model (fit-score-model.ts,
 * same IRLS and ridge) with the inputs of score-model.ts and with variants (an input added or
 * replaced), on dumped motions of development seeds, and compares them on sets not fitted:
 *
 *   KNITBONE_PAIRWISE_DIRS=<demo dirs> KNITBONE_PAIRWISE_DUMP=motions.json npm run bench -- pairwise
 *   KNITBONE_SET_SPACING=s11:1.2,s12:0.85 npx tsx tests/bench/score-feature-study.ts [--fit s11,s12,s13,s14] motions.json
 *
 * Without `--fit`: leave one set out (each set predicted by the fit on all the others, the
 * predictions pooled). With it: fitted on those sets, checked on the rest. Prints per variant the
 * Brier score (Brier 1950), precision above 0.8 and the ranking estimate from the dump (true
 * pairs whose correct motion is first in its pair, and of those in the top 3 of a piece; see
 * fit-score-model.ts `ranking`). KNITBONE_SET_SPACING gives each set's run spacing (the
 * benchmark's summary prints it) for inputs measured in spacings. KNITBONE_PAIR_FOLDS=n (for one
 * large set, e.g. a 200-fragment dump): n folds by fragment pair instead of sets (each fold
 * predicted by the fit on the others; the pieces are shared between folds, so this checks the
 * fit, not a new assemblage).
 */
import { readFileSync } from 'node:fs';
import { reliability } from './calibration';
import { fitLogistic, ranking, type Motion } from './fit-score-model';
import { LOCKED_INTERLOCK, scoreFeatures, SIDE_FULL, SIDE_NONE, TRUSTED_RADIUS_RATIO, type ScoreComponents } from '../../core/geometry/registration/score-model';

type Features = (c: ScoreComponents, spacing: number) => number[];

const trusted = (c: ScoreComponents): boolean => c.axesCompared === 1 && c.radiusRatio <= TRUSTED_RADIUS_RATIO;

/** The inputs of method /7's model (interlock capped at 0.1), the base the variants change. */
const base7 = (c: ScoreComponents): number[] => [
  c.contactFraction,
  c.contactFractionOther,
  Math.log1p(Math.max(0, c.contactAreaMm2)),
  Math.min(c.gapRmsMm, 3),
  Math.min(c.penetrationMm, 3),
  c.outlineAgreement,
  Math.min(c.interlock, 0.1),
  c.axesCompared ? Math.min(c.axisAngleDeg, 45) / 45 : 0,
  trusted(c) ? (1 - c.axisSide) / 2 : 0,
];
const sqrtOther = (c: ScoreComponents): number => Math.sqrt(Math.max(0, c.contactFractionOther));
const gapSp = (c: ScoreComponents, s: number): number => Math.min(c.gapRmsMm / s, 3);
const offset = (c: ScoreComponents): number => (trusted(c) ? Math.min(c.axisOffset, 2) : 0);
const il02 = (x: number[], c: ScoreComponents): number[] => x.map((v, k) => (k === 6 ? Math.min(c.interlock, 0.2) : v));
const gapIn = (x: number[], c: ScoreComponents, s: number): number[] => x.map((v, k) => (k === 3 ? gapSp(c, s) : v));

const VARIANTS: Record<string, Features> = {
  inputs7: (c) => base7(c),
  model: (c) => scoreFeatures(c),
  sqrtOther: (c) => [...base7(c), sqrtOther(c)],
  gapSpacings: (c, s) => gapIn(base7(c), c, s),
  gapBoth: (c, s) => [...base7(c), gapSp(c, s)],
  axisOffset: (c) => [...base7(c), offset(c)],
  interlock02: (c) => il02(base7(c), c),
  sqrtOtherIL02: (c) => [...il02(base7(c), c), sqrtOther(c)],
  sqrtOtherIL02Off: (c) => [...il02(base7(c), c), sqrtOther(c), offset(c)],
  sqrtBoth: (c) => [...base7(c), sqrtOther(c), Math.sqrt(Math.max(0, c.contactFraction))],
  sqrtOtherLogGap: (c) => [...base7(c), sqrtOther(c), Math.log(Math.max(0.02, Math.min(c.gapRmsMm, 3)))],
  sqrtOtherGapSp: (c, s) => [...gapIn(base7(c), c, s), sqrtOther(c)],
  sqrtOtherAll: (c, s) => [...gapIn(il02(base7(c), c), c, s), sqrtOther(c), offset(c)],
  // session 17, on 200-fragment sets (partial contacts with gaps of 0.2-0.45 mm): the gap bent
  modelLogGap: (c) => [...scoreFeatures(c), Math.log(Math.max(0.02, Math.min(c.gapRmsMm, 3)))],
  modelGapSq: (c) => [...scoreFeatures(c), Math.min(c.gapRmsMm, 3) ** 2],
  modelGapArea: (c) => [...scoreFeatures(c), Math.min(c.gapRmsMm, 3) * Math.log1p(Math.max(0, c.contactAreaMm2))],
};

/** Fold of a fragment pair (0..folds-1), from a hash of its set and names: deterministic. */
function pairFold(m: Motion, folds: number): number {
  let h = 2166136261;
  for (const ch of `${m.set}|${m.a}|${m.b}`) h = Math.imul(h ^ ch.charCodeAt(0), 16777619) >>> 0;
  return h % folds;
}

function probability(c: ScoreComponents, x: number[], w: { intercept: number; slopes: number[] }): number {
  const logit = x.reduce((s, v, k) => s + v * w.slopes[k], w.intercept);
  const locked = Math.min(1, c.interlock / LOCKED_INTERLOCK);
  const sameSide = trusted(c) ? Math.min(1, Math.max(0, (c.axisSide - SIDE_NONE) / (SIDE_FULL - SIDE_NONE))) : 1;
  return (locked * sameSide) / (1 + Math.exp(-logit));
}

function main(): void {
  const args = process.argv.slice(2);
  const at = args.indexOf('--fit');
  const fitSets = at >= 0 ? args.splice(at, 2)[1].split(',') : undefined;
  const only = process.env.KNITBONE_VARIANTS?.split(',');
  const setName = (s: string): string => s.split(/[\\/]/).pop()!;
  const spacingOf = new Map((process.env.KNITBONE_SET_SPACING ?? '').split(',').filter(Boolean).map((x) => [x.split(':')[0], Number(x.split(':')[1])] as [string, number]));
  const motions: Motion[] = args.flatMap((f) => JSON.parse(readFileSync(f, 'utf8')) as Motion[]);
  const sets = [...new Set(motions.map((m) => setName(m.set)))];
  const rows: string[] = [];
  for (const [name, feats] of Object.entries(VARIANTS)) {
    if (only && !only.includes(name)) continue;
    const X = motions.map((m) => feats(m.components as unknown as ScoreComponents, spacingOf.get(setName(m.set)) ?? 1.2));
    const pairFolds = Number(process.env.KNITBONE_PAIR_FOLDS ?? 0);
    const foldOf = (m: Motion): string => (pairFolds > 1 ? String(pairFold(m, pairFolds)) : setName(m.set));
    const units = pairFolds > 1 ? Array.from({ length: pairFolds }, (_, k) => String(k)) : sets;
    const folds = fitSets ? [{ fit: fitSets, check: sets.filter((s) => !fitSets.includes(s)) }] : units.map((s) => ({ fit: units.filter((t) => t !== s), check: [s] }));
    const checked: Motion[] = [], p: number[] = [];
    for (const fold of folds) {
      const unit = fitSets ? (m: Motion): string => setName(m.set) : foldOf;
      const idx = motions.map((m, i) => (fold.fit.includes(unit(m)) ? i : -1)).filter((i) => i >= 0);
      const w = fitLogistic(idx.map((i) => X[i]), idx.map((i) => (motions[i].correct ? 1 : 0)));
      motions.forEach((m, i) => {
        if (!fold.check.includes(unit(m))) return;
        checked.push(m);
        p.push(probability(m.components as unknown as ScoreComponents, X[i], w));
      });
    }
    const y = checked.map((m) => (m.correct ? 1 : 0));
    const r = reliability(p, y);
    const high = p.map((v, i) => (v > 0.8 ? y[i] : -1)).filter((v) => v >= 0);
    const rk = ranking(checked, p);
    rows.push(`${name.padEnd(18)} Brier ${r.brier.toFixed(5)} rel ${r.rel.toFixed(5)}  above 0.8 ${high.filter((v) => v).length}/${high.length}  first in pair ${rk.firstInPair}/${rk.pairs}  top 3 ${rk.top3} (${rk.top3Stored} >= 0.05)`);
  }
  const recorded = motions.filter((m) => !fitSets || !fitSets.includes(setName(m.set)));
  const ry = recorded.map((m) => (m.correct ? 1 : 0)), rp = recorded.map((m) => m.score);
  const rr = reliability(rp, ry), rk = ranking(recorded, rp);
  const high = rp.map((v, i) => (v > 0.8 ? ry[i] : -1)).filter((v) => v >= 0);
  process.stdout.write(`${fitSets ? `fitted on ${fitSets.join(',')}, checked on the rest` : 'leave one set out'} (${sets.join(', ')})\n`);
  process.stdout.write(`${'as recorded'.padEnd(18)} Brier ${rr.brier.toFixed(5)} rel ${rr.rel.toFixed(5)}  above 0.8 ${high.filter((v) => v).length}/${high.length}  first in pair ${rk.firstInPair}/${rk.pairs}  top 3 ${rk.top3} (${rk.top3Stored} >= 0.05)\n`);
  process.stdout.write(rows.join('\n') + '\n');
}

main();
