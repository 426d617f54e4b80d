import type { TriangleMesh } from './mesh';

/** Length units a scan file may be in; everything inside knitbone is millimetres. */
export type LengthUnit = 'mm' | 'cm' | 'm';

export const MILLIMETRES_PER: Record<LengthUnit, number> = { mm: 1, cm: 10, m: 1000 };

/** The mesh in millimetres (a copy when scaling is needed). */
export function toMillimetres(mesh: TriangleMesh, units: LengthUnit): TriangleMesh {
  const k = MILLIMETRES_PER[units];
  if (k === 1) return mesh;
  return { positions: mesh.positions.map((x) => x * k), triangles: mesh.triangles };
}
