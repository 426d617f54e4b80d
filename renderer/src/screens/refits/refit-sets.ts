import { Matrix4 } from 'three';
import { matrixFromRowMajor } from '../../viewer/build-geometry';
import type { JoinView } from '../review/review-model';

export interface RefitSetView {
  /** Catalogue numbers of the members, the first one the set's reference frame. */
  members: string[];
  /** Each member's pose in the reference member's scan frame (4x4 row-major, mm), when known. */
  poses: Map<string, number[] | null>;
  joins: JoinView[];
}

const isConjoin = (t: string | null): boolean => t === null || t.startsWith('conjoin');

function rowMajor(m: Matrix4): number[] {
  // three stores column-major; transpose to the design's row-major order.
  return m.clone().transpose().toArray();
}

/**
 * Refit sets from accepted conjoins (connected components), each member placed by chaining
 * join transforms along a breadth-first spanning tree from the first member. A join's
 * transform maps B's scan into A's frame, so pose(B) = pose(A) x T and pose(A) = pose(B) x T^-1.
 * Cycles are not reconciled here; where the host offers refined poses, those are used instead.
 */
export function refitSetsFromJoins(accepted: JoinView[]): RefitSetView[] {
  const conjoins = accepted.filter((j) => j.status === 'accepted' && isConjoin(j.type));
  const neighbours = new Map<string, JoinView[]>();
  for (const j of conjoins) {
    for (const s of [j.a, j.b]) neighbours.set(s, [...(neighbours.get(s) ?? []), j]);
  }
  const seen = new Set<string>();
  const sets: RefitSetView[] = [];
  const starts = [...neighbours.keys()].sort(new Intl.Collator(undefined, { numeric: true }).compare);
  for (const start of starts) {
    if (seen.has(start)) continue;
    const poses = new Map<string, Matrix4 | null>([[start, new Matrix4()]]);
    const members: string[] = [];
    const joins = new Set<JoinView>();
    const queue = [start];
    seen.add(start);
    while (queue.length) {
      const s = queue.shift()!;
      members.push(s);
      for (const j of neighbours.get(s) ?? []) {
        joins.add(j);
        const other = j.a === s ? j.b : j.a;
        if (seen.has(other)) continue;
        seen.add(other);
        const here = poses.get(s) ?? null;
        let pose: Matrix4 | null = null;
        if (here && j.transform) {
          const t = matrixFromRowMajor(j.transform);
          pose = j.a === s ? here.clone().multiply(t) : here.clone().multiply(t.invert());
        }
        poses.set(other, pose);
        queue.push(other);
      }
    }
    sets.push({
      members,
      poses: new Map([...poses].map(([k, m]) => [k, m ? rowMajor(m) : null])),
      joins: [...joins].sort((x, y) => x.id - y.id),
    });
  }
  return sets.sort((x, y) => y.members.length - x.members.length);
}
