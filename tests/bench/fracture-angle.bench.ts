/**
 * Fracture-angle benchmark (issue 5, points 5 and 7): Villa & Mahieu 1991 angle class of each
 * fracture face against the generator's break (a bevel beyond the right-angle tolerance is
 * oblique, else right), measured two ways on generated assemblages:
 * - on the faces the segmentation finds (as the segmentation benchmark scores them: each face
 *   takes the break covering most of its triangles), all faces and the pure ones only (one
 *   break covers at least 80 % of the face's area);
 * - on the true faces: the same angle measurement run on the generator's per-triangle labels
 *   (each break's triangles a face, every other surface as labelled), which leaves out the
 *   segmentation's errors (not those of the labels themselves, which follow the scan's
 *   triangles near a crease) and breaks faces that join several breaks into one face each.
 * Prints tables per sample and per break pattern; not a pass/fail test.
 *
 * KNITBONE_SAMPLE_DIR: generated sample folders, comma-separated (default demo-data/sample).
 */
import { readFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import { basename, dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { analyseFragment } from '../../core/geometry/analyse-fragment';
import type { AnalysisSettings } from '../../core/geometry/settings';
import { fractureFaces, type FractureFace } from '../../core/geometry/fracture-faces';
import { triangleNormalsAndAreas } from '../../core/geometry/mesh';
import { triangleCentroids } from '../../core/geometry/normal-filter';
import { parseMeshFile } from '../../core/geometry/parse/index';
import { SURFACE_CLASSES } from '../../core/geometry/surface-classes';
import { buildTopology } from '../../core/geometry/topology';

export interface TruthBreak { id: number; age: string; pattern: string; nominalBevelDeg: number }
export interface Truth {
  fragments: Array<{ catalogueNo: string; scanFile: string; boneId: string; triangleLabels: string }>;
  bones: Array<{ boneId: string; breaks: TruthBreak[] }>;
}

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');
/** Truth label codes (truth.json labelLegend): 0 periosteal or articular, 1 medullary, 2 damage scar, 10 + k break k. */
const FRACTURE_BASE = 10;
const OUTER = SURFACE_CLASSES.indexOf('outer-cortical');
const MEDULLARY = SURFACE_CLASSES.indexOf('medullary');
/** True faces smaller than this (mm²) are left out, as the segmentation leaves out small patches. */
const MIN_TRUE_FACE_MM2 = 30;
/** A found face is pure when one break covers at least this share of its area. */
const PURE_SHARE = 0.8;

interface Tally { faces: number; agree: number }
const tally = (): Tally => ({ faces: 0, agree: 0 });
const add = (t: Tally, ok: boolean): void => { t.faces++; if (ok) t.agree++; };
const show = (t: Tally): string => (t.faces ? `${((100 * t.agree) / t.faces).toFixed(1)} % (${t.agree}/${t.faces})` : '-');

/**
 * One generated fragment analysed (settings overrides from KNITBONE_SEGMENTATION_SETTINGS), its
 * truth labels per analysed triangle, triangle normals and areas, and the angle class expected
 * of a break (a bevel beyond the right-angle tolerance is oblique).
 */
export function analyseLabelled(dir: string, frag: Truth['fragments'][number]) {
  const parsed = parseMeshFile(readFileSync(join(dir, frag.scanFile)), frag.scanFile);
  const a = analyseFragment(parsed.mesh, JSON.parse(process.env.KNITBONE_SEGMENTATION_SETTINGS ?? '{}') as Partial<AnalysisSettings>);
  const input = Buffer.from(frag.triangleLabels, 'base64');
  const labels = new Uint8Array(a.triangleClass.length);
  for (let f = 0; f < labels.length; f++) labels[f] = input[a.sourceTriangle[f]];
  const { normals, areas } = triangleNormalsAndAreas(a.mesh);
  const expected = (b: TruthBreak): string => (Math.abs(b.nominalBevelDeg) > a.settings.rightAngleToleranceDeg ? 'oblique' : 'right');
  return { a, labels, normals, areas, expected };
}

/** The break covering most of a found face's area (truth labels per analysed triangle), or undefined when none does. */
export function dominantBreak(face: FractureFace, labels: Uint8Array, areas: Float64Array): { breakId: number; breakArea: number; faceArea: number } | undefined {
  const byBreak = new Map<number, number>();
  let faceArea = 0;
  for (const t of face.triangleIds) {
    faceArea += areas[t];
    if (labels[t] >= FRACTURE_BASE) byBreak.set(labels[t] - FRACTURE_BASE, (byBreak.get(labels[t] - FRACTURE_BASE) ?? 0) + areas[t]);
  }
  if (byBreak.size === 0) return undefined;
  const [breakId, breakArea] = [...byBreak.entries()].sort((x, y) => y[1] - x[1])[0];
  return { breakId, breakArea, faceArea };
}

interface SampleAngles { found: Tally; pure: Tally; trueFaces: Tally; byPattern: Map<string, { found: Tally; trueFaces: Tally }> }

function scoreSample(dir: string): SampleAngles {
  const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as Truth;
  const breaks = new Map<string, Map<number, TruthBreak>>();
  for (const b of truth.bones) breaks.set(b.boneId, new Map(b.breaks.map((x) => [x.id, x])));
  const out: SampleAngles = { found: tally(), pure: tally(), trueFaces: tally(), byPattern: new Map() };
  const pattern = (b: TruthBreak) => {
    const key = `${b.age} ${b.pattern}`;
    let v = out.byPattern.get(key);
    if (!v) out.byPattern.set(key, (v = { found: tally(), trueFaces: tally() }));
    return v;
  };
  for (const frag of truth.fragments) {
    const { a, labels, normals, areas, expected } = analyseLabelled(dir, frag);
    const nt = labels.length;
    const boneBreaks = breaks.get(frag.boneId);
    // Faces the segmentation found.
    for (const face of a.fractureFaces) {
      const dominant = dominantBreak(face, labels, areas);
      if (!dominant) continue;
      const { breakId, breakArea, faceArea } = dominant;
      const br = boneBreaks?.get(breakId);
      if (!br) continue;
      const ok = face.angleClass === expected(br);
      add(out.found, ok);
      add(pattern(br).found, ok);
      if (breakArea >= PURE_SHARE * faceArea) add(out.pure, ok);
    }
    // The true faces, measured the same way.
    const topo = buildTopology(a.mesh);
    const centroids = triangleCentroids(a.mesh.positions, a.mesh.triangles);
    const noSamples = { spacing: a.samples.spacing, points: new Float32Array(0), normals: new Float32Array(0), triangle: new Uint32Array(0) };
    for (const label of new Set(labels)) {
      if (label < FRACTURE_BASE) continue;
      const br = boneBreaks?.get(label - FRACTURE_BASE);
      if (!br) continue;
      // This break's triangles are the fracture class; other breaks and damage scars are left
      // out of the angle (not outer surface), periosteal or articular surface is outer.
      const triClass = Uint8Array.from(labels, (l) => (l === label ? 0 : l === 0 ? OUTER : MEDULLARY));
      const faces: FractureFace[] = fractureFaces({
        mesh: a.mesh, neighbours: topo.neighbours, triNormals: normals, areas, centroids, triClass,
        triRoughness: new Float32Array(nt).fill(1), medianRoughness: 1, axis: a.axis, samples: noSamples, settings: a.settings,
      });
      for (const face of faces) {
        if (face.area < MIN_TRUE_FACE_MM2) continue;
        const ok = face.angleClass === expected(br);
        add(out.trueFaces, ok);
        add(pattern(br).trueFaces, ok);
      }
    }
  }
  return out;
}

export default async function main(): Promise<void> {
  const dirs = (process.env.KNITBONE_SAMPLE_DIR ?? join(root, 'demo-data/sample')).split(',').filter(Boolean);
  const rows: Array<Record<string, string>> = [];
  const patterns = new Map<string, { found: Tally; trueFaces: Tally }>();
  for (const dir of dirs) {
    const cpu0 = process.cpuUsage();
    let s: SampleAngles;
    try {
      s = scoreSample(dir);
    } catch (err) {
      process.stdout.write(`(no generated sample at ${dir}: ${(err as Error).message})\n`);
      continue;
    }
    const cpu = process.cpuUsage(cpu0);
    rows.push({
      sample: basename(dir),
      'found faces': show(s.found),
      'pure found faces': show(s.pure),
      'true faces (truth labels)': show(s.trueFaces),
      'CPU s': ((cpu.user + cpu.system) / 1e6).toFixed(1),
    });
    for (const [k, v] of s.byPattern) {
      const p = patterns.get(k) ?? { found: tally(), trueFaces: tally() };
      p.found.faces += v.found.faces; p.found.agree += v.found.agree;
      p.trueFaces.faces += v.trueFaces.faces; p.trueFaces.agree += v.trueFaces.agree;
      patterns.set(k, p);
    }
  }
  process.stdout.write(`\nFracture angle class agreement with the generator's break (load average ${loadavg().map((x) => x.toFixed(1)).join(' ')}):\n`);
  console.table(rows);
  process.stdout.write('\nBy break (all samples):\n');
  console.table([...patterns.entries()].sort().map(([k, v]) => ({ break: k, 'found faces': show(v.found), 'true faces': show(v.trueFaces) })));
}
