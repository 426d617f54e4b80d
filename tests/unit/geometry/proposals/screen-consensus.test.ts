/**
 * The screen's consensus motion (screen-consensus.ts mostSupportedMotion): how many screened
 * motions end within a few degrees and millimetres of each one. Checked on motions with analytic
 * distances: turns about one axis by angles a and b differ by |a - b| (the angle of Ra^T Rb, a turn
 * by b - a about the same axis), and pure shifts t and u move any point by |t - u|. Then on the cut
 * bunny (tests/support/bunny-halves.ts, truth by construction): the screen with the consensus slot
 * keeps what it kept without it, in the same order, and what it adds is the most supported of its
 * own refined motions.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { consensusMotion, mostSupportedMotion } from '../../../../core/geometry/proposals/screen-consensus';
import { DEFAULT_MATCH_PARAMETERS, screenFacePair, type MatchTrace } from '../../../../core/geometry/proposals/pairwise-match';
import { displacementAt, rotationAboutAxis, rotationErrorDegrees, transformFrom, type RigidTransform } from '../../../../core/geometry/registration/rigid-transform';
import type { PreparedFragment } from '../../../../core/geometry/proposals/prepared-fragment';
import { preparedBunnyHalves } from '../../../support/bunny-halves';

const turn = (deg: number, shift: [number, number, number] = [0, 0, 0]): RigidTransform => transformFrom(rotationAboutAxis([0, 0, 1], (deg * Math.PI) / 180), shift);
const origin = [0, 0, 0];

describe('the most supported of a set of motions', () => {
  it('counts the motions within the angle of each one (turns about one axis: the error is the difference of the angles)', () => {
    // 0, 1 and 2 degrees lie within 3 of each other; 40 and 41 within 3 of each other; 90 alone
    const motions = [turn(40), turn(0), turn(1), turn(90), turn(41), turn(2)];
    expect(rotationErrorDegrees(motions[1], motions[5])).toBeCloseTo(2, 6);
    expect(mostSupportedMotion(motions, [0, 1, 2, 3, 4, 5], origin, 3, 1)).toEqual({ index: 1, support: 3 });
    // only the 40-degree group and the lone turn may be chosen: every motion still counts as support
    expect(mostSupportedMotion(motions, [0, 3, 4], origin, 3, 1)).toEqual({ index: 0, support: 2 });
    expect(mostSupportedMotion(motions, [3], origin, 3, 1)).toEqual({ index: 3, support: 1 });
  });

  it('leaves out motions beyond the angle or the displacement', () => {
    // 3.5 degrees apart: not within 3
    expect(mostSupportedMotion([turn(0), turn(3.5)], [0, 1], origin, 3, 1).support).toBe(1);
    // the same turn shifted by 0.5 and 3 mm: seen at the origin the displacements are 0.5 and 3
    const shifted = [turn(10), turn(10, [0.5, 0, 0]), turn(10, [0, 3, 0])];
    expect(displacementAt(shifted[0], shifted[2], origin)).toBeCloseTo(3, 6);
    expect(mostSupportedMotion(shifted, [0, 1, 2], origin, 3, 1)).toEqual({ index: 0, support: 2 });
    expect(mostSupportedMotion(shifted, [0, 1, 2], origin, 3, 4)).toEqual({ index: 0, support: 3 });
    // a turn of 2 degrees about the z axis moves a point 100 mm out by 2 * 100 * sin(1 degree) = 3.49 mm
    const far = [100, 0, 0];
    expect(mostSupportedMotion([turn(0), turn(2)], [0, 1], far, 3, 3).support).toBe(1);
    expect(mostSupportedMotion([turn(0), turn(2)], [0, 1], far, 3, 3.6).support).toBe(2);
  });

  it('returns no motion when none may be chosen', () => {
    expect(mostSupportedMotion([turn(0), turn(1)], [], origin, 3, 1)).toEqual({ index: -1, support: 0 });
  });
});

describe('the consensus motion of a face pair', () => {
  // as on a small face of dev seed 340 (DEVELOPERS.md): two wrong turns put the most of the face in
  // contact, four starts end within a degree of the truth (here the turn by 0) with a little less
  const m = (deg: number, overlap: number, shift: [number, number, number] = [0, 0, 0]): { transform: RigidTransform; overlap: number } => ({ transform: turn(deg, shift), overlap });
  const ranked = [m(55, 1.0), m(23, 0.98), m(0, 0.95), m(0.2, 0.95, [0.1, 0, 0]), m(-0.3, 0.94), m(0.1, 0.94), m(34, 0.91)].map((r) => ({ r, rank: r.overlap }));
  const kept = [ranked[0].r, ranked[1].r];

  it('is the motion most starts ended at, when it is not kept already', () => {
    expect(consensusMotion(ranked, kept, origin, 3, 1, 3)).toBe(ranked[2].r);
    expect(consensusMotion(ranked, kept, origin, 3, 1, 4)).toBe(ranked[2].r);
    // five needed, four ended there
    expect(consensusMotion(ranked, kept, origin, 3, 1, 5)).toBeNull();
    // off (0)
    expect(consensusMotion(ranked, kept, origin, 3, 1, 0)).toBeNull();
  });

  it('adds nothing when a kept motion lies within the distance of it', () => {
    expect(consensusMotion(ranked, [ranked[0].r, ranked[5].r], origin, 3, 1, 3)).toBeNull();
  });

  it('never chooses a motion of rank 0 (the screen\'s axis rule), though such motions count as support', () => {
    const ruled = ranked.map((q, i) => ({ r: q.r, rank: i >= 2 && i <= 5 ? 0 : q.rank }));
    // the four near the truth are out; each other motion has only itself
    expect(consensusMotion(ruled, kept, origin, 3, 1, 3)).toBeNull();
    const oneLeft = ranked.map((q, i) => ({ r: q.r, rank: i >= 3 && i <= 5 ? 0 : q.rank }));
    expect(consensusMotion(oneLeft, kept, origin, 3, 1, 3)).toBe(ranked[2].r);
  });
});

describe('the screen with the consensus slot (cut bunny)', () => {
  let A: PreparedFragment, B: PreparedFragment;
  beforeAll(async () => {
    ({ A, B } = await preparedBunnyHalves());
  }, 60_000);

  it('keeps the motions it kept without it, and adds only the most supported refined motion', () => {
    const base: MatchTrace = { coarse: [], refined: [], kept: [] };
    const without = screenFacePair(A, 0, B, 0, { ...DEFAULT_MATCH_PARAMETERS, screenConsensusMin: 0 }, base);
    const withTrace: MatchTrace = { coarse: [], refined: [], kept: [] };
    const withSlot = screenFacePair(A, 0, B, 0, { ...DEFAULT_MATCH_PARAMETERS, screenConsensusMin: 2 }, withTrace);
    expect(withSlot.slice(0, without.length).map((m) => Array.from(m.transform))).toEqual(without.map((m) => Array.from(m.transform)));
    expect(withSlot.length - without.length).toBeLessThanOrEqual(1);
    const refined = withTrace.refined.filter((r) => r.overlap >= DEFAULT_MATCH_PARAMETERS.minOverlap);
    const spacing = Math.max(A.spacing, B.spacing);
    const at = B.faces[0].centroid;
    const supportOf = (T: RigidTransform): number => refined.filter((r) => rotationErrorDegrees(T, r.transform) < 3 && displacementAt(T, r.transform, at) < 2 * spacing).length;
    const most = Math.max(...refined.map((r) => supportOf(r.transform)));
    if (withSlot.length > without.length) {
      expect(supportOf(withSlot[withSlot.length - 1].transform)).toBe(most);
      expect(most).toBeGreaterThanOrEqual(2);
    } else {
      // nothing added: the most supported motion is one of those kept, or too poorly supported
      expect(most < 2 || withSlot.some((k) => supportOf(k.transform) === most)).toBe(true);
    }
  });
});
