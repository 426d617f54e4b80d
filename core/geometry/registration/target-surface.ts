/**
 * A fragment's triangle surface prepared for closest-point queries: a bounding volume
 * hierarchy over its triangles (triangle-bvh.ts, checked against three-mesh-bvh), and each
 * triangle's unit normal (triangle numbers are the mesh's own).
 * Used by ICP and by the score.
 */
import { TriangleBvh, type TriangleHit } from './triangle-bvh';
import type { KdTree } from './nearest-neighbours';

export interface ClosestPoint {
  x: number;
  y: number;
  z: number;
  /** Unit normal of the triangle the closest point lies on (outward for a consistently wound mesh). */
  nx: number;
  ny: number;
  nz: number;
  distance: number;
  triangle: number;
  /** The sample the point is, for sampled surfaces (-1 otherwise): a hint for the next query of the same moving point. */
  sample?: number;
}

/** Anything that answers closest-point queries with a unit normal (a mesh BVH, or oriented samples). */
export interface ClosestPointSource {
  /** `hint`: the `sample` an earlier query of a nearby point returned (sampled surfaces use it; same answer). */
  closest(x: number, y: number, z: number, maxDistance?: number, out?: ClosestPoint, hint?: number): ClosestPoint | null;
}

/**
 * Oriented samples as a stand-in surface: the closest sample and its normal. Point-to-plane
 * residuals against sample tangent planes are as good as against the mesh while the samples
 * are dense, and a k-d tree query is much cheaper than a BVH query.
 */
export class SampledSurface implements ClosestPointSource {
  private readonly q = [0, 0, 0];
  constructor(readonly points: Float32Array, readonly normals: Float32Array, readonly tree: KdTree) {}

  closest(x: number, y: number, z: number, maxDistance = Infinity, out?: ClosestPoint, hint = -1): ClosestPoint | null {
    this.q[0] = x; this.q[1] = y; this.q[2] = z;
    const hit = this.tree.nearestOneNear(this.q, maxDistance * maxDistance, hint);
    if (hit.index < 0) return null;
    const i = hit.index;
    const res = out ?? ({} as ClosestPoint);
    res.x = this.points[3 * i]; res.y = this.points[3 * i + 1]; res.z = this.points[3 * i + 2];
    res.nx = this.normals[3 * i]; res.ny = this.normals[3 * i + 1]; res.nz = this.normals[3 * i + 2];
    res.distance = Math.sqrt(hit.dist2);
    res.triangle = -1;
    res.sample = i;
    return res;
  }
}

export class TargetSurface implements ClosestPointSource {
  readonly bvh: TriangleBvh;
  readonly triangleNormals: Float32Array;
  private readonly hit = {} as TriangleHit;

  /** `order`: a tree's triangle order stored before for this mesh (TriangleBvh), to build the same tree without sorting. */
  constructor(positions: Float32Array, triangles: Uint32Array, order?: Uint32Array) {
    this.bvh = new TriangleBvh(positions, triangles, order);
    const nt = triangles.length / 3;
    this.triangleNormals = new Float32Array(nt * 3);
    for (let t = 0; t < nt; t++) {
      const a = triangles[3 * t] * 3, b = triangles[3 * t + 1] * 3, c = triangles[3 * t + 2] * 3;
      const ux = positions[b] - positions[a], uy = positions[b + 1] - positions[a + 1], uz = positions[b + 2] - positions[a + 2];
      const vx = positions[c] - positions[a], vy = positions[c + 1] - positions[a + 1], vz = positions[c + 2] - positions[a + 2];
      const nx = uy * vz - uz * vy, ny = uz * vx - ux * vz, nz = ux * vy - uy * vx;
      const len = Math.hypot(nx, ny, nz) || 1;
      this.triangleNormals[3 * t] = nx / len;
      this.triangleNormals[3 * t + 1] = ny / len;
      this.triangleNormals[3 * t + 2] = nz / len;
    }
  }

  /** Closest surface point to (x, y, z) within maxDistance, or null. */
  closest(x: number, y: number, z: number, maxDistance = Infinity, out?: ClosestPoint): ClosestPoint | null {
    if (!this.bvh.closest(x, y, z, maxDistance, this.hit)) return null;
    const r = this.hit;
    const t = r.triangle;
    const res = out ?? ({} as ClosestPoint);
    res.x = r.x;
    res.y = r.y;
    res.z = r.z;
    res.nx = this.triangleNormals[3 * t];
    res.ny = this.triangleNormals[3 * t + 1];
    res.nz = this.triangleNormals[3 * t + 2];
    res.distance = r.distance;
    res.triangle = t;
    return res;
  }
}
