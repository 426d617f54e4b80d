import { STLLoader } from 'three/examples/jsm/loaders/STLLoader.js';
import type { TriangleMesh } from '../mesh';
import { meshFromGeometry, withCapturedConsole } from './from-three';
import { MeshFileError } from './mesh-file-error';

export type StlFormat = 'stl-ascii' | 'stl-binary';

/**
 * Binary STL: 80-byte header, uint32 little-endian triangle count, 50 bytes per triangle.
 * ASCII STL starts with "solid" and lists facets; a binary header may also start with
 * "solid", so the size rule decides first.
 */
export function stlFormat(bytes: Uint8Array): StlFormat {
  if (bytes.length >= 84) {
    const n = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength).getUint32(80, true);
    if (84 + 50 * n === bytes.length) return 'stl-binary';
  }
  const head = new TextDecoder().decode(bytes.subarray(0, Math.min(bytes.length, 1024)));
  if (/^\s*solid/.test(head) && /facet|endsolid/.test(head)) return 'stl-ascii';
  return 'stl-binary';
}

export function parseStl(bytes: Uint8Array): { mesh: TriangleMesh; format: StlFormat; warnings: string[] } {
  const format = stlFormat(bytes);
  if (format === 'stl-binary') {
    if (bytes.length < 84) throw new MeshFileError(`binary STL is truncated: ${bytes.length} bytes, less than the 84-byte header`);
    const n = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength).getUint32(80, true);
    const need = 84 + 50 * n;
    if (bytes.length < need) {
      throw new MeshFileError(`binary STL is truncated: the header declares ${n} triangles (${need} bytes) but the file has ${bytes.length} bytes`);
    }
    if (bytes.length > need) {
      throw new MeshFileError(`binary STL has ${bytes.length - need} bytes beyond the ${n} triangles its header declares: the count is wrong or the file is corrupt`);
    }
  } else {
    checkAsciiStl(new TextDecoder().decode(bytes));
  }
  const buffer = bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer;
  let geometry;
  let messages: string[];
  try {
    ({ value: geometry, messages } = withCapturedConsole(() => new STLLoader().parse(buffer)));
  } catch (err) {
    throw new MeshFileError(`STL could not be decoded: ${err instanceof Error ? err.message : String(err)}`);
  }
  if (messages.length) throw new MeshFileError(`STL is malformed: ${messages[0]}`);
  return { mesh: meshFromGeometry(geometry), format, warnings: [] };
}

/** Every facet has exactly three vertex lines of three numbers; facets are closed. */
function checkAsciiStl(text: string): void {
  const lines = text.split(/\r\n|\n|\r/);
  let inFacet = false;
  let vertices = 0;
  let facets = 0;
  let facetLine = 0;
  for (let i = 0; i < lines.length; i++) {
    const w = lines[i].trim().split(/\s+/);
    const lineNo = i + 1;
    switch (w[0]) {
      case 'facet':
        if (inFacet) throw new MeshFileError('ASCII STL opens a facet inside another facet', lineNo);
        inFacet = true;
        vertices = 0;
        facetLine = lineNo;
        break;
      case 'vertex': {
        if (!inFacet) throw new MeshFileError('ASCII STL has a vertex outside any facet', lineNo);
        if (w.length !== 4) throw new MeshFileError(`ASCII STL vertex needs 3 numbers, got ${w.length - 1}`, lineNo);
        for (const x of w.slice(1)) {
          if (!Number.isFinite(Number(x))) throw new MeshFileError(`ASCII STL vertex coordinate "${x.slice(0, 30)}" is not a finite number`, lineNo);
        }
        vertices++;
        break;
      }
      case 'endfacet':
        if (!inFacet) throw new MeshFileError('ASCII STL closes a facet that was not opened', lineNo);
        if (vertices !== 3) throw new MeshFileError(`ASCII STL facet has ${vertices} vertices; it needs 3`, facetLine);
        inFacet = false;
        facets++;
        break;
      default:
        break;
    }
  }
  if (inFacet) throw new MeshFileError('ASCII STL is truncated: the last facet is not closed', facetLine);
  if (facets === 0) throw new MeshFileError('the file holds no triangles: no facets in this ASCII STL');
}
