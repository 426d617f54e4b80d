/**
 * What a part of a fragment's surface is. A fracture face is a break surface; the others are
 * original bone surface: outer cortical (periosteal), medullary (the inner wall of the marrow
 * cavity) and articular ends. Codes are one byte per triangle.
 */
export type SurfaceClass = 'fracture' | 'outer-cortical' | 'medullary' | 'articular';

export const SURFACE_CLASSES: readonly SurfaceClass[] = ['fracture', 'outer-cortical', 'medullary', 'articular'];

export function surfaceClassCode(c: SurfaceClass): number {
  return SURFACE_CLASSES.indexOf(c);
}

export function isFracture(c: SurfaceClass): boolean {
  return c === 'fracture';
}
