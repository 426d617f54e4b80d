/**
 * The best few motions of a fragment pair with the interpenetration left out where it cannot
 * matter (pairwise-match.ts bestDistinct, score.ts deferredScore), checked against the slow path
 * that scores every motion in full and keeps the distinct best (distinctBest): on random motions
 * with clustered poses (many near-duplicates), tied and zero scores, and on the Stanford bunny
 * (open data in the npm package `bunny`) cut in two by a rough surface (tests/support/bunny-cut.ts),
 * joined and not joined.
 */
import fc from 'fast-check';
import { beforeAll, describe, expect, it } from 'vitest';
import { cutBunny, type CutPiece } from '../../../support/bunny-cut';
import { breakFaceFromLabels } from '../../../support/break-face-from-labels';
import { DEFAULT_FPFH_RADIUS_SPACINGS, defaultSpacing, prepareFragment, type PreparedFragment } from '../../../../core/geometry/proposals/prepared-fragment';
import { bestDistinct, DEFAULT_MATCH_PARAMETERS, distinctBest, matchFragments, type DeferredMatch, type FaceMatch } from '../../../../core/geometry/proposals/pairwise-match';
import { deferredScore, scoreJoin, type JoinScore } from '../../../../core/geometry/registration/score';
import { applyToPoints, compose, rotationAboutAxis, transformFrom } from '../../../../core/geometry/registration/rigid-transform';

const components = (score: number, contactFraction: number): JoinScore => ({
  score, contactFraction, contactFractionOther: 0, contactAreaMm2: 0, gapRmsMm: 0, contactGapRmsMm: 0, penetrationMm: 0, outlineAgreement: 0, interlock: 0,
  axesCompared: 0, axisOffset: 0, axisAngleDeg: 0, axisSide: 1, radiusRatio: 1,
});

describe('bestDistinct', () => {
  it('gives the first k of distinctBest over every motion scored in full, completing fewer', () => {
    let completed = 0, offered = 0;
    fc.assert(
      fc.property(
        fc.array(
          fc.record({
            // poses on a coarse grid of turns and shifts, so that many repeat one another (within 3 degrees and the shift)
            turn: fc.integer({ min: 0, max: 4 }), shift: fc.integer({ min: 0, max: 4 }),
            score: fc.oneof(fc.constant(0), fc.constantFrom(0.2, 0.5), fc.double({ min: 0, max: 1, noNaN: true })),
            slack: fc.oneof(fc.constant(0), fc.double({ min: 0, max: 0.5, noNaN: true })),
            contact: fc.constantFrom(0.1, 0.4, 0.9),
          }),
          { maxLength: 14 },
        ),
        fc.integer({ min: 1, max: 4 }),
        (motions, keep) => {
          const shift = 2;
          const list: DeferredMatch[] = motions.map((m, i) => ({
            transform: transformFrom(rotationAboutAxis([0, 0, 1], (m.turn * 2.5 * Math.PI) / 180), [1.5 * m.shift, 0, 0]),
            faceA: i, faceB: 0,
            score: {
              upper: m.score === 0 ? 0 : Math.min(1, m.score + m.slack),
              contactFraction: m.contact,
              complete: () => { completed++; return components(m.score, m.contact); },
            },
          }));
          offered += list.length;
          const full: FaceMatch[] = distinctBest(list.map((m) => ({ ...components(motions[m.faceA].score, motions[m.faceA].contact), transform: m.transform, faceA: m.faceA, faceB: 0 })), shift).slice(0, keep);
          expect(bestDistinct(list, keep, shift)).toEqual(full);
        },
      ),
      { numRuns: 500 },
    );
    // the point of it: motions that cannot reach the best few are not completed
    expect(completed).toBeLessThan(0.8 * offered);
  });
});

describe('bestDistinct with a minimum score', () => {
  it('gives the first k of distinctBest when the best reaches the minimum, else nothing, completing fewer', () => {
    let completedWith = 0, completedWithout = 0, belowWith = 0, belowWithout = 0;
    fc.assert(
      fc.property(
        fc.array(
          fc.record({
            turn: fc.integer({ min: 0, max: 4 }), shift: fc.integer({ min: 0, max: 4 }),
            score: fc.oneof(fc.constant(0), fc.constantFrom(0.02, 0.05, 0.2), fc.double({ min: 0, max: 0.1, noNaN: true })),
            slack: fc.oneof(fc.constant(0), fc.double({ min: 0, max: 0.1, noNaN: true })),
            contact: fc.constantFrom(0.1, 0.4, 0.9),
          }),
          { maxLength: 14 },
        ),
        fc.integer({ min: 1, max: 4 }),
        fc.constantFrom(0.05, 0.1),
        (motions, keep, minScore) => {
          const shift = 2;
          const make = (count: () => void): DeferredMatch[] => motions.map((m, i) => ({
            transform: transformFrom(rotationAboutAxis([0, 0, 1], (m.turn * 2.5 * Math.PI) / 180), [1.5 * m.shift, 0, 0]),
            faceA: i, faceB: 0,
            score: { upper: m.score === 0 ? 0 : Math.min(1, m.score + m.slack), contactFraction: m.contact, complete: () => { count(); return components(m.score, m.contact); } },
          }));
          const full: FaceMatch[] = distinctBest(motions.map((m, i) => ({ ...components(m.score, m.contact), transform: make(() => {})[i].transform, faceA: i, faceB: 0 })), shift);
          const below = full.length > 0 && full[0].score < minScore;
          const want = below ? [] : full.slice(0, keep);
          const n0 = completedWith, n1 = completedWithout;
          expect(bestDistinct(make(() => completedWith++), keep, shift, minScore)).toEqual(want);
          expect(bestDistinct(make(() => completedWithout++), keep, shift)).toEqual(full.slice(0, keep));
          if (below) {
            belowWith += completedWith - n0;
            belowWithout += completedWithout - n1;
            // every motion whose bound reaches the minimum may need completing, no other
            expect(completedWith - n0).toBeLessThanOrEqual(motions.filter((m) => m.score !== 0 && Math.min(1, m.score + m.slack) * (1 + 1e-9) >= minScore).length);
          }
        },
      ),
      { numRuns: 500 },
    );
    // the point of it: a pair below the minimum is settled with far fewer scores completed
    expect(belowWith).toBeLessThan(0.5 * belowWithout);
    expect(completedWith).toBeLessThan(0.9 * completedWithout);
  });

  it('completes no score when no upper bound reaches the minimum', () => {
    let completed = 0;
    const list: DeferredMatch[] = [0.01, 0.03, 0.049].map((upper, i) => ({
      transform: transformFrom(rotationAboutAxis([0, 0, 1], (i * 10 * Math.PI) / 180), [0, 0, 0]),
      faceA: i, faceB: 0,
      score: { upper, contactFraction: 0.5, complete: () => { completed++; return components(upper / 2, 0.5); } },
    }));
    expect(bestDistinct(list, 3, 2, 0.05)).toEqual([]);
    expect(completed).toBe(0);
    expect(bestDistinct(list, 3, 2)).toHaveLength(3);
  });
});

describe('on a cut Stanford bunny', () => {
  let lower: CutPiece, upper: CutPiece, otherUpper: CutPiece, spacing: number;
  const prepare = (piece: CutPiece, motion: number[]): PreparedFragment => {
    const positions = applyToPoints(motion, piece.positions) as Float32Array;
    const face = breakFaceFromLabels(positions, piece.triangles, piece.onCut, spacing);
    return prepareFragment({ positions, triangles: piece.triangles, faces: [face] }, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS });
  };
  beforeAll(async () => {
    let diagonal: number;
    ({ lower, upper, diagonal } = await cutBunny());
    ({ upper: otherUpper } = await cutBunny({ cutY: 55, amplitude: 4, seed: 9 }));
    spacing = defaultSpacing([diagonal]);
  });

  it('matchFragments with keep gives the first keep of the whole list, for a joining and a non-joining pair', () => {
    const M = transformFrom(rotationAboutAxis([1, 2, -1], (130 * Math.PI) / 180), [60, -30, 90]);
    const A = prepare(lower, transformFrom([1, 0, 0, 0, 1, 0, 0, 0, 1], [0, 0, 0]));
    // every screened motion (up to 4 per face pair) on to the fine step, so that there are many to choose from
    // each way round of the screen (screenWays): with 'smaller' the polish of this pair brings its best two motions
    // together, so the polished list must be drawn from more than `keep` motions, and it polishes polishBest of them
    // (not only `keep`), as the whole list does
    // (the fine step's k-d cut, fineKdMaxRmsSpacings, off: it gives up most of these motions, which leaves one;
    // with the cut on, the first keep must still be those of the whole list)
    for (const screenWays of ['given', 'smaller', 'both'] as const) {
      const params = { ...DEFAULT_MATCH_PARAMETERS, fineHypotheses: 4, minOverlap: 0, fineMinOverlap: 0, fineRatio: 0, screenWays, fineKdMaxRmsSpacings: 0 };
      const cut = { ...params, fineKdMaxRmsSpacings: DEFAULT_MATCH_PARAMETERS.fineKdMaxRmsSpacings };
      for (const B of [prepare(upper, M), prepare(otherUpper, M)]) {
        const all = matchFragments(A, B, params);
        expect(all.length, screenWays).toBeGreaterThan(1);
        for (const keep of [1, 2, 3]) expect(matchFragments(A, B, params, undefined, keep), `${screenWays} keep ${keep}`).toEqual(all.slice(0, keep));
        const allCut = matchFragments(A, B, cut);
        for (const keep of [1, 2, 3]) expect(matchFragments(A, B, cut, undefined, keep), `${screenWays} keep ${keep}, cut`).toEqual(allCut.slice(0, keep));
      }
    }
  });

  it('a deferred score completes to exactly the full score, and its upper bound is never below it', () => {
    const A = prepare(lower, transformFrom([1, 0, 0, 0, 1, 0, 0, 0, 1], [0, 0, 0]));
    const B = prepare(upper, transformFrom([1, 0, 0, 0, 1, 0, 0, 0, 1], [0, 0, 0]));
    const side = (f: PreparedFragment) => ({ surface: f.surface, facePoints: f.faces[0].points, faceNormals: f.faces[0].normals, surfacePoints: f.surfacePoints, surfaceNormals: f.surfaceNormals, surfaceTree: f.surfaceTree, outline: f.faces[0].outline, axis: f.axis });
    // the true pose, and poses pushed into the other piece (interpenetration) or turned off it
    for (const T of [
      transformFrom([1, 0, 0, 0, 1, 0, 0, 0, 1], [0, 0, 0]),
      transformFrom([1, 0, 0, 0, 1, 0, 0, 0, 1], [0, -2, 0]),
      compose(transformFrom(rotationAboutAxis([0, 0, 1], 0.1), [0, 0, 0]), transformFrom([1, 0, 0, 0, 1, 0, 0, 0, 1], [0.5, -1, 0])),
    ]) {
      const options = { contactTolerance: 0.4 * spacing, spacing };
      const d = deferredScore(side(A), side(B), T, options);
      const full = scoreJoin(side(A), side(B), T, options);
      expect(d.complete()).toEqual(full);
      expect(d.contactFraction).toBe(full.contactFraction);
      expect(d.upper).toBeGreaterThanOrEqual(full.score);
    }
  });
});
