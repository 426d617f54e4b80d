/**
 * Could the screen run fewer short ICPs by ranking the coarse hypotheses before them? Every
 * candidate face pair (as propose prunes them, k = DEFAULT_K) of the given demo folders is
 * screened with a trace; per coarse hypothesis: its overlap share before the short ICP
 * (faceOverlapUnder at the coarse motion), after it, whether the screen kept it, whether the
 * fragment pair's fine shortlist took it, and (true joins) whether it is correct (5 degrees,
 * 5 mm). Prints how many shortlisted (and correct shortlisted) motions would survive if only
 * each face pair's best N hypotheses by the overlap before the ICP were refined, or only those
 * above a floor, and the ICP runs that would save.
 *
 *   npx tsx tests/bench/screen-prerank-study.ts <demo dir>[,<demo dir>...] [out.json]
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import { join } from 'node:path';
import { DEFAULT_K } from '../../core/geometry/proposals/candidate-index';
import { DEFAULT_MATCH_PARAMETERS as P, faceOverlapUnder, fineShortlist, screenFacePair, type CoarseMotion, type MatchTrace } from '../../core/geometry/proposals/pairwise-match';
import { DEFAULT_FPFH_RADIUS_SPACINGS, prepareFragment } from '../../core/geometry/proposals/prepared-fragment';
import { displacementAt, rotationErrorDegrees, type RigidTransform } from '../../core/geometry/registration/rigid-transform';
import { candidateGroups, readStudyScans } from './study-assemblage';
const maxPairs = Number(process.env.KNITBONE_PROFILE_PAIRS ?? Infinity);
interface Hyp { fp: number; pre: number; post: number; kept: boolean; short: boolean; ok: boolean }
const rows: Array<{ dir: string; a: string; b: string; trueJoin: boolean; hyps: Hyp[] }> = [];
const cpu0 = process.cpuUsage();
for (const dir of process.argv[2].split(',')) {
  const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { fragments: Array<{ catalogueNo: string }>; joins: Array<{ a: string; b: string; type: string; transformBToA: number[]; survivingFraction: number }> };
  const { nos, inputs, spacing } = readStudyScans(dir);
  const prepared = inputs.map((x) => prepareFragment(x, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS }));
  const grouped = candidateGroups(prepared);
  // true-join pairs first, then others, up to maxPairs
  const trueOf = (a: number, b: number): { T: RigidTransform; swap: boolean } | null => {
    for (const j of truth.joins) {
      if (j.type !== 'conjoin' || j.survivingFraction < 0.3) continue;
      if (j.a === nos[a] && j.b === nos[b]) return { T: j.transformBToA, swap: false };
    }
    return null;
  };
  let n = 0;
  for (const list of grouped) {
    if (n++ >= maxPairs) break;
    const ia = list[0].a, ib = list[0].b;
    const a = prepared[ia], b = prepared[ib];
    const t = trueOf(ia, ib);
    const screened: Array<{ i: number; j: number; motion: CoarseMotion }> = [];
    const hyps: Array<{ fp: number; pre: number; post: number; kept: boolean; ok: boolean; motion?: CoarseMotion }> = [];
    list.forEach((c, fp) => {
      const tr: MatchTrace = { coarse: [], refined: [], kept: [] };
      const kept = screenFacePair(a, c.faceA, b, c.faceB, P, tr);
      for (const m of kept) screened.push({ i: c.faceA, j: c.faceB, motion: m });
      tr.coarse.forEach((h, k) => {
        const r = tr.refined[k];
        const ok = !!t && rotationErrorDegrees(r.transform, t.T) < 5 && displacementAt(r.transform, t.T, b.centroid) < 5;
        const km = kept.find((m) => m.transform === r.transform);
        hyps.push({ fp, pre: faceOverlapUnder(a, c.faceA, b, c.faceB, h).share, post: r.overlap, kept: !!km, ok, motion: km });
      });
    });
    const short = new Set(fineShortlist(a, b, screened, P).map((s) => s.motion));
    rows.push({ dir, a: nos[ia], b: nos[ib], trueJoin: !!t, hyps: hyps.map((h) => ({ fp: h.fp, pre: +h.pre.toFixed(3), post: +h.post.toFixed(3), kept: h.kept, short: !!h.motion && short.has(h.motion), ok: h.ok })) });
  }
}
if (process.argv[3]) writeFileSync(process.argv[3], JSON.stringify(rows));
const all = rows.flatMap((r) => r.hyps);
const used = process.cpuUsage(cpu0);
console.log(`fragment pairs ${rows.length} (true joins ${rows.filter((r) => r.trueJoin).length}), coarse hypotheses ${all.length}, kept by the screen ${all.filter((h) => h.kept).length}, shortlisted ${all.filter((h) => h.short).length} (correct ${all.filter((h) => h.short && h.ok).length}); CPU ${((used.user + used.system) / 1e6).toFixed(1)} s, load ${loadavg()[0].toFixed(2)}`);
// each hypothesis' place in its face pair by the overlap before the short ICP
const place: Array<{ h: Hyp; rank: number; of: number }> = [];
for (const r of rows) {
  const byPair = new Map<number, Hyp[]>();
  for (const h of r.hyps) byPair.set(h.fp, [...(byPair.get(h.fp) ?? []), h]);
  for (const hs of byPair.values()) [...hs].sort((p, q) => q.pre - p.pre).forEach((h, rank) => place.push({ h, rank, of: hs.length }));
}
for (const n of [2, 3, 4, 5, 6]) {
  const within = place.filter((p) => p.rank < n);
  console.log(`best ${n} by overlap before the ICP: shortlisted kept ${within.filter((p) => p.h.short).length}, correct shortlisted kept ${within.filter((p) => p.h.short && p.h.ok).length}; ICP runs ${within.length} of ${place.length}`);
}
for (const floor of [0, 0.01, 0.02, 0.05, 0.1]) {
  const below = all.filter((h) => h.pre <= floor);
  console.log(`overlap before the ICP at most ${floor}: ${below.length} runs saved, shortlisted lost ${below.filter((h) => h.short).length} (correct ${below.filter((h) => h.short && h.ok).length})`);
}
