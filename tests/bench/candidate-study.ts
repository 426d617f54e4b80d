/**
 * Candidate recall study, per fragment (no alignment): prepare a fragment as `knitbone propose`
 * does and record every prepared break face's traits and which true breaks it lies on (from
 * the generator's per-triangle labels in truth.json: nearest labelled triangle within 3 sample
 * spacings). `studyFromCache` takes the analysis a propose run stored; the command line
 * `npx tsx tests/bench/candidate-study.ts <demo-dir> <spacing> [shard] [shards]` analyses the
 * scans itself and writes <demo-dir>/candidate-study/<catalogue-no>.json, skipping those done.
 */
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { analyseFragment } from '../../core/geometry/analyse-fragment';
import { parseMeshFile } from '../../core/geometry/parse/index';
import { fragmentFromAnalysis } from '../../core/geometry/proposals/fragment-from-analysis';
import { prepareFragment, type FragmentInput, type PreparedFragment } from '../../core/geometry/proposals/prepared-fragment';
import { fragmentFaceTraits, type FaceTraits, type ShaftAxisLike } from '../../core/geometry/proposals/face-traits';
import { KdTree } from '../../core/geometry/registration/nearest-neighbours';
import type { TriangleMesh } from '../../core/geometry/mesh';

export interface StudyFace {
  parent: number;
  samples: number;
  traits: Omit<FaceTraits, 'meanFpfh'> & { meanFpfh: number[] };
  /** break id -> share of the face's samples on it */
  breaks: Record<string, number>;
}
export interface StudyFragment { no: string; spacing: number; faces: StudyFace[]; cpuMs: number }
/** Raw inputs of a studied fragment (base64 of little-endian typed arrays), so that new traits can be tried without analysing again. */
export interface StudyRaw {
  positions: string; triangles: string; triangleClass?: string;
  axis: ShaftAxisLike;
  faces: Array<{ parent: number; points: string; normals: string; fpfh: string; outline: string; area: number }>;
}
const b64 = (a: Float32Array | Uint32Array | Uint8Array): string => Buffer.from(a.buffer, a.byteOffset, a.byteLength).toString('base64');
export interface TruthFragment { catalogueNo: string; scanFile: string; triangleLabels: string }

export function scanPath(dir: string, f: TruthFragment): string {
  return join(dir, f.scanFile.includes('/') ? f.scanFile : join('scans', f.scanFile));
}

/** Prepare the analysed fragment at `spacing`, describe its faces and label them with the true breaks. */
export function studyFragment(f: TruthFragment, fileMesh: TriangleMesh, input: FragmentInput, axis: ShaftAxisLike, spacing: number, raw?: (r: StudyRaw) => void, preparedAlready?: PreparedFragment): StudyFragment {
  const c0 = process.cpuUsage();
  const prepared = preparedAlready ?? prepareFragment(input, { spacing, fpfhRadiusSpacings: 5 });
  const labels = Buffer.from(f.triangleLabels, 'base64');
  const cents: number[] = [], lab: number[] = [];
  const P = fileMesh.positions, T = fileMesh.triangles;
  for (let t = 0; t < T.length / 3; t++) {
    if (labels[t] < 10) continue;
    for (let k = 0; k < 3; k++) cents.push((P[3 * T[3 * t] + k] + P[3 * T[3 * t + 1] + k] + P[3 * T[3 * t + 2] + k]) / 3);
    lab.push(labels[t] - 10);
  }
  const tree = new KdTree(Float32Array.from(cents), 3);
  const traits = fragmentFaceTraits(input, prepared, axis);
  const faces: StudyFace[] = prepared.faces.map((face, fi) => {
    const n = face.points.length / 3;
    const count = new Map<number, number>();
    for (let i = 0; i < n; i++) {
      const r = tree.nearestOne([face.points[3 * i], face.points[3 * i + 1], face.points[3 * i + 2]], (3 * spacing) ** 2);
      if (r.index >= 0) count.set(lab[r.index], (count.get(lab[r.index]) ?? 0) + 1);
    }
    const breaks: Record<string, number> = {};
    for (const [k, c] of count) breaks[k] = c / n;
    const t = traits[fi];
    return { parent: face.parent, samples: n, traits: { ...t, meanFpfh: [...t.meanFpfh] }, breaks };
  });
  raw?.({
    positions: b64(input.positions), triangles: b64(input.triangles), axis,
    faces: prepared.faces.map((x) => ({ parent: x.parent, points: b64(x.points), normals: b64(x.normals), fpfh: b64(x.fpfh), outline: b64(x.outline), area: x.area })),
  });
  return { no: f.catalogueNo, spacing, faces, cpuMs: process.cpuUsage(c0).user / 1000 };
}

/** Read and analyse the scan as the propose run does (default settings), then study it. */
export function studyScan(dir: string, f: TruthFragment, spacing: number, raw?: (r: StudyRaw) => void): StudyFragment {
  const mesh = parseMeshFile(readFileSync(scanPath(dir, f)), f.scanFile).mesh;
  const analysis = analyseFragment(mesh);
  return studyFragment(f, mesh, fragmentFromAnalysis(analysis), analysis.axis, spacing, raw && ((r) => raw({ ...r, triangleClass: b64(analysis.triangleClass) })));
}

/** Study from an analysis a propose run stored (fragment-cache.ts): only the file's triangles are read again. */
export function studyFromCache(dir: string, f: TruthFragment, cached: { input: FragmentInput; axis: ShaftAxisLike }, spacing: number): StudyFragment {
  const mesh = parseMeshFile(readFileSync(scanPath(dir, f)), f.scanFile).mesh;
  return studyFragment(f, mesh, cached.input, cached.axis, spacing);
}

if (process.argv[1]?.endsWith('candidate-study.ts')) {
  const [dir, spacingArg, shardArg = '0', shardsArg = '1'] = process.argv.slice(2);
  const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { fragments: TruthFragment[] };
  const out = join(dir, 'candidate-study');
  mkdirSync(out, { recursive: true });
  truth.fragments.forEach((f, i) => {
    if (i % Number(shardsArg) !== Number(shardArg)) return;
    const file = join(out, `${f.catalogueNo}.json`);
    if (existsSync(file)) return;
    try {
      const raw = process.env.KNITBONE_STUDY_RAW ? (r: StudyRaw) => writeFileSync(join(out, `${f.catalogueNo}.raw`), JSON.stringify(r)) : undefined;
      writeFileSync(file, JSON.stringify(studyScan(dir, f, Number(spacingArg), raw)));
    } catch (err) {
      writeFileSync(file, JSON.stringify({ no: f.catalogueNo, spacing: Number(spacingArg), faces: [], cpuMs: 0, error: String(err) }));
    }
  });
}
