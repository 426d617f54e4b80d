import { closeSync, mkdirSync, openSync, writeSync } from 'node:fs';
import { join } from 'node:path';
import { BoneShape } from './bone-shape';
import { type BreakAge, planBreaks } from './break-plan';
import { contactArea, labelArea } from './contact';
import { type DamageRecord, damageEdges } from './damage';
import { type LabelledMesh, labelledMesh } from './labelled-mesh';
import { manifoldKernel } from './manifold-kernel';
import { slabVolume } from './mesh';
import { writeBinaryPly } from './ply-writer';
import { invertRigid, type Matrix4, multiply, randomPose } from './pose';
import { Random } from './random';
import { simulateScan } from './scan-simulation';
import { FRACTURE_BASE, type Piece, shatterBone } from './shatter';
import { depositionPoint, fragmentFind, round, SITE } from './site';
import { ELEMENTS, type ElementSpec } from './skeleton';
import { csvLine, SPECIMEN_COLUMNS, specimenRow, ZONES, type Zone } from './specimen-record';

export interface GenerateOptions {
  outDir: string;
  /** Number of fragments in the assemblage (scans written). */
  fragments: number;
  seed: string | number;
  /** Scanner point spacing (mm); 0.1-0.5 is a structured-light scanner, coarser keeps files small. */
  pointSpacing?: number;
  /** Scanner noise: standard deviation (mm) drawn per fragment from this range; [0, 0] for none. */
  noiseSd?: readonly [number, number];
  /** Chips, erosion and lost flakes along fracture edges. */
  damage?: boolean;
  /** Lose some fragments (end pieces and others), as in a real assemblage. */
  losses?: boolean;
  /** Stop after this many bones even if fewer fragments were made (fragments is then a ceiling). */
  bones?: number;
  /** Restrict the bones to these elements (by index into ELEMENTS), e.g. for tests. */
  elements?: readonly number[];
}

export interface GenerateSummary {
  fragments: number;
  bones: number;
  joins: number;
  bytesWritten: number;
  seconds: number;
}

export interface ProgressLike {
  (e: { stage: string; done: number; total: number; detail?: string }): void;
}

export const DEFAULT_POINT_SPACING = 1.0;
export const DEMO_TRUTH_FORMAT = 'knitbone demo truth 1';
export const DEFAULT_NOISE: readonly [number, number] = [0.02, 0.1];

const LABEL_LEGEND = {
  '0': 'original surface: periosteal or articular',
  '1': 'original surface: medullary cavity',
  '2': 'damage scar: chip, eroded edge or lost flake (matches nothing)',
  '10+k': 'fracture surface of break k of the fragment\'s bone (bones[].breaks[].id = k)',
};

/**
 * Generate an assemblage of broken long bones with known truth and write it to outDir:
 * scans/<catalogue-no>.ply, specimens.csv and truth.json. Bones are made, broken, damaged
 * and scanned one at a time and written as they are done, so memory stays bounded.
 */
export async function generateAssemblage(options: GenerateOptions, onProgress: ProgressLike = () => {}): Promise<GenerateSummary> {
  const started = performance.now();
  const wasm = await manifoldKernel();
  const spacing = options.pointSpacing ?? DEFAULT_POINT_SPACING;
  const noise = options.noiseSd ?? DEFAULT_NOISE;
  const damage = options.damage ?? true;
  const losses = options.losses ?? true;
  // meshes are built near the scanner's spacing; long edges left by the booleans (on the wide
  // ends) are split afterwards
  const cutResolution = Math.max(0.3, spacing);
  const boneResolution = Math.max(0.4, spacing * 1.3);
  const root = new Random(options.seed);
  const total = options.fragments;
  const numberPool = root.fork('catalogue').permutation(Math.max(total * 3, 1000));
  const catalogueNo = (k: number) => `QS-${String(10000 + numberPool[k]).padStart(5, '0')}`;
  const elementChoices = (options.elements ?? ELEMENTS.map((_, i) => i)).map((i) => ELEMENTS[i]);

  mkdirSync(join(options.outDir, 'scans'), { recursive: true });
  const csv = openSync(join(options.outDir, 'specimens.csv'), 'w');
  const truth = openSync(join(options.outDir, 'truth.json'), 'w');
  let bytes = 0;
  const put = (fd: number, s: string) => {
    bytes += writeSync(fd, s);
  };
  put(csv, csvLine(SPECIMEN_COLUMNS));
  put(
    truth,
    '{\n' +
      `"format": "${DEMO_TRUTH_FORMAT}",\n"seed": ${JSON.stringify(String(options.seed))},\n` +
      `"site": ${JSON.stringify(SITE)},\n` +
      `"units": "millimetres in scans and transforms; metres for x, y, z provenience",\n` +
      `"transformConvention": "4x4 row-major rigid matrices; poseBoneToScan maps the bone frame to the fragment's scan frame; a join's transformBToA maps points of B's scan file into A's scan file frame",\n` +
      `"pointSpacingMm": ${spacing},\n` +
      `"labelLegend": ${JSON.stringify(LABEL_LEGEND)},\n` +
      `"triangleLabelsEncoding": "base64 of one unsigned byte per triangle, in the scan file's face order",\n` +
      '"fragments": [\n',
  );
  const bones: unknown[] = [];
  const joins: unknown[] = [];
  let produced = 0;
  let firstFragment = true;
  let boneIndex = 0;
  try {
    while (produced < total && (options.bones === undefined || boneIndex < options.bones)) {
      const rng = root.fork(`bone-${boneIndex}`);
      const boneId = `bone-${String(boneIndex + 1).padStart(4, '0')}`;
      const spec = rng.pick(elementChoices);
      const side = rng.chance(0.5) ? 'left' : 'right';
      const shape = new BoneShape(spec, side);
      const plan = planBreaks(shape, rng.fork('plan'));
      const shattered = shatterBone(wasm, shape, plan, cutResolution, boneResolution);
      const { pieces, breaks, labelOf } = shattered;
      const ageOf = new Map(breaks.map((b) => [b.id, b]));
      const before = pieces.map((p) => labelledMesh(p.solid, labelOf));
      const zones = zoneBounds(shape);
      const coverage = before.map((m) => zoneVolumes(m, zones));
      const zoneTotals = ZONES.map((_, z) => coverage.reduce((s, c) => s + c[z], 0) || 1);

      // which fragments are lost
      const lossRng = rng.fork('losses');
      const lost = pieces.map(() => false);
      if (losses) {
        pieces.forEach((p, i) => {
          const box = p.solid.boundingBox();
          const tipP = box.min[2] < 1;
          const tipD = box.max[2] > shape.length - 1;
          lost[i] = lossRng.chance(tipP ? 0.25 : tipD ? 0.2 : 0.1);
        });
        if (lost.every(Boolean)) lost[lossRng.int(0, lost.length - 1)] = false;
      }
      let present = pieces.map((_, i) => i).filter((i) => !lost[i]);
      if (produced + present.length > total) {
        for (const i of present.slice(total - produced)) lost[i] = true;
        present = present.slice(0, total - produced);
      }

      // damage, then the surviving contact of every true join
      const damageRng = rng.fork('damage');
      const damageRecords: DamageRecord[][] = pieces.map(() => []);
      const after: LabelledMesh[] = before.slice();
      for (const i of present) {
        if (!damage) continue;
        const res = damageEdges(wasm, pieces[i].solid, before[i], labelOf, damageRng, plan.boneAge === 'fresh' ? 0.25 : 0.45);
        pieces[i].solid = res.solid;
        damageRecords[i] = res.records;
        if (res.records.length) after[i] = labelledMesh(res.solid, labelOf);
      }

      const numbers = new Map<number, string>();
      for (const i of present) numbers.set(i, catalogueNo(produced + numbers.size));
      const poses = new Map<number, Matrix4>();
      const scanRng = rng.fork('scans');
      const findRng = rng.fork('finds');
      const idRng = rng.fork('identification');
      const origin = depositionPoint(rng.fork('deposition'));
      for (const i of present) {
        const no = numbers.get(i)!;
        const refined = pieces[i].solid.refineToLength(spacing * 1.5);
        const mesh = labelledMesh(refined, labelOf);
        refined.delete();
        const volume = pieces[i].solid.volume();
        const centroid = meshCentroid(mesh);
        const pose = randomPose(scanRng, centroid, 40);
        poses.set(i, pose);
        const sd = noise[0] + (noise[1] - noise[0]) * scanRng.next();
        const scan = simulateScan(mesh, pose, sd, scanRng);
        bytes += writeBinaryPly(join(options.outDir, 'scans', `${no}.ply`), scan.positions, scan.triangles, [
          `knitbone demo scan of specimen ${no}`,
          'units millimetres',
        ]);
        const faceLabels = [...new Set(after[i].labels)].filter((l) => l >= FRACTURE_BASE);
        const faceAges = faceLabels.map((l) => ({ age: ageOf.get(l - FRACTURE_BASE)!.age as BreakAge, area: labelArea(after[i], l) }));
        const cov = Object.fromEntries(ZONES.map((z, k) => [z, round(coverage[i][k] / zoneTotals[k], 3)])) as Record<Zone, number>;
        const longitudinal = faceLabels.some((l) => ageOf.get(l - FRACTURE_BASE)!.pattern === 'longitudinal');
        const row = specimenRow(
          {
            catalogueNo: no,
            spec,
            side,
            coverage: cov,
            faceAges,
            volumeMm3: volume,
            completeCircumference: !longitudinal,
            damaged: damageRecords[i].length > 0,
            provenience: fragmentFind(findRng, origin),
          },
          idRng,
        );
        put(csv, csvLine(SPECIMEN_COLUMNS.map((c) => row[c])));
        const entry = {
          catalogueNo: no,
          scanFile: `scans/${no}.ply`,
          boneId,
          taxon: spec.taxon,
          element: spec.element,
          side,
          poseBoneToScan: pose.map((v) => round(v, 9)),
          noiseSdMm: round(sd, 4),
          vertexCount: scan.positions.length / 3,
          triangleCount: scan.labels.length,
          volumeMm3: round(volume, 1),
          zoneCoverage: cov,
          breaks: faceLabels.map((l) => l - FRACTURE_BASE),
          damage: damageRecords[i],
          triangleLabels: Buffer.from(scan.labels.buffer, scan.labels.byteOffset, scan.labels.byteLength).toString('base64'),
        };
        put(truth, (firstFragment ? '' : ',\n') + JSON.stringify(entry));
        firstFragment = false;
        onProgress({ stage: 'generating fragments', done: produced + numbers.size, total, detail: no });
      }

      // true joins between present fragments: the two sides of one break in contact
      for (const b of breaks) {
        const label = FRACTURE_BASE + b.id;
        const holders = present.filter((i) => before[i].labels.includes(label));
        for (const ia of holders) {
          for (const ib of holders) {
            if (pieces[ia].sides.get(b.id) !== 'in' || pieces[ib].sides.get(b.id) !== 'out') continue;
            const area0 = contactArea(before[ia], before[ib], label);
            if (area0 < 2) continue;
            const area1 = contactArea(after[ia], after[ib], label);
            const [a, bb] = numbers.get(ia)! < numbers.get(ib)! ? [ia, ib] : [ib, ia];
            joins.push({
              a: numbers.get(a),
              b: numbers.get(bb),
              boneId,
              breakId: b.id,
              type: 'conjoin',
              breakAge: b.age,
              pattern: b.pattern,
              transformBToA: multiply(poses.get(a)!, invertRigid(poses.get(bb)!)).map((v) => round(v, 9)),
              contactAreaMm2: round(area0, 1),
              survivingFraction: round(area1 / area0, 3),
              damaged: damageRecords[ia].some((d) => d.breakId === b.id) || damageRecords[ib].some((d) => d.breakId === b.id),
            });
          }
        }
      }
      bones.push({
        boneId,
        taxon: spec.taxon,
        element: spec.element,
        side,
        sizeClass: spec.sizeClass,
        lengthMm: spec.length,
        state: plan.boneAge,
        breaks: breaks.map((b) => ({ ...b, nominalBevelDeg: round(b.nominalBevelDeg, 1) })),
        fragments: present.map((i) => numbers.get(i)),
        lostFragments: pieces.length - present.length,
        lostVolumeMm3: round(pieces.reduce((s, p, i) => s + (lost[i] ? p.solid.volume() : 0), 0) + shattered.crumbs.reduce((s, v) => s + v, 0), 1),
        boneVolumeMm3: round(shattered.boneVolume, 1),
      });
      for (const p of pieces) p.solid.delete();
      produced += present.length;
      boneIndex++;
    }
    put(truth, '\n],\n"bones": [\n' + bones.map((b) => JSON.stringify(b)).join(',\n') + '\n],\n"joins": [\n' + joins.map((j) => JSON.stringify(j)).join(',\n') + '\n]\n}\n');
  } finally {
    closeSync(csv);
    closeSync(truth);
  }
  return { fragments: produced, bones: boneIndex, joins: joins.length, bytesWritten: bytes, seconds: (performance.now() - started) / 1000 };
}

function meshCentroid(m: LabelledMesh): [number, number, number] {
  const p = m.positions;
  const n = p.length / 3;
  let x = 0, y = 0, z = 0;
  for (let i = 0; i < n; i++) {
    x += p[i * 3];
    y += p[i * 3 + 1];
    z += p[i * 3 + 2];
  }
  return [x / n, y / n, z / n];
}

/** z limits of the five portion zones: the ends, and the shaft in thirds. */
export function zoneBounds(shape: BoneShape): Array<[number, number]> {
  const a = shape.diaphysisStart;
  const b = shape.diaphysisEnd;
  const third = (b - a) / 3;
  return [
    [-1000, a],
    [a, a + third],
    [a + third, a + 2 * third],
    [a + 2 * third, b],
    [b, 1000],
  ];
}

function zoneVolumes(mesh: LabelledMesh, zones: Array<[number, number]>): number[] {
  return zones.map(([lo, hi]) => Math.max(0, slabVolume(mesh.positions, mesh.triangles, lo, hi)));
}

export type { ElementSpec, Piece };
