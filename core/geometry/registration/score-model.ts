/**
 * The join score as a probability: a logistic model over the score's components (what a
 * person checks on a refit: contact, gaps, one piece running into the other, outlines that
 * meet, faces that lock, and for shaft pieces whether the two fitted shaft axes agree under the
 * motion: their tilt, and whether they lie on the same side of the wall seen from the join).
 * Two rules scale the probability down where the fit has too few examples to learn it: faces
 * that could slide (LOCKED_INTERLOCK) and a piece turned inside out (SIDE_NONE, SIDE_FULL).
 * Coefficients are fitted on motions with known truth from generated assemblages of development
 * seeds only (tests/bench/fit-score-model.ts, which also prints reliability tables and Brier
 * scores for the sets it did not fit) and belong to the matcher's method version: a new method
 * version needs a new fit. The held-out calibration is printed by `npm run bench -- pairwise`.
 */
/** What scoreJoin (score.ts) measures of a proposed motion; the model's inputs. */
export interface ScoreComponents {
  /** Share of break-face samples within `contactTolerance` of the other piece with opposed normals (the better-covered side). */
  contactFraction: number;
  /** The same share on the less-covered side. */
  contactFractionOther: number;
  /** Area in contact (mm^2), the smaller of the two sides' figures. */
  contactAreaMm2: number;
  /** RMS distance (mm) between the faces where they face each other within 3 tolerances. */
  gapRmsMm: number;
  /**
   * RMS distance (mm) of the samples in contact (within `contactTolerance`, opposed normals),
   * both sides together; the tolerance itself when none are. How tight the faces fit where they
   * touch: unlike gapRmsMm it does not read the margin of a partial contact (a chipped or eroded
   * rim, a break face that meets the partner over part of its area), where the faces part.
   */
  contactGapRmsMm: number;
  /** Depth (mm) that the deepest 2% of one piece's surface samples reach inside the other. */
  penetrationMm: number;
  /** Share of outline samples that meet the other face's outline within 2 tolerances (better side). */
  outlineAgreement: number;
  /**
   * How firmly the faces lock together, 0..1: sqrt of the smallest over the largest eigenvalue
   * of the point-to-plane information matrix of the contact (rotations scaled by the contact's
   * radius of gyration). Flat or cylindrical contacts that could slide or turn give about 0.
   */
  interlock: number;
  /** 1 when both pieces have a fitted shaft axis and the two were compared, else 0 (and the next two are 0). */
  axesCompared: number;
  /** Distance between the two shaft axis lines where they pass the join, over the larger fitted radius. */
  axisOffset: number;
  /** Angle between the two shaft axis lines (degrees, 0..90). */
  axisAngleDeg: number;
  /** Cosine between the directions from the join across to each axis line: 1 when both axes lie on the same side of the wall, -1 when a piece is turned inside out (1 when not compared, and when the join lies within SIDE_MIN_OFF_AXIS of A's axis, where the side is not defined). */
  axisSide: number;
  /** Larger over smaller fitted shaft radius (1 when not compared). */
  radiusRatio: number;
}

export const FEATURE_NAMES = ['contactFraction', 'contactFractionOther', 'sqrtContactFractionOther', 'logContactArea', 'gapRmsMm', 'contactGapRmsMm', 'penetrationMm', 'outlineAgreement', 'interlock', 'axisAngle', 'axisSideMismatch'] as const;

/**
 * The model's inputs, in FEATURE_NAMES order (penetration and interlock capped where they stop
 * telling anything). The less-covered side's share enters as it is and as its square root, so
 * the fit can bend it (fitted, the two together weigh against the motion, steeply over the first
 * tenths, most at about half, a little less towards full: given the contact area and the better
 * side's share, a wrong motion that slides a small face about on a large one covers much of the
 * small face). Since method /8,
 * with the root and the interlock capped at 0.2 (was 0.1): fitted on dev seeds 11-15 and checked
 * on 16 and 21, Brier 0.0098 -> 0.0087 against the same fit without them
 * (tests/bench/score-feature-study.ts). Since session 20 the contact gap as well (the RMS
 * distance of the samples in contact only): the band RMS gap reads the margin of a partial
 * contact (chipped or eroded rims, a face meeting its partner over part of its area), and put
 * true joins with small contacts among the wrong motions; fitted, the contact gap takes the
 * gap's weight (DEVELOPERS.md, join proposals).
 */
export function scoreFeatures(c: ScoreComponents, model: Pick<ScoreModel, 'interlockCap'> = SCORE_MODEL): number[] {
  return [
    c.contactFraction,
    c.contactFractionOther,
    Math.sqrt(Math.max(0, c.contactFractionOther)),
    Math.log1p(Math.max(0, c.contactAreaMm2)),
    Math.min(c.gapRmsMm, 3),
    Math.min(c.contactGapRmsMm, 3),
    Math.min(c.penetrationMm, 3),
    c.outlineAgreement,
    Math.min(c.interlock, model.interlockCap),
    c.axesCompared ? Math.min(c.axisAngleDeg, 45) / 45 : 0,
    trustedAxes(c) ? (1 - c.axisSide) / 2 : 0,
  ];
}


/**
 * Axis positions are compared only when the two fitted radii agree within this ratio: a fit
 * with a radius far off (narrow splinters, where outer and medullary arcs are short) places
 * its axis anywhere, and on development seeds every correct motion with the axes on opposite
 * sides of the wall had radii 1.5 to 5.4 times apart.
 */
export const TRUSTED_RADIUS_RATIO = 1.5;

function trustedAxes(c: ScoreComponents): boolean {
  return c.axesCompared === 1 && c.radiusRatio <= TRUSTED_RADIUS_RATIO;
}

export interface ScoreModel {
  /** The matcher's method version the coefficients were fitted for. */
  methodVersion: string;
  /** What the fit saw (seeds, counts), for the record. */
  fittedOn: string;
  /** Interlock above this adds nothing (the faces lock either way): 0.1 up to method /7, 0.2 since /8. */
  interlockCap: number;
  intercept: number;
  slopes: Record<(typeof FEATURE_NAMES)[number], number>;
}

export const SCORE_MODEL: ScoreModel = {
  methodVersion: 'axis-direction-fpfh-ransac-pair-vote-icp/8',
  fittedOn: 'knitbone demo, dev seed 340 at 200 fragments (scanner spacing 1.0 mm, run spacing 1.2 mm), session 20, with the contact gap (contactGapRmsMm) as an input: the motions a propose worker returns (matchFragments, best 5 of each fragment pair, polished; tests/bench/worker-motion-dump.ts) on every true candidate fragment pair and a third of the others (each of those counted 3 times), 1,734 fragment pairs, 7,024 motions (19,018 counted), 176 correct (within 5 degrees and 5 mm); five folds by fragment pair: Brier 0.00206 against 0.00290 for the session-17 fit (0.00311 refitting its inputs alone), above 0.8 129/133 correct against 100/104, true pairs whose correct motion is first in its pair and scores at least 0.05: 148 against 140 of 154',
  interlockCap: 0.2,
  intercept: -6.8092,
  slopes: { contactFraction: -0.1955, contactFractionOther: 0.9419, sqrtContactFractionOther: 0.4458, logContactArea: 1.8664, gapRmsMm: -2.2535, contactGapRmsMm: -104.3626, penetrationMm: -0.7359, outlineAgreement: 4.1974, interlock: 33.8104, axisAngle: -1.52, axisSideMismatch: -1.0986 },
};

/**
 * What identifies a fit: its method version and coefficients (not the words of `fittedOn`). A
 * proposal run keys its finished pairs on it (core/host/proposals/propose-run.ts), so a refit
 * score makes a later run score the pairs again instead of mixing old and new scores.
 */
export function scoreModelKey(model: ScoreModel = SCORE_MODEL): string {
  const key: unknown[] = [model.methodVersion, model.interlockCap, model.intercept, FEATURE_NAMES.map((n) => model.slopes[n])];
  // the rules below the fit (since session 16, when the side rule stopped judging joins on the axis)
  key.push({ rules: [LOCKED_INTERLOCK, SIDE_NONE, SIDE_FULL, SIDE_MIN_OFF_AXIS, TRUSTED_RADIUS_RATIO] });
  // how the components are measured, when that changes without a refit (SCORE_MEASURES)
  if (SCORE_MEASURES > 1) key.push({ measures: SCORE_MEASURES });
  return JSON.stringify(key);
}

/**
 * Version of how score.ts measures the components the model reads, raised when a measure
 * changes without a refit so that a run keyed on scoreModelKey scores its pairs again: 1 up to
 * session 22; 2 since session 23 (a sample counts as inside the other piece only when the
 * closest triangle's own normal agrees with the vote of the nearest surface samples).
 */
export const SCORE_MEASURES = 2;

/**
 * Below this interlock the contact could slide or turn (flat or cylindrical faces): the motion
 * is not fixed by the faces, whatever the contact, so the probability is scaled down in
 * proportion. A rule, not fitted: generated breaks are rough and never this flat (the
 * correct motions the model was fitted on all have interlock above 0.04).
 */
export const LOCKED_INTERLOCK = 0.03;

/**
 * A pose that puts two trusted shaft axes on opposite sides of the wall, seen from the join,
 * turns one piece inside out (its outer surface continues the other's medullary surface): no
 * join of two pieces of one shaft looks like that. The probability is scaled from 1 at
 * axisSide SIDE_FULL down to 0 at SIDE_NONE. A rule, not fitted (such poses are too rare in
 * the generated sets for the fit to weigh them): on development seeds 11-16 the correct
 * motions with trusted axes all had axisSide of 0.28 or more (129 motions), while 1,234 wrong
 * ones had it below 0.
 */
export const SIDE_NONE = -0.25;
export const SIDE_FULL = 0.1;

/**
 * Which side of the wall an axis lies on is only defined seen from a join off the axis: the
 * side (axisSide, score.ts axisAgreement) is measured only when B's face centroid lies at least
 * this share of A's fitted radius off A's axis, and is 1 (no mismatch) nearer to it. A half
 * ring's centroid lies at 2/pi of the radius; a whole ring's (a break across the shaft) on the
 * axis itself, where a fitted axis a fraction of a millimetre off turns the direction from the
 * join to it any way at all. Used by the screen since method /7 (screen-measures.ts); by the
 * score since session 16: on dev seed 340 at 200 fragments the truth of four transverse or
 * oblique joins had axisSide -0.5..-0.96 and scored 0 (DEVELOPERS.md, join proposals).
 */
export const SIDE_MIN_OFF_AXIS = 0.5;

export function scoreProbability(c: ScoreComponents, model: ScoreModel = SCORE_MODEL): number {
  const x = scoreFeatures(c, model);
  let logit = model.intercept;
  FEATURE_NAMES.forEach((n, k) => (logit += model.slopes[n] * x[k]));
  const locked = Math.min(1, c.interlock / LOCKED_INTERLOCK);
  const sameSide = trustedAxes(c) ? Math.min(1, Math.max(0, (c.axisSide - SIDE_NONE) / (SIDE_FULL - SIDE_NONE))) : 1;
  return (locked * sameSide) / (1 + Math.exp(-logit));
}
