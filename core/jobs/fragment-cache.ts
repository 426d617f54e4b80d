/**
 * What a proposal run keeps per scan so that a later run does not read and analyse the scan
 * again: the analysed fragment (cleaned mesh, break faces, shaft axis) and, per sample
 * spacing, the traits of its prepared break faces. Stored in a folder beside the catalogue
 * (`<catalogue>.match-cache/`), one file per scan and analysis, named by a hash of the scan's
 * content, units, analysis settings, the analyst's region corrections and the cache version,
 * so a changed scan or correction never reads a stale entry. Everything here can be recomputed
 * from the scans: deleting the folder only costs time. Files are written to a temporary name
 * and renamed, so a cancelled run leaves no half-written entry.
 */
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import type { FragmentAnalysis } from '../geometry/analyse-fragment';
import type { FaceTraits, ShaftAxisLike } from '../geometry/proposals/face-traits';
import type { FragmentInput, PreparedParts, SamplingParameters } from '../geometry/proposals/prepared-fragment';
import { FPFH_DIM } from '../geometry/registration/fpfh';
import { KnitboneError } from '../host/errors';
import { checkMatchableMesh, matchableFragment, type LengthUnit, type LoadedFragment } from './fragment-loader';

/** Bump when what is stored, or how the analysis that produced it works, changes. */
export const FRAGMENT_CACHE_VERSION = 'fragment-cache/7';

export interface FragmentSummary {
  faceAreas: number[];
  diagonalMm: number;
  centroid: [number, number, number];
  axis: ShaftAxisLike;
  /** Why the scan cannot be matched (no break face, wrong units...): kept so a later run does not read it again. */
  problem?: string;
}

export interface CachedFragment {
  summary: FragmentSummary;
  input: FragmentInput;
}

export function cacheDirFor(cataloguePath: string): string {
  return join(dirname(cataloguePath), `${basename(cataloguePath)}.match-cache`);
}

/** The cache key of one scan analysed with given settings and region corrections. */
export function fragmentKey(contentHash: string, units: string, settings: unknown, corrections: Array<[number, string]>): string {
  const sorted = [...corrections].sort((a, b) => a[0] - b[0]);
  return createHash('sha256').update(JSON.stringify([FRAGMENT_CACHE_VERSION, contentHash, units, settings ?? {}, sorted])).digest('hex').slice(0, 32);
}

/** The cache entry of a fragment read for matching. */
export function cachedFromLoaded(loaded: Omit<LoadedFragment, 'contentHash' | 'warnings'>): CachedFragment {
  const a = loaded.axis;
  return {
    input: loaded.input,
    summary: { faceAreas: loaded.input.faces.map((f) => f.area ?? 0), diagonalMm: loaded.diagonalMm, centroid: loaded.centroid, axis: { direction: a.direction, point: a.point, support: a.support } },
  };
}

/**
 * Store an analysis made elsewhere (importing scans) so a proposal run need not read the scan
 * again: the fragment, or why it cannot be matched. Never fails the caller: a cache that cannot
 * be written only costs the later run its time.
 */
export function storeAnalysisForMatching(
  dir: string,
  scan: { file: string; contentHash: string; units: LengthUnit; corrections?: Array<[number, string]> },
  mesh: { positions: Float32Array; triangles: Uint32Array },
  analysis: FragmentAnalysis,
): void {
  const key = fragmentKey(scan.contentHash, scan.units, analysis.settings, scan.corrections ?? []);
  try {
    checkMatchableMesh(scan.file, mesh, scan.units);
    writeFragment(dir, key, cachedFromLoaded(matchableFragment(scan.file, analysis)));
  } catch (err) {
    try {
      if (err instanceof KnitboneError && err.kind === 'bad-input') writeProblem(dir, key, err.message);
    } catch {
      // the cache is an optimisation only
    }
  }
}

function samplingKey(s: SamplingParameters): string {
  return `${s.spacing}-${s.fpfhRadiusSpacings}-${s.patches === false ? 'np' : 'p'}`;
}

function writeAtomically(file: string, data: Uint8Array | string): void {
  mkdirSync(dirname(file), { recursive: true });
  const tmp = `${file}.${process.pid}.${Math.random().toString(36).slice(2)}.tmp`;
  writeFileSync(tmp, data);
  renameSync(tmp, file);
}

/** Remember that a scan cannot be matched, and why. */
export function writeProblem(dir: string, key: string, problem: string): void {
  const summary: FragmentSummary = { faceAreas: [], diagonalMm: 0, centroid: [0, 0, 0], axis: { direction: [0, 0, 1], point: [0, 0, 0], support: 0 }, problem };
  writeAtomically(join(dir, `${key}.json`), JSON.stringify(summary));
}

/** The small part (face areas, size, axis), readable without the mesh. */
export function readSummary(dir: string, key: string): FragmentSummary | undefined {
  const file = join(dir, `${key}.json`);
  if (!existsSync(file)) return undefined;
  try {
    return JSON.parse(readFileSync(file, 'utf8')) as FragmentSummary;
  } catch {
    return undefined;
  }
}

/** uint32 header length, the JSON header padded with spaces to 4 bytes, then the arrays' bytes in order (the layout of both cache files). */
function packArrays(headerFields: object, arrays: ReadonlyArray<Float32Array | Uint32Array>): Buffer {
  const header = Buffer.from(JSON.stringify(headerFields), 'utf8');
  const pad = (4 - ((4 + header.length) % 4)) % 4;
  let size = 4 + header.length + pad;
  for (const a of arrays) size += a.byteLength;
  const out = Buffer.alloc(size);
  out.writeUInt32LE(header.length + pad, 0);
  header.copy(out, 4);
  out.fill(0x20, 4 + header.length, 4 + header.length + pad);
  let at = 4 + header.length + pad;
  for (const a of arrays) {
    Buffer.from(a.buffer, a.byteOffset, a.byteLength).copy(out, at);
    at += a.byteLength;
  }
  return out;
}

/**
 * Binary layout: uint32 header length, JSON header (array lengths, face areas, summary), then
 * float32/uint32 arrays in header order, each padded to 4 bytes.
 */
export function writeFragment(dir: string, key: string, f: CachedFragment): void {
  const arrays: Array<Float32Array | Uint32Array> = [f.input.positions, f.input.triangles];
  const faces = f.input.faces.map((x) => {
    arrays.push(x.points, x.normals, x.outline ?? new Float32Array(0), x.triangleIds ?? new Uint32Array(0));
    return { area: x.area ?? null, pieces: x.pieces?.length ?? 0 };
  });
  // the faces' pieces (triangle ids) after all faces, in face order
  for (const x of f.input.faces) for (const piece of x.pieces ?? []) arrays.push(piece);
  const out = packArrays({ lengths: arrays.map((a) => a.length), kinds: arrays.map((a) => (a instanceof Uint32Array ? 'u' : 'f')), faces }, arrays);
  writeAtomically(join(dir, `${key}.bin`), out);
  writeAtomically(join(dir, `${key}.json`), JSON.stringify(f.summary));
}

export function readFragment(dir: string, key: string): CachedFragment | undefined {
  const summary = readSummary(dir, key);
  const file = join(dir, `${key}.bin`);
  if (!summary || !existsSync(file)) return undefined;
  try {
    const buf = readFileSync(file);
    const hl = buf.readUInt32LE(0);
    const header = JSON.parse(buf.subarray(4, 4 + hl).toString('utf8')) as { lengths: number[]; kinds: Array<'u' | 'f'>; faces: Array<{ area: number | null; pieces?: number }> };
    let at = 4 + hl;
    const arrays = header.lengths.map((n, i) => {
      const bytes = buf.subarray(at, at + 4 * n);
      at += 4 * n;
      const copy = new ArrayBuffer(4 * n);
      new Uint8Array(copy).set(bytes);
      return header.kinds[i] === 'u' ? new Uint32Array(copy) : new Float32Array(copy);
    });
    if (at !== buf.length) return undefined;
    let pieceAt = 2 + 4 * header.faces.length;
    const input: FragmentInput = {
      positions: arrays[0] as Float32Array,
      triangles: arrays[1] as Uint32Array,
      faces: header.faces.map((x, i) => {
        const o = 2 + 4 * i;
        const tri = arrays[o + 3] as Uint32Array;
        const pieces = arrays.slice(pieceAt, (pieceAt += x.pieces ?? 0)) as Uint32Array[];
        return { points: arrays[o] as Float32Array, normals: arrays[o + 1] as Float32Array, outline: arrays[o + 2] as Float32Array, area: x.area ?? undefined, triangleIds: tri.length ? tri : undefined, ...(pieces.length ? { pieces } : {}) };
      }),
    };
    return { summary, input };
  } catch {
    return undefined;
  }
}

/** Version of the stored face traits (face-traits.ts): traits stored under another version are measured again. */
export const TRAITS_CACHE_VERSION = 4;

/** Traits of the prepared faces at one sampling (with each face's parent), as stored. */
export interface CachedTraits {
  parents: number[];
  traits: FaceTraits[];
}

function traitsFile(dir: string, key: string, sampling: SamplingParameters): string {
  return join(dir, `${key}.traits${TRAITS_CACHE_VERSION}-${samplingKey(sampling)}.json`);
}

export function readTraits(dir: string, key: string, sampling: SamplingParameters): CachedTraits | undefined {
  const file = traitsFile(dir, key, sampling);
  if (!existsSync(file)) return undefined;
  try {
    const raw = JSON.parse(readFileSync(file, 'utf8')) as { parents: number[]; traits: Array<Omit<FaceTraits, 'meanFpfh'> & { meanFpfh: number[] }> };
    return { parents: raw.parents, traits: raw.traits.map((t) => ({ ...t, meanFpfh: Float32Array.from(t.meanFpfh) })) };
  } catch {
    return undefined;
  }
}

export function writeTraits(dir: string, key: string, sampling: SamplingParameters, c: CachedTraits): void {
  writeAtomically(traitsFile(dir, key, sampling), JSON.stringify({ parents: c.parents, traits: c.traits.map((t) => ({ ...t, meanFpfh: [...t.meanFpfh] })) }));
}

/** Version of the stored prepared parts (prepared-fragment.ts, PreparedParts): parts stored under another version are prepared again. */
export const PREPARED_CACHE_VERSION = 2;

function preparedFile(dir: string, key: string, sampling: SamplingParameters): string {
  return join(dir, `${key}.prepared${PREPARED_CACHE_VERSION}-${samplingKey(sampling)}.bin`);
}

/**
 * A prepared fragment's parts at one sampling (samples, FPFH, descriptors, shaft axis), so that
 * a worker that does not hold the fragment builds it from these and the mesh instead of
 * preparing it again. Binary layout as writeFragment: uint32 header length, JSON header (spacing,
 * axis, each face's parent and area, array lengths), then the float32 arrays in header order.
 */
export function writePrepared(dir: string, key: string, sampling: SamplingParameters, parts: PreparedParts): void {
  const arrays: Float32Array[] = [parts.surfacePoints, parts.surfaceNormals];
  for (const f of parts.faces) arrays.push(f.points, f.normals, f.fpfh, f.outline, f.descriptor);
  const out = packArrays({ spacing: parts.spacing, axis: parts.axis, faces: parts.faces.map((f) => ({ parent: f.parent, area: f.area })), lengths: arrays.map((a) => a.length) }, arrays);
  writeAtomically(preparedFile(dir, key, sampling), out);
}

/** The stored parts, or undefined when there are none for this sampling or the file does not hold what it should (then the fragment is prepared again). */
export function readPrepared(dir: string, key: string, sampling: SamplingParameters): PreparedParts | undefined {
  const file = preparedFile(dir, key, sampling);
  if (!existsSync(file)) return undefined;
  try {
    const buf = readFileSync(file);
    const hl = buf.readUInt32LE(0);
    const header = JSON.parse(buf.subarray(4, 4 + hl).toString('utf8')) as { spacing: number; axis: PreparedParts['axis']; faces: Array<{ parent: number; area: number }>; lengths: number[] };
    if (header.spacing !== sampling.spacing || header.lengths.length !== 2 + 5 * header.faces.length) return undefined;
    const axis = header.axis;
    if (axis !== null && !(Array.isArray(axis.direction) && axis.direction.length === 3 && Array.isArray(axis.point) && axis.point.length === 3 && typeof axis.radius === 'number')) return undefined;
    let at = 4 + hl;
    const arrays = header.lengths.map((n) => {
      const copy = new ArrayBuffer(4 * n);
      new Uint8Array(copy).set(buf.subarray(at, at + 4 * n));
      at += 4 * n;
      return new Float32Array(copy);
    });
    if (at !== buf.length) return undefined;
    const faces = header.faces.map((f, i) => {
      const [points, normals, fpfh, outline, descriptor] = arrays.slice(2 + 5 * i, 7 + 5 * i);
      return { parent: f.parent, points, normals, fpfh, outline, area: f.area, descriptor };
    });
    const n3 = (a: Float32Array): boolean => a.length % 3 === 0;
    if (!n3(arrays[0]) || arrays[1].length !== arrays[0].length || faces.some((f) => !n3(f.points) || f.normals.length !== f.points.length || f.fpfh.length !== (f.points.length / 3) * FPFH_DIM || !n3(f.outline))) return undefined;
    return { spacing: header.spacing, surfacePoints: arrays[0], surfaceNormals: arrays[1], faces, axis: header.axis };
  } catch {
    return undefined;
  }
}

/** Version of the stored triangle orders (triangle-bvh.ts: how the build splits a node); bump when the build changes. */
export const TRIANGLE_ORDER_VERSION = 1;

function triangleOrderFile(dir: string, key: string): string {
  return join(dir, `${key}.bvh-order${TRIANGLE_ORDER_VERSION}.bin`);
}

/**
 * The triangle order of a fragment's mesh BVH (TriangleBvh.triangleOrder, uint32 per triangle),
 * so that a worker that assembles the fragment again builds the same tree without sorting
 * (about two thirds of assembling it: each worker assembles every fragment it meets, again after
 * its cache let it go). One per scan key, whatever the sampling.
 */
export function writeTriangleOrder(dir: string, key: string, order: Uint32Array): void {
  writeAtomically(triangleOrderFile(dir, key), Buffer.from(order.buffer, order.byteOffset, order.byteLength));
}

/** The stored order, or undefined (TriangleBvh ignores an order that is not a permutation of the mesh's triangles). */
export function readTriangleOrder(dir: string, key: string): Uint32Array | undefined {
  const file = triangleOrderFile(dir, key);
  if (!existsSync(file)) return undefined;
  try {
    const buf = readFileSync(file);
    if (buf.length % 4 !== 0) return undefined;
    const copy = new ArrayBuffer(buf.length);
    new Uint8Array(copy).set(buf);
    return new Uint32Array(copy);
  } catch {
    return undefined;
  }
}
