/**
 * Analytic test shapes built with three.js's own geometry generators (a reference library),
 * welded into TriangleMesh form.
 */
import { BufferGeometry, CylinderGeometry, IcosahedronGeometry, BoxGeometry } from 'three';
import type { TriangleMesh } from '../../../core/geometry/mesh';
import { weldVertices } from '../../../core/geometry/weld';

export function fromThree(g: BufferGeometry): TriangleMesh {
  const pos = g.getAttribute('position').array as Float32Array;
  const idx = g.getIndex();
  const triangles = idx ? Uint32Array.from(idx.array as ArrayLike<number>) : Uint32Array.from({ length: pos.length / 3 }, (_, i) => i);
  return weldVertices({ positions: Float32Array.from(pos), triangles }, 1e-5).mesh;
}

/** A geodesic sphere of radius r (icosahedron subdivided `detail` times). */
export function sphere(r: number, detail = 5): TriangleMesh {
  return fromThree(new IcosahedronGeometry(r, detail));
}

/** An open tube (side wall only) of radius r and length h along y. */
export function openCylinder(r: number, h: number, radial = 96, heightSegments = 48): TriangleMesh {
  return fromThree(new CylinderGeometry(r, r, h, radial, heightSegments, true));
}

/** A closed cylinder (with caps). */
export function closedCylinder(r: number, h: number, radial = 96, heightSegments = 8): TriangleMesh {
  return fromThree(new CylinderGeometry(r, r, h, radial, heightSegments, false));
}

export function box(w: number, h: number, d: number): TriangleMesh {
  return fromThree(new BoxGeometry(w, h, d));
}
