/**
 * Which faces a motion puts in contact: for a rigid motion of B onto A, every pair of the two
 * fragments' prepared faces (whole faces, pieces and patches) with the share of each face's
 * samples in opposed contact with the other (inOpposedContact, within one sample spacing).
 * Why: the screen finds a motion on one face pair and the fine step scores it on that pair, but a
 * motion near the truth can come from a face pair that does not meet under it (a part of a merged
 * break face that looks like the partner while another part of the same face, or a face that is
 * not a candidate, is what meets it): scored on its own pair it reads near 0 (dev s340 at 200
 * fragments, QS-10088|QS-10591: 0.008 on the faces it was found on, 0.999 on the faces that
 * meet; DEVELOPERS.md, session 24). The faces a motion puts most in contact are the ones to
 * refine and score it on. Kept cheap (it runs on every fragment pair): strided samples, a pair
 * skipped when the two faces' bounding spheres do not meet under the motion, and A's side counted
 * only when B's side reaches the minimum share.
 */
import { inOpposedContact } from '../registration/opposed-contact';
import { invert, type RigidTransform } from '../registration/rigid-transform';
import { stridedSamples } from '../registration/strided-samples';
import type { PreparedFace, PreparedFragment } from './prepared-fragment';

export interface FacePairContact {
  /** Prepared face of A and of B. */
  i: number;
  j: number;
  /** Share of A's face samples (of the strided set) in contact with B's face, and of B's with A's. */
  shareA: number;
  shareB: number;
}

interface FaceSamples {
  points: Float32Array;
  normals: Float32Array;
  /** Bounding sphere of the face's samples. */
  centre: [number, number, number];
  radius: number;
}

// strided samples and bounding sphere per face and sample count, made once per prepared face
const samplesCache = new WeakMap<PreparedFace, Map<number, FaceSamples>>();

function faceSamples(face: PreparedFace, max: number): FaceSamples {
  let byMax = samplesCache.get(face);
  if (!byMax) samplesCache.set(face, (byMax = new Map()));
  let s = byMax.get(max);
  if (!s) {
    const { points, normals } = stridedSamples(face.points, face.normals, max);
    const c = face.centroid;
    let r2 = 0;
    for (let k = 0; k < face.points.length; k += 3) {
      const dx = face.points[k] - c[0], dy = face.points[k + 1] - c[1], dz = face.points[k + 2] - c[2];
      r2 = Math.max(r2, dx * dx + dy * dy + dz * dz);
    }
    s = { points, normals, centre: [c[0], c[1], c[2]], radius: Math.sqrt(r2) };
    byMax.set(max, s);
  }
  return s;
}

function moved(T: RigidTransform, p: readonly number[]): [number, number, number] {
  return [T[0] * p[0] + T[1] * p[1] + T[2] * p[2] + T[3], T[4] * p[0] + T[5] * p[1] + T[6] * p[2] + T[7], T[8] * p[0] + T[9] * p[1] + T[10] * p[2] + T[11]];
}

/**
 * Every face pair of A and B that motion `T` (B into A's frame) puts in contact, with each side's
 * share of at most `samples` strided samples within `spacing` and with opposed normals; pairs whose
 * B side's share is under `minShare` are left out before A's side is counted (0: every pair in
 * contact at all).
 */
export function contactFacePairs(a: PreparedFragment, b: PreparedFragment, T: RigidTransform, samples: number, spacing: number, minShare = 0): FacePairContact[] {
  const back = invert(T);
  const q = [0, 0, 0];
  const out: FacePairContact[] = [];
  const sa = a.faces.map((f) => faceSamples(f, samples));
  const sb = b.faces.map((f) => faceSamples(f, samples));
  for (let j = 0; j < b.faces.length; j++) {
    const cb = moved(T, sb[j].centre);
    for (let i = 0; i < a.faces.length; i++) {
      const ca = sa[i].centre;
      const d = Math.hypot(cb[0] - ca[0], cb[1] - ca[1], cb[2] - ca[2]);
      if (d > sa[i].radius + sb[j].radius + spacing) continue;
      const FA = a.faces[i], FB = b.faces[j];
      let kb = 0;
      const nb = sb[j].points.length / 3;
      for (let k = 0; k < nb; k++) if (inOpposedContact(T, sb[j].points, sb[j].normals, k, FA.tree, FA.normals, spacing, q)) kb++;
      if (kb === 0 || kb < minShare * nb) continue;
      let ka = 0;
      const na = sa[i].points.length / 3;
      for (let k = 0; k < na; k++) if (inOpposedContact(back, sa[i].points, sa[i].normals, k, FB.tree, FB.normals, spacing, q)) ka++;
      out.push({ i, j, shareA: ka / Math.max(1, na), shareB: kb / Math.max(1, nb) });
    }
  }
  return out;
}

/**
 * The face pair among `contacts` that a motion meets best: the largest smaller share of the two
 * faces (a part that lies wholly in the contact beats the whole face it belongs to, whose share the
 * rest of the face dilutes), ties by the larger share; undefined when none reaches `minShare`.
 */
export function bestContactPair(contacts: FacePairContact[], minShare: number): FacePairContact | undefined {
  let best: FacePairContact | undefined;
  const lo = (c: FacePairContact): number => Math.min(c.shareA, c.shareB);
  const hi = (c: FacePairContact): number => Math.max(c.shareA, c.shareB);
  for (const c of contacts) {
    if (lo(c) < minShare) continue;
    if (!best || lo(c) > lo(best) || (lo(c) === lo(best) && hi(c) > hi(best))) best = c;
  }
  return best;
}

/**
 * For each of `motions` (refined motions of B onto A, each from its face pair i, j), the face pair
 * it puts most in contact (bestContactPair over contactFacePairs) when that is another pair than
 * its own and not one of `screened` (face pairs screened and refined on their own already: on dev
 * s340 at 200 fragments three quarters of the motions sent elsewhere went to such pairs, and none
 * of the joins gained did): the motion to refine and score again there (pairwise-match.ts matchFragments,
 * MatchParameters.contactPairMotions; motions that end alike are merged after scoring, by
 * distinctBest).
 */
export function contactPairStarts(
  a: PreparedFragment,
  b: PreparedFragment,
  motions: Array<{ transform: RigidTransform; i: number; j: number }>,
  samples: number,
  minShare: number,
  spacing: number,
  screened: Array<[number, number]> = [],
): Array<{ transform: RigidTransform; i: number; j: number }> {
  const out: Array<{ transform: RigidTransform; i: number; j: number }> = [];
  const own = new Set(screened.map(([i, j]) => `${i},${j}`));
  for (const m of motions) {
    const c = bestContactPair(contactFacePairs(a, b, m.transform, samples, spacing, minShare), minShare);
    if (!c || (c.i === m.i && c.j === m.j) || own.has(`${c.i},${c.j}`)) continue;
    out.push({ transform: m.transform, i: c.i, j: c.j });
  }
  return out;
}
