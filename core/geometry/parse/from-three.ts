import type { BufferGeometry } from 'three';
import type { TriangleMesh } from '../mesh';
import { MeshFileError } from './mesh-file-error';

/**
 * Copy a three.js geometry into a TriangleMesh and check what three does not: every
 * coordinate finite, every index inside the vertex list, at least one triangle.
 * A geometry without an index is a triangle soup (STL, OBJ): vertices 3k, 3k+1, 3k+2;
 * for an indexed format (PLY) a missing index means the file has no faces.
 */
export function meshFromGeometry(geometry: BufferGeometry, indexed = false): TriangleMesh {
  const attr = geometry.getAttribute('position');
  if (!attr || attr.itemSize !== 3) throw new MeshFileError('the file holds no vertex positions');
  const src = attr.array as ArrayLike<number>;
  const nVerts = attr.count;
  const positions = new Float32Array(nVerts * 3);
  for (let i = 0; i < nVerts * 3; i++) {
    const v = src[i];
    if (!Number.isFinite(v)) {
      throw new MeshFileError(`vertex ${Math.floor(i / 3)} has a coordinate that is not a finite number (${String(v)})`);
    }
    positions[i] = v;
  }
  const index = geometry.getIndex();
  let triangles: Uint32Array;
  if (index) {
    const arr = index.array as ArrayLike<number>;
    if (arr.length % 3 !== 0) throw new MeshFileError('the face list does not divide into triangles');
    triangles = new Uint32Array(arr.length);
    for (let i = 0; i < arr.length; i++) {
      const k = arr[i];
      if (!Number.isInteger(k) || k < 0 || k >= nVerts) {
        throw new MeshFileError(`face ${Math.floor(i / 3)} refers to vertex ${String(k)}, but the file has vertices 0 to ${nVerts - 1}`);
      }
      triangles[i] = k;
    }
  } else {
    if (indexed) throw new MeshFileError('the file holds no triangles: a surface scan needs faces, not only points');
    if (nVerts % 3 !== 0) throw new MeshFileError('the triangle list is incomplete (vertex count is not a multiple of 3)');
    triangles = new Uint32Array(nVerts);
    for (let i = 0; i < nVerts; i++) triangles[i] = i;
  }
  if (triangles.length === 0) throw new MeshFileError('the file holds no triangles: a surface scan needs faces, not only points');
  return { positions, triangles };
}

/** Run a three.js loader with its console chatter captured instead of printed. */
export function withCapturedConsole<T>(fn: () => T): { value: T; messages: string[] } {
  const messages: string[] = [];
  const saved = { warn: console.warn, error: console.error, log: console.log };
  const capture = (...args: unknown[]): void => {
    messages.push(args.map(String).join(' '));
  };
  console.warn = capture;
  console.error = capture;
  console.log = capture;
  try {
    return { value: fn(), messages };
  } finally {
    console.warn = saved.warn;
    console.error = saved.error;
    console.log = saved.log;
  }
}
