/**
 * Candidate pruning (design.md section 7, step 5): every break face of the assemblage goes into
 * one k-d tree by its descriptor; each face asks for the k faces nearest to what its partner
 * should look like (partnerDescriptor). Only those face pairs get the expensive alignment, so
 * the work grows like F log F in the number of faces F, not F squared. Faces of one fragment
 * never pair with each other.
 */
import { KdTree } from '../registration/nearest-neighbours';
import { partnerDescriptor } from './face-descriptor';

export interface IndexedFace {
  fragment: number;
  face: number;
  descriptor: Float32Array;
  /** Faces smaller than this share of the larger face's area are not partners (size may prune). */
  area: number;
}

export interface FacePairCandidate {
  /** Fragment indices, a < b. */
  a: number;
  b: number;
  faceA: number;
  faceB: number;
  /** Descriptor distance (smaller is more alike). */
  distance: number;
}

/** Candidate face pairs from k nearest partners per face; exhaustive = every pair of faces of different fragments. */
export function candidateFacePairs(faces: IndexedFace[], options: { k: number; exhaustive?: boolean }): FacePairCandidate[] {
  const out = new Map<string, FacePairCandidate>();
  const add = (i: number, j: number, distance: number): void => {
    let fi = faces[i], fj = faces[j];
    if (fi.fragment === fj.fragment) return;
    if (fi.fragment > fj.fragment) [fi, fj] = [fj, fi];
    const key = `${fi.fragment}:${fi.face}:${fj.fragment}:${fj.face}`;
    const old = out.get(key);
    if (!old || old.distance > distance) out.set(key, { a: fi.fragment, b: fj.fragment, faceA: fi.face, faceB: fj.face, distance });
  };
  if (options.exhaustive) {
    for (let i = 0; i < faces.length; i++) for (let j = i + 1; j < faces.length; j++) add(i, j, 0);
    return [...out.values()];
  }
  if (faces.length === 0) return [];
  const dim = faces[0].descriptor.length;
  const data = new Float32Array(faces.length * dim);
  faces.forEach((f, i) => data.set(f.descriptor, i * dim));
  const tree = new KdTree(data, dim);
  for (let i = 0; i < faces.length; i++) {
    const q = partnerDescriptor(faces[i].descriptor);
    // ask for a few extra to make up for faces of the same fragment
    const r = tree.nearest(q, options.k + 3);
    let taken = 0;
    for (let m = 0; m < r.indices.length && taken < options.k; m++) {
      const j = r.indices[m];
      if (faces[j].fragment === faces[i].fragment) continue;
      add(i, j, Math.sqrt(r.dist2[m]));
      taken++;
    }
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
