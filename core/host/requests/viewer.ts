import { readFileSync, statSync } from 'node:fs';
import { dirname, isAbsolute, resolve } from 'node:path';
import { z } from 'zod';
import { withCatalogue } from '../../catalogue/catalogue';
import { analyseFragment } from '../../geometry/analyse-fragment';
import { parseMeshFile } from '../../geometry/parse/index';
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

/**
 * The analysed (welded) mesh of one scan file and its fracture faces, in the scan file's
 * own frame in millimetres, so join transforms (B's file frame -> A's) place it directly.
 */
export function viewerMeshOf(path: string, units: string, scanId: number): ViewerMesh {
  const stat = statSync(path);
  const key = `${path}\u0000${stat.size}\u0000${stat.mtimeMs}\u0000${units}`;
  const hit = cache.get(key);
  if (hit) return { ...hit, scanId };
  const parsed = parseMeshFile(readFileSync(path), path);
  const scale = UNIT_SCALE[units] ?? 1;
  const positions = scale === 1 ? parsed.mesh.positions : parsed.mesh.positions.map((v) => v * scale);
  const analysis = analyseFragment({ positions, triangles: parsed.mesh.triangles });
  const triangleFaces = new Int32Array(analysis.mesh.triangles.length / 3).fill(-1);
  for (const f of analysis.fractureFaces) for (const t of f.triangleIds) triangleFaces[t] = f.id;
  const out: ViewerMesh = {
    scanId,
    units: 'mm',
    positions: base64(analysis.mesh.positions),
    triangles: base64(analysis.mesh.triangles),
    triangleFaces: base64(triangleFaces),
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
          return viewerMeshOf(path, scan.units, scan.id);
        } catch (err) {
          throw new KnitboneError('not-found', [{ file: scan.path, message: `the scan cannot be drawn: ${(err as Error).message}` }]);
        }
      }),
  }),
};
