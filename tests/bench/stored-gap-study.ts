/**
 * Why a true join whose fragment pair is a candidate gets no proposal stored (the proposals
 * bench's "candidate, nothing stored"), on a folder studied by candidate-restudy.ts (its
 * `candidate-study/` labels and `candidate-cache/` analysis and prepared parts are read, nothing
 * is analysed again). The candidate face pairs are chosen as a propose run chooses them (k = 30,
 * size classes from specimens.csv), each reached true join's fragment pair is aligned as a
 * propose worker aligns it (`matchFragments(..., 3, minScore)`), and for those that store
 * nothing every candidate face pair is screened and every screened motion refined and scored on
 * its own, to tell the causes apart:
 *   coarse      no screened motion of any candidate face pair lies near the truth
 *   shortlist   a screened motion near the truth, but the fine shortlist dropped it
 *   score       a refined motion near the truth, scoring below the run's minimum
 *   fine        near-truth screened motions drift away in the fine step
 *   polish      the fragment pair's motions ended below the minimum otherwise
 *   npx tsx tests/bench/stored-gap-study.ts <studied-dir>[,<dir>...] [params-json]
 * KNITBONE_STUDY_K (default 30), KNITBONE_STUDY_MIN (0.05), KNITBONE_STUDY_JOINS=a|b,... only those,
 * KNITBONE_STUDY_OUT=file.jsonl one record per studied join, KNITBONE_STUDY_WHOLE whole faces added per face
 * (candidate-index.ts `wholeFacePartners`, default WHOLE_FACE_PARTNERS; 0: none).
 */
import { appendFileSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { WHOLE_FACE_PARTNERS } from '../../core/geometry/proposals/candidate-index';
import { DEFAULT_MATCH_PARAMETERS, matchFragments, refineFacePair, screenFacePair, type MatchParameters, type MatchTrace } from '../../core/geometry/proposals/pairwise-match';
import { displacementAt, rotationErrorDegrees, type RigidTransform } from '../../core/geometry/registration/rigid-transform';
import { isCorrectMotion } from './correct-motion';
import { orderedJoin, readStudiedFolder } from './studied-folder';

interface Join { a: string; b: string; type: string; breakId: number; pattern: string; survivingFraction: number; contactAreaMm2?: number; transformBToA: number[] }
const [dirs, extra] = process.argv.slice(2);
const params: MatchParameters = { ...DEFAULT_MATCH_PARAMETERS, ...(extra ? (JSON.parse(extra) as Partial<MatchParameters>) : {}) };
const K = Number(process.env.KNITBONE_STUDY_K ?? 30), MIN = Number(process.env.KNITBONE_STUDY_MIN ?? 0.05);
const only = process.env.KNITBONE_STUDY_JOINS?.split(',');
const WHOLE = Number(process.env.KNITBONE_STUDY_WHOLE ?? WHOLE_FACE_PARTNERS);
const near = isCorrectMotion;
const tally = new Map<string, number>();
let cpuMatch = 0, cpuStudy = 0, studiedJoins = 0;
for (const dir of dirs.split(',')) {
  const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { joins: Join[] };
  const { study, fragOf, pairsOf, prep } = readStudiedFolder(dir, { k: K, wholeFacePartners: WHOLE });
  // KNITBONE_STUDY_EXPAND=whole: each candidate's pieces and patches paired with the other's whole face too; siblings: with every part of the other's face
  const expand = process.env.KNITBONE_STUDY_EXPAND;
  let before = 0, after = 0;
  for (const [key, list] of pairsOf) {
    before += list.length;
    if (expand) {
      const [fa, fb] = key.split(':').map(Number);
      const parA = study[fa].faces.map((f) => f.parent), parB = study[fb].faces.map((f) => f.parent);
      const whole = (par: number[], i: number): number => par.indexOf(par[i]);
      const seen = new Set(list.map(([x, y]) => `${x}:${y}`));
      const add = (x: number, y: number): void => { if (!seen.has(`${x}:${y}`)) { seen.add(`${x}:${y}`); list.push([x, y]); } };
      for (const [x, y] of [...list]) {
        if (expand === 'whole') { add(whole(parA, x), y); add(x, whole(parB, y)); add(whole(parA, x), whole(parB, y)); }
        else if (expand === 'whole1') { add(whole(parA, x), y); add(x, whole(parB, y)); }
        else if (expand === 'wholewhole') add(whole(parA, x), whole(parB, y));
        else for (let x2 = 0; x2 < parA.length; x2++) for (let y2 = 0; y2 < parB.length; y2++) if (parA[x2] === parA[x] && parB[y2] === parB[y]) add(x2, y2);
      }
    }
    after += list.length;
  }
  console.log(`${dir}: candidate face pairs ${before} -> ${after} (${expand ?? 'no expansion'}; whole faces added per face ${WHOLE}: ${before} face pairs)`);
  const eligible = truth.joins.filter((j) => j.type === 'conjoin' && j.survivingFraction >= 0.3 && fragOf.has(j.a) && fragOf.has(j.b));
  for (const j of eligible) {
    if (only && !only.includes(`${j.a}|${j.b}`)) continue;
    const { ia, ib, want, on } = orderedJoin({ study, fragOf }, j);
    const list = pairsOf.get(`${ia}:${ib}`) ?? [];
    const trueListed = list.filter(([x, y]) => on(ia, x) && on(ib, y));
    if (!trueListed.length) continue; // pruned or unreachable: not this study's loss
    studiedJoins++;
    const A = prep(ia), B = prep(ib);
    let t0 = process.cpuUsage();
    const got = matchFragments(A, B, params, list, 3, MIN);
    let d = process.cpuUsage(t0);
    cpuMatch += (d.user + d.system) / 1e6;
    const best = got[0];
    let cause: string;
    const detail: Record<string, unknown> = {};
    if (process.env.KNITBONE_STUDY_NO_DIAG && !(best && best.score >= MIN)) cause = 'nothing';
    else if (best && best.score >= MIN) cause = near(best.transform, want, B.centroid) ? 'stored right' : 'stored wrong';
    else {
      t0 = process.cpuUsage();
      let screenedNear = 0, refinedNear = 0, bestNear = -1, bestAny = -1;
      const perPair: Array<Record<string, unknown>> = [];
      for (const [x, y] of list) {
        const trace: MatchTrace = { coarse: [], refined: [], kept: [] };
        const s = screenFacePair(A, x, B, y, params, trace);
        const near10 = (T: RigidTransform): boolean => rotationErrorDegrees(T, want) < 10 && displacementAt(T, want, B.centroid) < 5;
        const coarseNear = trace.coarse.filter(near10).length;
        const shortNear = trace.refined.filter((r) => near(r.transform, want, B.centroid)).map((r) => +r.overlap.toFixed(2));
        const bestOverlap = Math.max(0, ...trace.refined.map((r) => r.overlap));
        const sn = s.filter((m) => near(m.transform, want, B.centroid));
        screenedNear += sn.length;
        const refined = s.map((m) => refineFacePair(A, x, B, y, [m], params)[0]).filter((m) => !!m);
        for (const m of refined) {
          bestAny = Math.max(bestAny, m.score);
          if (near(m.transform, want, B.centroid)) { refinedNear++; bestNear = Math.max(bestNear, m.score); }
        }
        const fromTruth = on(ia, x) && on(ib, y) ? refineFacePair(A, x, B, y, [{ transform: want, overlap: 1 }], params)[0] : undefined;
        if (on(ia, x) && on(ib, y)) perPair.push({ fromTruth: fromTruth && { near: near(fromTruth.transform, want, B.centroid), score: +fromTruth.score.toFixed(3), side: +fromTruth.axisSide.toFixed(2), axisDeg: Math.round(fromTruth.axisAngleDeg), contact: +fromTruth.contactFraction.toFixed(2), other: +fromTruth.contactFractionOther.toFixed(2), areaMm2: Math.round(fromTruth.contactAreaMm2), gap: +fromTruth.gapRmsMm.toFixed(2), pen: +fromTruth.penetrationMm.toFixed(2), outline: +fromTruth.outlineAgreement.toFixed(2), lock: +fromTruth.interlock.toFixed(2), offset: +fromTruth.axisOffset.toFixed(2), ratio: +fromTruth.radiusRatio.toFixed(2) }, faces: [x, y], parents: [A.faces[x].parent, B.faces[y].parent], samples: [A.faces[x].points.length / 3, B.faces[y].points.length / 3], shares: [study[ia].faces[x].breaks[String(j.breakId)], study[ib].faces[y].breaks[String(j.breakId)]], screened: s.length, near: sn.length, coarse: trace.coarse.length, coarseNear, shortNear, bestOverlap: +bestOverlap.toFixed(2), overlaps: s.map((m) => +m.overlap.toFixed(2)), nearRefined: refined.filter((m) => near(m.transform, want, B.centroid)).map((m) => ({ score: +m.score.toFixed(3), contact: +m.contactFraction.toFixed(2), other: +m.contactFractionOther.toFixed(2), areaMm2: Math.round(m.contactAreaMm2), gap: +m.gapRmsMm.toFixed(2), pen: +m.penetrationMm.toFixed(2), outline: +m.outlineAgreement.toFixed(2), lock: +m.interlock.toFixed(2), axisDeg: Math.round(m.axisAngleDeg), side: +m.axisSide.toFixed(2) })) });
      }
      // every face pair of the two fragments refined from the truth itself: which faces meet under it
      let oracle: { faces: number[]; parents: number[]; score: number; candidate: boolean; sameParents: boolean } | null = null;
      if (!process.env.KNITBONE_STUDY_NO_ORACLE) for (let x = 0; x < A.faces.length; x++) for (let y = 0; y < B.faces.length; y++) {
        const m = refineFacePair(A, x, B, y, [{ transform: want, overlap: 1 }], params)[0];
        if (!m || !near(m.transform, want, B.centroid) || (oracle && oracle.score >= m.score)) continue;
        oracle = { faces: [x, y], parents: [A.faces[x].parent, B.faces[y].parent], score: +m.score.toFixed(3), candidate: list.some(([p, q]) => p === x && q === y), sameParents: list.some(([p, q]) => A.faces[p].parent === A.faces[x].parent && B.faces[q].parent === B.faces[y].parent) };
      }
      detail.oracle = oracle;
      d = process.cpuUsage(t0);
      cpuStudy += (d.user + d.system) / 1e6;
      if (!screenedNear) cause = 'coarse';
      else if (!refinedNear) cause = 'fine';
      else if (bestNear < MIN) cause = 'score';
      else cause = 'shortlist';
      Object.assign(detail, { screenedNear, refinedNear, bestNear: +bestNear.toFixed(3), bestAny: +bestAny.toFixed(3), facePairs: list.length, truePairs: perPair });
    }
    tally.set(cause, (tally.get(cause) ?? 0) + 1);
    const rec = { dir: dir.split('/').pop(), join: `${j.a}|${j.b}`, pattern: j.pattern, age: (j as unknown as { breakAge: string }).breakAge, damaged: (j as unknown as { damaged: boolean }).damaged, area: j.contactAreaMm2, surviving: +j.survivingFraction.toFixed(2), cause, score: best ? +best.score.toFixed(3) : null, ...detail };
    if (!cause.startsWith('stored')) console.log(JSON.stringify(rec));
    if (process.env.KNITBONE_STUDY_OUT) appendFileSync(process.env.KNITBONE_STUDY_OUT, JSON.stringify(rec) + '\n');
  }
}
console.log(`${studiedJoins} joins with a true face pair among the candidates: ${[...tally].map(([k, v]) => `${k} ${v}`).join(', ')}; CPU s matching ${cpuMatch.toFixed(1)}, studying ${cpuStudy.toFixed(1)}`);
