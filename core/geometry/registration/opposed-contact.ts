/**
 * Is sample `i` of one face, moved by the rigid motion `M`, in contact with the other face:
 * within `radius` of one of its samples (k-d tree) with the two normals opposed (cosine below
 * -0.5)? The test behind RANSAC's inlier count and the overlap share of a coarse motion.
 * `q` is caller-owned scratch (3 numbers), so the test allocates nothing.
 */
import type { KdTree } from './nearest-neighbours';
import type { RigidTransform } from './rigid-transform';

export function inOpposedContact(
  M: RigidTransform,
  points: ArrayLike<number>,
  normals: ArrayLike<number>,
  i: number,
  tree: KdTree,
  treeNormals: ArrayLike<number>,
  radius: number,
  q: number[],
): boolean {
  const x = points[3 * i], y = points[3 * i + 1], z = points[3 * i + 2];
  q[0] = M[0] * x + M[1] * y + M[2] * z + M[3];
  q[1] = M[4] * x + M[5] * y + M[6] * z + M[7];
  q[2] = M[8] * x + M[9] * y + M[10] * z + M[11];
  const j = tree.nearestIndex(q, radius * radius);
  if (j < 0) return false;
  const a = normals[3 * i], b = normals[3 * i + 1], c = normals[3 * i + 2];
  const nx = M[0] * a + M[1] * b + M[2] * c;
  const ny = M[4] * a + M[5] * b + M[6] * c;
  const nz = M[8] * a + M[9] * b + M[10] * c;
  return nx * treeNormals[3 * j] + ny * treeNormals[3 * j + 1] + nz * treeNormals[3 * j + 2] < -0.5;
}
