/**
 * Candidate pruning (design.md section 7, step 5): each break face keeps the k faces of other
 * fragments that look most like its partner (face-descriptor.ts `partnerCost`), and the pairs
 * of all faces are unioned. Only those face pairs get the expensive alignment, so that work
 * grows like k F in the number of faces F, not F squared. Finding the k best is a plain scan
 * over all faces (about a microsecond per pair: under a second for 1,000 fragments), exact for
 * the robust cost, which a k-d tree cannot index. Faces of one fragment never pair with each
 * other; a caller may also rule out fragment pairs (`sizeClassCompatible`: recorded size
 * classes apart).
 */
import { describeFace, partnerCost } from './face-descriptor';
import { leanReadingVariance } from './lean-reading-variance';
import { distinctWholeFacesFirst } from './distinct-whole-faces-first';
import type { FaceTraits } from './face-traits';
import { wordContainmentCost } from './word-containment-cost';

export interface IndexedFace {
  fragment: number;
  face: number;
  traits: FaceTraits;
  /**
   * The fragment's face number of the whole break face this face is a part of (a corner piece
   * or a patch, prepared-fragment.ts); absent or equal to `face` for a whole face.
   */
  whole?: number;
}

export interface FacePairCandidate {
  /** Fragment indices, a < b. */
  a: number;
  b: number;
  faceA: number;
  faceB: number;
  /** Partner cost (smaller is more alike; 0 when exhaustive). */
  distance: number;
}

export interface PruningOptions {
  /** Partners kept per face. */
  k: number;
  /** Every pair of faces of different fragments (the baseline pruning is measured against). */
  exhaustive?: boolean;
  /** Fragment pairs that may join at all (default: all). */
  compatible?: (fragmentA: number, fragmentB: number) => boolean;
  /**
   * Whole faces added per face (WHOLE_FACE_PARTNERS): when a candidate pairs a face with a part
   * of another fragment's face, that part's whole face is offered to the face too, and each face
   * keeps the offers of least partner cost, at most this many (0: none).
   */
  wholeFacePartners?: number;
  /**
   * The second stage (CANDIDATE_RERANK): each face's `shortlist` cheapest partners by the trait
   * cost are ranked again by the trait cost plus `weight` times the FPFH-word containment cost,
   * and the first k kept. Default CANDIDATE_RERANK; null: the k cheapest by the trait cost alone.
   */
  rerank?: CandidateRerank | null;
  /**
   * Distinct whole faces (DISTINCT_WHOLE_FACES), where a face and its parts (`IndexedFace.whole`)
   * are one whole break face: 'face pairs', rank by rank over all faces each face takes its next
   * partner only when no face pair of the same two whole faces is kept yet, k per face; 'each
   * list', in each face's list a second face of one whole face moves behind the faces of other
   * whole faces before the first k are kept; null: each face's first k as ordered.
   */
  distinctWholeFaces?: DistinctWholeFaces | null;
  /**
   * The lean reading's error per piece (LEAN_PIECE_ERROR; lean-reading-variance.ts): the lean
   * figure of two faces is compared on a scale widened by their pieces' reading variances, so a
   * narrow splinter's lean counts less. 0: the lean's plain scale.
   */
  leanPieceError?: number;
}

export type DistinctWholeFaces = 'face pairs' | 'each list';

export interface CandidateRerank {
  /** Partners per face read by the trait cost before ranking again (at least k). */
  shortlist: number;
  /** Weight of `wordContainmentCost` (word-containment-cost.ts) beside the trait cost. */
  weight: number;
}

/**
 * Partners kept per face by default (chosen from the recall against pairs printed by the
 * benchmark). 30 until session 25; with distinct whole faces in each list (DISTINCT_WHOLE_FACES)
 * the lists overlap less, and 27 keeps about the face pairs 30 kept before (1-5% fewer).
 */
export const DEFAULT_K = 27;

/**
 * Whole faces added per face by default (`PruningOptions.wholeFacePartners`). A merged break
 * face (two breaks the segmentation did not part) is also offered as its parts (corner pieces,
 * patches), and a part often looks more like some piece's face than the whole does, although it
 * is the whole face (another part of it) that meets that piece: on dev seed 340 at 200 fragments
 * 22 of the 29 true joins with no proposal stored whose best face pair was not a candidate had a
 * whole face or another part of a candidate's face scoring well at the truth (DEVELOPERS.md,
 * "Why a candidate pair stores nothing"). Pairing every part's whole face with its partner adds
 * 62% face pairs; the offers of least partner cost, a few per face, keep most of the gain.
 */
export const WHOLE_FACE_PARTNERS = 2;

/**
 * The second stage of the index by default: each face's 90 cheapest partners by the trait cost,
 * ranked again with twice the FPFH-word containment cost added (fpfh-word-counts.ts,
 * word-containment-cost.ts), the first k kept. The traits are means over a face, which differ
 * when a piece keeps only part of its partner's break (the lost joins differ most in the lean,
 * the axis cosine, the span and the relief: DEVELOPERS.md, pruning section); the words of a part
 * are a subset of its partner's. Chosen on dev seeds 341 and 150 at 200 fragments and seed 160 at
 * 1,000 (weights 1-8, shortlists 60-150; tests/bench/candidate-rerank.ts), at the same face pairs
 * as the plain k = 30 union, with the codebook fitted on s341: candidate recall 290 -> 295 of 316
 * (s341), 297 -> 299 of 343 (s150), 303 -> 304 of 355 (s340), 1,096 -> 1,118 of 1,728 (s160).
 * The re-ranked lists overlap less, so k = 30 gives 2-3% more face pairs than without the stage
 * (k = 29 gives fewer and still gains). Faces without words (traits stored before) all cost the
 * same, so their order is the trait cost's.
 */
export const CANDIDATE_RERANK: CandidateRerank = { shortlist: 90, weight: 2 };

/**
 * How the index keeps its places for distinct whole faces by default (`PruningOptions.
 * distinctWholeFaces`). A merged break face is indexed as the whole and its parts (corner
 * pieces, patches: 65% of the faces at 200 fragments), which look alike, so a face's list of k
 * spends several places on one whole face of one piece; at 1,000 fragments the lists crowd and
 * true partners fall beyond k. 'each list' moves a second face of a whole face already listed
 * behind the faces of other whole faces, so the places go to other pieces, while a face's own
 * parts still list the same partner (several face pairs per true join for the aligner to try).
 * Measured (tests/bench/candidate-fusion.ts, candidate-recall.ts; the second stage in force;
 * DEVELOPERS.md, pruning section), candidate recall, plain k = 30 -> 'each list' k = 27 with
 * 1-5% fewer face pairs: dev s340 at 200 fragments 306 -> 314 of 355, s150 302 -> 312 of 343,
 * seed 160 at 1,000 1,122 -> 1,160 of 1,728 (the set the trait weights and the second stage's
 * weight were chosen on); proposals bench on s340, in a top 3 251 -> 253 of 376. 'face pairs'
 * (each face, rank by rank, takes its next partner only when its two whole faces have no face
 * pair yet) reaches more (s340 312 with 15% fewer face pairs, s160 1,291 with 14% more) but
 * leaves most true joins one face pair, and the aligner stored less: in a top 3 251 -> 242.
 */
export const DISTINCT_WHOLE_FACES: DistinctWholeFaces | null = 'each list';

/** The lean reading's error per piece by default (`PruningOptions.leanPieceError`): 0, off; 0.03 gained +16 candidate joins at k 27 on dev seed 160 at 1,000 fragments but +1 on fresh seed 931 and -1 on s340 at 200 (DEVELOPERS.md, pruning section, session 27). */
export const LEAN_PIECE_ERROR = 0;

/** With a distinct rule and no second stage: the trait-cost list held, in multiples of k (partners to move forward or to take instead). */
export const DISTINCT_LIST_DEPTH = 3;

/** The word cost of a face without counted words (traits stored before they were): about the median over shortlisted pairs. */
const MISSING_WORD_COST = 1;

/**
 * Recorded size classes (the live-weight classes of core/vocab/size-classes.ts) of two pieces
 * that may still be one bone: at most this far apart. A join is two pieces of one bone, so of
 * one animal and one size class (common practice: the size class is recorded for unidentified
 * shaft fragments precisely to group them); 0 trusts the analyst's classes as recorded, 1
 * allows for a piece put in the neighbouring class. Size class is a finding about the bone,
 * not provenience (design.md section 7), so it may prune (issue 6, item 3).
 */
export const SIZE_CLASS_MAX_DIFFERENCE = 0;

/**
 * Fragment pairs whose recorded size classes are at most `maxDifference` apart; a piece with no
 * size class recorded (null) may pair with any.
 */
export function sizeClassCompatible(sizeClasses: ReadonlyArray<number | null>, maxDifference = SIZE_CLASS_MAX_DIFFERENCE): (fragmentA: number, fragmentB: number) => boolean {
  return (a, b) => {
    const x = sizeClasses[a], y = sizeClasses[b];
    return x === null || y === null || x === undefined || y === undefined || Math.abs(x - y) <= maxDifference;
  };
}

/** Candidate face pairs: the union of each face's k most partner-like faces; or every pair when exhaustive. */
export function candidateFacePairs(faces: IndexedFace[], options: PruningOptions): FacePairCandidate[] {
  const out = new Map<string, FacePairCandidate>();
  const compatible = options.compatible ?? (() => true);
  const add = (i: number, j: number, distance: number): void => {
    let fi = faces[i], fj = faces[j];
    if (fi.fragment > fj.fragment) [fi, fj] = [fj, fi];
    const key = `${fi.fragment}:${fi.face}:${fj.fragment}:${fj.face}`;
    const old = out.get(key);
    if (!old || old.distance > distance) out.set(key, { a: fi.fragment, b: fj.fragment, faceA: fi.face, faceB: fj.face, distance });
  };
  const n = faces.length;
  if (options.exhaustive) {
    for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) {
      if (faces[i].fragment !== faces[j].fragment && compatible(Math.min(faces[i].fragment, faces[j].fragment), Math.max(faces[i].fragment, faces[j].fragment))) add(i, j, 0);
    }
    return [...out.values()];
  }
  const k = Math.max(1, Math.floor(options.k));
  const rerank = options.rerank === undefined ? CANDIDATE_RERANK : options.rerank;
  const distinct = options.distinctWholeFaces === undefined ? DISTINCT_WHOLE_FACES : options.distinctWholeFaces;
  // partners held per face by the trait cost: the shortlist when a second stage ranks them again,
  // a longer list when the distinct rule needs partners to move forward
  const L = rerank ? Math.max(k, Math.floor(rerank.shortlist)) : distinct ? k * DISTINCT_LIST_DEPTH : k;
  const desc = faces.map((f) => describeFace(f.traits));
  const leanVar = leanReadingVariance(faces, options.leanPieceError ?? LEAN_PIECE_ERROR);
  // each face's k best so far, sorted by cost (insertion into a short list)
  const bestCost = faces.map(() => new Float64Array(L).fill(Infinity));
  const bestIndex = faces.map(() => new Int32Array(L).fill(-1));
  const offer = (i: number, j: number, c: number): void => {
    const bc = bestCost[i], bi = bestIndex[i];
    if (c >= bc[L - 1]) return;
    let p = L - 1;
    while (p > 0 && bc[p - 1] > c) {
      bc[p] = bc[p - 1];
      bi[p] = bi[p - 1];
      p--;
    }
    bc[p] = c;
    bi[p] = j;
  };
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      const fa = faces[i].fragment, fb = faces[j].fragment;
      if (fa === fb || !compatible(Math.min(fa, fb), Math.max(fa, fb))) continue;
      const c = partnerCost(desc[i], desc[j], leanVar[i] + leanVar[j]);
      offer(i, j, c);
      offer(j, i, c);
    }
  }
  // the second stage: each shortlist ranked again with the word cost added
  const wordCost = (i: number, j: number): number => {
    const a = faces[i].traits.fpfhWordsMirrored, b = faces[j].traits.fpfhWords;
    return a && b ? wordContainmentCost(a, b) : MISSING_WORD_COST;
  };
  const wholeKey = faces.map((f) => `${f.fragment}:${f.whole ?? f.face}`);
  // each face's list in the order in force: [partner, trait cost, rank key]
  const lists: Array<Array<[number, number, number]>> = [];
  for (let i = 0; i < n; i++) {
    const order: Array<[number, number, number]> = [];
    for (let m = 0; m < L && bestIndex[i][m] >= 0; m++) order.push([bestIndex[i][m], bestCost[i][m], rerank ? bestCost[i][m] + rerank.weight * wordCost(i, bestIndex[i][m]) : m]);
    if (rerank) order.sort((x, y) => x[2] - y[2]);
    lists.push(distinct === 'each list' ? distinctWholeFacesFirst(order, (x) => wholeKey[x[0]]) : order);
  }
  if (distinct === 'face pairs') {
    // rank by rank over all faces, each face takes its next partner whose two whole faces have no
    // face pair yet, until it has taken k (or its list runs out)
    const covered = new Set<string>();
    const pos = new Int32Array(n);
    for (let round = 0; round < k; round++) {
      for (let i = 0; i < n; i++) {
        const list = lists[i];
        while (pos[i] < list.length) {
          const [j, c] = list[pos[i]++];
          const a = wholeKey[i], b = wholeKey[j];
          const g = a < b ? `${a}|${b}` : `${b}|${a}`;
          if (covered.has(g)) continue;
          covered.add(g);
          add(i, j, c);
          break;
        }
      }
    }
  } else {
    for (let i = 0; i < n; i++) for (let m = 0; m < Math.min(k, lists[i].length); m++) add(i, lists[i][m][0], lists[i][m][1]);
  }
  const w = Math.max(0, Math.floor(options.wholeFacePartners ?? 0));
  if (w > 0) {
    // the whole face of each part, by index into faces (-1: the face is whole or its whole is not indexed)
    const at = new Map(faces.map((f, i) => [`${f.fragment}:${f.face}`, i]));
    const wholeOf = faces.map((f) => (f.whole === undefined || f.whole === f.face ? -1 : at.get(`${f.fragment}:${f.whole}`) ?? -1));
    const keyOf = (i: number, j: number): string => {
      const [x, y] = faces[i].fragment < faces[j].fragment ? [faces[i], faces[j]] : [faces[j], faces[i]];
      return `${x.fragment}:${x.face}:${y.fragment}:${y.face}`;
    };
    // every whole face offered to each face (through any of its parts), with its partner cost
    const offers = faces.map(() => new Map<number, number>());
    const offerWhole = (i: number, part: number): void => {
      const o = wholeOf[part];
      if (o >= 0 && !offers[i].has(o) && !out.has(keyOf(i, o))) offers[i].set(o, partnerCost(desc[i], desc[o], leanVar[i] + leanVar[o]));
    };
    for (const c of [...out.values()]) {
      const i = at.get(`${c.a}:${c.faceA}`)!, j = at.get(`${c.b}:${c.faceB}`)!;
      offerWhole(i, j);
      offerWhole(j, i);
    }
    // each face keeps its w cheapest offers
    for (let i = 0; i < n; i++) for (const [o, c] of [...offers[i]].sort((x, y) => x[1] - y[1]).slice(0, w)) add(i, o, c);
  }
  return [...out.values()];
}

/** Group face pairs by fragment pair ("a:b"). */
export function byFragmentPair(pairs: FacePairCandidate[]): Map<string, FacePairCandidate[]> {
  const m = new Map<string, FacePairCandidate[]>();
  for (const p of pairs) {
    const key = `${p.a}:${p.b}`;
    const list = m.get(key);
    if (list) list.push(p);
    else m.set(key, [p]);
  }
  return m;
}
