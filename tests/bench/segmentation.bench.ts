/**
 * Segmentation benchmark (issue 5, point 7): on the generated sample assemblage
 * (demo-data/sample: scans plus truth.json with per-triangle labels), per-triangle
 * fracture/original agreement weighted by area, fracture-angle class agreement with the
 * generator's break (Villa & Mahieu 1991: a bevelled fresh break is oblique, a dry or modern
 * one is right-angled), and time and memory for ingest plus segmentation of a
 * 200,000-triangle scan. Prints tables; not a pass/fail test.
 *
 * KNITBONE_SAMPLE_DIR points at another generated sample folder (or several, comma-separated:
 * one row each); KNITBONE_SEGMENTATION_PART=accuracy|speed runs only that part;
 * KNITBONE_SEGMENTATION_SETTINGS takes analysis setting overrides as JSON (settings.ts), e.g.
 * '{"faceSplitMeanAngleDeg":180,"faceSplitCreaseShare":2}' for faces without splitting.
 */
import { readFileSync } from 'node:fs';
import { availableParallelism, loadavg } from 'node:os';
import { basename, dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { analyseFragment, type FragmentAnalysis } from '../../core/geometry/analyse-fragment';
import { triangleNormalsAndAreas } from '../../core/geometry/mesh';
import { parseMeshFile } from '../../core/geometry/parse/index';
import { brokenTube } from '../unit/geometry/broken-tube';
import { plyBinary } from '../unit/geometry/mesh-writers';

interface TruthBreak { id: number; age: string; pattern: string; nominalBevelDeg: number }
interface Truth {
  fragments: Array<{ catalogueNo: string; scanFile: string; boneId: string; triangleLabels: string }>;
  bones: Array<{ boneId: string; breaks: TruthBreak[] }>;
}

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');

/** Expected Villa & Mahieu angle class of a generated break: bevel beyond the right-angle tolerance is oblique. */
function expectedAngleClass(b: TruthBreak, toleranceDeg: number): 'oblique' | 'right' {
  return Math.abs(b.nominalBevelDeg) > toleranceDeg ? 'oblique' : 'right';
}

export interface SampleScores {
  fragments: number;
  triangles: number;
  areaAgreement: number;
  areaAgreementWithoutDamage: number;
  faces: number;
  facesScored: number;
  angleAgreement: number;
  /** Angle class agreement of faces on breaks expected oblique (bevelled) and right-angled. */
  angleByExpected: Record<'oblique' | 'right', { faces: number; agree: number }>;
  outlineCounts: Record<string, number>;
  ms: number;
  perFragment: Array<{ no: string; tris: number; agree: number; faces: number; ms: number }>;
  confusion: Record<string, number>;
  /**
   * Face purity: the area share of a face lying on its dominant true break (anything else,
   * another break or original surface, counts against it). Area-weighted mean over all faces,
   * and the share of faces (by count) whose purity is under 0.7.
   */
  purity: number;
  impureFaceShare: number;
  /** Agreement if every region took its majority true label: the ceiling of a per-region classifier. */
  regionCeiling: number;
}

export function scoreSample(dir: string, settings = {}): SampleScores {
  const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as Truth;
  const breaks = new Map<string, Map<number, TruthBreak>>();
  for (const b of truth.bones) breaks.set(b.boneId, new Map(b.breaks.map((x) => [x.id, x])));
  let ceilingArea = 0;
  let purityArea = 0, faceArea = 0, impure = 0;
  let agreeArea = 0, totalArea = 0, agreeND = 0, totalND = 0, faces = 0, scored = 0, angleOk = 0, ms = 0, tris = 0;
  const outlineCounts: Record<string, number> = {};
  const confusion: Record<string, number> = {};
  const angleByExpected: SampleScores['angleByExpected'] = { oblique: { faces: 0, agree: 0 }, right: { faces: 0, agree: 0 } };
  const perFragment: SampleScores['perFragment'] = [];
  for (const frag of truth.fragments) {
    const bytes = readFileSync(join(dir, frag.scanFile));
    const labels = Buffer.from(frag.triangleLabels, 'base64');
    const t0 = performance.now();
    const parsed = parseMeshFile(bytes, frag.scanFile);
    const a: FragmentAnalysis = analyseFragment(parsed.mesh, settings);
    const dt = performance.now() - t0;
    ms += dt;
    tris += labels.length;
    const predicted = new Uint8Array(labels.length);
    for (let f = 0; f < a.triangleClass.length; f++) if (a.triangleClass[f] === 0) predicted[a.sourceTriangle[f]] = 1;
    const { areas } = triangleNormalsAndAreas(parsed.mesh);
    let fa = 0, ft = 0;
    for (let f = 0; f < labels.length; f++) {
      const isFracture = labels[f] >= 2 ? 1 : 0;
      const ok = predicted[f] === isFracture;
      totalArea += areas[f]; ft += areas[f];
      if (ok) { agreeArea += areas[f]; fa += areas[f]; }
      if (labels[f] !== 2) { totalND += areas[f]; if (ok) agreeND += areas[f]; }
      const key = `truth ${labels[f] >= 10 ? 'fracture' : labels[f] === 2 ? 'damage' : labels[f] === 1 ? 'medullary' : 'outer/articular'} -> ${predicted[f] ? 'fracture' : 'original'}`;
      confusion[key] = (confusion[key] ?? 0) + areas[f];
    }
    {
      const nr = a.regions.length;
      const fr = new Float64Array(nr), tot = new Float64Array(nr);
      for (let f = 0; f < a.regionOfTriangle.length; f++) {
        const src = a.sourceTriangle[f];
        tot[a.regionOfTriangle[f]] += areas[src];
        if (labels[src] >= 2) fr[a.regionOfTriangle[f]] += areas[src];
      }
      for (let r = 0; r < nr; r++) ceilingArea += Math.max(fr[r], tot[r] - fr[r]);
    }
    for (const face of a.fractureFaces) {
      faces++;
      outlineCounts[face.outlineClass] = (outlineCounts[face.outlineClass] ?? 0) + 1;
      // The break this face belongs to: the truth label covering most of its area.
      const byBreak = new Map<number, number>();
      const areaByBreak = new Map<number, number>();
      let thisArea = 0;
      for (const t of face.triangleIds) {
        const src = a.sourceTriangle[t];
        const l = labels[src];
        thisArea += areas[src];
        if (l >= 10) {
          byBreak.set(l - 10, (byBreak.get(l - 10) ?? 0) + 1);
          areaByBreak.set(l - 10, (areaByBreak.get(l - 10) ?? 0) + areas[src]);
        }
      }
      const dominant = Math.max(0, ...areaByBreak.values());
      faceArea += thisArea;
      purityArea += dominant;
      if (dominant < 0.7 * thisArea) impure++;
      if (byBreak.size === 0) continue;
      const breakId = [...byBreak.entries()].sort((x, y) => y[1] - x[1])[0][0];
      const br = breaks.get(frag.boneId)?.get(breakId);
      if (!br) continue;
      scored++;
      const expected = expectedAngleClass(br, a.settings.rightAngleToleranceDeg);
      angleByExpected[expected].faces++;
      if (face.angleClass === expected) { angleOk++; angleByExpected[expected].agree++; }
    }
    perFragment.push({ no: frag.catalogueNo, tris: labels.length, agree: fa / ft, faces: a.fractureFaces.length, ms: dt });
  }
  for (const k of Object.keys(confusion)) confusion[k] = confusion[k] / totalArea;
  return {
    fragments: truth.fragments.length,
    triangles: tris,
    areaAgreement: agreeArea / totalArea,
    areaAgreementWithoutDamage: agreeND / totalND,
    faces,
    facesScored: scored,
    angleAgreement: scored ? angleOk / scored : NaN,
    angleByExpected,
    outlineCounts,
    ms,
    perFragment,
    confusion,
    purity: faceArea > 0 ? purityArea / faceArea : NaN,
    impureFaceShare: faces ? impure / faces : NaN,
    regionCeiling: ceilingArea / totalArea,
  };
}

async function largeScan(targetTriangles: number): Promise<{ bytes: Uint8Array; truth: Uint8Array; triangles: number }> {
  // Edge length chosen so the tube has about the target number of triangles.
  let edge = 0.28;
  for (let i = 0; i < 4; i++) {
    const t = await brokenTube({ cuts: [{ normal: [0, 0, 1], offset: -30 }, { baseZ: -45, baseRadius: 50, halfAngleDeg: 45 }], edgeLength: edge });
    const n = t.mesh.triangles.length / 3;
    if (Math.abs(n / targetTriangles - 1) < 0.04) return { bytes: plyBinary(t.mesh, true), truth: t.truth, triangles: n };
    edge *= Math.sqrt(n / targetTriangles);
  }
  const t = await brokenTube({ cuts: [{ normal: [0, 0, 1], offset: -30 }, { baseZ: -45, baseRadius: 50, halfAngleDeg: 45 }], edgeLength: edge });
  return { bytes: plyBinary(t.mesh, true), truth: t.truth, triangles: t.mesh.triangles.length / 3 };
}

const pct = (x: number): string => `${(100 * x).toFixed(1)} %`;

/** One row of the per-sample table. */
function summaryRow(name: string, s: SampleScores): Record<string, string | number> {
  const c = s.confusion;
  const byExp = (k: 'oblique' | 'right'): string => (s.angleByExpected[k].faces ? `${s.angleByExpected[k].agree}/${s.angleByExpected[k].faces}` : '-');
  return {
    sample: name,
    fragments: s.fragments,
    triangles: s.triangles,
    'agreement (area)': pct(s.areaAgreement),
    'region ceiling': pct(s.regionCeiling),
    'original -> fracture': pct((c['truth outer/articular -> fracture'] ?? 0) + (c['truth medullary -> fracture'] ?? 0)),
    'of which medullary': pct(c['truth medullary -> fracture'] ?? 0),
    'fracture -> original': pct((c['truth fracture -> original'] ?? 0) + (c['truth damage -> original'] ?? 0)),
    faces: s.faces,
    'face purity (area)': pct(s.purity),
    'faces purity < 0.7': pct(s.impureFaceShare),
    'angle class agreement': pct(s.angleAgreement),
    'oblique ok': byExp('oblique'),
    'right ok': byExp('right'),
  };
}

/**
 * KNITBONE_SAMPLE_DIR: one generated sample folder, or several separated by commas (one row
 * each in the per-sample table). KNITBONE_SEGMENTATION_PART=accuracy or speed runs one part.
 */
export default async function main(): Promise<void> {
  const dirs = (process.env.KNITBONE_SAMPLE_DIR ?? join(root, 'demo-data/sample')).split(',').filter(Boolean);
  const part = process.env.KNITBONE_SEGMENTATION_PART ?? 'all';
  const rows: Array<Record<string, string | number>> = [];
  if (part !== 'speed') {
    for (const dir of dirs) {
      let s: SampleScores | undefined;
      const cpu0 = process.cpuUsage();
      try {
        s = scoreSample(dir, JSON.parse(process.env.KNITBONE_SEGMENTATION_SETTINGS ?? '{}'));
      } catch (err) {
        process.stdout.write(`(no generated sample at ${dir}: ${(err as Error).message})\n`);
      }
      if (!s) continue;
      const cpu = process.cpuUsage(cpu0);
      rows.push({ ...summaryRow(basename(dir), s), 'CPU s': ((cpu.user + cpu.system) / 1e6).toFixed(1) });
      if (dirs.length > 1) continue;
      process.stdout.write(`\nGenerated sample (${dir.replace(root + '/', '')}): ${s.fragments} fragments, ${s.triangles} triangles\n`);
      console.table({
        'per-triangle agreement, area-weighted (damage scars count as fracture)': pct(s.areaAgreement),
        'per-triangle agreement, area-weighted, damage scars left out': pct(s.areaAgreementWithoutDamage),
        'fracture faces found': s.faces,
        'face purity: area share on the dominant true break, area-weighted': pct(s.purity),
        'faces with purity under 0.7': pct(s.impureFaceShare),
        'faces lying on a true break': s.facesScored,
        'angle class agreement (Villa & Mahieu) of those faces': pct(s.angleAgreement),
        'outline classes found': JSON.stringify(s.outlineCounts),
        'ingest + segmentation, whole sample': `${s.ms.toFixed(0)} ms`,
      });
      console.table(Object.fromEntries(Object.entries(s.confusion).sort().map(([k, v]) => [k, pct(v)])));
      console.table(s.perFragment.map((f) => ({ fragment: f.no, triangles: f.tris, agreement: pct(f.agree), faces: f.faces, ms: Math.round(f.ms) })));
    }
    if (rows.length) {
      process.stdout.write(`\nPer sample (load average ${loadavg().map((x) => x.toFixed(1)).join(' ')}):\n`);
      console.table(rows);
    }
  }
  if (part === 'accuracy') return;
  const big = await largeScan(200_000);
  const before = process.memoryUsage();
  let peakRss = before.rss;
  const timer = setInterval(() => { peakRss = Math.max(peakRss, process.memoryUsage().rss); }, 20);
  const times: number[] = [], cpuTimes: number[] = [];
  let analysis: FragmentAnalysis | undefined;
  for (let i = 0; i < 3; i++) {
    const t0 = performance.now();
    const c0 = process.cpuUsage();
    const parsed = parseMeshFile(big.bytes, 'large.ply');
    analysis = analyseFragment(parsed.mesh);
    const c = process.cpuUsage(c0);
    times.push(performance.now() - t0);
    cpuTimes.push((c.user + c.system) / 1000);
    peakRss = Math.max(peakRss, process.memoryUsage().rss);
  }
  clearInterval(timer);
  let agree = 0, total = 0;
  const { areas } = triangleNormalsAndAreas(analysis!.mesh);
  for (let f = 0; f < analysis!.triangleClass.length; f++) {
    total += areas[f];
    if ((analysis!.triangleClass[f] === 0 ? 1 : 0) === big.truth[analysis!.sourceTriangle[f]]) agree += areas[f];
  }
  process.stdout.write(`\nLarge scan: broken tube with known truth, ${big.triangles} triangles, binary PLY ${(big.bytes.length / 1e6).toFixed(1)} MB (one thread; load average ${loadavg().map((x) => x.toFixed(1)).join(' ')} on ${availableParallelism()} cores)\n`);
  console.table({
    'ingest + segmentation, best of 3': `${Math.min(...times).toFixed(0)} ms`,
    'ingest + segmentation, each run': times.map((t) => t.toFixed(0)).join(', ') + ' ms',
    'CPU time (user + system, all threads), each run': cpuTimes.map((t) => t.toFixed(0)).join(', ') + ' ms',
    'peak resident memory of the process': `${(peakRss / 1e6).toFixed(0)} MB`,
    'per-triangle agreement, area-weighted': pct(agree / total),
  });
}
