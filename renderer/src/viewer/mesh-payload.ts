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

/** A region of the segmentation with the class in force (the analyst's correction, if any). */
export interface RegionSummary {
  id: number;
  surfaceClass: SurfaceClassName;
  area: number;
  triangles: number;
  corrected: boolean;
}

export type SurfaceClassName = 'fracture' | 'outer-cortical' | 'medullary' | 'articular';

export interface MeshPayload {
  /** base64 of little-endian float32 x,y,z per vertex, millimetres. */
  positions: string;
  /** base64 of little-endian uint32, three vertex indices per triangle. */
  triangles: string;
  /** base64 of little-endian int32: the face id of each triangle (-1 none), when segmented. */
  triangleFaces?: string | null;
  faces?: FaceSummary[] | null;
  /** base64 of little-endian int32: the region id of each triangle, when segmented. */
  triangleRegions?: string | null;
  regions?: RegionSummary[] | null;
  /** The catalogue keeps this scan's regions, so a class can be corrected. */
  correctable?: boolean;
  scanId?: number;
}

export interface MeshView {
  positions: Float32Array;
  triangles: Uint32Array;
  triangleFaces: Int32Array | null;
  faces: FaceSummary[];
  triangleRegions: Int32Array | null;
  regions: RegionSummary[];
  correctable: boolean;
  scanId: number | null;
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
  const triangleRegions = p.triangleRegions ? new Int32Array(bytesOf(p.triangleRegions)) : null;
  if (positions.length % 3 !== 0 || triangles.length % 3 !== 0) throw new Error('the scan sent to the viewer is malformed');
  if (triangleFaces && triangleFaces.length !== triangles.length / 3) throw new Error('the face labels do not match the scan');
  if (triangleRegions && triangleRegions.length !== triangles.length / 3) throw new Error('the region labels do not match the scan');
  return {
    positions,
    triangles,
    triangleFaces,
    faces: p.faces ?? [],
    triangleRegions,
    regions: p.regions ?? [],
    correctable: p.correctable ?? false,
    scanId: p.scanId ?? null,
  };
}
