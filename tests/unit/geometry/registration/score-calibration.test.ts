/**
 * The join score must read as a probability (issue 6, item 3) on motions it was not fitted on:
 * scored motions of development sets left out of the fit (tests/support/score-motions-checked.json,
 * written by `npx tsx tests/bench/fit-score-model.ts --fit <sets> --fixture ...` from a pairwise
 * benchmark dump; each motion's truth from the generator: within 5 degrees and 5 mm of the true
 * motion). Measured with the Brier score (Brier 1950: mean squared difference between forecast
 * probability and outcome) against the previous fit (method /7, its coefficients as committed in
 * 85424fb), and the precision of motions scoring above 0.8 against the target (at least 90%).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { SCORE_MODEL, scoreProbability, type ScoreComponents, type ScoreModel } from '../../../../core/geometry/registration/score-model';

const fixture = JSON.parse(readFileSync(join(import.meta.dirname, '../../../support/score-motions-checked.json'), 'utf8')) as { fields: string[]; motions: number[][] };
const motions = fixture.motions.map((row) => ({ components: Object.fromEntries(fixture.fields.map((f, k) => [f, row[k]])) as unknown as ScoreComponents, correct: row[fixture.fields.indexOf('correct')] === 1 }));

/** The fit of method /7 (seeds 11-15 of the matcher of 2 Dec 2026): no square-root input, interlock capped at 0.1. */
const METHOD_7_FIT: ScoreModel = {
  methodVersion: 'axis-direction-fpfh-ransac-pair-vote-icp/7',
  fittedOn: 'dev seeds 11-15',
  interlockCap: 0.1,
  intercept: -6.3928,
  slopes: { contactFraction: -0.8664, contactFractionOther: -1.7292, sqrtContactFractionOther: 0, logContactArea: 1.0481, gapRmsMm: -30.9317, contactGapRmsMm: 0, penetrationMm: -0.6512, outlineAgreement: 4.8316, interlock: 48.2222, axisAngle: -3.0803, axisSideMismatch: -4.4996 },
};

const brier = (model: ScoreModel): number => motions.reduce((s, m) => s + (scoreProbability(m.components, model) - (m.correct ? 1 : 0)) ** 2, 0) / motions.length;

describe('join score calibration on development motions not fitted', () => {
  it('has enough motions, correct and wrong, to judge', () => {
    expect(motions.filter((m) => m.correct).length).toBeGreaterThan(50);
    expect(motions.filter((m) => !m.correct).length).toBeGreaterThan(500);
  });
  it('forecasts better than the previous fit (lower Brier score)', () => {
    expect(brier(SCORE_MODEL)).toBeLessThan(brier(METHOD_7_FIT));
  });
  it('is right at least 9 times in 10 above 0.8 (issue 6, item 5)', () => {
    const high = motions.filter((m) => scoreProbability(m.components) > 0.8);
    expect(high.length).toBeGreaterThan(10);
    expect(high.filter((m) => m.correct).length / high.length).toBeGreaterThanOrEqual(0.9);
  });
});
