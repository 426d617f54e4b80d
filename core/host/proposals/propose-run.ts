/**
 * `proposals.run`: propose joins across every scanned specimen of a catalogue (issue 6, item 2).
 *
 *   1. read and analyse every scan in worker threads (break faces),
 *   2. describe every break face at one sample spacing and index the descriptors,
 *   3. align only the candidate face pairs the index suggests (or all, when exhaustive),
 *   4. store each fragment pair's best motion as a proposed join, with its score components,
 *      method version and parameters, and record the pair as done for these parameters.
 *
 * Pairs already done with the same parameters are skipped, so a later run does only what is
 * new and a cancelled run resumes. Decided joins (accepted, rejected) are never touched and
 * their pairs are not proposed again. Provenience is not used (design.md section 7); recorded
 * size classes may prune the candidates (candidate-index.ts `SIZE_CLASS_MAX_DIFFERENCE`).
 */
import { createHash } from 'node:crypto';
import { availableParallelism } from 'node:os';
import { withCatalogue, type Catalogue } from '../../catalogue/catalogue';
import { ProposalPairRepository } from '../../catalogue/proposal-pairs';
import type { Join } from '../../catalogue/records';
import { byFragmentPair, CANDIDATE_RERANK, candidateFacePairs, DEFAULT_K, DISTINCT_WHOLE_FACES, SIZE_CLASS_MAX_DIFFERENCE, sizeClassCompatible, WHOLE_FACE_PARTNERS, type IndexedFace } from '../../geometry/proposals/candidate-index';
import { DESCRIPTOR_FIGURES, TEXTURE_WEIGHT } from '../../geometry/proposals/face-descriptor';
import { DEFAULT_MATCH_PARAMETERS, METHOD_VERSION, type MatchParameters } from '../../geometry/proposals/pairwise-match';
import { scoreModelKey } from '../../geometry/registration/score-model';
import { cycleAgreement, solvePoses, type PoseSolution } from '../../geometry/proposals/pose-graph';
import { invert } from '../../geometry/registration/rigid-transform';
import { startTypeScriptWorker } from '../../jobs/typescript-worker';
import { runPool, type PoolTask } from '../../jobs/affinity-pool';
import { bandOrder } from '../../jobs/pair-order';
import { PREPARED_CACHE_VERSION, readSummary } from '../../jobs/fragment-cache';
import { WORKER_CACHE_SIZE, type AnalyseResult, type MatchResult, type ProposalTask } from '../../jobs/proposal-worker';
import { describeFaces, latestScanRefs, runSampling } from './describe-faces';
import type { RequestContext } from '../request';

export interface ProposeOptions {
  catalogue: string;
  workers?: number;
  /** Align every pair of break faces (the baseline the pruning is measured against). */
  exhaustive?: boolean;
  /** Partners asked of the index per face. */
  k?: number;
  /**
   * Pieces whose recorded size classes are further apart than this are not paired by the index
   * (default SIZE_CLASS_MAX_DIFFERENCE; null: size classes are not used). Not used when exhaustive.
   */
  sizeClassMaxDifference?: number | null;
  /** Best motions scoring below this are not stored as proposals. */
  minScore?: number;
  ransacIterations?: number;
}

export interface ProposeOutcome {
  proposals: Join[];
  run: {
    scans: number;
    faces: number;
    candidatePairs: number;
    /** Break face pairs the index suggested (every pair when exhaustive). */
    candidateFacePairs: number;
    alignedPairs: number;
    /** Face pairs aligned in this run. */
    alignedFacePairs: number;
    /** Scans read and analysed in this run (the others came from the cache). */
    analysedScans: number;
    /** Scans whose break faces were described in this run (the others' traits came from the cache: an earlier run, or importing the scans). */
    describedScans: number;
    /** Wall seconds per stage. */
    stageSeconds: { reading: number; describing: number; aligning: number };
    /** While aligning: fragments prepared by the workers (a fragment not in a worker's memory is prepared again), and each worker's busy seconds (the rest of the stage it waited). */
    aligningPreparations: number;
    workerBusySeconds: number[];
    skippedDone: number;
    skippedDecided: number;
    /**
     * Size classes in force: pieces further apart than `gap` classes were not paired (null: size
     * classes not used), and how many of the run's pieces have a class recorded (the others pair with all).
     */
    sizeClasses: { gap: number | null; piecesWithClass: number };
    stored: number;
    cancelled: boolean;
    problems: Array<{ scanId: number; file: string; message: string }>;
    parameters: Record<string, unknown>;
    parametersHash: string;
    seconds: number;
  };
}

export async function proposeJoins(options: ProposeOptions, ctx: RequestContext): Promise<ProposeOutcome> {
  const started = Date.now();
  return withCatalogue(options.catalogue, async (cat) => {
    const { scans, specimenOfScan } = latestScanRefs(cat);
    const problems: ProposeOutcome['run']['problems'] = [];
    const workerCount = Math.max(1, Math.min(options.workers ?? availableParallelism(), 64));
    const workers = Array.from({ length: workerCount }, () => startTypeScriptWorker(new URL('../../jobs/proposal-worker.ts', import.meta.url)));
    const stopWorkers = (): void => workers.forEach((w) => void w.terminate());
    const stageSeconds = { reading: 0, describing: 0, aligning: 0 };
    let stageStart = Date.now();
    const endStage = (name: keyof typeof stageSeconds): void => {
      stageSeconds[name] = (Date.now() - stageStart) / 1000;
      stageStart = Date.now();
    };
    const outcome = (over: Partial<ProposeOutcome['run']>, parameters: Record<string, unknown> = {}, hash = ''): ProposeOutcome => ({
      proposals: cat.joins.list({ status: 'proposed' }),
      run: {
        scans: scans.length, faces: 0, candidatePairs: 0, candidateFacePairs: 0, alignedPairs: 0, alignedFacePairs: 0, analysedScans: 0, describedScans: 0, stageSeconds: { ...stageSeconds }, aligningPreparations: 0, workerBusySeconds: [], skippedDone: 0, skippedDecided: 0, sizeClasses: { gap: null, piecesWithClass: 0 }, stored: 0,
        cancelled: false, problems, parameters, parametersHash: hash, seconds: (Date.now() - started) / 1000, ...over,
      },
    });
    try {
      // 1. analyse
      const analysedOk = new Map<number, AnalyseResult>();
      const takeSummary = (r: AnalyseResult): void => {
        if (r.problem) problems.push({ scanId: r.scanId, file: scans.find((s) => s.scanId === r.scanId)!.file, message: r.problem });
        else analysedOk.set(r.scanId, r);
      };
      // scans analysed by an earlier run come from the cache
      const toAnalyse = scans.filter((scan) => {
        const cached = readSummary(scan.cache!.dir, scan.cache!.key);
        if (cached) takeSummary({ scanId: scan.scanId, ...cached });
        return !cached;
      });
      const analyseTasks: PoolTask<ProposalTask>[] = toAnalyse.map((scan) => ({ keys: [String(scan.scanId)], message: { kind: 'analyse', scan } }));
      const a1 = await runPool<ProposalTask, AnalyseResult>(analyseTasks, {
        workers, cacheSize: WORKER_CACHE_SIZE, signal: ctx.signal,
        onResult: takeSummary,
        onError: (message, i) => problems.push({ scanId: toAnalyse[i].scanId, file: toAnalyse[i].file, message }),
        onProgress: (done, total) => ctx.onProgress({ stage: 'reading scans', done, total }),
      });
      endStage('reading');
      if (a1.cancelled) return outcome({ cancelled: true });
      const usable = scans.filter((s) => analysedOk.has(s.scanId));
      const sampling = runSampling(usable.map((s) => analysedOk.get(s.scanId)!));
      const params: MatchParameters = { ...DEFAULT_MATCH_PARAMETERS, ...(options.ransacIterations ? { ransacIterations: options.ransacIterations } : {}) };
      const k = options.k ?? DEFAULT_K;
      const wholeFacePartners = WHOLE_FACE_PARTNERS;
      // the size-class gap in force (null: not used; --exhaustive pairs every face)
      const sizeClassMaxDifference = options.exhaustive ? null : options.sizeClassMaxDifference === undefined ? SIZE_CLASS_MAX_DIFFERENCE : options.sizeClassMaxDifference;
      // prepared: how faces become samples, patches and corner pieces (fragment-cache.ts); a change
      // there changes every pair's outcome, so pairs done before it are aligned again
      const parameters = { method: METHOD_VERSION, scoreModel: scoreModelKey(), prepared: PREPARED_CACHE_VERSION, sampling, match: params, wholeFacePartners, pruning: { k, figures: DESCRIPTOR_FIGURES, textureWeight: TEXTURE_WEIGHT, rerank: CANDIDATE_RERANK, distinctWholeFaces: DISTINCT_WHOLE_FACES, sizeClassMaxDifference }, exhaustive: options.exhaustive ?? false, minScore: options.minScore ?? 0.05, provenience: 'not used' };
      // The whole faces offered beside their parts (wholeFacePartners) add face pairs to a
      // fragment pair that is aligned anyway, so they decide its outcome like the matcher does.
      // A pair is done for the parameters that decide its outcome; which pairs are aligned
      // (pruning, exhaustive) does not change a pair's result, so widening the search later
      // aligns only the pairs not aligned before.
      const { pruning: _pruning, exhaustive: _exhaustive, ...outcomeParameters } = parameters;
      const parametersHash = createHash('sha256').update(JSON.stringify(outcomeParameters)).digest('hex').slice(0, 16);

      // 2. describe and index
      const faces: IndexedFace[] = [];
      const fragIndex = new Map(usable.map((s, i) => [s.scanId, i]));
      // faces described by an earlier run or by importing the scans, at this sampling, come from the cache
      const d = await describeFaces(usable, sampling, {
        workers, signal: ctx.signal,
        // a part (corner piece, patch) knows its whole face: the first prepared face of its segmentation face
        onResult: (r) => r.traits.forEach((traits, face) => faces.push({ fragment: fragIndex.get(r.scanId)!, face, whole: r.parents.indexOf(r.parents[face]), traits })),
        onError: (scan, message) => problems.push({ scanId: scan.scanId, file: scan.file, message }),
        onProgress: ctx.onProgress,
      });
      endStage('describing');
      if (d.cancelled) return outcome({ cancelled: true }, parameters, parametersHash);
      // size class may prune (issue 6, item 3): the recorded class of each piece, by fragment index
      const sizeClassOf = new Map(cat.specimens.list().map((s) => [s.id, s.sizeClass]));
      const sizeClasses = usable.map((s) => sizeClassOf.get(specimenOfScan.get(s.scanId)!) ?? null);
      const compatible = sizeClassMaxDifference === null ? undefined : sizeClassCompatible(sizeClasses, sizeClassMaxDifference);
      const sizeClassReport = { gap: sizeClassMaxDifference, piecesWithClass: sizeClasses.filter((c) => c !== null).length };
      const candidates = candidateFacePairs(faces, { k, exhaustive: options.exhaustive, wholeFacePartners, rerank: CANDIDATE_RERANK, distinctWholeFaces: DISTINCT_WHOLE_FACES, ...(compatible ? { compatible } : {}) });
      const grouped = byFragmentPair(candidates);

      // 3. what is left to do
      const pairsRepo = new ProposalPairRepository(cat);
      const done = pairsRepo.doneKeys(parametersHash);
      const decided = new Set<string>();
      const accepted: Join[] = [];
      for (const j of cat.joins.list()) {
        if (j.status === 'proposed') continue;
        decided.add(pairKey(j.specimenA, j.specimenB));
        if (j.status === 'accepted' && j.transform && j.type === 'conjoin') accepted.push(j);
      }
      const poses = refitPoses(accepted);
      let skippedDone = 0, skippedDecided = 0;
      // a pair whose best motion scores below this is recorded as done but not proposed
      const minScore = options.minScore ?? 0.05;
      const tasks: PoolTask<ProposalTask>[] = [];
      for (const list of grouped.values()) {
        const A = usable[list[0].a], B = usable[list[0].b];
        const [sa, sb] = A.scanId < B.scanId ? [A, B] : [B, A];
        if (done.has(`${sa.scanId}:${sb.scanId}`)) { skippedDone++; continue; }
        if (decided.has(pairKey(specimenOfScan.get(sa.scanId)!, specimenOfScan.get(sb.scanId)!))) { skippedDecided++; continue; }
        const facePairs: Array<[number, number]> = list.map((c) => (sa === A ? [c.faceA, c.faceB] : [c.faceB, c.faceA]));
        tasks.push({ keys: [String(sa.scanId), String(sb.scanId)], message: { kind: 'match', a: sa, b: sb, facePairs, sampling, params, keep: 3, minScore } });
      }
      // keep pairs that share fragments near each other in the queue (worker caches; pair-order.ts)
      const slot = new Map(usable.map((u, i) => [String(u.scanId), i]));
      const ordered = bandOrder(tasks, (t) => [slot.get(t.keys[0])!, slot.get(t.keys[1])!], usable.length);
      tasks.length = 0;
      for (const t of ordered) tasks.push(t);

      // 4. align and store
      let stored = 0, alignedFacePairs = 0, aligningPreparations = 0;
      const busy = new Map<number, number>();
      const facePairsOf = new Map(tasks.map((t) => {
        const msg = t.message as Extract<ProposalTask, { kind: 'match' }>;
        return [`${msg.a.scanId}:${msg.b.scanId}`, msg.facePairs.length];
      }));
      const m = await runPool<ProposalTask, MatchResult>(tasks, {
        workers, cacheSize: WORKER_CACHE_SIZE, signal: ctx.signal,
        onResult: (r) => {
          alignedFacePairs += facePairsOf.get(`${r.scanA}:${r.scanB}`) ?? 0;
          aligningPreparations += r.prepared;
          busy.set(r.worker, (busy.get(r.worker) ?? 0) + r.busyMs / 1000);
          if (storeResult(cat, pairsRepo, r, specimenOfScan, analysedOk, poses, { parametersHash, parameters, minScore })) stored++;
        },
        onError: (message, i) => {
          const t = tasks[i].message as Extract<ProposalTask, { kind: 'match' }>;
          problems.push({ scanId: t.b.scanId, file: t.b.file, message: `aligning with scan ${t.a.scanId}: ${message}` });
        },
        onProgress: (n, total) => ctx.onProgress({ stage: 'aligning candidate pairs', done: n, total }),
      });
      endStage('aligning');
      return outcome(
        { faces: faces.length, candidatePairs: grouped.size, candidateFacePairs: candidates.length, alignedPairs: m.done, alignedFacePairs, analysedScans: toAnalyse.length, describedScans: d.described, stageSeconds: { ...stageSeconds }, aligningPreparations, workerBusySeconds: [...busy.values()], skippedDone, skippedDecided, sizeClasses: sizeClassReport, stored, cancelled: m.cancelled },
        parameters,
        parametersHash,
      );
    } finally {
      stopWorkers();
    }
  });
}

function pairKey(a: number, b: number): string {
  return a < b ? `${a}:${b}` : `${b}:${a}`;
}

/** Poses of the refit sets formed by accepted conjoins (for cycle agreement of new proposals). */
function refitPoses(accepted: Join[]): PoseSolution[] {
  const edges = accepted.map((j) => ({ a: String(j.specimenA), b: String(j.specimenB), transform: j.transform!, weight: j.score ?? 1 }));
  const sets: PoseSolution[] = [];
  const seen = new Set<string>();
  for (const e of edges) {
    if (seen.has(e.a)) continue;
    const sol = solvePoses(edges, { root: e.a });
    for (const k of sol.poses.keys()) seen.add(k);
    sets.push(sol);
  }
  return sets;
}

/**
 * Store one pair's outcome in one transaction: the best motion as a proposed join (updating an
 * earlier undecided proposal for the same specimens) when it scores at least minScore, and the
 * pair as done. A proposal that closes a cycle with accepted joins gains (consistent) or loses
 * (inconsistent) rank: score' = 1 - (1 - score) / 2, or score / 2.
 */
function storeResult(
  cat: Catalogue,
  pairs: ProposalPairRepository,
  r: MatchResult,
  specimenOfScan: Map<number, number>,
  analysed: Map<number, AnalyseResult>,
  poses: PoseSolution[],
  run: { parametersHash: string; parameters: Record<string, unknown>; minScore: number },
): boolean {
  const best = r.matches[0];
  const specA = specimenOfScan.get(r.scanA)!, specB = specimenOfScan.get(r.scanB)!;
  return cat.transaction(() => {
    let joinId: number | null = null;
    let stored = false;
    if (best && best.score >= run.minScore) {
      let score = best.score;
      let cycle = 0;
      for (const sol of poses) {
        const agreement = cycleAgreement(sol, String(specA), String(specB), best.transform, analysed.get(r.scanB)?.centroid);
        if (!agreement) continue;
        const consistent = agreement.rotationDeg < 3 && agreement.translationMm < 2;
        cycle = consistent ? 1 : -1;
        score = consistent ? 1 - (1 - score) / 2 : score / 2;
      }
      const fields = {
        scanA: r.scanA,
        scanB: r.scanB,
        transform: best.transform,
        score,
        scoreComponents: {
          geometryScore: best.score,
          contactFraction: best.contactFraction,
          contactFractionOther: best.contactFractionOther,
          gapRmsMm: best.gapRmsMm,
          penetrationMm: best.penetrationMm,
          outlineAgreement: best.outlineAgreement,
          faceA: best.faceA,
          faceB: best.faceB,
          cycleWithAccepted: cycle,
        },
        methodVersion: METHOD_VERSION,
        parameters: { ...run.parameters, parametersHash: run.parametersHash, alternatives: r.matches.slice(1).map((x) => ({ score: x.score, transform: x.transform, faceA: x.faceA, faceB: x.faceB })) },
      };
      const existing = cat.joins.list({ specimenId: specA }).find((j) => j.status === 'proposed' && ((j.specimenA === specA && j.specimenB === specB) || (j.specimenA === specB && j.specimenB === specA)));
      if (existing && existing.specimenA === specA) joinId = cat.joins.update(existing.id, fields, undefined, 'proposal-update').id;
      else if (existing) {
        // stored the other way round: keep its orientation (transform maps its B into its A)
        joinId = cat.joins.update(existing.id, { ...fields, scanA: r.scanB, scanB: r.scanA, transform: invert(best.transform) }, undefined, 'proposal-update').id;
      } else joinId = cat.joins.insert({ specimenA: specA, specimenB: specB, status: 'proposed', ...fields }, undefined, 'propose').id;
      stored = true;
    }
    pairs.record({ scanA: r.scanA, scanB: r.scanB, parametersHash: run.parametersHash, methodVersion: METHOD_VERSION, bestScore: best && best.score >= run.minScore ? best.score : null, joinId });
    return stored;
  });
}
