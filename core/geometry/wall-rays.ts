import { BufferAttribute, BufferGeometry, DoubleSide, Ray } from 'three';
import { MeshBVH } from 'three-mesh-bvh';
import type { TriangleMesh } from './mesh';

/**
 * Rays shot into the bone from its surface (the shape diameter idea of Shapira, Shamir &
 * Cohen-Or 2008, one ray per sampled triangle along the inward normal, in a BVH from
 * three-mesh-bvh). On a shaft wall the ray crosses the cortex and leaves through the other
 * wall face nearly head-on; on a break face it runs along inside the wall and leaves
 * obliquely, or far away. Per sampled triangle: the distance to the exit and the cosine
 * between the ray and the exit surface's normal (1 = head-on).
 */
export interface WallRays {
  /** Triangles that got a ray. */
  triangles: Uint32Array;
  distance: Float32Array;
  exitCosine: Float32Array;
  /** The triangle each ray leaves through (-1 when it leaves through none). */
  exitTriangle: Int32Array;
  /**
   * Per ray, where a second ray from the same triangle, shot the other way (along the outward
   * normal, into the air), meets the fragment again: the cosine between that ray and the
   * normal of the surface it meets, negated (1 = the two surfaces face each other squarely),
   * or -2 when it meets nothing. The medullary surface looks across the cavity at its other
   * side when the fragment holds some of it; outer surface and the break faces of a splinter
   * lie on its outside and look into open air. Filled only when `outward` is asked for (all -2 otherwise).
   */
  outwardCosine: Float32Array;
}

/** Rays from an even stride of at most `maxRays` triangles, or from the triangles listed in `from`. */
export function castWallRays(mesh: TriangleMesh, triNormals: Float32Array, centroids: Float32Array, maxRays: number, from?: ArrayLike<number>, outward = false): WallRays {
  const nt = triNormals.length / 3;
  const step = Math.max(1, Math.ceil(nt / maxRays));
  const geometry = new BufferGeometry();
  geometry.setAttribute('position', new BufferAttribute(mesh.positions, 3));
  // A copy of the index, and an indirect BVH: the default build reorders the index in place,
  // and hit.faceIndex must name our triangles.
  geometry.setIndex(new BufferAttribute(mesh.triangles.slice(), 1));
  const bvh = new MeshBVH(geometry, { indirect: true });
  const shooters = from ? Uint32Array.from(from) : Uint32Array.from({ length: Math.ceil(nt / step) }, (_, i) => i * step);
  const n = shooters.length;
  const triangles = new Uint32Array(n), distance = new Float32Array(n), exitCosine = new Float32Array(n), exitTriangle = new Int32Array(n).fill(-1), outwardCosine = new Float32Array(n).fill(-2);
  const ray = new Ray();
  for (let k = 0; k < n; k++) {
    const f = shooters[k];
    const nx = triNormals[3 * f], ny = triNormals[3 * f + 1], nz = triNormals[3 * f + 2];
    triangles[k] = f;
    if (outward) {
      ray.origin.set(centroids[3 * f] + nx * 1e-3, centroids[3 * f + 1] + ny * 1e-3, centroids[3 * f + 2] + nz * 1e-3);
      ray.direction.set(nx, ny, nz);
      const back = bvh.raycastFirst(ray, DoubleSide);
      if (back && back.faceIndex !== undefined && back.faceIndex !== null && back.faceIndex !== f) {
        const g = back.faceIndex;
        outwardCosine[k] = -(nx * triNormals[3 * g] + ny * triNormals[3 * g + 1] + nz * triNormals[3 * g + 2]);
      }
    }
    ray.origin.set(centroids[3 * f] - nx * 1e-3, centroids[3 * f + 1] - ny * 1e-3, centroids[3 * f + 2] - nz * 1e-3);
    ray.direction.set(-nx, -ny, -nz);
    const hit = bvh.raycastFirst(ray, DoubleSide);
    if (!hit || hit.faceIndex === undefined || hit.faceIndex === null) {
      distance[k] = Infinity;
      exitCosine[k] = 0;
      continue;
    }
    const g = hit.faceIndex;
    exitTriangle[k] = g;
    distance[k] = hit.distance;
    exitCosine[k] = -(nx * triNormals[3 * g] + ny * triNormals[3 * g + 1] + nz * triNormals[3 * g + 2]);
  }
  geometry.dispose();
  return { triangles, distance, exitCosine, exitTriangle, outwardCosine };
}
