/**
 * Where the CPU of a propose worker's fragment pair goes after the screen, and how often the
 * shortlisted motions repeat one another: `npx tsx tests/bench/fine-step-study.ts DIR`.
 * Like propose-profile.ts (same fragments, spacing and candidate pairs; KNITBONE_PROFILE_PAIRS
 * limits the fragment pairs), but each fragment pair goes the way matchFragments with `keep`
 * goes: screen, shortlist, fine ICP, deferred score, then bestDistinct. Prints CPU s per step
 * and, over shortlisted motions, how many lie within given angles and distances of a better one
 * before the fine step and after it.
 */
import { loadavg } from 'node:os';
import { join } from 'node:path';
import { bestDistinct, DEFAULT_MATCH_PARAMETERS, fineShortlist, fineTransform, scoredSide, screenFacePair, type CoarseMotion, type DeferredMatch } from '../../core/geometry/proposals/pairwise-match';
import { DEFAULT_FPFH_RADIUS_SPACINGS, prepareFragment } from '../../core/geometry/proposals/prepared-fragment';
import { deferredScore } from '../../core/geometry/registration/score';
import { displacementAt, rotationErrorDegrees, type RigidTransform } from '../../core/geometry/registration/rigid-transform';
import { candidateGroups, readStudyScans } from './study-assemblage';

const dir = process.argv[2];
const maxPairs = Number(process.env.KNITBONE_PROFILE_PAIRS ?? Infinity);
const { inputs, spacing } = readStudyScans(dir);
const cpu = (): number => { const u = process.cpuUsage(); return (u.user + u.system) / 1e6; };
const prepared = inputs.map((x) => prepareFragment(x, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS }));
const grouped = candidateGroups(prepared).slice(0, maxPairs);
const params = DEFAULT_MATCH_PARAMETERS;
const t = { screen: 0, shortlist: 0, fine: 0, deferred: 0, best: 0 };
let facePairs = 0, fineRuns = 0, completed = 0, completedAll = 0;
// a propose run wants the best 3 of a pair, or its best alone when that scores below the run's minimum (0.05)
const minScore = Number(process.env.KNITBONE_MIN_SCORE ?? 0.05);
const diffs: number[][] = [];
let fineOther = 0;
const thresholds: Array<[number, number]> = [[0.5, 0.25], [1, 0.5], [2, 1], [3, 2]];
const before = thresholds.map(() => 0), after = thresholds.map(() => 0), sameParent = thresholds.map(() => 0);
for (const list of grouped) {
  const a = prepared[list[0].a], b = prepared[list[0].b];
  let t0 = cpu();
  const screened: Array<{ i: number; j: number; motion: CoarseMotion }> = [];
  for (const c of list) for (const motion of screenFacePair(a, c.faceA, b, c.faceB, params)) screened.push({ i: c.faceA, j: c.faceB, motion });
  facePairs += list.length;
  let t1 = cpu(); t.screen += t1 - t0; t0 = t1;
  const shortlist = fineShortlist(a, b, screened, params);
  t1 = cpu(); t.shortlist += t1 - t0; t0 = t1;
  const fine = shortlist.map((s) => fineTransform(a, s.i, b, s.j, s.motion.transform, params));
  fineRuns += fine.length;
  t1 = cpu(); t.fine += t1 - t0; t0 = t1;
  if (process.env.KNITBONE_COMPARE_ITS) {
    const [m, l] = process.env.KNITBONE_COMPARE_ITS.split(',');
    const keepM = process.env.KNITBONE_FINE_MID_IT, keepL = process.env.KNITBONE_FINE_LAST_IT;
    process.env.KNITBONE_FINE_MID_IT = m; process.env.KNITBONE_FINE_LAST_IT = l;
    const tt = cpu();
    shortlist.forEach((s, k) => {
      const other = fineTransform(a, s.i, b, s.j, s.motion.transform, params);
      diffs.push([rotationErrorDegrees(other, fine[k]), displacementAt(other, fine[k], b.centroid)]);
    });
    fineOther += cpu() - tt;
    if (keepM === undefined) delete process.env.KNITBONE_FINE_MID_IT; else process.env.KNITBONE_FINE_MID_IT = keepM;
    if (keepL === undefined) delete process.env.KNITBONE_FINE_LAST_IT; else process.env.KNITBONE_FINE_LAST_IT = keepL;
    t0 = cpu();
  }
  const deferred: DeferredMatch[] = shortlist.map((s, k) => ({ transform: fine[k], faceA: a.faces[s.i].parent, faceB: b.faces[s.j].parent, score: deferredScore(scoredSide(a, a.faces[s.i]), scoredSide(b, b.faces[s.j]), fine[k], { contactTolerance: params.contactToleranceSpacings * spacing, spacing }) }));
  t1 = cpu(); t.deferred += t1 - t0; t0 = t1;
  let n = 0;
  const counted = deferred.map((d) => ({ ...d, score: { ...d.score, complete: () => { n++; return d.score.complete(); } } }));
  bestDistinct(counted, 3, 2 * spacing, minScore);
  completed += n;
  t1 = cpu(); t.best += t1 - t0;
  n = 0;
  bestDistinct(counted, 3, 2 * spacing);
  completedAll += n;
  t0 = cpu();
  // repeats: a shortlisted motion within (deg, spacings) of an earlier (better ranked) one
  const cb = b.centroid;
  shortlist.forEach((s, k) => {
    thresholds.forEach(([deg, sp], q) => {
      const near = (u: RigidTransform, v: RigidTransform): boolean => rotationErrorDegrees(u, v) < deg && displacementAt(u, v, cb) < sp * spacing;
      const prev = shortlist.slice(0, k);
      if (prev.some((p) => near(p.motion.transform, s.motion.transform))) before[q]++;
      if (prev.some((p) => near(p.motion.transform, s.motion.transform) && a.faces[p.i].parent === a.faces[s.i].parent && b.faces[p.j].parent === b.faces[s.j].parent)) sameParent[q]++;
      if (fine.slice(0, k).some((p) => near(p, fine[k]))) after[q]++;
    });
  });
}
const f = (x: number): string => x.toFixed(1);
process.stdout.write(`fragment pairs ${grouped.length}  face pairs ${facePairs}  fine runs ${fineRuns}  completed ${completed} (with no minimum score ${completedAll})  spacing ${spacing}  load ${loadavg()[0].toFixed(2)}\n`);
process.stdout.write(`CPU s: screen ${f(t.screen)}  shortlist ${f(t.shortlist)}  fine ${f(t.fine)}  deferred score ${f(t.deferred)}  best (complete) ${f(t.best)}\n`);
thresholds.forEach(([deg, sp], q) => process.stdout.write(`within ${deg} deg and ${sp} spacing of a better shortlisted motion: before fine ${before[q]} (same parent faces ${sameParent[q]}), after fine ${after[q]}\n`));
{
  const its = (globalThis as unknown as { __its?: number[][] }).__its ?? [];
  const hist = (k: number): string => { const h = new Map<number, number>(); for (const x of its) h.set(x[k], (h.get(x[k]) ?? 0) + 1); return [...h.entries()].sort((a, b) => a[0] - b[0]).map(([a, b]) => `${a}:${b}`).join(' '); };
  process.stdout.write(`mid iterations ${hist(0)}\nlast iterations ${hist(1)}\n`);
}
if (diffs.length) {
  const q = (k: number, p: number): string => { const v = diffs.map((d) => d[k]).sort((x, y) => x - y); return v[Math.min(v.length - 1, Math.floor(p * v.length))].toFixed(3); };
  process.stdout.write(`other iterations ${process.env.KNITBONE_COMPARE_ITS}: fine CPU ${fineOther.toFixed(1)} s; difference rot deg p50/p90/p99/max ${q(0, 0.5)}/${q(0, 0.9)}/${q(0, 0.99)}/${q(0, 1)}, shift mm ${q(1, 0.5)}/${q(1, 0.9)}/${q(1, 0.99)}/${q(1, 1)}\n`);
}
