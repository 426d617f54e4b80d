/**
 * With MatchParameters.screenWays 'smaller' (not the default: see its note) the screen moves the
 * face with fewer samples onto the other: the coarse stages and the screen's trimmed short ICP are not symmetric in the two
 * faces, and a small face moved onto a large one finds a partner for most of its samples, where
 * the large face moved onto the small one has most of its samples outside the contact. This join
 * of the generated sample (demo-data/sample, truth.json; a spiral break) came out 4.5 degrees
 * off when the screen moves B's faces onto A's whatever their size (the default), and within
 * half a degree with 'smaller'. The matcher sees only the scan files; the truth motion is the generator's record of how
 * it cut the bone. Targets: the accuracy goals (median rotation error at most 1 degree,
 * translation at most 0.5 mm).
 */
import { describe, expect, it } from 'vitest';
import { DEFAULT_MATCH_PARAMETERS, matchFragments } from '../../../core/geometry/proposals/pairwise-match';
import { displacementAt, rotationErrorDegrees } from '../../../core/geometry/registration/rigid-transform';
import { sampleJoin } from './sample-join';


describe('screen direction', () => {
  it('moves the smaller face onto the larger one and finds a join within 1 degree', { timeout: 120_000 }, () => {
    const j = sampleJoin('QS-10022', 'QS-10081');
    const { A, B } = j;
    // since method /8's score the pair's best is a motion of the same join 3.8 degrees off (score
    // 0.93, more of the smaller face in contact), the one within 1 degree second (0.87); with the
    // default screen no motion of the pair comes within 1 degree
    const motions = matchFragments(A, B, { ...DEFAULT_MATCH_PARAMETERS, screenWays: 'smaller' });
    const near = motions.find((m) => rotationErrorDegrees(m.transform, j.transformBToA) < 1 && displacementAt(m.transform, j.transformBToA, B.centroid) < 0.5);
    expect(near).toBeDefined();
    // the best is a correct proposal as the benchmarks count it (within 5 degrees and 5 mm)
    expect(rotationErrorDegrees(motions[0].transform, j.transformBToA)).toBeLessThan(5);
  });
});
