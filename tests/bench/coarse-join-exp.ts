/**
 * Reruns the screen (and, with KNITBONE_EXP_FINE=1, the fine step) of the true joins of a
 * `KNITBONE_PAIRWISE_JOINS` file whose class is given, under several parameter variants: does a
 * coarse motion come near the truth (within 10 deg / 5 mm: C), does the screen's short ICP keep it
 * (within 5/5: R), is it sent to the fine step (K), is the fragment pair's best motion correct (W).
 *
 *   npx tsx tests/bench/coarse-join-exp.ts <joins.json> '<class prefixes, comma>' '[{"name":..,"p":{..}}]'
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { DEFAULT_MATCH_PARAMETERS, distinctBest, matchFacePair, screenFacePair, type FaceMatch, type MatchParameters, type MatchTrace } from '../../core/geometry/proposals/pairwise-match';
import { prepareFragment, spacingForFaces, DEFAULT_FPFH_RADIUS_SPACINGS, type FragmentInput, type PreparedFragment } from '../../core/geometry/proposals/prepared-fragment';
import { displacementAt, invert, rotationErrorDegrees, type RigidTransform } from '../../core/geometry/registration/rigid-transform';
import { SPACING_LADDER } from '../../core/geometry/proposals/prepared-fragment';
import { loadCached } from './pairwise.bench';

interface Rec { set: string; pair: string; cls: string; contactAreaMm2: number; pattern: string }
const recs = (JSON.parse(readFileSync(process.argv[2], 'utf8')) as Rec[]).filter((r) => (process.argv[3] ?? 'a').split(',').some((c) => r.cls.startsWith(c)));
const variants: Array<{ name: string; p: Partial<MatchParameters> }> = JSON.parse(process.argv[4] ?? '[{"name":"base","p":{}}]');
const fine = !!process.env.KNITBONE_EXP_FINE;
const root = process.env.KNITBONE_EXP_ROOT ?? '/tmp/g5';
const seen = new Set<string>();
const tally = new Map<string, number>(), ms = new Map<string, number>();
const spacings = new Map<string, number>();
for (const r of recs) {
  if (seen.has(r.set + r.pair)) continue;
  seen.add(r.set + r.pair);
  const dir = join(root, r.set);
  const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { fragments: Array<{ catalogueNo: string }>; joins: Array<{ a: string; b: string; type: string; transformBToA: number[] }> };
  if (!spacings.has(dir)) {
    const inputs: FragmentInput[] = [];
    for (const f of truth.fragments) try { inputs.push(loadCached(join(dir, 'scans', `${f.catalogueNo}.ply`))); } catch { /* refused */ }
    const raw = spacingForFaces(inputs.flatMap((x) => x.faces.map((y) => y.area ?? 0)));
    spacings.set(dir, SPACING_LADDER.reduce((best, v) => (Math.abs(Math.log(v / raw)) < Math.abs(Math.log(best / raw)) ? v : best), SPACING_LADDER[0]));
  }
  const spacing = spacings.get(dir)!;
  const [a, b] = r.pair.split('|');
  const tj = truth.joins.find((j) => j.type === 'conjoin' && ((j.a === a && j.b === b) || (j.a === b && j.b === a)))!;
  // KNITBONE_EXP_SWAP=1: B's faces are matched onto A's the other way round (the truth's b as A)
  // KNITBONE_EXP_SWAP=bench: the pairwise benchmark's order (the earlier fragment of truth.json as A)
  const order = truth.fragments.map((f) => f.catalogueNo);
  const swap = process.env.KNITBONE_EXP_SWAP === 'bench' ? order.indexOf(tj.b) < order.indexOf(tj.a) : !!process.env.KNITBONE_EXP_SWAP;
  const [na, nb] = swap ? [tj.b, tj.a] : [tj.a, tj.b];
  const A: PreparedFragment = prepareFragment(loadCached(join(dir, 'scans', `${na}.ply`)), { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS });
  const B: PreparedFragment = prepareFragment(loadCached(join(dir, 'scans', `${nb}.ply`)), { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS });
  const T = (swap ? invert(tj.transformBToA) : tj.transformBToA) as RigidTransform;
  const row: string[] = [];
  for (const v of variants) {
    const params = { ...DEFAULT_MATCH_PARAMETERS, ...v.p };
    const tr: MatchTrace = { coarse: [], refined: [], kept: [] };
    const all: FaceMatch[] = [];
    const c0 = process.cpuUsage();
    for (let i = 0; i < A.faces.length; i++) for (let j = 0; j < B.faces.length; j++) {
      if (fine) all.push(...matchFacePair(A, i, B, j, params, tr));
      else screenFacePair(A, i, B, j, params, tr);
    }
    const d = process.cpuUsage(c0);
    ms.set(v.name, (ms.get(v.name) ?? 0) + (d.user + d.system) / 1000);
    const near = (x: RigidTransform, deg: number): boolean => rotationErrorDegrees(x, T) < deg && displacementAt(x, T, B.centroid) < 5;
    const best = distinctBest(all, 2 * spacing)[0];
    const st = (best && near(best.transform, 5) ? 'W' : '') + (tr.kept.some((x) => near(x, 5)) ? 'K' : tr.refined.some((x) => near(x.transform, 5)) ? 'R' : tr.coarse.some((x) => near(x, 10)) ? 'C' : '-');
    tally.set(v.name + ' ' + st, (tally.get(v.name + ' ' + st) ?? 0) + 1);
    const nearest = tr.coarse.map((x) => [rotationErrorDegrees(x, T), displacementAt(x, T, B.centroid)]).sort((p, q) => p[0] + p[1] - q[0] - q[1])[0] ?? [NaN, NaN];
    row.push(`${v.name} ${st} (${tr.coarse.length} hyps, nearest ${nearest[0].toFixed(1)}/${nearest[1].toFixed(1)})`);
  }
  console.log(`${r.set} ${r.pair} ${r.cls} ${r.pattern} ${r.contactAreaMm2}: ${row.join(', ')}`);
}
console.log([...tally].sort().map(([k, v]) => `${k}: ${v}`).join('\n'));
for (const v of variants) console.log(`${v.name}: CPU ${(ms.get(v.name) ?? 0).toFixed(0)} ms`);
