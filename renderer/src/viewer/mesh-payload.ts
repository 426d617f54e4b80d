/**
 * A scan as it travels from the host to the viewer: flat typed arrays (design.md: geometry
 * works on Float32Array positions and Uint32Array triangles), base64-encoded in JSON, and
 * the fracture/original faces of its segmentation when there is one.
 */
export interface FaceSummary {
  id: number;
  kind: 'fracture' | 'original' | string;
  area?: number;
  triangles?: number;
  meanAngleDeg?: number | null;
  angleClass?: string | null;
  outlineClass?: string | null;
}

export interface MeshPayload {
  /** base64 of little-endian float32 x,y,z per vertex, millimetres. */
  positions: string;
  /** base64 of little-endian uint32, three vertex indices per triangle. */
  triangles: string;
  /** base64 of little-endian int32: the face id of each triangle (-1 none), when segmented. */
  triangleFaces?: string | null;
  faces?: FaceSummary[] | null;
}

export interface MeshView {
  positions: Float32Array;
  triangles: Uint32Array;
  triangleFaces: Int32Array | null;
  faces: FaceSummary[];
}

function bytesOf(b64: string): ArrayBuffer {
  const bin = atob(b64);
  const out = new Uint8Array(bin.length);
  for (let i = 0; i < bin.length; i++) out[i] = bin.charCodeAt(i);
  return out.buffer;
}

export function decodeMesh(p: MeshPayload): MeshView {
  const positions = new Float32Array(bytesOf(p.positions));
  const triangles = new Uint32Array(bytesOf(p.triangles));
  const triangleFaces = p.triangleFaces ? new Int32Array(bytesOf(p.triangleFaces)) : null;
  if (positions.length % 3 !== 0 || triangles.length % 3 !== 0) throw new Error('the scan sent to the viewer is malformed');
  if (triangleFaces && triangleFaces.length !== triangles.length / 3) throw new Error('the face labels do not match the scan');
  return { positions, triangles, triangleFaces, faces: p.faces ?? [] };
}
