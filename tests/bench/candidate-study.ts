/**
 * Candidate recall study, per fragment (no alignment): analyse a scan as `knitbone propose`
 * does, prepare it at the run's spacing, and record every prepared break face's traits and
 * which true breaks it lies on (from the generator's per-triangle labels in truth.json).
 * `npx tsx tests/bench/candidate-study.ts <demo-dir> <spacing> [shard] [shards]` writes
 * <demo-dir>/candidate-study/<catalogue-no>.json, skipping fragments already done.
 */
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { analyseFragment } from '../../core/geometry/analyse-fragment';
import { parseMeshFile } from '../../core/geometry/parse/index';
import { fragmentFromAnalysis } from '../../core/geometry/proposals/fragment-from-analysis';
import { prepareFragment } from '../../core/geometry/proposals/prepared-fragment';
import { faceTraits, type FaceTraits } from '../../core/geometry/proposals/face-traits';
import { KdTree } from '../../core/geometry/registration/nearest-neighbours';

export interface StudyFace {
  parent: number;
  samples: number;
  traits: Omit<FaceTraits, 'meanFpfh'> & { meanFpfh: number[] };
  /** break id -> share of the face's samples on it */
  breaks: Record<string, number>;
}
export interface StudyFragment { no: string; spacing: number; faces: StudyFace[]; cpuMs: number }

interface TruthFragment { catalogueNo: string; scanFile: string; triangleLabels: string }

export function studyFragment(dir: string, f: TruthFragment, spacing: number): StudyFragment {
  const c0 = process.cpuUsage();
  const bytes = readFileSync(join(dir, f.scanFile.includes('/') ? f.scanFile : join('scans', f.scanFile)));
  const mesh = parseMeshFile(bytes, f.scanFile).mesh;
  const analysis = analyseFragment(mesh);
  const prepared = prepareFragment(fragmentFromAnalysis(analysis), { spacing, fpfhRadiusSpacings: 5 });
  const labels = Buffer.from(f.triangleLabels, 'base64');
  const cents: number[] = [], lab: number[] = [];
  const P = mesh.positions, T = mesh.triangles;
  for (let t = 0; t < T.length / 3; t++) {
    if (labels[t] < 10) continue;
    for (let k = 0; k < 3; k++) cents.push((P[3 * T[3 * t]+ k] + P[3 * T[3 * t + 1] + k] + P[3 * T[3 * t + 2] + k]) / 3);
    lab.push(labels[t] - 10);
  }
  const tree = new KdTree(Float32Array.from(cents), 3);
  const faces: StudyFace[] = prepared.faces.map((face) => {
    const n = face.points.length / 3;
    const count = new Map<number, number>();
    for (let i = 0; i < n; i++) {
      const r = tree.nearestOne([face.points[3 * i], face.points[3 * i + 1], face.points[3 * i + 2]], (3 * spacing) ** 2);
      if (r.index >= 0) count.set(lab[r.index], (count.get(lab[r.index]) ?? 0) + 1);
    }
    const breaks: Record<string, number> = {};
    for (const [k, c] of count) breaks[k] = c / n;
    const t = faceTraits(face.points, face.normals, face.area, face.fpfh, analysis.axis);
    return { parent: face.parent, samples: n, traits: { ...t, meanFpfh: [...t.meanFpfh] }, breaks };
  });
  return { no: f.catalogueNo, spacing, faces, cpuMs: process.cpuUsage(c0).user / 1000 };
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
      writeFileSync(file, JSON.stringify(studyFragment(dir, f, Number(spacingArg))));
    } catch (err) {
      writeFileSync(file, JSON.stringify({ no: f.catalogueNo, spacing: Number(spacingArg), faces: [], cpuMs: 0, error: String(err) }));
    }
  });
}
