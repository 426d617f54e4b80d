import type { TriangleMesh } from '../mesh';
import { MeshFileError } from './mesh-file-error';
import { parseObj } from './obj';
import { parsePly } from './ply';
import { parseStl } from './stl';

export { MeshFileError } from './mesh-file-error';

export type MeshFileFormat = 'ply-ascii' | 'ply-binary-le' | 'ply-binary-be' | 'stl-ascii' | 'stl-binary' | 'obj';

export interface ParsedMeshFile {
  /** Triangles in the order the file lists them (polygons fanned), vertices as stored. */
  mesh: TriangleMesh;
  format: MeshFileFormat;
  warnings: string[];
}

/** Default largest file we read: 2 GB (issue 5); a setting of the import. */
export const DEFAULT_MAX_MESH_BYTES = 2 * 1024 ** 3;

export const MESH_EXTENSIONS = ['.ply', '.stl', '.obj'] as const;

/**
 * Decode a mesh file's bytes. The extension chooses the reader (".ply", ".stl", ".obj");
 * without a known extension the first bytes decide. Throws MeshFileError saying what is wrong.
 */
export function parseMeshFile(bytes: Uint8Array, fileName: string, maxBytes = DEFAULT_MAX_MESH_BYTES): ParsedMeshFile {
  if (bytes.length > maxBytes) {
    throw new MeshFileError(`file is ${bytes.length} bytes, over the limit of ${maxBytes} bytes (raise the size limit to read it)`);
  }
  if (bytes.length === 0) throw new MeshFileError('file is empty');
  const ext = /\.[^./\\]+$/.exec(fileName.toLowerCase())?.[0];
  const kind = ext === '.ply' || ext === '.stl' || ext === '.obj' ? ext : sniff(bytes);
  if (kind === '.ply') {
    const r = parsePly(bytes);
    const format = r.format === 'ascii' ? 'ply-ascii' : r.format === 'binary_little_endian' ? 'ply-binary-le' : 'ply-binary-be';
    return { mesh: r.mesh, format, warnings: r.warnings };
  }
  if (kind === '.stl') {
    const r = parseStl(bytes);
    return { mesh: r.mesh, format: r.format, warnings: r.warnings };
  }
  if (kind === '.obj') {
    const r = parseObj(bytes);
    return { mesh: r.mesh, format: 'obj', warnings: r.warnings };
  }
  throw new MeshFileError('unknown mesh format: use a .ply, .stl or .obj file');
}

function sniff(bytes: Uint8Array): string | undefined {
  const head = new TextDecoder().decode(bytes.subarray(0, 256));
  if (head.startsWith('ply')) return '.ply';
  if (/^\s*solid/.test(head)) return '.stl';
  if (/^(#|v |o |g |mtllib)/m.test(head)) return '.obj';
  if (bytes.length >= 84) return '.stl';
  return undefined;
}
