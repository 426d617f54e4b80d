/**
 * Align two fragments through their break faces: for a pair of faces, coarse motions from
 * the pieces' shaft axes, FPFH correspondences and RANSAC, and (small faces) point pair
 * feature voting, each refined by trimmed point-to-plane ICP against the other
 * fragment's surface, then scored. Faces are matched in part as well as in whole (RANSAC and
 * the trimmed ICP only need the shared patch), so one break face may meet several partners.
 */
import { hypot } from '../hypot';
import { icpPointToPlane, type IcpResult } from '../registration/icp-point-to-plane';
import { ransacAlignFaces } from '../registration/ransac-alignment';
import { FPFH_DIM } from '../registration/fpfh';
import { SampledSurface } from '../registration/target-surface';
import { displacementAt, invert, rotationErrorDegrees, type RigidTransform } from '../registration/rigid-transform';
import { searchAboutSharedAxis } from '../registration/shaft-axis-search';
import { searchAlongAxisDirections } from '../registration/axis-direction-search';
import { pointPairVoting } from '../registration/point-pair-voting';
import { principalFrameMotions } from '../registration/principal-frame-motions';
import { inOpposedContact } from '../registration/opposed-contact';
import type { KdTree } from '../registration/nearest-neighbours';
import { deferredScore, scoreJoin, type DeferredScore, type JoinScore, type ScoredSide } from '../registration/score';
import type { PreparedFace, PreparedFragment } from './prepared-fragment';
import { stridedSamples } from '../registration/strided-samples';
import { LOCKED_INTERLOCK } from '../registration/score-model';
import { screenAxisConsistency, screenInterlock } from './screen-measures';
import { repeatsMotion } from './repeated-motion';
import { withFacePairPlaces } from './face-pair-places';
import { consensusMotion } from './screen-consensus';
import { contactPairStarts } from './contact-face-pairs';

export const METHOD_VERSION = 'axis-direction-fpfh-ransac-pair-vote-icp/8';

export interface MatchParameters {
  ransacIterations: number;
  /** RANSAC hypotheses of B's face onto A's kept per face pair (0: not run). */
  hypothesesPerPair: number;
  /**
   * RANSAC run the other way round as well (A's face moved onto B's, its motions turned round),
   * keeping this many hypotheses of that run beside the hypothesesPerPair of B onto A (0 or left
   * out: not run; left out of the defaults so that the propose run's parameters hash is unchanged).
   * RANSAC is not symmetric in the two faces (the correspondences are, but the sampled triples'
   * checks and the inlier count read the moving face's samples): on large flat longitudinal faces
   * one way round found no motion near the truth while the other did. Measured in session 19 with
   * 2 (DEVELOPERS.md): dev s340 at 200 fragments, true joins in a top 3 210 -> 213 of 376, precision
   * above 0.8 118/119 -> 121/122, but matching CPU +14% paired: not made the default.
   */
  ransacReverseHypotheses?: number;
  /**
   * Coarse motions laying B's face onto A's by the two faces' principal frames
   * (principal-frame-motions.ts): 2 (e1 onto +-e1) or 4 (also onto +-e2); 0 or left out: none.
   * Tried only on face pairs whose sample counts are within principalFrameMinSizeRatio of each other.
   */
  principalFrameMotions?: number;
  principalFrameMinSizeRatio?: number;
  principalFrameMinSamples?: number;
  /** Peaks of the shared-axis vote tried per flip. */
  axisPeaks: number;
  /** Weight each vote of the shared-axis search by how alike the two samples' FPFH are. */
  axisFeatureWeights: boolean;
  /** Hypotheses of the search along the two axis directions (0: not run); see axis-direction-search.ts. */
  directionPeaks: number;
  /**
   * Skip RANSAC when a hypothesis of the axis-direction search puts this share of the smaller face
   * in contact (above 1: never; a wrong turn on a broad, flattish break can overlap as much as the truth).
   */
  directionGoodOverlap: number;
  /** Tilts between the two axis directions tried about each of two directions (degrees); [0] measured better than [-6, 0, 6] on dev seeds 15-16 (recall 45 vs 43 of 83, 1.4x less CPU): the short ICP takes up a few degrees. */
  directionTiltsDeg: number[];
  /**
   * Hypotheses from point pair feature voting (point-pair-voting.ts) added to RANSAC's (0: never
   * run) when the smaller face has at most pairVoteMaxFaceSamples samples; such a face pair is
   * never settled by the axis searches alone either (a wrong turn covers a small face as well as
   * the truth).
   */
  pairVoteHypotheses: number;
  pairVoteMaxFaceSamples: number;
  /** Samples of the smaller face in the vote, and reference samples of the larger face. */
  pairVoteSamples: number;
  pairVoteReferences: number;
  /**
   * Whether RANSAC (smallPairRansac) and the search along the axis directions (smallPairDirections)
   * still run on a face pair that pair voting serves (pairVoteHypotheses above 0 and the smaller
   * face at most pairVoteMaxFaceSamples samples; left out: true, as before session 22). false since
   * session 22: FPFH over a radius as wide as a small face barely differ from sample to sample, and
   * a wrong turn about the axis covers a small face as well as the truth, so on such pairs the
   * motions that reach the fine step come from pair voting and the shared axis; most of them are
   * the small breaks matched as pieces (facePieceSplitMinAreaMm2). Dev s340 at 200 fragments (all
   * 304 candidate fragment pairs of true joins and 145 others, tests/bench/match-truth-ab.ts):
   * RANSAC off 193 -> 194 true pairs whose best motion is correct (-1 +2), matching CPU -3.1%;
   * the direction search off 193 -> 194 (-1 +2), -6.4%.
   */
  smallPairRansac?: boolean;
  smallPairDirections?: boolean;
  /** Shaft pieces whose fitted radii differ by more than this factor are not searched about a shared axis. */
  maxRadiusRatio: number;
  /**
   * The search about the shared axis moves A's axis across itself so that B's outer surface meets
   * A's at A's face (registration/axis-meeting-outer-surface.ts), each face's outer radius read as
   * this quantile of its samples' distances from its own axis (0 or left out: the two fitted axes
   * laid on one line, as before session 26). A fit on a partial arc of a flattened shaft reads the
   * local curvature, so two pieces of one shaft fit radii and centres some millimetres apart, and
   * with the axes on one line the samples at the join lie at different radii and no longer pair
   * in the vote. Moved only when the two outer radii differ by more than the vote's radial
   * tolerance. Left out of the defaults (off); measured at 0.9 in session 26 (prop26a): on the
   * true joins of dev s340 at 200 fragments that store nothing and have a true face pair scoring at least 0.05 at the truth, the difference of the two
   * faces' 0.9 quantiles predicts the radial gap of the samples the truth pairs within 1.1 mm on
   * 13 of 18 (tests/bench/shared-axis-radius-study.ts); proposals bench there true joins in a top
   * 3 252 -> 251 of 376, precision above 0.8 197/198 -> 198/199, CPU +2.6% at a higher load: the
   * cause found, not a recall gain (DEVELOPERS.md, session 26).
   */
  axisOuterQuantile?: number;
  /** Skip RANSAC when a shared-axis hypothesis already puts this share of the smaller face in contact. */
  axisGoodOverlap: number;
  /**
   * Such a hypothesis also skips the axis-direction search (false: that search always runs on two
   * shaft pieces). false since method /6: on dev seeds 11-16, 15 of the 40 true joins with no
   * coarse motion near the truth had been settled by a wrong shared-axis motion (fitted axis
   * points off on partial arcs; tests/bench/coarse-miss-study.ts), and the direction search then
   * finds 7 of them; about 5% more CPU per face pair (tests/bench/coarse-cost-exp.ts).
   */
  axisSettlesDirections: boolean;
  /**
   * Screen ranking of two shaft pieces with trusted radii (screen-measures.ts
   * screenAxisConsistency): a motion counts fully while its two fitted axes are tilted at most
   * the first angle (degrees) against each other, not at all from the second on, and not at all
   * when it puts the axes on opposite sides of the wall (the score's side rule). Since method /7:
   * on dev seeds 11-16 correct motions of such pieces had axes within 11 degrees and on the same
   * side, while a third of the wrong motions that outranked a correct one by overlap (and took
   * its place in the fine step) had them 25 degrees and more apart or across the wall
   * (tests/bench/screen-rank-study.ts). [0, 0] with a huge second angle: overlap alone.
   */
  screenAxisTiltDeg: [number, number];
  /**
   * Which way round the screen moves one face onto the other: 'given' (B's face onto A's; the
   * default, also when left out), 'smaller' (the face with fewer samples onto the other), 'both'
   * (both ways, the motions of A onto B turned round, then ranked together). Left out of the
   * defaults so that the propose run's parameters hash is unchanged. 'smaller' measured against
   * 'given' on dev seeds 11-16 and 21 (pairwise benchmark): true joins in a piece's top 3 241 ->
   * 245, best of pair 257 -> 259, precision above 0.8 144/157 -> 144/156, the same CPU. The
   * analytic off-axis tube of tests/unit/geometry/proposals/off-axis-screen.test.ts, lost by
   * 'smaller' until the axis-direction search was made symmetric in the two faces (session 12),
   * now passes every way; so does best-distinct.test.ts since matchFragments with `keep` draws
   * more motions where the polish merges some (session 13); with 'smaller' or 'both'
   * polish-both-ways.test.ts still fails (the sample's transverse join 1.33 / 1.67 degrees off
   * instead of under 1); on the committed sample it is no better (DEVELOPERS.md).
   */
  screenWays?: 'given' | 'smaller' | 'both';
  /**
   * A face pair's screened motion that at least this many of its coarse motions ended at (after
   * the short ICP, within 3 degrees and 2 spacings of it, each putting at least minOverlap of the
   * smaller face in contact) goes on to the fine step beside the fineHypotheses best by rank, when
   * it is not one of them (screen-consensus.ts; 0 or left out: none). 3 since session 22: the
   * overlap share ranks a wrong turn that covers a small face above the truth, while several
   * starts ending at one motion mark the truth's wide basin; on the true joins of dev s340 at 200
   * fragments that stored nothing (stored-gap-study.ts) stored right 209 -> 212 of 277 with 2 or
   * 3, none lost (DEVELOPERS.md, "The screen's consensus motion").
   */
  screenConsensusMin?: number;
  /** Hypotheses whose overlap share is below this are dropped before the fine step. */
  minOverlap: number;
  /** A face pair's screened motions go on to the fine step while their rank is at least this share of the best one's. */
  screenKeepRatio: number;
  /** Pairing distance of the screen's short ICP, in sample spacings. */
  screenIcpDistanceSpacings: number;
  /** Hypotheses refined against the whole surface and scored. */
  fineHypotheses: number;
  /**
   * Screened motions of one fragment pair (over all its face pairs) that go on to the fine step:
   * at most this many, the best by overlap share, each at least fineMinOverlap and at least
   * fineRatio times the pair's best overlap (measured with tests/bench/face-pair-study.ts).
   * 8 and 0.3 (were 3 and 0.5): on fragment pairs with many faces the true motion was often
   * 4th-8th by the screen's rank; best motion of the true pair correct on dev seeds 15 / 16 /
   * the committed sample 21 / 14 / 21 with 3 and 0.5, 24 / 19 / 26 with 8 and 0.3 (every face
   * pair through its own fine step: 25 / 20 / 28) for 1.1-1.3x the CPU (tests/bench/propose-gap.ts).
   * 12 (was 8) since method /6, where the axis-direction search always runs on shaft pieces and
   * adds wrong motions of high overlap to the screen: best motion of the true fragment pair
   * correct through the shortlist on dev seeds 11-16, 178 / 315 with 8, 189 with 12 (169 before
   * method /6), 1.02x the CPU on those pairs (tests/bench/coarse-miss-study.ts for the causes).
   * 24 (was 12) since small breaks are matched as pieces too (facePieceSplitMinAreaMm2) and the
   * principal-frame motions joined the screen: more faces per fragment and more screened motions
   * per face pair; the sample join of fine-shortlist.test.ts is found with 16 after the pieces
   * alone (not with 12-14) and with 24 after both (not with 16-20).
   * fineRatio 0.5 (was 0.3) since session 22: on dev s340 at 200 fragments (the shortlists of 495
   * fragment pairs replayed, tests/bench/shortlist-kind-study.ts) 6% fewer fine runs and every
   * pair's best motion as before; with 0.6 a true join's correct best motion is lost.
   */
  finePerFragmentPair: number;
  fineMinOverlap: number;
  fineRatio: number;
  /**
   * A screened motion does not take a place in the fine shortlist when a better one already there
   * came from a face pair of the same two faces (the whole face or any of its pieces and patches
   * on each side) and lies within fineRepeatDeg degrees and fineRepeatSpacings sample spacings
   * (at B's face centroid) of it (0 or left out: no such check). A piece's motion that coincides
   * with its whole face's converges to about the same place in the fine step.
   */
  fineRepeatDeg?: number;
  fineRepeatSpacings?: number;
  /**
   * Places in the fine shortlist beyond finePerFragmentPair for face pairs that have none yet:
   * after the shortlist is filled, the best-ranked screened motion of each face pair not in it
   * (at least fineMinOverlap, whatever fineRatio and the repeat rule say) is added, best first,
   * up to this many (face-pair-places.ts; 0 or left out: none). 4 since session 24: on the true
   * joins of dev s340 at 200 fragments that stored nothing (stored-gap-study.ts), 5 had their
   * true face pair's motion out-ranked by wrong turns of other face pairs of the same fragment
   * pair; with 2 places 4 of them store right, with 4 or 8 all 5, none lost (DEVELOPERS.md).
   */
  fineFacePairPlaces?: number;
  /**
   * The fine shortlist's first this many motions (by the screen's rank), once refined, are also
   * refined and scored on the face pair of the two fragments (whole face, piece or patch) that they
   * put most in contact, when that is not their own pair and the smaller of its two faces' contact
   * shares is at least contactPairMinShare (contact-face-pairs.ts; shares over contactPairSamples
   * strided samples per face). 0 or left out: none. A motion near the truth found on a face pair
   * that does not meet under it scores near 0 on that pair. 6, 0.2 and 40 since session 25: on dev
   * s340 at 200 fragments true joins in a top 3 251 -> 254 of 376, precision above 0.8 194/195 ->
   * 197/198, paired matching CPU +5.9% (match-truth-ab.ts, after the fine step's k-d cut); check
   * seed 861 at 100 fragments 127 -> 127 (DEVELOPERS.md, session 25). 12 motions: +7.6% CPU.
   */
  contactPairMotions?: number;
  contactPairMinShare?: number;
  contactPairSamples?: number;
  /**
   * A face pair with a part (piece or patch) on either side is not screened when a motion screened
   * on a pair of the same faces' wholes (or of one whole and the other part) already puts at least
   * this share of each of its two faces in contact; that motion goes on to the fine shortlist from
   * the faces it was screened on, ranked by the larger share of the part pair's faces it covers
   * (screenFacePairs; 0 or left out: every pair screened). 0 by default; measured at 0.8 (session
   * 24): paired matching on dev s340 at 200 fragments, 506 fragment pairs, matching CPU -3.3% and
   * true pairs whose best motion is correct 198 -> 198; proposals bench there, true joins in a top 3
   * 244 -> 245, precision above 0.8 188/189 -> 184/184, propose CPU 417.8 -> 409.4 s; but on check
   * seed 761 at 100 fragments 119 -> 118 and CPU 167.1 -> 169.4 s: too little gained to change every
   * catalogue's run hash. Session 23's rule (the larger share at least 0.5, the motion standing for
   * the part pair on the part's faces) saved 15% of the matching CPU but lost 2 of those joins and
   * put the committed sample's transverse join 4.7 degrees off (see DEVELOPERS.md, sessions 23, 24).
   */
  partCoverShare?: number;
  /** Whether partCoverShare applies to small face pairs too (those pair voting serves, pairVoteMaxFaceSamples). */
  partCoverSmall?: boolean;
  /**
   * A face pair with a part (piece or patch) on either side, above pair voting's size, takes the
   * coarse hypotheses that the search along the axis directions and RANSAC found on a pair of the
   * same faces' wholes (or of one whole and the other part) screened before it, as starts of its
   * own short ICP, instead of running those two searches itself (screenFacePairs; false or left
   * out: every pair runs its own searches). The shared-axis search and the principal frames still
   * run on the part pair, and its motions are ranked and kept on its own faces as before; a pair
   * whose wholes' searches gave no hypothesis searches by itself. A part's samples are those of its
   * whole or a stretch of the same break, so the wholes' hypotheses already hold most of what the
   * part's own searches find, and the short ICP on the part's faces takes each into the part's own
   * basin, unless the wholes' few hypotheses (3 direction peaks, 4 RANSAC motions) miss what only
   * the part's own searches find. Left out of the defaults (off; the run's parameters hash is
   * main's) since session 26 (prop26v): on dev s340 at 200 fragments the part pairs were 78% of
   * the screen's CPU on fragment pairs that are not joins, the two searches half of a large part
   * pair's (tests/bench/screen-kind-study.ts); with the rule paired matching -8.4% (match-truth-ab.ts,
   * 497 fragment pairs, true pairs whose best motion is correct 201 -> 201), -7.7% on the run's mix
   * (match-speed.ts, 600 strided pairs), proposals bench there 252 -> 253 true joins in a top 3; but
   * check seed 886 at 100 fragments 120 -> 116 (paired matching 101 -> 98, -10.5% CPU): on each lost
   * join every correct screened motion came from a large part pair's own direction search or RANSAC,
   * and no hypothesis of its wholes' pairs led there (DEVELOPERS.md, session 26).
   */
  partReusesSearches?: boolean;
  /** Samples of B's face in the coarse ICP rounds and in the fine rounds. */
  icpSamples: number;
  fineSamples: number;
  /** Samples of B's face in the last rounds against A's triangles (BVH). */
  bvhSamples: number;
  /** Rounds of the fine step against A's face samples, then against A's triangles (BVH). */
  fineIterations: number;
  bvhIterations: number;
  /**
   * A shortlisted motion whose k-d rounds end with the trimmed RMS point-to-plane residual of
   * their kept pairs above this many sample spacings is given up before the BVH rounds and the
   * score (fineTransformOrNone; 0 or left out: every motion goes on). Faces that meet under the
   * motion lie on each other's tangent planes at the end of the k-d rounds; faces that do not
   * conform leave larger residuals, and the BVH rounds never brought such a motion to a score
   * that counts. 0.15 since session 25: on dev s340 at 200 fragments (501 fragment pairs, 5,180
   * shortlisted motions; tests/bench/fine-stop-study.ts) the motions whose score reaches 0.05
   * ended their k-d rounds at 0.036 / 0.054 / 0.071 spacings (p5 / p50 / p90; highest 0.135
   * but one, 0.288, a correct motion its pair's answer did not hold), while 41% of the motions of
   * pairs that are not joins ended above 0.15: the BVH rounds and the score of those are about
   * 14% of matching such a pair. Proposals bench there: true joins in a top 3 251 -> 251 of 376,
   * precision above 0.8 194/195 both, CPU 416.9 -> 361.3 s; check seed 853 at 100 fragments
   * 126 -> 126 of 189, every pair's best score identical, CPU 196.9 -> 175.3 s (DEVELOPERS.md,
   * session 25).
   */
  fineKdMaxRmsSpacings?: number;
  /** Share of ICP pairs kept each round (screen). */
  icpTrim: number;
  /** Share of ICP pairs kept each round of the fine step. */
  fineTrim: number;
  /**
   * When above 0, the fine step chooses its kept share each round (icp-point-to-plane.ts
   * autoTrimLambda), at least fineTrimMin, instead of fineTrim. 2 (was a fixed 0.7): of the true
   * joins on dev seeds 11-16 and 21 whose best motion landed 5-12 degrees off the truth (a face
   * opened like a book: the fixed trim dropped the far pairs that would close it), 8 of 18 became
   * correct (1 with the fixed trim; a fixed 0.95 gave 9 but lost 6 of 90 found joins, this 3)
   * (tests/bench/fine-accuracy-study.ts).
   */
  fineTrimLambda: number;
  fineTrimMin: number;
  /**
   * A fragment pair's best this many refined motions are also refined from the other side
   * (polishBothWays: A's face onto B's surface) and the better scored of the two kept (0: never).
   * 3 since method /8: pairwise benchmark on dev seeds 11-16 and 21 (each face pair through its
   * own fine step, then the pair's best 3 polished; same score model), true joins in a piece's
   * top 3 241 -> 250 of 379, best of pair 257 -> 261, precision above 0.8 144/157 -> 150/163,
   * rotation error p95 of correct best motions 3.41 -> 3.06 degrees, for 0.62 ms per face pair
   * (5% of 11.8).
   */
  polishBest: number;
  /** Contact tolerance in sample spacings. */
  contactToleranceSpacings: number;
  seed: number;
}

export const DEFAULT_MATCH_PARAMETERS: MatchParameters = {
  ransacIterations: 1500,
  hypothesesPerPair: 4,
  principalFrameMotions: 2,
  principalFrameMinSizeRatio: 0.5,
  principalFrameMinSamples: 300,
  axisPeaks: 2,
  axisFeatureWeights: false,
  directionPeaks: 3,
  directionGoodOverlap: 2,
  directionTiltsDeg: [0],
  pairVoteHypotheses: 4,
  pairVoteMaxFaceSamples: 150,
  pairVoteSamples: 120,
  pairVoteReferences: 30,
  smallPairRansac: false,
  smallPairDirections: false,
  maxRadiusRatio: 1.35,
  axisGoodOverlap: 0.35,
  axisSettlesDirections: false,
  screenAxisTiltDeg: [20, 45],
  screenConsensusMin: 3,
  minOverlap: 0.08,
  screenKeepRatio: 0.7,
  screenIcpDistanceSpacings: 3,
  fineHypotheses: 2,
  finePerFragmentPair: 24,
  fineMinOverlap: 0.2,
  fineRatio: 0.5,
  fineRepeatDeg: 2,
  fineRepeatSpacings: 1,
  fineFacePairPlaces: 4,
  contactPairMotions: 6,
  contactPairMinShare: 0.2,
  contactPairSamples: 40,
  partCoverShare: 0,
  icpSamples: 150,
  fineSamples: 300,
  bvhSamples: 120,
  fineIterations: 20,
  bvhIterations: 8,
  fineKdMaxRmsSpacings: 0.15,
  icpTrim: 0.7,
  fineTrim: 0.7,
  fineTrimLambda: 2,
  fineTrimMin: 0.5,
  polishBest: 3,
  contactToleranceSpacings: 0.4,
  seed: 1,
};

export interface FaceMatch extends JoinScore {
  transform: RigidTransform;
  faceA: number;
  faceB: number;
}

/**
 * What one face pair went through, for the benchmark's breakdown of missed joins: every coarse
 * hypothesis, each after the short ICP with its overlap share, and those sent on to the fine step.
 */
export interface MatchTrace {
  coarse: RigidTransform[];
  refined: Array<{ transform: RigidTransform; overlap: number }>;
  kept: RigidTransform[];
  /** When given, CPU ms spent per step of the screen are added here (tests/bench/screen-stages.ts). */
  times?: Record<string, number>;
  /** When given, the step each coarse hypothesis came from, in the order of `coarse` (tests/bench/screen-kind-study.ts). */
  stages?: string[];
}

/** f(), its CPU time (ms) added to times[step] when timing. */
function timed<T>(times: Record<string, number> | undefined, step: string, f: () => T): T {
  if (!times) return f();
  const t = process.cpuUsage();
  const out = f();
  const u = process.cpuUsage(t);
  times[step] = (times[step] ?? 0) + (u.user + u.system) / 1000;
  return out;
}

/** One side of a join as the score reads it: the fragment's surface and one of its break faces. */
export function scoredSide(f: PreparedFragment, face: PreparedFace): ScoredSide {
  return { surface: f.surface, facePoints: face.points, faceNormals: face.normals, surfacePoints: f.surfacePoints, surfaceNormals: f.surfaceNormals, surfaceTree: f.surfaceTree, outline: face.outline, axis: f.axis };
}

/** A coarse motion of B's face onto A's face, with the share of the smaller face it puts in contact. */
export interface CoarseMotion {
  transform: RigidTransform;
  overlap: number;
}

/** Refined, scored motions carrying B's face fb onto A's face fa, best first: the screen, then the fine step. */
export function matchFacePair(a: PreparedFragment, fa: number, b: PreparedFragment, fb: number, params: MatchParameters = DEFAULT_MATCH_PARAMETERS, trace?: MatchTrace): FaceMatch[] {
  return refineFacePair(a, fa, b, fb, screenFacePair(a, fa, b, fb, params, trace), params);
}

/**
 * Screening stage of one face pair: coarse motions (about the shared shaft axis, else from FPFH
 * and RANSAC), each polished by a few rounds of ICP against A's face samples, ranked by the
 * share of the smaller face they put in contact; the few distinct best go on to the fine step.
 * Touches only the two faces' samples and k-d trees.
 */
export function screenFacePair(a: PreparedFragment, fa: number, b: PreparedFragment, fb: number, params: MatchParameters = DEFAULT_MATCH_PARAMETERS, trace?: MatchTrace): CoarseMotion[] {
  return screenWithStarts(a, fa, b, fb, params, trace).kept;
}

/**
 * screenFacePair, with the axis-direction and RANSAC hypotheses of B's face onto A's taken from
 * `inherited` instead of searched when given (MatchParameters.partReusesSearches); also returns
 * the hypotheses of those two steps it used (searched or inherited), for the pairs after it.
 */
function screenWithStarts(a: PreparedFragment, fa: number, b: PreparedFragment, fb: number, params: MatchParameters, trace?: MatchTrace, inherited?: RigidTransform[]): { kept: CoarseMotion[]; searched: RigidTransform[] } {
  const FA = a.faces[fa], FB = b.faces[fb];
  const ways = params.screenWays ?? 'given';
  const reverse = ways === 'both' || (ways === 'smaller' && FB.points.length > FA.points.length);
  const forward = ways !== 'smaller' || !reverse;
  const searched: RigidTransform[] = [];
  let refined: CoarseMotion[] = forward ? coarseMotions(a, fa, b, fb, params, trace, inherited, searched) : [];
  if (reverse) {
    // A's face moved onto B's, each motion turned round (B onto A): the coarse stages and the
    // short ICP are not symmetric in the two faces
    const back: MatchTrace | undefined = trace ? { coarse: [], refined: [], kept: [], ...(trace.times ? { times: trace.times } : {}) } : undefined;
    const turned = coarseMotions(b, fb, a, fa, params, back).map((r) => ({ transform: invert(r.transform), overlap: r.overlap }));
    if (trace && back) {
      trace.coarse.push(...back.coarse.map(invert));
      trace.refined.push(...turned);
    }
    refined = refined.concat(turned);
  }
  // 3. early rejection, then the few best on to the fine step against the whole surface, ranked
  // by overlap share times how well the motion agrees with the two pieces' shaft axes
  const spacing = Math.max(a.spacing, b.spacing);
  const ranked = refined
    .filter((r) => r.overlap >= params.minOverlap)
    .map((r) => ({ r, rank: r.overlap * screenAxisConsistency(a.axis, b.axis, r.transform, FB.centroid, params.screenAxisTiltDeg) }))
    .sort((p, q) => q.rank - p.rank);
  const kept: CoarseMotion[] = [];
  const near = (k: CoarseMotion, r: CoarseMotion): boolean => rotationErrorDegrees(k.transform, r.transform) < 3 && displacementAt(k.transform, r.transform, FB.centroid) < 2 * spacing;
  for (const { r, rank } of ranked) {
    if (rank <= 0 || (kept.length && rank < params.screenKeepRatio * ranked[0].rank)) break;
    if (kept.some((k) => near(k, r))) continue;
    kept.push(r);
    if (kept.length >= params.fineHypotheses) break;
  }
  // the motion most starts ended at goes on as well (screen-consensus.ts), when enough did
  const consensus = consensusMotion(ranked, kept, FB.centroid, 3, 2 * spacing, params.screenConsensusMin ?? 0);
  if (consensus) kept.push(consensus);
  if (trace) trace.kept.push(...kept.map((k) => k.transform));
  return { kept, searched };
}

/**
 * The screen's coarse motions of B's face onto A's face (steps 1-2 of screenFacePair), each after
 * the short ICP with its overlap share; every one is added to the trace. With `inherited`, those
 * hypotheses stand for the axis-direction search's and RANSAC's, which do not run; `searched`
 * (when given) receives the hypotheses of those two steps that were refined.
 */
function coarseMotions(a: PreparedFragment, fa: number, b: PreparedFragment, fb: number, params: MatchParameters, trace?: MatchTrace, inherited?: RigidTransform[], searched?: RigidTransform[]): CoarseMotion[] {
  const FA = a.faces[fa], FB = b.faces[fb];
  const spacing = Math.max(a.spacing, b.spacing);
  const starts: RigidTransform[] = [];
  // 1. shaft pieces: turn about and shift along the shared axis (cheap, hard to fool)
  const shafts = !!a.axis && !!b.axis && sameShaft(a.axis.radius, b.axis.radius, params.maxRadiusRatio);
  if (shafts) {
    for (const h of timed(trace?.times, 'shared axis', () => searchAboutSharedAxis(a.axis!, FA.points, FA.normals, b.axis!, FB.points, FB.normals, { spacing, peaks: params.axisPeaks, maxSamples: params.icpSamples, ...(params.axisOuterQuantile ? { outerQuantile: params.axisOuterQuantile } : {}), ...(params.axisFeatureWeights ? { featuresA: FA.fpfh, featuresB: FB.mirroredFpfh, featureDim: FPFH_DIM } : {}) }))) starts.push(h.transform);
  }
  const coarse = stridedSamples(FB.points, FB.normals, params.icpSamples);
  const small = smallPair(FA, FB, params);
  const faceSurfaceA = new SampledSurface(FA.points, FA.normals, FA.tree);
  const checkA = stridedSamples(FA.points, FA.normals, params.icpSamples);
  const refine = (list: RigidTransform[], stage: string): CoarseMotion[] =>
    list.map((h) => {
      trace?.coarse.push(h);
      trace?.stages?.push(stage);
      const icp = timed(trace?.times, 'short icp', () => icpPointToPlane(coarse.points, coarse.normals, faceSurfaceA, h, { maxDistance: params.screenIcpDistanceSpacings * spacing, trim: params.icpTrim, maxIterations: 15, tolerance: 1e-3 * spacing }));
      return { transform: icp.transform, overlap: timed(trace?.times, 'overlap share', () => overlapShare(icp.transform, coarse, FA.tree, FA.normals, checkA, FB.tree, FB.normals, spacing)) };
    });
  let refined = refine(starts, 'shared axis');
  // shaft pieces whose fitted axis points or radii disagree (partial arcs): the axis directions only
  const good = (list: CoarseMotion[], share: number): boolean => list.some((r) => r.overlap >= share);
  // a small face is easily covered by a wrong turn about the axis: it never settles the search
  let settled = shafts && !small && good(refined, params.axisGoodOverlap);
  if (inherited) {
    searched?.push(...inherited);
    refined = refined.concat(refine(inherited, 'inherited'));
    settled = true;
  }
  if (!inherited && a.axis && b.axis && params.directionPeaks > 0 && (!settled || !params.axisSettlesDirections) && !(small && params.pairVoteHypotheses > 0 && params.smallPairDirections === false)) {
    const hyps = timed(trace?.times, 'axis directions', () => searchAlongAxisDirections(a.axis!.direction, FA.points, FA.normals, b.axis!.direction, FB.points, FB.normals, { spacing, peaks: params.directionPeaks, maxSamples: params.icpSamples, tiltsDeg: params.directionTiltsDeg }));
    searched?.push(...hyps.map((h) => h.transform));
    const more = refine(hyps.map((h) => h.transform), 'axis directions');
    refined = refined.concat(more);
    // the directions alone are a weaker prior than the shared axis: only a clear contact skips RANSAC
    settled = settled || (params.directionGoodOverlap <= 1 && !small && good(more, params.directionGoodOverlap));
  }
  // 2. general path (and shaft pieces whose axes find nothing): FPFH correspondences, RANSAC
  if (!settled) {
    const hyps = params.hypothesesPerPair <= 0 || (small && params.pairVoteHypotheses > 0 && params.smallPairRansac === false) ? [] : timed(trace?.times, 'ransac', () => ransacAlignFaces(
      { points: FB.points, normals: FB.normals, fpfh: FB.fpfh, tree: FB.tree, featureIndex: FB.featureIndex, mirroredFpfh: FB.mirroredFpfh, mirroredFeatureFpfh: FB.mirroredFeatureFpfh },
      { points: FA.points, normals: FA.normals, fpfh: FA.fpfh, tree: FA.tree, featureIndex: FA.featureIndex, featureFpfh: FA.featureFpfh },
      { inlierDistance: 1.5 * spacing, iterations: params.ransacIterations, keep: params.hypothesesPerPair, seed: params.seed + 7919 * fa + 104729 * fb },
    ));
    searched?.push(...hyps.map((h) => h.transform));
    refined = refined.concat(refine(hyps.map((h) => h.transform), 'ransac'));
    const back = params.ransacReverseHypotheses ?? 0;
    if (back > 0) {
      const rev = timed(trace?.times, 'ransac', () => ransacAlignFaces(
        { points: FA.points, normals: FA.normals, fpfh: FA.fpfh, tree: FA.tree, featureIndex: FA.featureIndex, mirroredFpfh: FA.mirroredFpfh, mirroredFeatureFpfh: FA.mirroredFeatureFpfh },
        { points: FB.points, normals: FB.normals, fpfh: FB.fpfh, tree: FB.tree, featureIndex: FB.featureIndex, featureFpfh: FB.featureFpfh },
        { inlierDistance: 1.5 * spacing, iterations: params.ransacIterations, keep: back, seed: params.seed + 7919 * fb + 104729 * fa },
      ));
      searched?.push(...rev.map((h) => invert(h.transform)));
      refined = refined.concat(refine(rev.map((h) => invert(h.transform)), 'ransac'));
    }
    // point pair features: on a small face FPFH histograms over a radius as wide as the face barely differ, pair features still do
    if (params.pairVoteHypotheses > 0 && small) {
      const votes = timed(trace?.times, 'pair voting', () => pointPairVoting(FA.points, FA.normals, FB.points, FB.normals, { spacing, maxSamples: params.pairVoteSamples, references: params.pairVoteReferences, hypotheses: params.pairVoteHypotheses }));
      refined = refined.concat(refine(votes.map((h) => h.transform), 'pair voting'));
    }
  }
  const frames = params.principalFrameMotions ?? 0;
  if (frames > 0) {
    const na = FA.points.length / 3, nb = FB.points.length / 3;
    if (Math.min(na, nb) >= (params.principalFrameMinSamples ?? 0) && Math.min(na, nb) >= (params.principalFrameMinSizeRatio ?? 0.5) * Math.max(na, nb)) {
      refined = refined.concat(refine(principalFrameMotions(FA.points, FA.normals, FB.points, FB.normals, { quarterTurns: frames >= 4 }), 'principal frames'));
    }
  }
  trace?.refined.push(...refined);
  return refined;
}

/**
 * Fine stage of one face pair: each screened motion refined by trimmed point-to-plane ICP
 * (first against A's face samples, the last rounds against A's triangles in the BVH) and
 * scored against both whole surfaces; distinct motions, best first.
 */
export function refineFacePair(a: PreparedFragment, fa: number, b: PreparedFragment, fb: number, screened: CoarseMotion[], params: MatchParameters = DEFAULT_MATCH_PARAMETERS): FaceMatch[] {
  const FA = a.faces[fa], FB = b.faces[fb];
  const spacing = Math.max(a.spacing, b.spacing);
  const out: FaceMatch[] = [];
  for (const r of screened) {
    const T = fineTransformOrNone(a, fa, b, fb, r.transform, params);
    if (!T) continue;
    const s = scoreJoin(scoredSide(a, FA), scoredSide(b, FB), T, { contactTolerance: params.contactToleranceSpacings * spacing, spacing });
    out.push({ ...s, transform: T, faceA: FA.parent, faceB: FB.parent });
  }
  return distinctBest(out, 2 * spacing);
}

/**
 * The fine rounds of one screened motion: trimmed point-to-plane ICP on B's samples that the
 * motion put near A's face, first against A's face samples (cheap k-d queries), the last few
 * rounds against A's triangles (BVH).
 */
export function fineTransform(a: PreparedFragment, fa: number, b: PreparedFragment, fb: number, start: RigidTransform, params: MatchParameters): RigidTransform {
  return fineBvhRounds(a, fa, b, fb, fineKdRounds(a, fa, b, fb, start, params).transform, params);
}

/**
 * The fine step of one shortlisted motion (fineTransform), or undefined when its k-d rounds end
 * with the trimmed RMS residual above params.fineKdMaxRmsSpacings (faces that do not conform under
 * the motion): the BVH rounds and the score are then not worth their CPU.
 */
export function fineTransformOrNone(a: PreparedFragment, fa: number, b: PreparedFragment, fb: number, start: RigidTransform, params: MatchParameters): RigidTransform | undefined {
  const mid = fineKdRounds(a, fa, b, fb, start, params);
  const cut = params.fineKdMaxRmsSpacings ?? 0;
  if (cut > 0 && !(mid.rms <= cut * Math.max(a.spacing, b.spacing))) return undefined;
  return fineBvhRounds(a, fa, b, fb, mid.transform, params);
}

/** The fine step's first rounds (fineTransform): B's samples near A's face against A's face samples (k-d). */
export function fineKdRounds(a: PreparedFragment, fa: number, b: PreparedFragment, fb: number, start: RigidTransform, params: MatchParameters): IcpResult {
  const FA = a.faces[fa], FB = b.faces[fb];
  const spacing = Math.max(a.spacing, b.spacing);
  const faceSurfaceA = new SampledSurface(FA.points, FA.normals, FA.tree);
  const fine = nearFace(FB.points, FB.normals, start, FA.tree, 2 * spacing, params.fineSamples);
  return icpPointToPlane(fine.points, fine.normals, faceSurfaceA, start, {
    maxDistance: 1.5 * spacing,
    trim: params.fineTrim,
    autoTrimLambda: params.fineTrimLambda,
    autoTrimMin: params.fineTrimMin,
    maxIterations: params.fineIterations,
    tolerance: 1e-4 * spacing,
  });
}

/** The fine step's last rounds (fineTransform): B's samples near A's face against A's triangles (BVH), from the k-d rounds' motion. */
export function fineBvhRounds(a: PreparedFragment, fa: number, b: PreparedFragment, fb: number, mid: RigidTransform, params: MatchParameters): RigidTransform {
  const FA = a.faces[fa], FB = b.faces[fb];
  const spacing = Math.max(a.spacing, b.spacing);
  const last = nearFace(FB.points, FB.normals, mid, FA.tree, 1.5 * spacing, params.bvhSamples);
  return icpPointToPlane(last.points, last.normals, a.surface, mid, {
    maxDistance: 1.5 * spacing,
    trim: params.fineTrim,
    autoTrimLambda: params.fineTrimLambda,
    autoTrimMin: params.fineTrimMin,
    maxIterations: params.bvhIterations,
    tolerance: 1e-4 * spacing,
  }).transform;
}

/**
 * One refined motion polished from the other side: the fine step run with A's face samples
 * moved onto B's surface (from the inverse of `m`), turned back into B -> A and scored. The
 * better scored of the two is returned (the fine step is not symmetric: it pairs only the moving
 * face's samples, so a face that covers part of the other is closed from one side only).
 */
export function polishBothWays(a: PreparedFragment, fa: number, b: PreparedFragment, fb: number, m: FaceMatch, params: MatchParameters = DEFAULT_MATCH_PARAMETERS): FaceMatch {
  const FA = a.faces[fa], FB = b.faces[fb];
  const spacing = Math.max(a.spacing, b.spacing);
  const T = invert(fineTransform(b, fb, a, fa, invert(m.transform), params));
  const s = scoreJoin(scoredSide(a, FA), scoredSide(b, FB), T, { contactTolerance: params.contactToleranceSpacings * spacing, spacing });
  return s.score > m.score ? { ...s, transform: T, faceA: FA.parent, faceB: FB.parent } : m;
}

/**
 * Contact of two faces under a motion, with every sample (for the benchmark): the better side's
 * share of its samples in contact (as overlapShare) and the contact area that side's count stands for.
 */
export function faceOverlapUnder(a: PreparedFragment, fa: number, b: PreparedFragment, fb: number, T: RigidTransform): { share: number; areaMm2: number } {
  const FA = a.faces[fa], FB = b.faces[fb];
  const spacing = Math.max(a.spacing, b.spacing);
  const kb = contactCount(FB.points, FB.normals, T, FA.tree, FA.normals, spacing);
  const ka = contactCount(FA.points, FA.normals, invert(T), FB.tree, FB.normals, spacing);
  return { share: Math.max(kb / Math.max(1, FB.points.length / 3), ka / Math.max(1, FA.points.length / 3)), areaMm2: Math.max(ka, kb) * spacing * spacing };
}

/**
 * Share of the smaller face in contact under a motion: B's samples moved onto A's face and
 * A's samples moved back onto B's face, within one spacing and with opposed normals (k-d tree
 * only, for ranking hypotheses before the fine step).
 */
function overlapShare(...args: Parameters<typeof contactShares>): number {
  return Math.max(...contactShares(...args));
}

/** The shares of B's samples and of A's samples in contact under a motion (as overlapShare), in that order. */
function contactShares(
  T: RigidTransform,
  b: { points: Float32Array; normals: Float32Array },
  treeA: KdTree,
  normalsA: Float32Array,
  a: { points: Float32Array; normals: Float32Array },
  treeB: KdTree,
  normalsB: Float32Array,
  spacing: number,
): [number, number] {
  const nb = b.points.length / 3, na = a.points.length / 3;
  return [contactCount(b.points, b.normals, T, treeA, normalsA, spacing) / Math.max(1, nb), contactCount(a.points, a.normals, invert(T), treeB, normalsB, spacing) / Math.max(1, na)];
}

/** Samples that `M` puts within `spacing` of a sample of the other face with opposed normals. */
function contactCount(pts: Float32Array, nrm: Float32Array, M: RigidTransform, tree: KdTree, N: Float32Array, spacing: number): number {
  const q = [0, 0, 0];
  let k = 0;
  const n = pts.length / 3;
  for (let i = 0; i < n; i++) if (inOpposedContact(M, pts, nrm, i, tree, N, spacing, q)) k++;
  return k;
}

/** B's samples that `T` puts within `within` of A's face, at most `max` of them (evenly strided). */
function nearFace(points: Float32Array, normals: Float32Array, T: RigidTransform, treeA: KdTree, within: number, max: number): { points: Float32Array; normals: Float32Array } {
  const n = points.length / 3;
  const keep: number[] = [];
  const q = [0, 0, 0];
  // neighbouring samples mostly lie near one sample of A: the last one found answers first (same answers)
  let near = -1;
  for (let i = 0; i < n; i++) {
    const x = points[3 * i], y = points[3 * i + 1], z = points[3 * i + 2];
    q[0] = T[0] * x + T[1] * y + T[2] * z + T[3];
    q[1] = T[4] * x + T[5] * y + T[6] * z + T[7];
    q[2] = T[8] * x + T[9] * y + T[10] * z + T[11];
    const j = treeA.someWithin(q, within * within, near);
    if (j >= 0) {
      keep.push(i);
      near = j;
    }
  }
  if (keep.length < 12) return stridedSamples(points, normals, max);
  const step = Math.max(1, keep.length / max);
  const m = Math.min(keep.length, Math.ceil(keep.length / step));
  const P = new Float32Array(3 * m), N = new Float32Array(3 * m);
  for (let k = 0; k < m; k++) {
    const i = keep[Math.min(keep.length - 1, Math.floor(k * step))];
    P.set(points.subarray(3 * i, 3 * i + 3), 3 * k);
    N.set(normals.subarray(3 * i, 3 * i + 3), 3 * k);
  }
  return { points: P, normals: N };
}

/** A face pair whose smaller face has at most pairVoteMaxFaceSamples samples (see MatchParameters). */
function smallPair(FA: PreparedFace, FB: PreparedFace, params: MatchParameters): boolean {
  return Math.min(FA.points.length, FB.points.length) / 3 <= params.pairVoteMaxFaceSamples;
}

/** Two shaft pieces that join have about the same radius at the break (design.md section 7, notes for long bones). */
function sameShaft(ra: number, rb: number, maxRatio: number): boolean {
  return Math.max(ra, rb) <= maxRatio * Math.min(ra, rb);
}

/**
 * Every face pair (or the given ones) of A and B, merged, best first: every face pair is
 * screened, and only the fragment pair's few best screened motions are refined and scored.
 * With `keep`, only the best `keep` are wanted: the same as the first `keep` of the whole list,
 * with the interpenetration left out of the motions that cannot reach them (bestDistinct); with
 * `minScore` as well, a pair whose best motion scores below it gets no motion (a propose run
 * stores no proposal for it), found with as few scores completed as bestDistinct can.
 */
export function matchFragments(
  a: PreparedFragment,
  b: PreparedFragment,
  params: MatchParameters = DEFAULT_MATCH_PARAMETERS,
  facePairs?: Array<[number, number]>,
  keep?: number,
  minScore = 0,
): FaceMatch[] {
  const pairs: Array<[number, number]> = facePairs ?? [];
  if (!facePairs) for (let i = 0; i < a.faces.length; i++) for (let j = 0; j < b.faces.length; j++) pairs.push([i, j]);
  const screened = screenFacePairs(a, b, pairs, params);
  const spacing = Math.max(a.spacing, b.spacing);
  const shortlist = fineShortlist(a, b, screened, params);
  // which prepared faces (piece or patch) each refined motion came from, for polishing
  const origin = new Map<FaceMatch, [number, number]>();
  if (keep === undefined) {
    const all: FaceMatch[] = [];
    for (const s of shortlist) for (const m of refineFacePair(a, s.i, b, s.j, [s.motion], params)) {
      origin.set(m, [s.i, s.j]);
      all.push(m);
    }
    // (at most one refined motion per shortlist entry, in its order: none where the fine step gave it up)
    for (const d of onContactPairs(a, b, all.map((m) => ({ transform: m.transform, i: origin.get(m)![0], j: origin.get(m)![1] })), pairs, params)) {
      const m: FaceMatch = { ...d.score.complete(), transform: d.transform, faceA: d.faceA, faceB: d.faceB };
      origin.set(m, [d.i!, d.j!]);
      all.push(m);
    }
    return polishRanked(a, b, distinctBest(all, 2 * spacing), origin, params, spacing);
  }
  const fine = shortlist.flatMap((s) => refinedDeferred(a, s.i, b, s.j, s.motion.transform, params));
  fine.push(...onContactPairs(a, b, fine.map((d) => ({ transform: d.transform, i: d.i!, j: d.j! })), pairs, params));
  if (params.polishBest <= 0) return bestDistinct(fine, keep, 2 * spacing, minScore, origin);
  // The whole list polishes its first polishBest motions and ranks again, which may bring two of
  // them together (or lift the third above the second): drawn from only `keep` motions the polished
  // list could come out shorter or in another order. So polish at least polishBest, and when the
  // polish merged some, draw as many more as are missing (the tail below the polished ones keeps
  // its order, so the first `keep` are then those of the whole list). Completed scores and
  // polished motions are kept between the draws.
  const completed: Array<FaceMatch | undefined> = new Array(fine.length);
  const polished = new Map<FaceMatch, FaceMatch>();
  for (let draw = Math.max(keep, params.polishBest); ; ) {
    const best = bestDistinct(fine, draw, 2 * spacing, minScore, origin, completed);
    const out = polishRanked(a, b, best, origin, params, spacing, polished);
    if (out.length >= keep || best.length < draw) return out.slice(0, keep);
    draw += keep - out.length;
  }
}

/**
 * The first params.contactPairMotions of a fragment pair's refined motions (the fine shortlist's
 * order, those the fine step gave up left out), refined again and scored on the face pair each puts most in contact, when that is not one of the
 * screened face pairs (contact-face-pairs.ts contactPairStarts; none when the setting is 0 or left out).
 */
function onContactPairs(a: PreparedFragment, b: PreparedFragment, refined: Array<{ transform: RigidTransform; i: number; j: number }>, screened: Array<[number, number]>, params: MatchParameters): DeferredMatch[] {
  const n = params.contactPairMotions ?? 0;
  if (!(n > 0)) return [];
  const spacing = Math.max(a.spacing, b.spacing);
  // the same fine step as a shortlisted motion's, given up alike when the faces do not conform
  return contactPairStarts(a, b, refined.slice(0, n), params.contactPairSamples ?? 40, params.contactPairMinShare ?? 0.2, spacing, screened)
    .flatMap((s) => refinedDeferred(a, s.i, b, s.j, s.transform, params));
}

/**
 * One motion through the fine step on face pair (fa, fb) (fineTransformOrNone) with its score
 * deferred: none when the fine step gives it up, else one DeferredMatch.
 */
function refinedDeferred(a: PreparedFragment, fa: number, b: PreparedFragment, fb: number, start: RigidTransform, params: MatchParameters): DeferredMatch[] {
  const FA = a.faces[fa], FB = b.faces[fb];
  const spacing = Math.max(a.spacing, b.spacing);
  const transform = fineTransformOrNone(a, fa, b, fb, start, params);
  if (!transform) return [];
  const score = deferredScore(scoredSide(a, FA), scoredSide(b, FB), transform, { contactTolerance: params.contactToleranceSpacings * spacing, spacing });
  return [{ transform, faceA: FA.parent, faceB: FB.parent, score, i: fa, j: fb }];
}

/**
 * The screened motions of the given face pairs of A and B (screenFacePair), in the pairs' order.
 * With params.partCoverShare above 0 the pairs are screened whole faces first, and a face pair
 * with a part (piece or patch) on either side (above pair voting's size unless partCoverSmall) is
 * not screened when a motion already screened on a pair of its faces' wholes (or of one whole and
 * the other part) puts at least that share of each of the two faces in contact: such a motion
 * goes on from the faces it was screened on, its overlap raised to the larger share of the part
 * pair's faces it covers, so the fine shortlist ranks it as the part pair's own would rank (the
 * shortlist's repeat rule, fineRepeatDeg, leaves out its lower-ranked copy). The part pair's own
 * screen would find about the same motion again, at a whole screen's cost. Not the part's faces:
 * refined on a part, a motion screened on the whole can settle a few degrees off where the part's
 * own screen would have led (the committed sample's transverse join, 4.7 degrees; session 24).
 * With params.partReusesSearches the pairs are screened whole faces first as well, and a part
 * pair above pair voting's size takes the axis-direction and RANSAC hypotheses of the pairs of
 * its wholes screened before it as starts instead of searching (coarseMotions' `inherited`).
 * `traces` (optional, one per pair): what each pair's screen went through (MatchTrace).
 */
export function screenFacePairs(a: PreparedFragment, b: PreparedFragment, pairs: Array<[number, number]>, params: MatchParameters, traces?: MatchTrace[]): Array<{ i: number; j: number; motion: CoarseMotion }> {
  const share = params.partCoverShare ?? 0;
  const reuse = params.partReusesSearches ?? false;
  if (!(share > 0) && !reuse) {
    const screened: Array<{ i: number; j: number; motion: CoarseMotion }> = [];
    pairs.forEach(([i, j], k) => { for (const motion of screenFacePair(a, i, b, j, params, traces?.[k])) screened.push({ i, j, motion }); });
    return screened;
  }
  const wholeA = wholeFaces(a), wholeB = wholeFaces(b);
  const parts = ([i, j]: [number, number]): number => (wholeA[i] === i ? 0 : 1) + (wholeB[j] === j ? 0 : 1);
  const order = pairs.map((p, k) => ({ p, k, n: parts(p) })).sort((x, y) => x.n - y.n || x.k - y.k);
  // the motions each face pair's own screen found (none for a covered pair), and the hypotheses
  // of its axis-direction search and RANSAC (searched or inherited)
  const found = new Map<string, CoarseMotion[]>();
  const searchedOf = new Map<string, RigidTransform[]>();
  // each pair's screened motions, given out in the pairs' order
  const out: Array<Array<{ i: number; j: number; motion: CoarseMotion }>> = pairs.map(() => []);
  const spacing = Math.max(a.spacing, b.spacing);
  for (const { p: [i, j], k, n } of order) {
    const wi = wholeA[i], wj = wholeB[j];
    const from = n > 0 ? [[wi, wj], [wi, j], [i, wj]].filter(([x, y], m, all) => (x !== i || y !== j) && all.findIndex(([u, v]) => u === x && v === y) === m) : [];
    const large = !smallPair(a.faces[i], b.faces[j], params);
    if (share > 0 && n > 0 && (params.partCoverSmall || large)) {
      const FA = a.faces[i], FB = b.faces[j];
      const prior = from.flatMap(([x, y]) => (found.get(`${x},${y}`) ?? []).map((motion) => ({ x, y, motion })));
      if (prior.length) {
        const sb = stridedSamples(FB.points, FB.normals, params.icpSamples), sa = stridedSamples(FA.points, FA.normals, params.icpSamples);
        const covering = prior.map((p) => ({ ...p, shares: contactShares(p.motion.transform, sb, FA.tree, FA.normals, sa, FB.tree, FB.normals, spacing) })).filter((p) => Math.min(...p.shares) >= share);
        if (covering.length) {
          found.set(`${i},${j}`, []);
          for (const { x, y, motion, shares } of covering) out[k].push({ i: x, j: y, motion: { transform: motion.transform, overlap: Math.max(motion.overlap, ...shares) } });
          continue;
        }
      }
    }
    // a large part pair takes the searches' hypotheses of the pairs of its wholes screened before it
    let inherited: RigidTransform[] | undefined;
    if (reuse && n > 0 && large) {
      const lists = from.map(([x, y]) => searchedOf.get(`${x},${y}`)).filter((l): l is RigidTransform[] => l !== undefined);
      const starts = [...new Set(lists.flat())];
      if (starts.length) inherited = starts;
    }
    const { kept, searched } = screenWithStarts(a, i, b, j, params, traces?.[k], inherited);
    found.set(`${i},${j}`, kept);
    searchedOf.set(`${i},${j}`, searched);
    for (const motion of kept) out[k].push({ i, j, motion });
  }
  return out.flat();
}

/** For each prepared face, the index of its whole face (the first prepared face of its parent). */
function wholeFaces(f: PreparedFragment): number[] {
  const first = new Map<number, number>();
  return f.faces.map((x, k) => {
    if (!first.has(x.parent)) first.set(x.parent, k);
    return first.get(x.parent)!;
  });
}

/**
 * The first params.polishBest of `ranked` polished from the other side (polishBothWays), the list
 * ranked again; `polished` (optional) keeps each motion's polished one for a later call.
 */
export function polishRanked(a: PreparedFragment, b: PreparedFragment, ranked: FaceMatch[], origin: Map<FaceMatch, [number, number]>, params: MatchParameters, spacing: number, polished?: Map<FaceMatch, FaceMatch>): FaceMatch[] {
  const n = Math.min(params.polishBest, ranked.length);
  if (n <= 0) return ranked;
  const head = ranked.slice(0, n).map((m) => {
    const done = polished?.get(m);
    if (done) return done;
    const o = origin.get(m);
    const p = o ? polishBothWays(a, o[0], b, o[1], m, params) : m;
    polished?.set(m, p);
    return p;
  });
  return distinctBest([...head, ...ranked.slice(n)], 2 * spacing);
}

/** A refined motion whose score is not complete yet (score.ts, deferredScore). */
export interface DeferredMatch {
  transform: RigidTransform;
  faceA: number;
  faceB: number;
  score: DeferredScore;
  /** The prepared faces (piece or patch indices) of A and B it came from, when known. */
  i?: number;
  j?: number;
}

/**
 * The first `keep` of distinctBest over the completed motions, completing as few as it can:
 * motions are completed in order of their upper bounds until every motion left sorts after the
 * `keep`-th kept one (upper bound below its score, or both 0 and less contact). Such a motion
 * cannot change the kept ones before it (distinctBest keeps or drops each motion by the better
 * ones only), so the answer is the same as completing all.
 * With `minScore` above 0, a pair none of whose motions reaches it gets no motion at all (a
 * propose run stores no proposal for it): once every completed motion scores below minScore and
 * every motion left has an upper bound below it, the answer is empty and nothing more is
 * completed (when no upper bound reaches minScore, nothing is completed at all). A pair whose
 * best reaches minScore gets the same first `keep` as without it.
 * `done` (optional, one entry per motion) holds the motions completed so far, so that a second call
 * with a larger `keep` completes only what it needs more.
 */
export function bestDistinct(list: DeferredMatch[], keep: number, shift: number, minScore = 0, origin?: Map<FaceMatch, [number, number]>, done: Array<FaceMatch | undefined> = new Array(list.length)): FaceMatch[] {
  const byUpper = list.map((_, i) => i).sort((p, q) => list[q].score.upper - list[p].score.upper);
  let next = 0;
  // relative slack: the bound is exact in real numbers, and exp need not be monotone to the last bit
  const sortsAfter = (d: DeferredScore, last: FaceMatch): boolean => (d.upper === 0 ? last.score > 0 || d.contactFraction < last.contactFraction : d.upper * (1 + 1e-9) < last.score);
  const belowMinimum = (d: DeferredScore): boolean => d.upper * (1 + 1e-9) < minScore;
  for (;;) {
    const kept = distinctBest(done.filter((m): m is FaceMatch => m !== undefined), shift);
    if (minScore > 0 && (kept.length === 0 || kept[0].score < minScore) && byUpper.slice(next).every((i) => belowMinimum(list[i].score))) return [];
    if (next >= byUpper.length) return kept.slice(0, keep);
    if (kept.length >= keep) {
      const last = kept[keep - 1];
      if (byUpper.slice(next).every((i) => sortsAfter(list[i].score, last))) return kept.slice(0, keep);
    }
    const i = byUpper[next++];
    if (done[i]) continue;
    const m = list[i];
    done[i] = { ...m.score.complete(), transform: m.transform, faceA: m.faceA, faceB: m.faceB };
    if (origin && m.i !== undefined && m.j !== undefined) origin.set(done[i]!, [m.i, m.j]);
  }
}

/**
 * The screened motions of one fragment pair that deserve the fine step (see
 * MatchParameters.finePerFragmentPair), best first by overlap share times how firmly the
 * contact locks (screen-measures.ts: faces that could slide or turn, such as the flat ends
 * of a tube, overlap fully in many wrong positions).
 */
export function fineShortlist<T extends { i: number; j: number; motion: CoarseMotion }>(a: PreparedFragment, b: PreparedFragment, screened: T[], params: MatchParameters): T[] {
  const spacing = Math.max(a.spacing, b.spacing);
  const ranked = screened
    .filter((s) => s.motion.overlap >= params.fineMinOverlap)
    .map((s) => ({ s, rank: s.motion.overlap * Math.min(1, screenInterlock(a.faces[s.i], b.faces[s.j], s.motion.transform, spacing) / LOCKED_INTERLOCK) }))
    .sort((p, q) => q.rank - p.rank);
  const best = ranked[0]?.rank ?? 0;
  const within = ranked.filter((r) => r.rank >= params.fineRatio * best).map((r) => r.s);
  const deg = params.fineRepeatDeg ?? 0;
  if (!(deg > 0)) return withFacePairPlaces(within.slice(0, params.finePerFragmentPair), ranked.map((r) => r.s), params.fineFacePairPlaces ?? 0);
  const shift = (params.fineRepeatSpacings ?? 0) * spacing;
  const out: T[] = [];
  for (const s of within) {
    if (out.length >= params.finePerFragmentPair) break;
    if (out.some((o) => repeatsMotion(a, b, o, s, deg, shift))) continue;
    out.push(s);
  }
  return withFacePairPlaces(out, ranked.map((r) => r.s), params.fineFacePairPlaces ?? 0);
}

/** Sort by score and drop motions that repeat a better one (within 3 degrees and `shift` mm). */
export function distinctBest(list: FaceMatch[], shift: number): FaceMatch[] {
  const sorted = [...list].sort((p, q) => q.score - p.score || q.contactFraction - p.contactFraction);
  const kept: FaceMatch[] = [];
  for (const m of sorted) {
    const dup = kept.some(
      (k) =>
        rotationErrorDegrees(k.transform, m.transform) < 3 &&
        hypot(k.transform[3] - m.transform[3], k.transform[7] - m.transform[7], k.transform[11] - m.transform[11]) < shift,
    );
    if (!dup) kept.push(m);
  }
  return kept;
}
