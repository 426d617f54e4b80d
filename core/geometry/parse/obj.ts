import { Mesh, type BufferGeometry } from 'three';
import { OBJLoader } from 'three/examples/jsm/loaders/OBJLoader.js';
import type { TriangleMesh } from '../mesh';
import { meshFromGeometry, withCapturedConsole } from './from-three';
import { MeshFileError } from './mesh-file-error';

/**
 * Read a Wavefront OBJ file. Face indices are checked first (1-based, or negative counting
 * back from the last vertex read so far), because three's OBJLoader turns a bad index into
 * NaN coordinates; three then decodes, and every group is joined into one mesh.
 */
export function parseObj(bytes: Uint8Array): { mesh: TriangleMesh; warnings: string[] } {
  const text = new TextDecoder().decode(bytes);
  checkObjFaces(text);
  let group;
  let messages: string[];
  try {
    ({ value: group, messages } = withCapturedConsole(() => new OBJLoader().parse(text)));
  } catch (err) {
    throw new MeshFileError(`OBJ could not be decoded: ${err instanceof Error ? err.message : String(err)}`);
  }
  const parts: TriangleMesh[] = [];
  group.traverse((o) => {
    if (o instanceof Mesh) parts.push(meshFromGeometry(o.geometry as BufferGeometry));
  });
  if (parts.length === 0) throw new MeshFileError('the file holds no triangles: no faces ("f" lines) in this OBJ');
  return { mesh: concatMeshes(parts), warnings: messages };
}

function checkObjFaces(text: string): void {
  const lines = text.split(/\r\n|\n|\r/);
  let vertices = 0;
  let faces = 0;
  for (let i = 0; i < lines.length; i++) {
    const line = lines[i].trim();
    if (line.startsWith('v ') || line.startsWith('v\t')) {
      vertices++;
      const w = line.split(/\s+/);
      if (w.length < 4) throw new MeshFileError(`OBJ vertex needs 3 coordinates, got ${w.length - 1}`, i + 1);
      for (const x of w.slice(1, 4)) {
        if (!Number.isFinite(Number(x))) throw new MeshFileError(`OBJ vertex coordinate "${x.slice(0, 30)}" is not a finite number`, i + 1);
      }
    } else if (line.startsWith('f ') || line.startsWith('f\t')) {
      const w = line.split(/\s+/).slice(1);
      if (w.length < 3) throw new MeshFileError(`OBJ face has ${w.length} vertices; a face needs at least 3`, i + 1);
      for (const token of w) {
        const k = Number(token.split('/')[0]);
        const ok = Number.isInteger(k) && k !== 0 && (k > 0 ? k <= vertices : -k <= vertices);
        if (!ok) {
          throw new MeshFileError(`OBJ face refers to vertex "${token.slice(0, 30)}", but only ${vertices} vertices are defined before it`, i + 1);
        }
      }
      faces++;
    }
  }
  if (faces === 0) throw new MeshFileError('the file holds no triangles: no faces ("f" lines) in this OBJ');
}

function concatMeshes(parts: TriangleMesh[]): TriangleMesh {
  if (parts.length === 1) return parts[0];
  const nv = parts.reduce((s, p) => s + p.positions.length, 0);
  const nt = parts.reduce((s, p) => s + p.triangles.length, 0);
  const positions = new Float32Array(nv);
  const triangles = new Uint32Array(nt);
  let pv = 0;
  let pt = 0;
  for (const p of parts) {
    positions.set(p.positions, pv);
    const base = pv / 3;
    for (let i = 0; i < p.triangles.length; i++) triangles[pt + i] = p.triangles[i] + base;
    pv += p.positions.length;
    pt += p.triangles.length;
  }
  return { positions, triangles };
}
