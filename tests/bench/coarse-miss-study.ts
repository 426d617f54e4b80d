/**
 * Why true joins get no coarse hypothesis (class a of the pairwise benchmark), by category.
 * For each generated assemblage (truth.json beside the scans), every true join's fragment pair
 * is screened face pair by face pair (as tests/bench/pairwise.bench.ts does); a join is in class
 * a when no coarse hypothesis of any face pair comes within 10 degrees and 5 mm of the truth (at
 * B's centroid), no screened motion within 5/5, and some face pair holds the break under the
 * truth. For those, the face pair that holds the most of the break is described: samples per
 * face, the share of each face in contact under the truth, how many true breaks lie on each face
 * (generator labels), whether the coarse stages that ran (shared axis, axis directions, RANSAC,
 * pair voting) had a chance: the share of RANSAC's feature correspondences that the truth
 * confirms, and whether the short ICP started near the truth returns to it.
 *
 *   npx tsx tests/bench/coarse-miss-study.ts <demo-dir>[,<demo-dir>...]
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { DEFAULT_MATCH_PARAMETERS, faceOverlapUnder, screenFacePair, type MatchParameters, type MatchTrace } from '../../core/geometry/proposals/pairwise-match';
import { DEFAULT_FPFH_RADIUS_SPACINGS, prepareFragment, runSpacing, type PreparedFace, type PreparedFragment } from '../../core/geometry/proposals/prepared-fragment';
import { FPFH_DIM } from '../../core/geometry/registration/fpfh';
import { icpPointToPlane } from '../../core/geometry/registration/icp-point-to-plane';
import { displacementAt, invert, compose, rotationAboutAxis, transformFrom, rotationErrorDegrees, type RigidTransform } from '../../core/geometry/registration/rigid-transform';
import { SampledSurface } from '../../core/geometry/registration/target-surface';
import { stridedSamples } from '../../core/geometry/registration/strided-samples';
import { featureCorrespondences } from '../../core/geometry/registration/feature-correspondences';
import { inOpposedContact } from '../../core/geometry/registration/opposed-contact';
import { searchAboutSharedAxis } from '../../core/geometry/registration/shaft-axis-search';
import { searchAlongAxisDirections } from '../../core/geometry/registration/axis-direction-search';
import { ransacAlignFaces } from '../../core/geometry/registration/ransac-alignment';
import { pointPairVoting } from '../../core/geometry/registration/point-pair-voting';
import { faceBreaks, studied, type TruthFragment, type TruthJoin } from './face-pair-study';

/** A true contact smaller than this (mm^2, the truth's contact area times its surviving share) is a category of its own. */
const SMALL_CONTACT_MM2 = 60;
const f2 = (x: number, d = 2): string => (Number.isFinite(x) ? x.toFixed(d) : '-');

function contactShare(P: PreparedFace, Q: PreparedFace, T: RigidTransform, spacing: number): number {
  const q = [0, 0, 0];
  let k = 0;
  const n = P.points.length / 3;
  for (let i = 0; i < n; i++) if (inOpposedContact(T, P.points, P.normals, i, Q.tree, Q.normals, spacing, q)) k++;
  return k / Math.max(1, n);
}

/** Share of RANSAC's feature correspondences (as ransac-alignment.ts builds them) that the truth puts within 1.5 spacings. */
function correspondenceTruth(FA: PreparedFace, FB: PreparedFace, T: RigidTransform, spacing: number): { total: number; good: number } {
  let total = 0, good = 0;
  const check = (i: number, j: number): void => {
    total++;
    const x = FB.points[3 * i], y = FB.points[3 * i + 1], z = FB.points[3 * i + 2];
    const px = T[0] * x + T[1] * y + T[2] * z + T[3], py = T[4] * x + T[5] * y + T[6] * z + T[7], pz = T[8] * x + T[9] * y + T[10] * z + T[11];
    if (Math.hypot(px - FA.points[3 * j], py - FA.points[3 * j + 1], pz - FA.points[3 * j + 2]) < 1.5 * spacing) good++;
  };
  const sIdx = FB.featureIndex, tIdx = FA.featureIndex;
  const found = featureCorrespondences(FB.mirroredFeatureFpfh, FA.featureFpfh, FPFH_DIM);
  for (let k = 0; k < found.sourceBest.length; k++) for (const j of [found.sourceBest[k], found.sourceSecond[k]]) if (j >= 0) check(sIdx ? sIdx[k] : k, tIdx ? tIdx[j] : j);
  for (let k = 0; k < found.targetBest.length; k++) if (found.targetBest[k] >= 0) check(sIdx ? sIdx[found.targetBest[k]] : found.targetBest[k], tIdx ? tIdx[k] : k);
  return { total, good };
}

/** Does the short ICP of the screen, started `deg` degrees and `mm` off the truth, return within 5 deg / 5 mm? Share of 6 tries. */
function basin(FA: PreparedFace, FB: PreparedFace, T: RigidTransform, spacing: number, deg: number, mm: number, centroid: ArrayLike<number>, params: MatchParameters): number {
  const coarse = stridedSamples(FB.points, FB.normals, params.icpSamples);
  const surf = new SampledSurface(FA.points, FA.normals, FA.tree);
  let ok = 0;
  const axes = [[1, 0, 0], [0, 1, 0], [0, 0, 1], [0.577, 0.577, 0.577], [-0.707, 0.707, 0], [0, -0.707, 0.707]];
  for (const [k, ax] of axes.entries()) {
    const c = FA.centroid;
    const R = rotationAboutAxis(ax, (deg * Math.PI) / 180);
    // turn about A's face centroid, then shift
    const turn = compose(transformFrom(R, [c[0] - (R[0] * c[0] + R[1] * c[1] + R[2] * c[2]), c[1] - (R[3] * c[0] + R[4] * c[1] + R[5] * c[2]), c[2] - (R[6] * c[0] + R[7] * c[1] + R[8] * c[2])]), T);
    const sh = axes[(k + 2) % axes.length];
    const start = compose(transformFrom([1, 0, 0, 0, 1, 0, 0, 0, 1], [sh[0] * mm, sh[1] * mm, sh[2] * mm]), turn);
    const icp = icpPointToPlane(coarse.points, coarse.normals, surf, start, { maxDistance: 3 * spacing, trim: params.icpTrim, maxIterations: 15, tolerance: 1e-3 * spacing });
    if (rotationErrorDegrees(icp.transform, T) < 5 && displacementAt(icp.transform, T, centroid) < 5) ok++;
  }
  return ok / axes.length;
}

export interface MissRecord {
  set: string;
  join: string;
  pattern: string;
  cls: string;
  nA: number;
  nB: number;
  shareA: number;
  shareB: number;
  breaksA: number;
  breaksB: number;
  patchA: boolean;
  patchB: boolean;
  shafts: boolean;
  corrGood: number;
  corrTotal: number;
  basin: number;
  bestCoarseDeg: number;
  stages: string;
  category: string;
  faceA: number;
  faceB: number;
}

/** Each coarse stage's hypotheses on the truth's face pair (run whether or not the screen would): the nearest one's rank, rotation and translation error. */
function stages(A: PreparedFragment, fa: number, B: PreparedFragment, fb: number, T: RigidTransform, params: MatchParameters): string {
  const FA = A.faces[fa], FB = B.faces[fb];
  const spacing = Math.max(A.spacing, B.spacing);
  const near = (list: RigidTransform[]): string => {
    if (!list.length) return 'none';
    const e = list.map((m, k) => ({ k, r: rotationErrorDegrees(m, T), t: displacementAt(m, T, B.centroid) })).sort((p, q) => p.r + p.t - (q.r + q.t))[0];
    return `#${e.k}/${list.length} ${f2(e.r, 1)}deg ${f2(e.t, 1)}mm`;
  };
  const out: string[] = [];
  if (A.axis && B.axis) {
    out.push('axis ' + near(searchAboutSharedAxis(A.axis, FA.points, FA.normals, B.axis, FB.points, FB.normals, { spacing, peaks: 10, maxSamples: params.icpSamples }).map((h) => h.transform)));
    out.push('dir ' + near(searchAlongAxisDirections(A.axis.direction, FA.points, FA.normals, B.axis.direction, FB.points, FB.normals, { spacing, peaks: 10, maxSamples: params.icpSamples, tiltsDeg: [0] }).map((h) => h.transform)));
  }
  out.push('ransac ' + near(ransacAlignFaces(
    { points: FB.points, normals: FB.normals, fpfh: FB.fpfh, tree: FB.tree, featureIndex: FB.featureIndex, mirroredFpfh: FB.mirroredFpfh, mirroredFeatureFpfh: FB.mirroredFeatureFpfh },
    { points: FA.points, normals: FA.normals, fpfh: FA.fpfh, tree: FA.tree, featureIndex: FA.featureIndex, featureFpfh: FA.featureFpfh },
    { inlierDistance: 1.5 * spacing, iterations: params.ransacIterations, keep: 10, seed: params.seed + 7919 * fa + 104729 * fb },
  ).map((h) => h.transform)));
  out.push('vote ' + near(pointPairVoting(FA.points, FA.normals, FB.points, FB.normals, { spacing, maxSamples: params.pairVoteSamples, references: params.pairVoteReferences, hypotheses: 10 }).map((h) => h.transform)));
  return out.join(' | ');
}

export function studyMisses(dir: string, params: MatchParameters = DEFAULT_MATCH_PARAMETERS): MissRecord[] {
  const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { fragments: TruthFragment[]; joins: TruthJoin[] };
  const frags = truth.fragments.map((f) => studied(dir, f));
  const byNo = new Map<string, number>();
  frags.forEach((f, i) => f && byNo.set(f.no, i));
  const spacing = runSpacing(frags.flatMap((f) => (f ? f.input.faces.map((x) => x.area ?? 0) : [])));
  const prepared: Array<PreparedFragment | null> = frags.map((f) => (f ? prepareFragment(f.input, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS }) : null));
  const breaks = frags.map((f, i) => (f ? faceBreaks(f, prepared[i]!) : []));
  const out: MissRecord[] = [];
  for (const j of truth.joins) {
    if (j.type !== 'conjoin' || j.survivingFraction < 0.3 || !byNo.has(j.a) || !byNo.has(j.b)) continue;
    const ia = byNo.get(j.a)!, ib = byNo.get(j.b)!;
    const A = prepared[ia]!, B = prepared[ib]!;
    const T = j.transformBToA;
    const trace: MatchTrace = { coarse: [], refined: [], kept: [] };
    let bestPair: [number, number] = [0, 0], bestShare = -1, bestArea = 0;
    for (let fa = 0; fa < A.faces.length; fa++) {
      for (let fb = 0; fb < B.faces.length; fb++) {
        const o = faceOverlapUnder(A, fa, B, fb, T);
        if (o.share > bestShare) { bestShare = o.share; bestPair = [fa, fb]; }
        bestArea = Math.max(bestArea, o.areaMm2);
        screenFacePair(A, fa, B, fb, params, trace);
      }
    }
    const near = (m: RigidTransform, deg: number, mm: number): boolean => rotationErrorDegrees(m, T) < deg && displacementAt(m, T, B.centroid) < mm;
    let cls: string;
    if (trace.kept.some((m) => near(m, 5, 5))) cls = 'kept';
    else if (trace.refined.some((r) => near(r.transform, 5, 5))) cls = 'refined';
    else if (trace.coarse.some((m) => near(m, 10, 5))) cls = 'coarse';
    else if (bestShare < 0.2 || bestArea < 0.3 * ((j as TruthJoin & { contactAreaMm2?: number }).contactAreaMm2 ?? 0) * j.survivingFraction) cls = 'e';
    else cls = 'a';
    const [fa, fb] = bestPair;
    const FA = A.faces[fa], FB = B.faces[fb];
    const nb = (m: Map<number, number>): number => [...m.values()].filter((v) => v >= 0.15).length;
    const rec: MissRecord = {
      set: dir.split('/').pop()!, join: `${j.a}|${j.b}`, pattern: j.pattern, cls,
      nA: FA.points.length / 3, nB: FB.points.length / 3,
      shareA: contactShare(FA, FB, invert(T), spacing), shareB: contactShare(FB, FA, T, spacing),
      breaksA: nb(breaks[ia][fa]), breaksB: nb(breaks[ib][fb]),
      patchA: A.faces.filter((x) => x.parent === FA.parent).length > 1 && FA.index !== A.faces.findIndex((x) => x.parent === FA.parent),
      patchB: B.faces.filter((x) => x.parent === FB.parent).length > 1 && FB.index !== B.faces.findIndex((x) => x.parent === FB.parent),
      shafts: !!A.axis && !!B.axis,
      corrGood: 0, corrTotal: 0, basin: NaN, stages: '', category: '', faceA: fa, faceB: fb,
      bestCoarseDeg: Math.min(...trace.coarse.map((m) => rotationErrorDegrees(m, T))),
    };
    if (cls === 'a') {
      // which category: the shared-axis search alone settled the face pair (RANSAC skipped, and
      // the direction search unless it always runs); the contact is part of both faces; a small
      // face held by part of a large one; or the faces correspond and still no stage found it
      const axisOnly: MatchTrace = { coarse: [], refined: [], kept: [] };
      screenFacePair(A, fa, B, fb, { ...params, directionPeaks: 0, ransacIterations: 0, pairVoteHypotheses: 0 }, axisOnly);
      const small = Math.min(FA.points.length, FB.points.length) / 3 <= params.pairVoteMaxFaceSamples;
      const settled = !!A.axis && !!B.axis && !small && axisOnly.refined.some((r) => r.overlap >= params.axisGoodOverlap);
      const contact = ((j as TruthJoin & { contactAreaMm2?: number }).contactAreaMm2 ?? Infinity) * j.survivingFraction;
      rec.category = settled ? '1 axis search settled'
        : contact < SMALL_CONTACT_MM2 ? `2 contact under ${SMALL_CONTACT_MM2} mm2`
        : Math.max(rec.shareA, rec.shareB) < 0.45 ? '3 contact is part of both faces'
        : Math.min(rec.shareA, rec.shareB) < 0.3 ? '4 small face in part of a large one' : '5 faces correspond';
      const c = correspondenceTruth(FA, FB, T, spacing);
      rec.corrGood = c.good; rec.corrTotal = c.total;
      rec.basin = basin(FA, FB, T, spacing, 8, 2, B.centroid, params);
      rec.stages = stages(A, fa, B, fb, T, params);
      const tr: MatchTrace = { coarse: [], refined: [], kept: [] };
      screenFacePair(A, fa, B, fb, params, tr);
      const bestO = Math.max(0, ...tr.refined.map((r) => r.overlap));
      // the truth itself through the screen's short ICP: its overlap share against the best the screen found
      const self: MatchTrace = { coarse: [], refined: [], kept: [] };
      const near5 = tr.refined.filter((r) => rotationErrorDegrees(r.transform, T) < 5 && displacementAt(r.transform, T, B.centroid) < 5);
      rec.stages += ` | screen best overlap ${f2(bestO)} (truth under contact ${f2(Math.max(rec.shareA, rec.shareB))})${near5.length ? ' near5 ' + f2(near5[0].overlap) : ''}`;
      void self;
    }
    out.push(rec);
  }
  return out;
}

if (process.argv[1]?.endsWith('coarse-miss-study.ts')) {
  const dirs = (process.argv[2] ?? '').split(',').filter(Boolean);
  const c0 = process.cpuUsage();
  const all: MissRecord[] = [];
  for (const d of dirs) all.push(...studyMisses(d));
  const counts = new Map<string, number>();
  for (const r of all) counts.set(r.cls, (counts.get(r.cls) ?? 0) + 1);
  console.log(`joins ${all.length}: ${[...counts].map(([k, v]) => `${k} ${v}`).join(', ')}`);
  const cats = new Map<string, number>();
  for (const r of all) if (r.cls === 'a') cats.set(r.category, (cats.get(r.category) ?? 0) + 1);
  console.log(`class a by category: ${[...cats].sort().map(([k, v]) => `${k}: ${v}`).join(', ')}`);
  for (const r of all.filter((x) => x.cls === 'a')) {
    console.log(`${r.set} [${r.category}] ${r.join} ${r.pattern} nA ${r.nA} nB ${r.nB} shareA ${f2(r.shareA)} shareB ${f2(r.shareB)} breaks ${r.breaksA}/${r.breaksB} patch ${r.patchA ? 'A' : ''}${r.patchB ? 'B' : ''} shafts ${r.shafts} corr ${r.corrGood}/${r.corrTotal} (${f2(r.corrGood / Math.max(1, r.corrTotal), 3)}) basin ${f2(r.basin)} bestCoarse ${f2(r.bestCoarseDeg, 1)} deg\n    ${r.stages}`);
  }
  if (process.env.KNITBONE_MISS_DUMP) writeFileSync(process.env.KNITBONE_MISS_DUMP, JSON.stringify(all.filter((x) => x.cls === 'a').map((r) => ({ ...r, dir: dirs.find((d) => d.endsWith(r.set)) }))));
  const d = process.cpuUsage(c0);
  console.log(`CPU ${((d.user + d.system) / 1e6).toFixed(1)} s`);
}
