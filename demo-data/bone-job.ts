import type { ManifoldToplevel } from 'manifold-3d';
import { BoneShape } from './bone-shape';
import { type BreakAge, planBreaks } from './break-plan';
import { contactArea, labelArea } from './contact';
import { type DamageRecord, damageEdges } from './damage';
import { type LabelledMesh, labelledMesh } from './labelled-mesh';
import { slabVolume } from './mesh';
import { type Matrix4, randomPose } from './pose';
import { Random } from './random';
import { simulateScan } from './scan-simulation';
import { type BreakRecord, FRACTURE_BASE, shatterBone } from './shatter';
import { depositionPoint, fragmentFind, round } from './site';
import { ELEMENTS } from './skeleton';
import { type SpecimenRow, specimenRow, ZONES, type Zone } from './specimen-record';

/**
 * One bone from start to finish: made, broken, damaged and scanned, from its own seed only.
 * Nothing here knows catalogue numbers or how many fragments came before, so bones can be
 * made in any order, on any thread, and give the same bytes (generate.ts numbers and writes
 * them in bone order).
 */
export interface BoneTask {
  boneIndex: number;
  /** Seed of this bone's random stream (derived from the assemblage seed by generate.ts). */
  seed: string;
  pointSpacing: number;
  noiseSd: readonly [number, number];
  damage: boolean;
  losses: boolean;
  /** Indices into ELEMENTS to choose from. */
  elements: readonly number[];
}

export interface FragmentResult {
  scan: LabelledMesh;
  pose: Matrix4;
  noiseSd: number;
  /** Volume (mm³) as scanned, and before damage (for the lost volume when the piece is dropped). */
  volumeMm3: number;
  volumeBeforeDamageMm3: number;
  zoneCoverage: Record<Zone, number>;
  breaks: number[];
  damage: DamageRecord[];
  /** The specimen row, catalogue_no still empty. */
  row: SpecimenRow;
}

export interface JoinResult {
  /** Indices into fragments. */
  a: number;
  b: number;
  breakId: number;
  breakAge: BreakAge;
  pattern: string;
  contactAreaMm2: number;
  survivingFraction: number;
  damaged: boolean;
}

export interface BoneResult {
  boneIndex: number;
  taxon: string;
  element: string;
  side: 'left' | 'right';
  sizeClass: number;
  lengthMm: number;
  state: 'fresh' | 'dry';
  breaks: BreakRecord[];
  /** Pieces made, present or not. */
  pieceCount: number;
  /** Volume of the lost pieces and crumbs (mm³). */
  lostVolumeMm3: number;
  boneVolumeMm3: number;
  /** The fragments that survive, in the order they are to be numbered. */
  fragments: FragmentResult[];
  joins: JoinResult[];
}

export function makeBone(wasm: ManifoldToplevel, task: BoneTask): BoneResult {
  const spacing = task.pointSpacing;
  // Cut bodies (the rough fracture surfaces) are built at the scanner's spacing; the smooth
  // bone surfaces more coarsely (chords of 2 mm on a 10 mm radius stray 0.05 mm from the
  // circle, under the scanner noise), which halves the work of every boolean. Long edges are
  // split to the spacing afterwards.
  const cutResolution = Math.max(0.3, spacing);
  const boneResolution = Math.max(0.6, Math.min(2, spacing * 2));
  const rng = new Random(task.seed);
  const spec = rng.pick(task.elements.map((i) => ELEMENTS[i]));
  const side = rng.chance(0.5) ? 'left' : 'right';
  const shape = new BoneShape(spec, side);
  const plan = planBreaks(shape, rng.fork('plan'));
  const shattered = shatterBone(wasm, shape, plan, cutResolution, boneResolution);
  const { pieces, breaks, labelOf } = shattered;
  const ageOf = new Map(breaks.map((b) => [b.id, b]));
  const before = pieces.map((p) => labelledMesh(p.solid, labelOf));
  const zones = zoneBounds(shape);
  const coverage = before.map((m) => zones.map(([lo, hi]) => Math.max(0, slabVolume(m.positions, m.triangles, lo, hi))));
  const zoneTotals = ZONES.map((_, z) => coverage.reduce((s, c) => s + c[z], 0) || 1);
  const volumeBefore = pieces.map((p) => p.solid.volume());

  // which fragments are lost
  const lossRng = rng.fork('losses');
  const lost = pieces.map(() => false);
  if (task.losses) {
    pieces.forEach((p, i) => {
      const box = p.solid.boundingBox();
      const tipP = box.min[2] < 1;
      const tipD = box.max[2] > shape.length - 1;
      lost[i] = lossRng.chance(tipP ? 0.25 : tipD ? 0.2 : 0.1);
    });
    if (lost.every(Boolean)) lost[lossRng.int(0, lost.length - 1)] = false;
  }
  const present = pieces.map((_, i) => i).filter((i) => !lost[i]);

  // damage, then the surviving contact of every true join
  const damageRng = rng.fork('damage');
  const damageRecords: DamageRecord[][] = pieces.map(() => []);
  const after: LabelledMesh[] = before.slice();
  for (const i of present) {
    if (!task.damage) continue;
    const res = damageEdges(wasm, pieces[i].solid, before[i], labelOf, damageRng, plan.boneAge === 'fresh' ? 0.25 : 0.45);
    pieces[i].solid = res.solid;
    damageRecords[i] = res.records;
    if (res.records.length) after[i] = labelledMesh(res.solid, labelOf);
  }

  const scanRng = rng.fork('scans');
  const findRng = rng.fork('finds');
  const idRng = rng.fork('identification');
  const origin = depositionPoint(rng.fork('deposition'));
  const fragments: FragmentResult[] = [];
  for (const i of present) {
    const refined = pieces[i].solid.refineToLength(spacing * 1.5);
    const mesh = labelledMesh(refined, labelOf);
    refined.delete();
    const volume = pieces[i].solid.volume();
    const pose = randomPose(scanRng, meshCentroid(mesh), 40);
    const sd = task.noiseSd[0] + (task.noiseSd[1] - task.noiseSd[0]) * scanRng.next();
    const scan = simulateScan(mesh, pose, sd, scanRng);
    const faceLabels = [...new Set(after[i].labels)].filter((l) => l >= FRACTURE_BASE);
    const faceAges = faceLabels.map((l) => ({ age: ageOf.get(l - FRACTURE_BASE)!.age as BreakAge, area: labelArea(after[i], l) }));
    const cov = Object.fromEntries(ZONES.map((z, k) => [z, round(coverage[i][k] / zoneTotals[k], 3)])) as Record<Zone, number>;
    const longitudinal = faceLabels.some((l) => ageOf.get(l - FRACTURE_BASE)!.pattern === 'longitudinal');
    const row = specimenRow(
      {
        catalogueNo: '',
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
    fragments.push({
      scan,
      pose,
      noiseSd: sd,
      volumeMm3: volume,
      volumeBeforeDamageMm3: volumeBefore[i],
      zoneCoverage: cov,
      breaks: faceLabels.map((l) => l - FRACTURE_BASE),
      damage: damageRecords[i],
      row,
    });
  }

  // true joins between present fragments: the two sides of one break in contact
  const joins: JoinResult[] = [];
  for (const b of breaks) {
    const label = FRACTURE_BASE + b.id;
    const holders = present.filter((i) => before[i].labels.includes(label));
    for (const ia of holders) {
      for (const ib of holders) {
        if (pieces[ia].sides.get(b.id) !== 'in' || pieces[ib].sides.get(b.id) !== 'out') continue;
        const area0 = contactArea(before[ia], before[ib], label);
        if (area0 < 2) continue;
        const area1 = contactArea(after[ia], after[ib], label);
        joins.push({
          a: present.indexOf(ia),
          b: present.indexOf(ib),
          breakId: b.id,
          breakAge: b.age,
          pattern: b.pattern,
          contactAreaMm2: area0,
          survivingFraction: area1 / area0,
          damaged: damageRecords[ia].some((d) => d.breakId === b.id) || damageRecords[ib].some((d) => d.breakId === b.id),
        });
      }
    }
  }
  const lostVolume = pieces.reduce((s, _, i) => s + (lost[i] ? volumeBefore[i] : 0), 0) + shattered.crumbs.reduce((s, v) => s + v, 0);
  for (const p of pieces) p.solid.delete();
  return {
    boneIndex: task.boneIndex,
    taxon: spec.taxon,
    element: spec.element,
    side,
    sizeClass: spec.sizeClass,
    lengthMm: spec.length,
    state: plan.boneAge,
    breaks,
    pieceCount: pieces.length,
    lostVolumeMm3: lostVolume,
    boneVolumeMm3: shattered.boneVolume,
    fragments,
    joins,
  };
}

/** The typed arrays of a result, to hand over to another thread without copying. */
export function transferablesOf(result: BoneResult): ArrayBuffer[] {
  return result.fragments.flatMap((f) => [f.scan.positions.buffer, f.scan.triangles.buffer, f.scan.labels.buffer] as ArrayBuffer[]);
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
