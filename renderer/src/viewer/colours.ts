/** Colours of the 3D views (sRGB 0..1, as CSS writes them; build-geometry converts them to linear). Chosen to read on both themes. */
export const SURFACE = {
  bone: [0.86, 0.82, 0.72],
  boneAlt: [0.74, 0.78, 0.84],
  fracture: [0.85, 0.47, 0.16],
  selected: [0.2, 0.55, 0.9],
  /** Original surface classes, when a view colours every region by its class. */
  medullary: [0.55, 0.4, 0.34],
  articular: [0.66, 0.79, 0.62],
} as const;

/** The colour of a region by its surface class (outer cortical surface keeps the part's own colour). */
export function classColour(surfaceClass: string, base: readonly number[]): readonly number[] {
  if (surfaceClass === 'fracture') return SURFACE.fracture;
  if (surfaceClass === 'medullary') return SURFACE.medullary;
  if (surfaceClass === 'articular') return SURFACE.articular;
  return base;
}

/**
 * Contact-gap ramp: 0 mm (touching) deep teal, 1 mm yellow, 2.5 mm and more: no contact
 * (the surface's own colour shows).
 */
export function gapColour(mm: number, base: readonly number[]): [number, number, number] {
  const t = Math.min(1, Math.max(0, mm / 2.5));
  if (t >= 1) return [base[0], base[1], base[2]];
  const stops: Array<[number, [number, number, number]]> = [
    [0, [0.05, 0.45, 0.45]],
    [0.4, [0.95, 0.85, 0.25]],
    [1, [base[0], base[1], base[2]]],
  ];
  for (let i = 1; i < stops.length; i++) {
    const [t1, c1] = stops[i];
    const [t0, c0] = stops[i - 1];
    if (t <= t1) {
      const u = (t - t0) / (t1 - t0);
      return [c0[0] + (c1[0] - c0[0]) * u, c0[1] + (c1[1] - c0[1]) * u, c0[2] + (c1[2] - c0[2]) * u];
    }
  }
  return [base[0], base[1], base[2]];
}
