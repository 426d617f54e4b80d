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

/** Reads and analyses every fragment of `dir` with `settings` (partial analysis settings). */
export function* studyFragments(dir: string, settings: Record<string, unknown>): Generator<StudyFragment> {
  const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { fragments: StudyTruthFragment[] };
  for (const frag of truth.fragments) {
    const parsed = parseMeshFile(readFileSync(join(dir, frag.scanFile)), frag.scanFile);
    const a = analyseFragment(parsed.mesh, settings);
    const topo = buildTopology(a.mesh);
    const { normals, areas } = triangleNormalsAndAreas(a.mesh);
    const centroids = triangleCentroids(a.mesh.positions, a.mesh.triangles);
    const filtered = bilateralNormalFilter(normals, areas, centroids, topo.neighbours, a.settings.normalFilterIterations, a.settings.normalFilterRange);
    yield { frag, labels: Buffer.from(frag.triangleLabels, 'base64'), source: parsed.mesh, a, topo, normals, areas, centroids, filtered };
  }
}
