import { PLYLoader } from 'three/examples/jsm/loaders/PLYLoader.js';
import type { TriangleMesh } from '../mesh';
import { meshFromGeometry, withCapturedConsole } from './from-three';
import { MeshFileError } from './mesh-file-error';
import { checkPlyAsciiBody, checkPlyBinaryBody, readPlyHeader, type PlyFormat } from './ply-header';

/** Read a PLY file (ASCII, binary little- or big-endian): header and body checked, three decodes. */
export function parsePly(bytes: Uint8Array): { mesh: TriangleMesh; format: PlyFormat; warnings: string[] } {
  const header = readPlyHeader(bytes);
  if (header.format === 'ascii') {
    checkPlyAsciiBody(new TextDecoder().decode(bytes.subarray(header.bodyOffset)), header);
  } else {
    checkPlyBinaryBody(bytes, header);
  }
  const buffer = bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer;
  let geometry;
  let messages: string[];
  try {
    ({ value: geometry, messages } = withCapturedConsole(() => new PLYLoader().parse(buffer)));
  } catch (err) {
    throw new MeshFileError(`PLY body could not be decoded: ${err instanceof Error ? err.message : String(err)}`);
  }
  return { mesh: meshFromGeometry(geometry, true), format: header.format, warnings: messages };
}
