/**
 * The segmentation studies' reader: every fragment of generated folders (truth.json) with its
 * truth labels, its analysis and the per-triangle figures the pipeline works on (topology, normals,
 * areas, centroids, bilaterally filtered normals) rebuilt from the analysed mesh.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { analyseFragment, type FragmentAnalysis } from '../../core/geometry/analyse-fragment';
import { triangleNormalsAndAreas, type TriangleMesh } from '../../core/geometry/mesh';
import { bilateralNormalFilter, triangleCentroids } from '../../core/geometry/normal-filter';
import { parseMeshFile } from '../../core/geometry/parse/index';
import { buildTopology, type Topology } from '../../core/geometry/topology';

export interface StudyTruthFragment { catalogueNo: string; scanFile: string; boneId: string; triangleLabels: string; element: string }

export interface StudyFragment {
  frag: StudyTruthFragment;
  /** Truth label per input triangle (>= 2: break). */
  labels: Buffer;
  /** The mesh as read (input triangles). */
  source: TriangleMesh;
  a: FragmentAnalysis;
  topo: Topology;
  normals: Float32Array;
  areas: Float64Array;
  centroids: Float32Array;
  filtered: Float32Array;
}

/** A fragment of a generated folder as read, with its truth labels and its input triangles' areas (nothing analysed). */
export interface LabelledScan {
  frag: StudyTruthFragment;
  /** Truth label per input triangle (>= 2: break). */
  labels: Buffer;
  /** The mesh as read (input triangles). */
  source: TriangleMesh;
  /** Area of each input triangle, and their sum. */
  inputAreas: Float64Array;
  total: number;
}

/** Reads every fragment of `dir` (truth.json and its scans) with its truth labels. */
export function* labelledScans(dir: string): Generator<LabelledScan> {
  const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { fragments: StudyTruthFragment[] };
  for (const frag of truth.fragments) {
    const source = parseMeshFile(readFileSync(join(dir, frag.scanFile)), frag.scanFile).mesh;
    const inputAreas = triangleNormalsAndAreas(source).areas;
    let total = 0;
    for (let f = 0; f < inputAreas.length; f++) total += inputAreas[f];
    yield { frag, labels: Buffer.from(frag.triangleLabels, 'base64'), source, inputAreas, total };
  }
}

/**
 * Per-triangle fracture/original agreement of an analysis with the truth labels, weighted by the
 * input triangles' areas (the segmentation benchmark's figure for one fragment): an analysed
 * triangle of class 0 (fracture) agrees with a label >= 2 (break), any other class with a label < 2.
 */
export function labelAgreement(
  a: { triangleClass: ArrayLike<number>; sourceTriangle: ArrayLike<number> }, scan: Pick<LabelledScan, 'labels' | 'inputAreas' | 'total'>,
): number {
  let ok = 0;
  for (let f = 0; f < a.triangleClass.length; f++) {
    const s = a.sourceTriangle[f];
    if ((a.triangleClass[f] === 0) === (scan.labels[s] >= 2)) ok += scan.inputAreas[s];
  }
  return ok / scan.total;
}

/** Reads and analyses every fragment of `dir` with `settings` (partial analysis settings). */
export function* studyFragments(dir: string, settings: Record<string, unknown>): Generator<StudyFragment> {
  for (const { frag, labels, source } of labelledScans(dir)) {
    const a = analyseFragment(source, settings);
    const topo = buildTopology(a.mesh);
    const { normals, areas } = triangleNormalsAndAreas(a.mesh);
    const centroids = triangleCentroids(a.mesh.positions, a.mesh.triangles);
    const filtered = bilateralNormalFilter(normals, areas, centroids, topo.neighbours, a.settings.normalFilterIterations, a.settings.normalFilterRange);
    yield { frag, labels, source, a, topo, normals, areas, centroids, filtered };
  }
}
