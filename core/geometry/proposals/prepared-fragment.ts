/**
 * A fragment made ready for matching: its surface in a BVH, evenly spaced samples of the whole
 * surface and of each break face (with FPFH descriptors), the faces' outlines, and a small
 * descriptor per face for the candidate index. Pure: typed arrays in, typed arrays out.
 */
import { computeFpfh, FPFH_DIM } from '../registration/fpfh';
import { MIN_PATCH_SAMPLES, splitIntoPatches } from './face-patches';
import { KdTree } from '../registration/nearest-neighbours';
import { gatherFeatures, mirrorFpfh } from '../registration/ransac-alignment';
import { TargetSurface } from '../registration/target-surface';
import { sampleTriangles, voxelResample } from '../registration/voxel-sampling';
import { faceDescriptor } from './face-descriptor';
import { fitShaftAxis } from '../shaft-axis';
import type { ShaftFrame } from '../registration/shaft-axis-search';

/** A break face as segmentation reports it (any resolution): samples with outward normals. */
export interface BreakFaceInput {
  points: Float32Array;
  normals: Float32Array;
  /** Points along the face's outline curve(s), packed xyz; empty when unknown. */
  outline?: Float32Array;
  /** Area in mm^2, if known. */
  area?: number;
  /** The face's triangles (indices into the fragment's triangles): when given, the face is sampled from them. */
  triangleIds?: Uint32Array;
  /** Pieces of the face (triangle ids) cut at corners of its outer rim: matched as patches besides the face. */
  pieces?: Uint32Array[];
}

export interface FragmentInput {
  positions: Float32Array;
  triangles: Uint32Array;
  faces: BreakFaceInput[];
}

export interface PreparedFace {
  index: number;
  /** The segmentation's face this one is, or is a patch of. */
  parent: number;
  points: Float32Array;
  normals: Float32Array;
  fpfh: Float32Array;
  tree: KdTree;
  /**
   * Made once per face for the feature correspondences of every pair it takes part in: the
   * samples whose features are matched (an even subset of at most FEATURE_SAMPLES; undefined
   * when all are), their fpfh and mirrored fpfh (as a partner would show it) packed in order,
   * and the mirrored fpfh of every sample.
   */
  featureIndex: Uint32Array | undefined;
  featureFpfh: Float32Array;
  mirroredFpfh: Float32Array;
  mirroredFeatureFpfh: Float32Array;
  outline: Float32Array;
  area: number;
  centroid: [number, number, number];
  /** Rotation-invariant numbers for the candidate index (see face-descriptor.ts). */
  descriptor: Float32Array;
}

export interface PreparedFragment {
  surface: TargetSurface;
  surfacePoints: Float32Array;
  surfaceNormals: Float32Array;
  surfaceTree: KdTree;
  faces: PreparedFace[];
  centroid: [number, number, number];
  diagonal: number;
  spacing: number;
  /** The fitted shaft axis (from the surface off the break faces), or null when the piece is not a shaft. */
  axis: ShaftFrame | null;
}

/**
 * Samples of a face whose FPFH take part in feature correspondences, at most: finding them
 * costs the product of the two faces' counts (a brute-force search in 33 dimensions, where a
 * k-d tree prunes little), and an even subset of a large face gives RANSAC as many good
 * triples as it needs (measured with tests/bench/face-pair-study.ts).
 */
export const FEATURE_SAMPLES = 320;

/** Indices of an even stride of at most `max` of n items, or undefined when all n are wanted. */
function evenSubset(n: number, max: number): Uint32Array | undefined {
  if (n <= max) return undefined;
  const out = new Uint32Array(max);
  for (let k = 0; k < max; k++) out[k] = Math.floor((k * n) / max);
  return out;
}

/** Below this share of the surface lying parallel to one axis the piece is not treated as a shaft. */
export const SHAFT_SUPPORT_MIN = 0.5;

export interface SamplingParameters {
  /** Distance between samples (mm). */
  spacing: number;
  /** FPFH neighbourhood radius in sample spacings. */
  fpfhRadiusSpacings: number;
  /** Also match patches of faces that turn sharply (default true). */
  patches?: boolean;
  /** How faces are split into patches (face-patches.ts; defaults: 20 and 40 degrees, 12% of the face, 40 samples). */
  patchOptions?: { angleDeg?: number; meanAngleDeg?: number; minShare?: number; minSamples?: number };
}

export const DEFAULT_FPFH_RADIUS_SPACINGS = 5;

export function prepareFragment(input: FragmentInput, params: SamplingParameters): PreparedFragment {
  return assemblePrepared(input, prepareParts(input, params));
}

/**
 * What preparing a fragment computes that takes time (the samples, each face's FPFH and
 * descriptor, the shaft axis fit), as plain arrays: with the fragment's mesh it is enough to
 * build the prepared fragment again (assemblePrepared) without sampling or describing anything,
 * so a propose worker can take a fragment that another worker prepared from the match cache.
 */
export interface PreparedParts {
  spacing: number;
  surfacePoints: Float32Array;
  surfaceNormals: Float32Array;
  faces: PreparedFaceParts[];
  axis: ShaftFrame | null;
}

export interface PreparedFaceParts {
  parent: number;
  points: Float32Array;
  normals: Float32Array;
  fpfh: Float32Array;
  outline: Float32Array;
  area: number;
  descriptor: Float32Array;
}

/** The parts of a prepared fragment (what assemblePrepared needs besides the mesh). */
export function preparedParts(f: PreparedFragment): PreparedParts {
  return {
    spacing: f.spacing,
    surfacePoints: f.surfacePoints,
    surfaceNormals: f.surfaceNormals,
    faces: f.faces.map((x) => ({ parent: x.parent, points: x.points, normals: x.normals, fpfh: x.fpfh, outline: x.outline, area: x.area, descriptor: x.descriptor })),
    axis: f.axis,
  };
}

/**
 * The prepared fragment from its mesh and parts: search structures and what follows from the
 * parts in a few passes. `triangleOrder` (optional): the triangle BVH's order stored for this
 * mesh (TriangleBvh.triangleOrder), which builds the same tree without sorting.
 */
export function assemblePrepared(input: FragmentInput, parts: PreparedParts, triangleOrder?: Uint32Array): PreparedFragment {
  const { positions, triangles } = input;
  const box = boundsOf(positions);
  return {
    surface: new TargetSurface(positions, triangles, triangleOrder),
    surfacePoints: parts.surfacePoints,
    surfaceNormals: parts.surfaceNormals,
    surfaceTree: new KdTree(parts.surfacePoints, 3),
    faces: parts.faces.map((p, index): PreparedFace => {
      const mirrored = mirrorFpfh(p.fpfh);
      const featureIndex = evenSubset(p.points.length / 3, FEATURE_SAMPLES);
      return {
        index, parent: p.parent, points: p.points, normals: p.normals, fpfh: p.fpfh, tree: new KdTree(p.points, 3),
        featureIndex,
        featureFpfh: featureIndex ? gatherFeatures(p.fpfh, featureIndex) : p.fpfh,
        mirroredFpfh: mirrored,
        mirroredFeatureFpfh: featureIndex ? gatherFeatures(mirrored, featureIndex) : mirrored,
        outline: p.outline, area: p.area, centroid: centroidOf(p.points), descriptor: p.descriptor,
      };
    }),
    centroid: centroidOf(positions),
    diagonal: Math.hypot(box[3] - box[0], box[4] - box[1], box[5] - box[2]),
    spacing: parts.spacing,
    axis: parts.axis,
  };
}

function prepareParts(input: FragmentInput, params: SamplingParameters): PreparedParts {
  const { positions, triangles } = input;
  const all = sampleTriangles(positions, triangles, params.spacing * 2.5);
  const faces: PreparedFaceParts[] = [];
  input.faces.forEach((f, parent) => {
    const s = f.triangleIds && f.triangleIds.length
      ? sampleFaceTriangles(positions, triangles, f.triangleIds, params.spacing)
      : voxelResample(f.points, f.normals, params.spacing);
    if (s.points.length < 9) return;
    const fpfh = computeFpfh(s.points, s.normals, params.spacing * params.fpfhRadiusSpacings);
    const outline = f.outline && f.outline.length >= 3 ? thinPolyline(f.outline, params.spacing * 0.5) : new Float32Array(0);
    const area = f.area ?? (s.points.length / 3) * params.spacing * params.spacing;
    const add = (points: Float32Array, normals: Float32Array, feats: Float32Array, line: Float32Array, a: number): void => {
      faces.push({ parent, points, normals, fpfh: feats, outline: line, area: a, descriptor: faceDescriptor(points, normals, line, a, feats) });
    };
    add(s.points, s.normals, fpfh, outline, area);
    if (params.patches === false) return;
    const nFace = s.points.length / 3;
    for (const piece of f.pieces ?? []) {
      const ps = sampleFaceTriangles(positions, triangles, piece, params.spacing);
      if (ps.points.length < 3 * MIN_PATCH_SAMPLES) continue;
      add(ps.points, ps.normals, computeFpfh(ps.points, ps.normals, params.spacing * params.fpfhRadiusSpacings), outlineNear(ps.points, outline, params.spacing), (area * ps.points.length) / 3 / Math.max(1, nFace));
    }
    const patches = splitIntoPatches(s.points, s.normals, params.spacing, { angleDeg: 20, meanAngleDeg: 40, ...params.patchOptions });
    if (patches.length < 2) return;
    const n = s.points.length / 3;
    for (const p of patches) {
      const P = new Float32Array(3 * p.indices.length), N = new Float32Array(3 * p.indices.length), F = new Float32Array(FPFH_DIM * p.indices.length);
      p.indices.forEach((i, k) => {
        P.set(s.points.subarray(3 * i, 3 * i + 3), 3 * k);
        N.set(s.normals.subarray(3 * i, 3 * i + 3), 3 * k);
        F.set(fpfh.subarray(FPFH_DIM * i, FPFH_DIM * i + FPFH_DIM), FPFH_DIM * k);
      });
      add(P, N, F, outlineNear(P, outline, params.spacing), (area * p.indices.length) / n);
    }
  });
  return { spacing: params.spacing, surfacePoints: all.points, surfaceNormals: all.normals, faces, axis: shaftFrameOf(positions, triangles, input.faces) };
}

/** The outline points next to a patch's samples (within 1.5 spacings). */
function outlineNear(points: Float32Array, outline: Float32Array, spacing: number): Float32Array {
  const pt = new KdTree(points, 3);
  const line: number[] = [];
  for (let i = 0; i < outline.length; i += 3) {
    if (pt.nearestOne([outline[i], outline[i + 1], outline[i + 2]], (1.5 * spacing) ** 2).index >= 0) line.push(outline[i], outline[i + 1], outline[i + 2]);
  }
  return Float32Array.from(line);
}

/** The piece's own shaft axis, fitted on the triangles that are not break face (all, when faces are not given by triangles). */
function shaftFrameOf(positions: Float32Array, triangles: Uint32Array, faces: BreakFaceInput[]): ShaftFrame | null {
  const nt = triangles.length / 3;
  const skip = new Uint8Array(nt);
  for (const f of faces) if (f.triangleIds) for (const t of f.triangleIds) if (t < nt) skip[t] = 1;
  let m = 0;
  for (let t = 0; t < nt; t++) if (!skip[t]) m++;
  if (m < 20) return null;
  const centroids = new Float32Array(3 * m), normals = new Float32Array(3 * m), areas = new Float64Array(m);
  let k = 0;
  for (let t = 0; t < nt; t++) {
    if (skip[t]) continue;
    const a = triangles[3 * t] * 3, b = triangles[3 * t + 1] * 3, c = triangles[3 * t + 2] * 3;
    const ux = positions[b] - positions[a], uy = positions[b + 1] - positions[a + 1], uz = positions[b + 2] - positions[a + 2];
    const vx = positions[c] - positions[a], vy = positions[c + 1] - positions[a + 1], vz = positions[c + 2] - positions[a + 2];
    const nx = uy * vz - uz * vy, ny = uz * vx - ux * vz, nz = ux * vy - uy * vx;
    const l = Math.hypot(nx, ny, nz);
    for (let d = 0; d < 3; d++) centroids[3 * k + d] = (positions[a + d] + positions[b + d] + positions[c + d]) / 3;
    if (l > 0) { normals[3 * k] = nx / l; normals[3 * k + 1] = ny / l; normals[3 * k + 2] = nz / l; }
    areas[k] = l / 2;
    k++;
  }
  const fit = fitShaftAxis(centroids, normals, areas);
  if (!(fit.support >= SHAFT_SUPPORT_MIN) || !(fit.radius > 0)) return null;
  return { direction: fit.direction, point: fit.point, radius: fit.radius };
}

function sampleFaceTriangles(positions: Float32Array, triangles: Uint32Array, ids: Uint32Array, spacing: number) {
  const sub = new Uint32Array(ids.length * 3);
  ids.forEach((t, i) => sub.set(triangles.subarray(3 * t, 3 * t + 3), 3 * i));
  return sampleTriangles(positions, sub, spacing);
}

export function centroidOf(p: ArrayLike<number>): [number, number, number] {
  const n = p.length / 3;
  let x = 0, y = 0, z = 0;
  for (let i = 0; i < n; i++) {
    x += p[3 * i]; y += p[3 * i + 1]; z += p[3 * i + 2];
  }
  return n ? [x / n, y / n, z / n] : [0, 0, 0];
}

export function boundsOf(p: ArrayLike<number>): [number, number, number, number, number, number] {
  const b: [number, number, number, number, number, number] = [Infinity, Infinity, Infinity, -Infinity, -Infinity, -Infinity];
  for (let i = 0; i < p.length; i += 3) {
    for (let k = 0; k < 3; k++) {
      if (p[i + k] < b[k]) b[k] = p[i + k];
      if (p[i + k] > b[k + 3]) b[k + 3] = p[i + k];
    }
  }
  return b;
}

/** Keep outline points at least `gap` apart (in listed order). */
function thinPolyline(p: Float32Array, gap: number): Float32Array {
  const out: number[] = [p[0], p[1], p[2]];
  for (let i = 3; i < p.length; i += 3) {
    const o = out.length - 3;
    if (Math.hypot(p[i] - out[o], p[i + 1] - out[o + 1], p[i + 2] - out[o + 2]) >= gap) out.push(p[i], p[i + 1], p[i + 2]);
  }
  return Float32Array.from(out);
}

/** A sample spacing that suits a pair (or set) of fragments: about 1/60 of the larger box diagonal. */
export function defaultSpacing(diagonals: number[]): number {
  const d = Math.max(...diagonals);
  return Math.max(1e-6, d / 60);
}

/** Samples wanted on a typical break face: enough for FPFH and RANSAC, few enough to be quick. */
export const SAMPLES_PER_FACE = 300;

/**
 * One spacing for a set of break faces (all faces compared must share it, since FPFH depends on
 * it): a typical (median) face gets about SAMPLES_PER_FACE samples; kept within 0.3-4 mm.
 */
export function spacingForFaces(areas: number[]): number {
  if (areas.length === 0) return 1;
  const s = [...areas].sort((p, q) => p - q);
  const median = s[Math.floor(s.length / 2)];
  return Math.min(4, Math.max(0.3, Math.sqrt(median / SAMPLES_PER_FACE)));
}

/** Spacings a proposal run chooses from, so that adding a few scans rarely changes the parameters. */
export const SPACING_LADDER = [0.3, 0.42, 0.6, 0.85, 1.2, 1.7, 2.4, 3.4];

/** The run's spacing for a set of break face areas: spacingForFaces rounded (in log) to the nearest rung of SPACING_LADDER. */
export function runSpacing(areas: number[]): number {
  const raw = spacingForFaces(areas);
  return SPACING_LADDER.reduce((best, v) => (Math.abs(Math.log(v / raw)) < Math.abs(Math.log(best / raw)) ? v : best), SPACING_LADDER[0]);
}
