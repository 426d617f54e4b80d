/**
 * CPU of the screen and fine step over a sample of the candidate index's face pairs of one
 * assemblage, for variants of the matching parameters (beside coarse-miss-exp.ts).
 *
 *   npx tsx tests/bench/coarse-cost-exp.ts <demo-dir> <pairs> '[{"name":..,"p":{..}}]'
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { loadavg } from 'node:os';
import { candidateFacePairs, DEFAULT_K, type IndexedFace } from '../../core/geometry/proposals/candidate-index';
import { faceTraits } from '../../core/geometry/proposals/face-traits';
import { DEFAULT_MATCH_PARAMETERS, refineFacePair, screenFacePair, type MatchParameters, type MatchTrace } from '../../core/geometry/proposals/pairwise-match';
import { DEFAULT_FPFH_RADIUS_SPACINGS, prepareFragment, runSpacing } from '../../core/geometry/proposals/prepared-fragment';
import { mulberry32 } from '../../core/geometry/seeded-random';
import { studied, type TruthFragment } from './face-pair-study';

const [dir, nPairs = '300', vs = '[{"name":"base","p":{}}]'] = process.argv.slice(2);
const variants = JSON.parse(vs) as Array<{ name: string; p: Partial<MatchParameters> }>;
const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { fragments: TruthFragment[] };
const frags = truth.fragments.map((f) => studied(dir, f)).filter((x) => !!x);
const spacing = runSpacing(frags.flatMap((f) => f!.input.faces.map((x) => x.area ?? 0)));
const prepared = frags.map((f) => prepareFragment(f!.input, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS }));
const faces: IndexedFace[] = [];
prepared.forEach((p, i) => p.faces.forEach((x, face) => faces.push({ fragment: i, face, traits: faceTraits(x.points, x.normals, x.area, x.fpfh, frags[i]!.axis) })));
const cands = candidateFacePairs(faces, { k: DEFAULT_K });
const rnd = mulberry32(11);
const sample = cands.filter(() => rnd() < Number(nPairs) / cands.length);
const q = (xs: number[], p: number): number => [...xs].sort((a, b) => a - b)[Math.floor(p * xs.length)];
const acc = variants.map(() => ({ screenMs: [] as number[], totalMs: [] as number[], hyps: 0, kept: 0 }));
for (const c of sample) {
  variants.forEach((v, vi) => {
    const params = { ...DEFAULT_MATCH_PARAMETERS, ...v.p };
    const t0 = process.cpuUsage();
    const tr: MatchTrace = { coarse: [], refined: [], kept: [] };
    const s = screenFacePair(prepared[c.a], c.faceA, prepared[c.b], c.faceB, params, tr);
    const d0 = process.cpuUsage(t0);
    refineFacePair(prepared[c.a], c.faceA, prepared[c.b], c.faceB, s, params);
    const d1 = process.cpuUsage(t0);
    acc[vi].screenMs.push((d0.user + d0.system) / 1000);
    acc[vi].totalMs.push((d1.user + d1.system) / 1000);
    acc[vi].hyps += tr.coarse.length;
    acc[vi].kept += s.length;
  });
}
const mean = (xs: number[]): number => xs.reduce((a, b) => a + b, 0) / xs.length;
variants.forEach((v, vi) => {
  const { screenMs, totalMs, hyps, kept } = acc[vi];
  console.log(`${v.name}: ${sample.length} face pairs, screen med ${q(screenMs, 0.5).toFixed(1)} mean ${mean(screenMs).toFixed(1)} ms, screen+fine med ${q(totalMs, 0.5).toFixed(1)} mean ${mean(totalMs).toFixed(1)} ms; hyps/pair ${(hyps / sample.length).toFixed(1)}, kept/pair ${(kept / sample.length).toFixed(2)} (load ${loadavg()[0].toFixed(1)})`);
});
