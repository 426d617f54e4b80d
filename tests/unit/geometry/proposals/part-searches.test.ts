/**
 * A face pair with a piece on either side takes the coarse hypotheses that RANSAC (and the search
 * along the axis directions) found on the pair of its whole faces as starts of its own short ICP,
 * instead of searching again (pairwise-match.ts screenFacePairs, `partReusesSearches`).
 * The Stanford bunny (open data in the npm package `bunny`) cut in two by a rough surface
 * (tests/support/bunny-cut.ts, tests/support/bunny-cut-pieces.ts), the upper half moved by a known motion (analytic by construction):
 * each half's cut is its one break face, matched whole and as a piece (the cut's triangles with x
 * below the cut's mean x before the motion: the same stretch of the break on both halves, so the
 * true motion lays each piece on the other).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { bunnyCutPieces } from '../../../support/bunny-cut-pieces';
import type { PreparedFragment } from '../../../../core/geometry/proposals/prepared-fragment';
import { DEFAULT_MATCH_PARAMETERS, matchFragments, screenFacePairs, type MatchParameters, type MatchTrace } from '../../../../core/geometry/proposals/pairwise-match';
import { rotationErrorDegrees, displacementAt, type RigidTransform } from '../../../../core/geometry/registration/rigid-transform';

const spacing = 1.2;
let A: PreparedFragment, B: PreparedFragment, truth: RigidTransform;

beforeAll(async () => {
  ({ A, B, truth } = await bunnyCutPieces(spacing));
  pairs = [];
  for (let i = 0; i < A.faces.length; i++) for (let j = 0; j < B.faces.length; j++) pairs.push([i, j]);
});

let pairs: Array<[number, number]> = [];
const on: MatchParameters = { ...DEFAULT_MATCH_PARAMETERS, partReusesSearches: true };
const off: MatchParameters = { ...DEFAULT_MATCH_PARAMETERS, partReusesSearches: false };
const nearTruth = (T: RigidTransform): boolean => rotationErrorDegrees(T, truth) < 3 && displacementAt(T, truth, B.faces[0].centroid) < 2 * spacing;
const traces = (n: number): MatchTrace[] => Array.from({ length: n }, () => ({ coarse: [], refined: [], kept: [], stages: [] }));
const key = (T: RigidTransform): string => Array.from(T).join(',');
/** The coarse hypotheses of one step in a trace. */
const ofStage = (t: MatchTrace, stage: string): string[] => t.coarse.filter((_, k) => t.stages![k] === stage).map(key);

describe('part face pairs that reuse their whole faces\' searches', () => {
  it('the set-up: each half has its whole cut (index 0) and the piece (index 1), above pair voting\'s size', () => {
    expect(A.faces.length).toBeGreaterThanOrEqual(2);
    expect(B.faces.length).toBeGreaterThanOrEqual(2);
    expect(A.faces.every((f) => f.parent === 0) && B.faces.every((f) => f.parent === 0)).toBe(true);
    expect(Math.min(A.faces[1].points.length, B.faces[1].points.length) / 3).toBeGreaterThan(on.pairVoteMaxFaceSamples);
  });

  it('run no RANSAC of their own: their starts are the whole pair\'s RANSAC hypotheses, and one of their screened motions is the truth', () => {
    const tOff = traces(pairs.length), tOn = traces(pairs.length);
    const all = screenFacePairs(A, B, pairs, off, tOff);
    const cut = screenFacePairs(A, B, pairs, on, tOn);
    const wholeRansac = ofStage(tOff[0], 'ransac');
    expect(wholeRansac.length).toBeGreaterThan(0);
    // the whole pair is screened as without the setting, number for number
    expect(cut.filter((s) => s.i === 0 && s.j === 0)).toEqual(all.filter((s) => s.i === 0 && s.j === 0));
    expect(ofStage(tOn[0], 'ransac')).toEqual(wholeRansac);
    // each part pair above pair voting's size searched by itself without the setting, and with it
    // took the whole pair's hypotheses (those of a pair of one whole and one part are the same ones)
    const large = pairs.map(([i, j], k) => ({ i, j, k })).filter(({ i, j }) => (i > 0 || j > 0) && Math.min(A.faces[i].points.length, B.faces[j].points.length) / 3 > on.pairVoteMaxFaceSamples);
    expect(large.some(({ i, j }) => i === 1 && j === 1)).toBe(true);
    for (const { k } of large) {
      expect(ofStage(tOff[k], 'ransac').length).toBeGreaterThan(0);
      expect(ofStage(tOn[k], 'ransac')).toEqual([]);
      expect(ofStage(tOn[k], 'inherited')).toEqual(wholeRansac);
    }
    // the piece against the piece: a screened motion within 3 degrees and 2 spacings of the truth
    expect(cut.filter((s) => s.i === 1 && s.j === 1).some((s) => nearTruth(s.motion.transform))).toBe(true);
    // the screened motions are given in the pairs' order, as without the setting
    const order = (list: typeof all): string => [...new Set(list.map((s) => `${s.i},${s.j}`))].join(' ');
    expect(order(cut)).toBe(order(all));
  });

  it('the fragment pair\'s best motion is the truth within 1 degree and 1 mm', () => {
    const best = matchFragments(A, B, on, pairs, 1)[0];
    expect(rotationErrorDegrees(best.transform, truth)).toBeLessThan(1);
    expect(displacementAt(best.transform, truth, B.faces[0].centroid)).toBeLessThan(1);
  });

  it('a part pair offered without a pair of its whole faces searches as before', () => {
    const only: Array<[number, number]> = [[1, 1]];
    const t = traces(1);
    const cut = screenFacePairs(A, B, only, on, t);
    expect(cut.length).toBeGreaterThan(0);
    expect(cut).toEqual(screenFacePairs(A, B, only, off));
    expect(ofStage(t[0], 'ransac').length).toBeGreaterThan(0);
  });
});
