/**
 * How far the best motion of a true fragment pair lands from the truth under given matching
 * parameters: every face pair of each listed true join through matchFacePair, merged as the
 * pairwise benchmark merges them (distinctBest), and the winner's rotation and translation
 * error printed (a study of joins whose winner lands 5-12 degrees off the truth: the fine
 * step's accuracy, not the coarse search).
 *
 *   npx tsx tests/bench/fine-accuracy-study.ts <joins.json from KNITBONE_PAIRWISE_JOINS> [params json]
 *
 * Studies the joins of the file whose winner is within WITHIN_DEG degrees and 6 mm (default 12)
 * but not correct, plus KNITBONE_STUDY_FOUND found ones (default 0) as a check. Development
 * seeds only.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { DEFAULT_MATCH_PARAMETERS, distinctBest, matchFacePair, type FaceMatch } from '../../core/geometry/proposals/pairwise-match';
import { prepareFragment, spacingForFaces, DEFAULT_FPFH_RADIUS_SPACINGS, type FragmentInput, type PreparedFragment } from '../../core/geometry/proposals/prepared-fragment';
import { displacementAt, rotationErrorDegrees, invert, type RigidTransform } from '../../core/geometry/registration/rigid-transform';
import { loadCached } from './pairwise.bench';

const SPACING_LADDER = [0.3, 0.42, 0.6, 0.85, 1.2, 1.7, 2.4, 3.4];
interface Rec { set: string; pair: string; cls: string; winnerErr?: [number, number] }
const recs = JSON.parse(readFileSync(process.argv[2], 'utf8')) as Rec[];
const params = { ...DEFAULT_MATCH_PARAMETERS, ...(JSON.parse(process.argv[3] ?? '{}') as object) };
const within = Number(process.env.WITHIN_DEG ?? 12);
const nFound = Number(process.env.KNITBONE_STUDY_FOUND ?? 0);
const seen = new Set<string>();
const chosen = recs.filter((r) => {
  const k = `${r.set}|${r.pair}`;
  if (seen.has(k)) return false;
  seen.add(k);
  return r.cls !== 'found' && !!r.winnerErr && r.winnerErr[0] < within && r.winnerErr[1] < 6;
});
const found = recs.filter((r) => r.cls === 'found');
for (let i = 0; i < nFound && found.length; i++) chosen.push(found[Math.floor((i * found.length) / nFound)]);
const sets = new Map<string, { dir: string; spacing: number; inputs: Map<string, FragmentInput>; prepared: Map<string, PreparedFragment>; truth: { joins: Array<{ a: string; b: string; type: string; transformBToA: number[] }> } }>();
let ok = 0, cpu = 0;
for (const r of chosen) {
  const dir = join('/tmp/g5', r.set);
  let s = sets.get(r.set);
  if (!s) {
    const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { fragments: Array<{ catalogueNo: string }>; joins: Array<{ a: string; b: string; type: string; transformBToA: number[] }> };
    const inputs = new Map<string, FragmentInput>();
    for (const f of truth.fragments) {
      try { inputs.set(f.catalogueNo, loadCached(join(dir, 'scans', `${f.catalogueNo}.ply`))); } catch { /* refused scan */ }
    }
    const raw = spacingForFaces([...inputs.values()].flatMap((x) => x.faces.map((y) => y.area ?? 0)));
    const spacing = SPACING_LADDER.reduce((best, v) => (Math.abs(Math.log(v / raw)) < Math.abs(Math.log(best / raw)) ? v : best), SPACING_LADDER[0]);
    s = { dir, spacing, inputs, prepared: new Map(), truth };
    sets.set(r.set, s);
  }
  const S = s;
  const prep = (no: string): PreparedFragment => S.prepared.get(no) ?? S.prepared.set(no, prepareFragment(S.inputs.get(no)!, { spacing: S.spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS })).get(no)!;
  const [a, b] = r.pair.split('|');
  const tj = S.truth.joins.find((j) => j.type === 'conjoin' && ((j.a === a && j.b === b) || (j.a === b && j.b === a)))!;
  // as the benchmark: B's faces moved onto A's, A the first of the two in catalogue order (the truth maps tj.b onto tj.a)
  const order = [...S.inputs.keys()];
  const flip = order.indexOf(tj.a) > order.indexOf(tj.b);
  const A = prep(flip ? tj.b : tj.a), B = prep(flip ? tj.a : tj.b);
  const t = (flip ? invert(tj.transformBToA as RigidTransform) : tj.transformBToA) as RigidTransform;
  const c0 = process.cpuUsage();
  const all: FaceMatch[] = [];
  for (let i = 0; i < A.faces.length; i++) for (let k = 0; k < B.faces.length; k++) all.push(...matchFacePair(A, i, B, k, params));
  const c1 = process.cpuUsage(c0);
  cpu += (c1.user + c1.system) / 1e6;
  const ranked = distinctBest(all, 2 * S.spacing);
  const err = (m: FaceMatch): string => `${rotationErrorDegrees(m.transform, t).toFixed(1)}/${displacementAt(m.transform, t, B.centroid).toFixed(1)}:${m.score.toFixed(2)}`;
  const w = ranked[0];
  const good = !!w && rotationErrorDegrees(w.transform, t) < 5 && displacementAt(w.transform, t, B.centroid) < 5;
  if (good) ok++;
  console.log(`${r.set} ${r.pair} ${r.cls} was ${r.winnerErr?.map((x) => x.toFixed(1)).join('/')} now ${ranked.slice(0, 4).map(err).join(' ')}${good ? ' OK' : ''}`);
}
console.log(`correct winners ${ok} of ${chosen.length}; CPU ${cpu.toFixed(1)} s`);
