/**
 * The join score reads as a probability only for the matcher it was fitted on: its coefficients
 * are fitted on scored motions of one method version (tests/bench/fit-score-model.ts), and a
 * matcher that changes which motions reach the fine step and how they are refined changes what
 * the components look like on correct and wrong motions alike. Calibration as such is measured
 * by `npm run bench -- pairwise` (reliability tables, Brier score: Brier 1950, Murphy 1973), not
 * here; this checks the bookkeeping that says which matcher the fit belongs to (project rule,
 * DEVELOPERS.md "The score": a new method version needs a new fit), and that a proposal run keys
 * its finished pairs on the score model too, so a refit score is not mixed with stored ones.
 */
import { describe, expect, it } from 'vitest';
import { METHOD_VERSION } from '../../../../core/geometry/proposals/pairwise-match';
import { SCORE_MODEL, scoreModelKey } from '../../../../core/geometry/registration/score-model';

describe('score model bookkeeping', () => {
  it('is fitted for the matcher\'s current method version', () => {
    expect(SCORE_MODEL.methodVersion).toBe(METHOD_VERSION);
  });
  it('gives a key that changes with any coefficient', () => {
    const k = scoreModelKey(SCORE_MODEL);
    expect(scoreModelKey({ ...SCORE_MODEL, intercept: SCORE_MODEL.intercept + 1e-3 })).not.toBe(k);
    expect(scoreModelKey({ ...SCORE_MODEL, slopes: { ...SCORE_MODEL.slopes, gapRmsMm: SCORE_MODEL.slopes.gapRmsMm + 1e-3 } })).not.toBe(k);
    expect(scoreModelKey({ ...SCORE_MODEL, fittedOn: 'other words' })).toBe(k);
  });
});
