import { readFileSync, statSync } from 'node:fs';
import { dirname, isAbsolute, resolve } from 'node:path';
import { z } from 'zod';
import { withCatalogue } from '../../catalogue/catalogue';
import { analyseFragment } from '../../geometry/analyse-fragment';
import { parseMeshFile } from '../../geometry/parse/index';
import type { AnalysisSettings } from '../../geometry/settings';
import type { SurfaceClass } from '../../geometry/surface-classes';
import { KnitboneError } from '../errors';
import { defineRequest } from '../request';

/** A scan for the app's 3D views: flat arrays as base64 (little-endian), faces summarised. */
export interface ViewerMesh {
  scanId: number;
  units: 'mm';
  positions: string;
  triangles: string;
  /** Face id of every triangle, -1 for original bone surface. */
  triangleFaces: string;
  /** Region id of every triangle (base64 int32): what the analyst selects and corrects. */
  triangleRegions: string;
  /** The segmentation's regions with their class in force (the analyst's correction, if any). */
  regions: Array<{ id: number; surfaceClass: SurfaceClass; area: number; triangles: number; corrected: boolean }>;
  /** True when the catalogue keeps this scan's regions, so corrections can be stored. */
  correctable: boolean;
  faces: Array<{
    id: number;
    kind: 'fracture';
    area: number;
    triangles: number;
    meanAngleDeg: number;
    angleClass: string;
    outlineClass: string;
    breakAge: string;
    evidence: string[];
  }>;
}

const UNIT_SCALE: Record<string, number> = { mm: 1, cm: 10, m: 1000 };
const cache = new Map<string, ViewerMesh>();
const CACHE_SIZE = 24;

function base64(a: Float32Array | Uint32Array | Int32Array): string {
  return Buffer.from(a.buffer, a.byteOffset, a.byteLength).toString('base64');
}

/** How a scan is segmented for the view: the stored settings and the corrections in force. */
export interface ViewerSegmentation {
  settings?: Partial<AnalysisSettings>;
  corrections?: ReadonlyMap<number, SurfaceClass>;
  correctable?: boolean;
}

/**
 * The analysed (welded) mesh of one scan file and its fracture faces, in the scan file's
 * own frame in millimetres, so join transforms (B's file frame -> A's) place it directly.
 * Segmented with the settings the scan was analysed with and the analyst's region class
 * corrections applied, so the view shows what the catalogue holds.
 */
export function viewerMeshOf(path: string, units: string, scanId: number, segmentation: ViewerSegmentation = {}): ViewerMesh {
  const stat = statSync(path);
  const corrections = segmentation.corrections ?? new Map<number, SurfaceClass>();
  const correctionKey = JSON.stringify([...corrections.entries()].sort((a, b) => a[0] - b[0]));
  const key = [path, stat.size, stat.mtimeMs, units, JSON.stringify(segmentation.settings ?? {}), correctionKey].join('\u0000');
  const hit = cache.get(key);
  if (hit) return { ...hit, scanId, correctable: segmentation.correctable ?? false };
  const parsed = parseMeshFile(readFileSync(path), path);
  const scale = UNIT_SCALE[units] ?? 1;
  const positions = scale === 1 ? parsed.mesh.positions : parsed.mesh.positions.map((v) => v * scale);
  const analysis = analyseFragment({ positions, triangles: parsed.mesh.triangles }, segmentation.settings ?? {}, corrections);
  const triangleFaces = new Int32Array(analysis.mesh.triangles.length / 3).fill(-1);
  for (const f of analysis.fractureFaces) for (const t of f.triangleIds) triangleFaces[t] = f.id;
  const triangleRegions = Int32Array.from(analysis.regionOfTriangle);
  const out: ViewerMesh = {
    scanId,
    units: 'mm',
    positions: base64(analysis.mesh.positions),
    triangles: base64(analysis.mesh.triangles),
    triangleFaces: base64(triangleFaces),
    triangleRegions: base64(triangleRegions),
    regions: analysis.regions.map((r) => ({
      id: r.id,
      surfaceClass: r.surfaceClass,
      area: Math.round(r.area * 1000) / 1000,
      triangles: r.triangleCount,
      corrected: corrections.has(r.id),
    })),
    correctable: segmentation.correctable ?? false,
    faces: analysis.fractureFaces.map((f) => ({
      id: f.id,
      kind: 'fracture',
      area: f.area,
      triangles: f.triangleIds.length,
      meanAngleDeg: f.meanAngleDeg,
      angleClass: f.angleClass,
      outlineClass: f.outlineClass,
      breakAge: f.breakAge.suggestion,
      evidence: f.breakAge.evidence,
    })),
  };
  cache.set(key, out);
  if (cache.size > CACHE_SIZE) cache.delete(cache.keys().next().value!);
  return out;
}

/** Requests of the app's views that no other area answers. */
export const viewerRequests = {
  'viewer.mesh': defineRequest({
    summary: "A specimen's scan (its newest, or the one named) as flat arrays for the 3D views, with its fracture faces",
    input: z
      .object({
        catalogue: z.string().trim().min(1, 'give the path of a catalogue file'),
        specimenId: z.number().int().positive(),
        scanId: z.number().int().positive().optional(),
      })
      .strict(),
    run: (input) =>
      withCatalogue(input.catalogue, (cat): ViewerMesh | null => {
        cat.specimens.require(input.specimenId);
        const scans = cat.scans.list({ specimenId: input.specimenId });
        const scan = input.scanId !== undefined ? scans.find((s) => s.id === input.scanId) : scans[scans.length - 1];
        if (!scan) {
          if (input.scanId !== undefined) throw new KnitboneError('not-found', `specimen ${input.specimenId} has no scan ${input.scanId}`);
          return null;
        }
        const path = isAbsolute(scan.path) ? scan.path : resolve(dirname(cat.path), scan.path);
        try {
          return viewerMeshOf(path, scan.units, scan.id, {
            settings: (scan.stats.settings ?? {}) as Partial<AnalysisSettings>,
            corrections: cat.regionClasses.inForce(scan.id),
            correctable: Array.isArray(scan.stats.regions),
          });
        } catch (err) {
          throw new KnitboneError('not-found', [{ file: scan.path, message: `the scan cannot be drawn: ${(err as Error).message}` }]);
        }
      }),
  }),
};
