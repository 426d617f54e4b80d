import { z } from 'zod';

/**
 * Every numeric cut-off of ingest and segmentation, with its default and what it means.
 * Lengths are millimetres, angles degrees. These are settings, not hidden constants: the
 * import request and `knitbone inspect` accept overrides, and every stored result records
 * the settings that produced it.
 */
export const analysisSettingsSchema = z.object({
  /** Vertices closer than this are one vertex (weld). */
  weldToleranceMm: z.number().positive().default(0.001),
  /** Spacing of the resampled working copy used for matching. */
  sampleSpacingMm: z.number().positive().default(0.5),
  /** Iterations of bilateral normal filtering before region growing (Zheng et al. 2011). */
  normalFilterIterations: z.number().int().min(0).max(50).default(6),
  /** Range width of the bilateral filter, as a distance between unit normals (0..2). */
  normalFilterRange: z.number().positive().default(0.45),
  /** Largest angle between the filtered normals of two adjacent triangles in one region. */
  growAngleDeg: z.number().positive().max(90).default(18),
  /** An edge whose filtered normals differ by more than this is a ridge (a candidate break edge). */
  ridgeAngleDeg: z.number().positive().max(180).default(35),
  /** Regions smaller than this share of the fragment's area are merged into a neighbour. */
  minRegionAreaShare: z.number().min(0).max(0.5).default(0.002),
  /**
   * A region is original bone surface (outer cortical or medullary) when its area-weighted
   * mean |normal . radial direction| about the fitted shaft axis is at least this.
   */
  corticalRadialMin: z.number().min(0).max(1).default(0.82),
  /** Roughness above this multiple of the fragment's median roughness marks a rough region. */
  roughnessRatioFracture: z.number().positive().default(1.6),
  /** Fracture angle within this many degrees of 90 counts as a right angle (Villa & Mahieu 1991). */
  rightAngleToleranceDeg: z.number().positive().max(45).default(12),
  /** Share of a face's angle samples that must agree for "right" or "oblique"; else "mixed". */
  angleClassShare: z.number().min(0.5).max(1).default(0.65),
  /** Radius of the plane fits either side of a break edge. */
  anglePlaneRadiusMm: z.number().positive().default(2.5),
  /** Mean |outline tangent . shaft axis| below this: a transverse outline. */
  outlineTransverseMax: z.number().min(0).max(1).default(0.3),
  /** Mean |outline tangent . shaft axis| above this: a curved / V-shaped outline. */
  outlineCurvedMin: z.number().min(0).max(1).default(0.5),
});

export type AnalysisSettings = z.output<typeof analysisSettingsSchema>;

export function analysisSettings(overrides: Partial<AnalysisSettings> = {}): AnalysisSettings {
  return analysisSettingsSchema.parse(overrides);
}
