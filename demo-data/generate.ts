import { closeSync, mkdirSync, openSync, writeSync } from 'node:fs';
import { join } from 'node:path';
import { runInOrder } from '../core/jobs/ordered-pool';
import { defaultWorkerCount } from '../core/jobs/worker-pool';
import { type BoneResult, type BoneTask, makeBone } from './bone-job';
import { manifoldKernel } from './manifold-kernel';
import { writeBinaryPly } from './ply-writer';
import { invertRigid, multiply } from './pose';
import { Random } from './random';
import { round, SITE } from './site';
import { writeSiteDefinitions } from './site-definitions';
import { ELEMENTS, type ElementSpec } from './skeleton';
import { csvLine, SPECIMEN_COLUMNS } from './specimen-record';

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
  /** Worker threads making bones (default: one per core). The files do not depend on it. */
  workers?: number;
  signal?: AbortSignal;
}

export interface GenerateSummary {
  fragments: number;
  bones: number;
  joins: number;
  bytesWritten: number;
  seconds: number;
  workers: number;
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
 * scans/<catalogue-no>.ply, specimens.csv, truth.json and site.json. Bones are made on
 * `workers` threads (bone-job.ts: each from its own seed), then numbered and written in bone
 * order as they arrive, so the files are the same whatever the number of workers and memory
 * stays bounded by a few bones.
 */
export async function generateAssemblage(options: GenerateOptions, onProgress: ProgressLike = () => {}): Promise<GenerateSummary> {
  const started = performance.now();
  const spacing = options.pointSpacing ?? DEFAULT_POINT_SPACING;
  const noise = options.noiseSd ?? DEFAULT_NOISE;
  const root = new Random(options.seed);
  const total = options.fragments;
  const numberPool = root.fork('catalogue').permutation(Math.max(total * 3, 1000));
  const catalogueNo = (k: number) => `QS-${String(10000 + numberPool[k]).padStart(5, '0')}`;
  const elements = options.elements ?? ELEMENTS.map((_, i) => i);
  // bone seeds, derived from the assemblage seed one after the other
  const seeds: string[] = [];
  const taskOf = (k: number): BoneTask | undefined => {
    if (options.bones !== undefined && k >= options.bones) return undefined;
    while (seeds.length <= k) seeds.push(root.forkSeed(`bone-${seeds.length}`));
    return { boneIndex: k, seed: seeds[k], pointSpacing: spacing, noiseSd: noise, damage: options.damage ?? true, losses: options.losses ?? true, elements };
  };

  mkdirSync(join(options.outDir, 'scans'), { recursive: true });
  let bytes = writeSiteDefinitions(options.outDir);
  const csv = openSync(join(options.outDir, 'specimens.csv'), 'w');
  const truth = openSync(join(options.outDir, 'truth.json'), 'w');
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
  let bonesWritten = 0;
  let firstFragment = true;

  /** Number and write one finished bone; 'stop' once the assemblage is complete. */
  const write = (bone: BoneResult): 'stop' | undefined => {
    const boneId = `bone-${String(bone.boneIndex + 1).padStart(4, '0')}`;
    const keep = Math.min(bone.fragments.length, total - produced);
    const numbers = bone.fragments.slice(0, keep).map((_, k) => catalogueNo(produced + k));
    for (let k = 0; k < keep; k++) {
      const f = bone.fragments[k];
      const no = numbers[k];
      bytes += writeBinaryPly(join(options.outDir, 'scans', `${no}.ply`), f.scan.positions, f.scan.triangles, [
        `knitbone demo scan of specimen ${no}`,
        'units millimetres',
      ]);
      put(csv, csvLine(SPECIMEN_COLUMNS.map((c) => (c === 'catalogue_no' ? no : f.row[c]))));
      const entry = {
        catalogueNo: no,
        scanFile: `scans/${no}.ply`,
        boneId,
        taxon: bone.taxon,
        element: bone.element,
        side: bone.side,
        poseBoneToScan: f.pose.map((v) => round(v, 9)),
        noiseSdMm: round(f.noiseSd, 4),
        vertexCount: f.scan.positions.length / 3,
        triangleCount: f.scan.labels.length,
        volumeMm3: round(f.volumeMm3, 1),
        zoneCoverage: f.zoneCoverage,
        breaks: f.breaks,
        damage: f.damage,
        triangleLabels: Buffer.from(f.scan.labels.buffer, f.scan.labels.byteOffset, f.scan.labels.byteLength).toString('base64'),
      };
      put(truth, (firstFragment ? '' : ',\n') + JSON.stringify(entry));
      firstFragment = false;
      onProgress({ stage: 'generating fragments', done: produced + k + 1, total, detail: no });
    }
    for (const j of bone.joins) {
      if (j.a >= keep || j.b >= keep) continue;
      const [a, b] = numbers[j.a] < numbers[j.b] ? [j.a, j.b] : [j.b, j.a];
      const poseA = bone.fragments[a].pose;
      const poseB = bone.fragments[b].pose;
      joins.push({
        a: numbers[a],
        b: numbers[b],
        boneId,
        breakId: j.breakId,
        type: 'conjoin',
        breakAge: j.breakAge,
        pattern: j.pattern,
        transformBToA: multiply(poseA, invertRigid(poseB)).map((v) => round(v, 9)),
        contactAreaMm2: round(j.contactAreaMm2, 1),
        survivingFraction: round(j.survivingFraction, 3),
        damaged: j.damaged,
      });
    }
    const dropped = bone.fragments.slice(keep).reduce((s, f) => s + f.volumeBeforeDamageMm3, 0);
    bones.push({
      boneId,
      taxon: bone.taxon,
      element: bone.element,
      side: bone.side,
      sizeClass: bone.sizeClass,
      lengthMm: bone.lengthMm,
      state: bone.state,
      breaks: bone.breaks.map((b) => ({ ...b, nominalBevelDeg: round(b.nominalBevelDeg, 1) })),
      fragments: numbers,
      lostFragments: bone.pieceCount - keep,
      lostVolumeMm3: round(bone.lostVolumeMm3 + dropped, 1),
      boneVolumeMm3: round(bone.boneVolumeMm3, 1),
    });
    produced += keep;
    bonesWritten++;
    return produced >= total ? 'stop' : undefined;
  };

  const workers = Math.max(1, Math.floor(options.workers ?? defaultWorkerCount()));
  try {
    if (total > 0) {
      if (workers === 1) {
        const wasm = await manifoldKernel();
        for (let k = 0; ; k++) {
          if (options.signal?.aborted) throw new Error('cancelled');
          const task = taskOf(k);
          if (!task || write(makeBone(wasm, task)) === 'stop') break;
        }
      } else {
        await runInOrder<BoneTask, BoneResult>({
          moduleUrl: new URL('./bone-worker.ts', import.meta.url),
          workers,
          // Bones give 2-15 fragments; near the end, start no more than are likely needed
          // (the rest would be thrown away) until the bones in hand are counted.
          task: (k) => (k > bonesWritten && produced + 3 * (k - bonesWritten) >= total ? null : taskOf(k)),
          onResult: (_, bone) => write(bone),
          signal: options.signal,
        });
      }
    }
    put(truth, '\n],\n"bones": [\n' + bones.map((b) => JSON.stringify(b)).join(',\n') + '\n],\n"joins": [\n' + joins.map((j) => JSON.stringify(j)).join(',\n') + '\n]\n}\n');
  } finally {
    closeSync(csv);
    closeSync(truth);
  }
  return { fragments: produced, bones: bones.length, joins: joins.length, bytesWritten: bytes, seconds: (performance.now() - started) / 1000, workers };
}

export type { ElementSpec };
