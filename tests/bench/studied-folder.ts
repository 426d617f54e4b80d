/**
 * A folder studied by candidate-restudy.ts, read for the studies that align its candidates
 * (stored-gap-study.ts, truth-gap-study.ts, worker-motion-dump.ts): its `candidate-study/` labels,
 * the candidate face pairs chosen as a propose run chooses them (k best per face, whole faces
 * offered, size classes from specimens.csv), and its fragments assembled from `candidate-cache/`
 * (analysis and prepared parts; nothing is analysed again), a bounded number kept at a time.
 */
import { existsSync, readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { candidateFacePairs, sizeClassCompatible, type IndexedFace } from '../../core/geometry/proposals/candidate-index';
import { assemblePrepared, type PreparedFragment } from '../../core/geometry/proposals/prepared-fragment';
import { invert, type RigidTransform } from '../../core/geometry/registration/rigid-transform';
import { readFragment, readPrepared } from '../../core/jobs/fragment-cache';
import { sizeClassesFromCsv } from './candidate-recall';
import type { StudyFragment } from './candidate-study';

export interface StudiedFolder {
  study: StudyFragment[];
  spacing: number;
  /** Index in `study` of a fragment number. */
  fragOf: Map<string, number>;
  /** Candidate face pairs per fragment pair `${a}:${b}` (a < b, indices in `study`). */
  pairsOf: Map<string, Array<[number, number]>>;
  /** The prepared fragment of `study[i]`. */
  prep(i: number): PreparedFragment;
}

export function readStudiedFolder(dir: string, options: { k: number; wholeFacePartners: number; keepFragments?: number }): StudiedFolder {
  const study = readdirSync(join(dir, 'candidate-study')).filter((f) => f.endsWith('.json'))
    .map((f) => JSON.parse(readFileSync(join(dir, 'candidate-study', f), 'utf8')) as StudyFragment)
    .filter((f) => f.faces.length > 0);
  const spacing = study[0].spacing;
  const fragOf = new Map(study.map((f, i) => [f.no, i]));
  const faces: IndexedFace[] = [];
  study.forEach((f, i) => f.faces.forEach((x, face) => faces.push({ fragment: i, face, whole: f.faces.findIndex((y) => y.parent === x.parent), traits: { ...x.traits, meanFpfh: Float32Array.from(x.traits.meanFpfh) } })));
  const classes = existsSync(join(dir, 'specimens.csv')) ? sizeClassesFromCsv(readFileSync(join(dir, 'specimens.csv'), 'utf8')) : undefined;
  const compatible = classes ? sizeClassCompatible(study.map((f) => classes.get(f.no) ?? null)) : undefined;
  const candidates = candidateFacePairs(faces, { k: options.k, wholeFacePartners: options.wholeFacePartners, ...(compatible ? { compatible } : {}) });
  const pairsOf = new Map<string, Array<[number, number]>>();
  for (const c of candidates) pairsOf.set(`${c.a}:${c.b}`, [...(pairsOf.get(`${c.a}:${c.b}`) ?? []), [c.faceA, c.faceB]]);
  const cache = join(dir, 'candidate-cache');
  const keep = options.keepFragments ?? Infinity;
  const prepared = new Map<number, PreparedFragment>();
  const prep = (i: number): PreparedFragment => {
    let p = prepared.get(i);
    if (!p) {
      const no = study[i].no;
      const c = readFragment(cache, no), parts = readPrepared(cache, no, { spacing, fpfhRadiusSpacings: 5 });
      if (!c || !parts) throw new Error(`${no}: not in ${cache}`);
      p = assemblePrepared(c.input, parts);
      if (prepared.size >= keep) prepared.delete(prepared.keys().next().value as number);
      prepared.set(i, p);
    }
    return p;
  };
  return { study, spacing, fragOf, pairsOf, prep };
}

/**
 * A true join of the generator's truth as the studies read it: the two pieces' indices in
 * `study` in increasing order (the order candidate pairs are keyed by), the true motion of the
 * second onto the first in that order, and whether a face of a piece holds at least 30% of the
 * join's break (the bench's reachability share).
 */
export function orderedJoin(folder: Pick<StudiedFolder, 'study' | 'fragOf'>, j: { a: string; b: string; breakId: number; transformBToA: RigidTransform }): { ia: number; ib: number; want: RigidTransform; on(fr: number, face: number): boolean } {
  let ia = folder.fragOf.get(j.a)!, ib = folder.fragOf.get(j.b)!;
  let want = j.transformBToA;
  if (ia > ib) { [ia, ib] = [ib, ia]; want = invert(want); }
  return { ia, ib, want, on: (fr, face) => (folder.study[fr].faces[face].breaks[String(j.breakId)] ?? 0) >= 0.3 };
}
