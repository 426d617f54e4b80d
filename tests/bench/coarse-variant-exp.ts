/**
 * Screen variants on the true face pairs of joins studied by stored-gap-study.ts (its
 * KNITBONE_STUDY_OUT records, `truePairs`): for each variant of the match parameters, whether a
 * screened motion kept for the fine step (K), one after the short ICP (R) or a coarse hypothesis
 * (C) lies near the truth, and the screen's CPU. Reads the studied folder's candidate cache.
 *   npx tsx tests/bench/coarse-variant-exp.ts <studied-dir> <records.jsonl> '<variants json>'
 * KNITBONE_EXP_CAUSES=coarse,score,... only records of those causes; KNITBONE_EXP_VERBOSE=1 lists each coarse hypothesis.
 */
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { DEFAULT_MATCH_PARAMETERS, screenFacePair, type MatchParameters, type MatchTrace } from '../../core/geometry/proposals/pairwise-match';
import { assemblePrepared, type PreparedFragment } from '../../core/geometry/proposals/prepared-fragment';
import { displacementAt, invert, rotationErrorDegrees, type RigidTransform } from '../../core/geometry/registration/rigid-transform';
import { readFragment, readPrepared } from '../../core/jobs/fragment-cache';
import type { StudyFragment } from './candidate-study';
import { isCorrectMotion } from './correct-motion';
import { screenAxisConsistency } from '../../core/geometry/proposals/screen-measures';

interface Join { a: string; b: string; type: string; transformBToA: number[] }
interface Rec { join: string; cause: string; truePairs?: Array<{ faces: [number, number] }> }
const [dir, recFile, vjson] = process.argv.slice(2);
const variants = JSON.parse(vjson ?? '[{"name":"base","p":{}}]') as Array<{ name: string; p: Partial<MatchParameters> }>;
const causes = process.env.KNITBONE_EXP_CAUSES?.split(',');
const recs = readFileSync(recFile, 'utf8').split('\n').filter((l) => l.startsWith('{')).map((l) => JSON.parse(l) as Rec)
  .filter((r) => r.truePairs?.length && (!causes || causes.includes(r.cause)));
const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { joins: Join[] };
const study = readdirSync(join(dir, 'candidate-study')).filter((f) => f.endsWith('.json'))
  .map((f) => JSON.parse(readFileSync(join(dir, 'candidate-study', f), 'utf8')) as StudyFragment).filter((f) => f.faces.length > 0);
const spacing = study[0].spacing;
const fragOf = new Map(study.map((f, i) => [f.no, i]));
const prepared = new Map<number, PreparedFragment>();
const prep = (i: number): PreparedFragment => {
  let p = prepared.get(i);
  if (!p) {
    const c = readFragment(join(dir, 'candidate-cache'), study[i].no), parts = readPrepared(join(dir, 'candidate-cache'), study[i].no, { spacing, fpfhRadiusSpacings: 5 });
    if (!c || !parts) throw new Error(`${study[i].no}: not cached`);
    p = assemblePrepared(c.input, parts);
    prepared.set(i, p);
  }
  return p;
};
const tally = new Map<string, number>(), cpu = new Map<string, number>();
for (const r of recs) {
  const [na, nb] = r.join.split('|');
  const j = truth.joins.find((x) => x.a === na && x.b === nb)!;
  let ia = fragOf.get(na)!, ib = fragOf.get(nb)!;
  let want = j.transformBToA as RigidTransform;
  if (ia > ib) { [ia, ib] = [ib, ia]; want = invert(want); }
  const A = prep(ia), B = prep(ib);
  const row: string[] = [];
  for (const v of variants) {
    let best = '-';
    const rank = { '-': 0, C: 1, R: 2, K: 3 } as Record<string, number>;
    let hyps = 0;
    for (const { faces: [x, y] } of r.truePairs!) {
      const tr: MatchTrace = { coarse: [], refined: [], kept: [] };
      const t0 = process.cpuUsage();
      const prm = { ...DEFAULT_MATCH_PARAMETERS, ...v.p };
      screenFacePair(A, x, B, y, prm, tr);
      const d = process.cpuUsage(t0);
      cpu.set(v.name, (cpu.get(v.name) ?? 0) + (d.user + d.system) / 1000);
      hyps += tr.coarse.length;
      const near10 = (T: RigidTransform): boolean => rotationErrorDegrees(T, want) < 10 && displacementAt(T, want, B.centroid) < 5;
      const st = tr.kept.some((T) => isCorrectMotion(T, want, B.centroid)) ? 'K' : tr.refined.some((q) => isCorrectMotion(q.transform, want, B.centroid)) ? 'R' : tr.coarse.some(near10) ? 'C' : '-';
      if (rank[st] > rank[best]) best = st;
      if (process.env.KNITBONE_EXP_VERBOSE) {
        console.log(`  ${v.name} faces ${x},${y} n ${A.faces[x].points.length / 3}/${B.faces[y].points.length / 3} axes ${!!A.axis}/${!!B.axis} r ${A.axis?.radius.toFixed(1)}/${B.axis?.radius.toFixed(1)}`);
        tr.coarse.forEach((T, k) => console.log(`    coarse ${k}: rot ${rotationErrorDegrees(T, want).toFixed(1)} disp ${displacementAt(T, want, B.centroid).toFixed(1)} -> icp rot ${rotationErrorDegrees(tr.refined[k].transform, want).toFixed(1)} disp ${displacementAt(tr.refined[k].transform, want, B.centroid).toFixed(1)} ov ${tr.refined[k].overlap.toFixed(2)} axes ${screenAxisConsistency(A.axis, B.axis, tr.refined[k].transform, B.faces[y].centroid, prm.screenAxisTiltDeg).toFixed(2)}${tr.kept.includes(tr.refined[k].transform) ? ' kept' : ''}`));
      }
    }
    tally.set(v.name + best, (tally.get(v.name + best) ?? 0) + 1);
    row.push(`${v.name} ${best} (${hyps})`);
  }
  console.log(`${r.cause} ${r.join}: ${row.join(', ')}`);
}
for (const v of variants) console.log(`${v.name}: kept ${tally.get(v.name + 'K') ?? 0}, refined ${tally.get(v.name + 'R') ?? 0}, coarse ${tally.get(v.name + 'C') ?? 0}, none ${tally.get(v.name + '-') ?? 0} of ${recs.length}; screen CPU ${((cpu.get(v.name) ?? 0) / 1000).toFixed(1)} s`);
