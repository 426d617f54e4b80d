/**
 * Extra places in the fine shortlist for face pairs that have none (pairwise-match.ts
 * fineShortlist, `fineFacePairPlaces`; face-pair-places.ts). The Stanford bunny (open data in the
 * npm package `bunny`) cut in two by a rough surface (tests/support/bunny-halves.ts), the upper
 * half moved by a known motion, so the truth is analytic by construction. A's one break face is
 * offered twice, as itself (parent 0) and as another face (parent 1). Face pair (0, 0) carries
 * many wrong turns of high overlap (the truth turned by 10-60 degrees about an axis through B's
 * face centroid: analytic, so their rotation error is exactly that angle); face pair (1, 0)
 * carries the truth at a lower overlap, as a partial contact of a multi-face fragment pair does.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { bunnyHalvesWithFaceCopies, shortlistEntry, turnedAbout } from '../../../support/shortlist-entries';
import type { PreparedFragment } from '../../../../core/geometry/proposals/prepared-fragment';
import { DEFAULT_MATCH_PARAMETERS, fineShortlist, refineFacePair } from '../../../../core/geometry/proposals/pairwise-match';
import { withFacePairPlaces } from '../../../../core/geometry/proposals/face-pair-places';
import { displacementAt, rotationErrorDegrees, type RigidTransform } from '../../../../core/geometry/registration/rigid-transform';

let A: PreparedFragment, B: PreparedFragment, truth: RigidTransform, c: number[];

/** The truth turned by `deg` degrees about an axis through B's face centroid (B's frame). */
function turned(deg: number, axis?: number[]): RigidTransform {
  return turnedAbout(truth, c, deg, axis);
}
const entry = shortlistEntry;

beforeAll(async () => {
  ({ A, B, truth, c } = await bunnyHalvesWithFaceCopies((f) => [f, { ...f, parent: 1 }]));
});

describe('places in the fine shortlist for face pairs that have none', () => {
  it('the helper adds the best of each unrepresented face pair, in rank order, up to the places', () => {
    const r = [
      { i: 0, j: 0, k: 'a' }, { i: 0, j: 1, k: 'b' }, { i: 2, j: 0, k: 'c' }, { i: 2, j: 0, k: 'd' }, { i: 3, j: 3, k: 'e' }, { i: 4, j: 4, k: 'f' },
    ];
    const short = [r[0], r[1]];
    expect(withFacePairPlaces(short, r, 0)).toBe(short);
    // (2,0) once (its best, c), then (3,3); (0,0) and (0,1) are represented already
    expect(withFacePairPlaces(short, r, 2).map((x) => x.k)).toEqual(['a', 'b', 'c', 'e']);
    expect(withFacePairPlaces(short, r, 10).map((x) => x.k)).toEqual(['a', 'b', 'c', 'e', 'f']);
  });

  it('a truth out-ranked by wrong turns of another face pair gets a place and refines to the truth', () => {
    // 30 wrong turns on face pair (0, 0) at overlap 0.9-0.95; the truth on (1, 0) at 0.4, under
    // fineRatio (0.5) times the best and behind the 24 places
    const wrong = Array.from({ length: 30 }, (_, k) => entry(0, turned(10 + (50 * k) / 29, k % 2 ? [0.3, -0.5, 0.8] : [-0.7, 0.2, 0.4]), 0.95 - k * 0.0015));
    const right = entry(1, truth, 0.4);
    const screened = [...wrong, right];
    const without = fineShortlist(A, B, screened, { ...DEFAULT_MATCH_PARAMETERS, fineFacePairPlaces: 0 });
    expect(without).not.toContain(right);
    expect(without.length).toBeLessThanOrEqual(DEFAULT_MATCH_PARAMETERS.finePerFragmentPair);
    const withPlaces = fineShortlist(A, B, screened, { ...DEFAULT_MATCH_PARAMETERS, fineFacePairPlaces: 4 });
    expect(withPlaces).toContain(right);
    // only one face pair lacked a place: one motion more, the rest unchanged and in order
    expect(withPlaces.length).toBe(without.length + 1);
    expect(withPlaces.slice(0, without.length)).toEqual(without);
    // the defaults give the place
    expect(fineShortlist(A, B, screened, DEFAULT_MATCH_PARAMETERS)).toContain(right);
    // the admitted motion's fine step lands on the truth (within 1 degree and 1 mm at B's face centroid)
    const m = refineFacePair(A, 1, B, 0, [right.motion], DEFAULT_MATCH_PARAMETERS)[0];
    expect(rotationErrorDegrees(m.transform, truth)).toBeLessThan(1);
    expect(displacementAt(m.transform, truth, Float64Array.from(c))).toBeLessThan(1);
  });

  it('a truth below fineMinOverlap gets no place', () => {
    const wrong = Array.from({ length: 5 }, (_, k) => entry(0, turned(20 + 5 * k), 0.9));
    const low = entry(1, truth, DEFAULT_MATCH_PARAMETERS.fineMinOverlap / 2);
    expect(fineShortlist(A, B, [...wrong, low], { ...DEFAULT_MATCH_PARAMETERS, fineFacePairPlaces: 4 })).not.toContain(low);
  });
});
