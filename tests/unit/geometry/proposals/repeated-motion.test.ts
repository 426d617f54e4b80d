/**
 * The fine shortlist leaves out a screened motion that repeats a better one of the same two faces
 * (pairwise-match.ts fineShortlist, `fineRepeatDeg` / `fineRepeatSpacings`; repeated-motion.ts).
 * The Stanford bunny (open data in the npm package `bunny`) cut in two by a rough surface
 * (tests/support/bunny-halves.ts), the upper half moved by a known motion. A's one break face is
 * offered three times: as itself, as a piece of itself (same parent) and as another face (another
 * parent). The motions compared are the truth turned about an axis through B's face centroid by a
 * known angle, or shifted by a known distance, so the angle and the displacement at the centroid
 * between two of them are known exactly (analytic geometry).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { bunnyHalvesWithFaceCopies, shortlistEntry, turnedAbout } from '../../../support/shortlist-entries';
import type { PreparedFragment } from '../../../../core/geometry/proposals/prepared-fragment';
import { DEFAULT_MATCH_PARAMETERS, fineShortlist } from '../../../../core/geometry/proposals/pairwise-match';
import { repeatsMotion } from '../../../../core/geometry/proposals/repeated-motion';
import { compose, transformFrom, type RigidTransform } from '../../../../core/geometry/registration/rigid-transform';

let A: PreparedFragment, B: PreparedFragment, truth: RigidTransform, c: number[];

/** The truth turned by `deg` degrees about an axis through B's face centroid (B's frame). */
function turned(deg: number, axis?: number[]): RigidTransform {
  return turnedAbout(truth, c, deg, axis);
}
/** The truth after shifting B by `mm` along x (B's frame): moved by `mm` everywhere. */
function shifted(mm: number): RigidTransform {
  return compose(truth, transformFrom([1, 0, 0, 0, 1, 0, 0, 0, 1], [mm, 0, 0]));
}
const entry = shortlistEntry;

beforeAll(async () => {
  // face 0, a piece of it (same parent), and the same samples as another face (parent 1)
  ({ A, B, truth, c } = await bunnyHalvesWithFaceCopies((f) => [f, { ...f }, { ...f, parent: 1 }]));
});

describe('screened motions repeating a better one of the same faces', () => {
  it('repeat when both face pairs share their faces and the motions lie within the angle and distance', () => {
    const o = entry(0, truth, 0.9);
    expect(repeatsMotion(A, B, o, entry(1, turned(1), 0.8), 2, 1.2)).toBe(true);
    expect(repeatsMotion(A, B, o, entry(1, turned(3), 0.8), 2, 1.2)).toBe(false);
    expect(repeatsMotion(A, B, o, entry(1, shifted(1.0), 0.8), 2, 1.2)).toBe(true);
    expect(repeatsMotion(A, B, o, entry(1, shifted(1.5), 0.8), 2, 1.2)).toBe(false);
    // another face of A: not a repeat, however near
    expect(repeatsMotion(A, B, o, entry(2, turned(1), 0.8), 2, 1.2)).toBe(false);
    expect(repeatsMotion(A, B, o, entry(2, truth, 0.8), 2, 1.2)).toBe(false);
  });

  it('take no place in the fine shortlist, which keeps the other motions', () => {
    const screened = [entry(0, truth, 0.9), entry(1, turned(1), 0.85), entry(2, turned(1), 0.85), entry(1, turned(40), 0.8)];
    const all = fineShortlist(A, B, screened, DEFAULT_MATCH_PARAMETERS);
    const off = fineShortlist(A, B, screened, { ...DEFAULT_MATCH_PARAMETERS, fineRepeatDeg: 0 });
    const on = fineShortlist(A, B, screened, { ...DEFAULT_MATCH_PARAMETERS, fineRepeatDeg: 2, fineRepeatSpacings: 1 });
    // the defaults leave repeats out
    expect(all).toEqual(on);
    const offCount = off.length;
    expect(offCount).toBeGreaterThanOrEqual(3);
    // exactly one of the two motions of face 0 and its piece 1 degree apart is left out
    expect(on.length).toBe(offCount - 1);
    expect(on.filter((s) => s.i === 0 || (s.i === 1 && s.motion.transform !== screened[3].motion.transform)).length).toBe(1);
    expect(on).toContain(screened[2]);
    if (off.includes(screened[3])) expect(on).toContain(screened[3]);
  });
});
