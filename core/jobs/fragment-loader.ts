/**
 * Read a scan file and make it ready for matching: parse (PLY, STL, OBJ), scale to millimetres,
 * analyse (fracture faces) and check that the result can be matched at all. Every refusal names
 * the file and says what to do (issue 6, item 8: no break face, degenerate or tiny fragments,
 * wrong units).
 */
import { createHash } from 'node:crypto';
import { readFileSync, statSync } from 'node:fs';
import { analyseFragment, type FragmentAnalysis } from '../geometry/analyse-fragment';
import { MeshFileError, parseMeshFile } from '../geometry/parse/index';
import { fragmentFromAnalysis } from '../geometry/proposals/fragment-from-analysis';
import type { FragmentInput } from '../geometry/proposals/prepared-fragment';
import type { ShaftAxis } from '../geometry/shaft-axis';
import type { AnalysisSettings } from '../geometry/settings';
import type { SurfaceClass } from '../geometry/surface-classes';
import { KnitboneError } from '../host/errors';

export type LengthUnit = 'mm' | 'cm' | 'm';
const TO_MM: Record<LengthUnit, number> = { mm: 1, cm: 10, m: 1000 };

/** Plausible sizes of a bone fragment, box diagonal in mm (common practice: from a few mm to a whole long bone). */
export const SMALLEST_FRAGMENT_MM = 4;
export const LARGEST_FRAGMENT_MM = 1500;
/** Fewer triangles than this cannot carry a break surface worth matching. */
export const FEWEST_TRIANGLES = 100;

export interface LoadedFragment {
  file: string;
  contentHash: string;
  input: FragmentInput;
  diagonalMm: number;
  centroid: [number, number, number];
  /** The fitted shaft axis (support < 0.5: not a shaft piece). */
  axis: ShaftAxis;
  warnings: string[];
}

/** How the scan was analysed when imported: its settings and the analyst's region class corrections. */
export interface AnalysisChoices {
  settings?: Partial<AnalysisSettings>;
  corrections?: Array<[number, SurfaceClass]>;
}

export function readScanBytes(file: string): Uint8Array {
  try {
    if (statSync(file).isDirectory()) throw new KnitboneError('bad-input', [{ file, message: 'this is a folder; give a mesh file (.ply, .stl or .obj)' }]);
    return readFileSync(file);
  } catch (err) {
    if (err instanceof KnitboneError) throw err;
    throw new KnitboneError('not-found', [{ file, message: 'cannot read this file; check the path' }]);
  }
}

export function contentHashOf(bytes: Uint8Array): string {
  return createHash('sha256').update(bytes).digest('hex');
}

export function loadFragment(file: string, units: LengthUnit = 'mm', bytes: Uint8Array = readScanBytes(file), choices: AnalysisChoices = {}): LoadedFragment {
  let parsed;
  try {
    parsed = parseMeshFile(bytes, file);
  } catch (err) {
    if (err instanceof MeshFileError) throw new KnitboneError('bad-input', [{ file, line: err.line, message: err.message }]);
    throw err;
  }
  const mesh = parsed.mesh;
  const scale = TO_MM[units];
  if (scale !== 1) {
    const p = new Float32Array(mesh.positions.length);
    for (let i = 0; i < p.length; i++) p[i] = mesh.positions[i] * scale;
    mesh.positions = p;
  }
  checkMatchableMesh(file, mesh, units);
  const analysis = analyseFragment(mesh, choices.settings ?? {}, new Map(choices.corrections ?? []));
  return { ...matchableFragment(file, analysis), contentHash: contentHashOf(bytes), warnings: parsed.warnings };
}

/** Refuse a mesh (already in mm) too small, too coarse or too large to be a bone fragment worth matching. */
export function checkMatchableMesh(file: string, mesh: { positions: Float32Array; triangles: Uint32Array }, units: LengthUnit): void {
  const nt = mesh.triangles.length / 3;
  const diag = diagonalOf(mesh.positions);
  if (nt < FEWEST_TRIANGLES || !(diag > 0)) {
    throw new KnitboneError('bad-input', [{ file, message: `has ${nt} triangles and is ${diag.toFixed(2)} mm across: too little surface to match; check that this is the full scan` }]);
  }
  if (diag < SMALLEST_FRAGMENT_MM) {
    throw new KnitboneError('bad-input', [{ file, message: `is ${diag.toFixed(3)} ${units === 'mm' ? 'mm' : `mm (${units} scaled)`} across, smaller than any fragment worth matching (${SMALLEST_FRAGMENT_MM} mm); if the file is not in ${units}, give its units (--units cm or --units m)` }]);
  }
  if (diag > LARGEST_FRAGMENT_MM) {
    throw new KnitboneError('bad-input', [{ file, message: `is ${Math.round(diag)} mm across, larger than any bone (${LARGEST_FRAGMENT_MM} mm); the file's units are probably not ${units}: give its units (--units mm, cm or m)` }]);
  }
}

/** What matching takes from an analysis; refused when the fragment has no break face. */
export function matchableFragment(file: string, analysis: FragmentAnalysis): Omit<LoadedFragment, 'contentHash' | 'warnings'> {
  const input = fragmentFromAnalysis(analysis);
  if (input.faces.length === 0) {
    throw new KnitboneError('bad-input', [{ file, message: 'no break face was found on this fragment, so it cannot be joined by its surfaces; check the scan covers the broken ends' }]);
  }
  return { file, input, diagonalMm: diagonalOf(input.positions), centroid: centroid(input.positions), axis: analysis.axis };
}

function diagonalOf(p: Float32Array): number {
  const mn = [Infinity, Infinity, Infinity], mx = [-Infinity, -Infinity, -Infinity];
  for (let i = 0; i < p.length; i += 3) for (let k = 0; k < 3; k++) {
    if (p[i + k] < mn[k]) mn[k] = p[i + k];
    if (p[i + k] > mx[k]) mx[k] = p[i + k];
  }
  return Math.hypot(mx[0] - mn[0], mx[1] - mn[1], mx[2] - mn[2]);
}

function centroid(p: Float32Array): [number, number, number] {
  const n = p.length / 3;
  let x = 0, y = 0, z = 0;
  for (let i = 0; i < p.length; i += 3) { x += p[i]; y += p[i + 1]; z += p[i + 2]; }
  return [x / n, y / n, z / n];
}
