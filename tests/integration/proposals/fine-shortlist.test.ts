/**
 * The fine step of a fragment pair (matchFragments) takes the screen's few best motions over
 * all its face pairs. On a pair with several faces each the true motion need not be among the
 * screen's first three: this join of the generated sample (demo-data/sample, truth.json; a
 * transverse break, 118 mm^2 of contact, 4 x 4 faces) was lost when only 3 went on and is found
 * by every face pair's own fine step; since method /6 (the axis-direction search runs on every
 * pair of shaft pieces and adds wrong motions of high overlap) it is 11th by the screen's rank,
 * lost with 8 going on and found with 12. The matcher sees only the scan files; the truth motion is
 * the generator's record of how it cut the bone.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { matchFragments } from '../../../core/geometry/proposals/pairwise-match';
import { prepareFragment } from '../../../core/geometry/proposals/prepared-fragment';
import { displacementAt, rotationErrorDegrees } from '../../../core/geometry/registration/rigid-transform';
import { loadFragment } from '../../../core/jobs/fragment-loader';

const sample = join(import.meta.dirname, '../../../demo-data/sample');
const truth = JSON.parse(readFileSync(join(sample, 'truth.json'), 'utf8')) as { joins: Array<{ a: string; b: string; type: string; transformBToA: number[] }> };
// the spacing `knitbone propose` chooses for the sample (runSpacing of its break face areas)
const sampling = { spacing: 0.85, fpfhRadiusSpacings: 5 };

describe('fine step of a fragment pair', () => {
  it('refines enough screened motions to keep a true join ranked below the screen\'s first three', { timeout: 120_000 }, () => {
    const j = truth.joins.find((x) => x.a === 'QS-10221' && x.b === 'QS-10933' && x.type === 'conjoin')!;
    expect(j).toBeDefined();
    const A = prepareFragment(loadFragment(join(sample, 'scans', `${j.a}.ply`)).input, sampling);
    const B = prepareFragment(loadFragment(join(sample, 'scans', `${j.b}.ply`)).input, sampling);
    const [best] = matchFragments(A, B);
    expect(best).toBeDefined();
    // correct as the proposals benchmark counts it: within 5 degrees, and 5 mm at B's centroid
    expect(rotationErrorDegrees(best.transform, j.transformBToA)).toBeLessThan(5);
    expect(displacementAt(best.transform, j.transformBToA, B.centroid)).toBeLessThan(5);
  });
});
