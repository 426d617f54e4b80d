/**
 * Experiments on the class-a face pairs dumped by coarse-miss-study.ts (KNITBONE_MISS_DUMP):
 * which change to the coarse stages brings a hypothesis near the truth, and at what CPU.
 *
 *   npx tsx tests/bench/coarse-miss-exp.ts <misses.json>
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { DEFAULT_MATCH_PARAMETERS, screenFacePair, type MatchParameters, type MatchTrace } from '../../core/geometry/proposals/pairwise-match';
import { DEFAULT_FPFH_RADIUS_SPACINGS, prepareFragment, runSpacing, type PreparedFragment } from '../../core/geometry/proposals/prepared-fragment';
import { displacementAt, rotationErrorDegrees, type RigidTransform } from '../../core/geometry/registration/rigid-transform';
import { studied, type TruthFragment, type TruthJoin } from './face-pair-study';

interface Miss { dir: string; join: string; faceA: number; faceB: number; nA: number; nB: number; shareA: number; shareB: number }

const misses = JSON.parse(readFileSync(process.argv[2], 'utf8')) as Miss[];
const params = DEFAULT_MATCH_PARAMETERS;
const byDir = new Map<string, Miss[]>();
for (const m of misses) byDir.set(m.dir, [...(byDir.get(m.dir) ?? []), m]);
const variants: Array<{ name: string; p: Partial<MatchParameters> }> = JSON.parse(process.argv[3] ?? '[{"name":"base","p":{}}]');
const hits = new Map<string, number>(), ms = new Map<string, number>();
for (const [dir, list] of byDir) {
  const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { fragments: TruthFragment[]; joins: TruthJoin[] };
  const frags = new Map(truth.fragments.map((f) => [f.catalogueNo, studied(dir, f)]));
  const spacing = runSpacing([...frags.values()].flatMap((f) => (f ? f.input.faces.map((x) => x.area ?? 0) : [])));
  const prep = new Map<string, PreparedFragment>();
  const get = (no: string): PreparedFragment => {
    if (!prep.has(no)) prep.set(no, prepareFragment(frags.get(no)!.input, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS }));
    return prep.get(no)!;
  };
  for (const m of list) {
    const [a, b] = m.join.split('|');
    const j = truth.joins.find((x) => x.a === a && x.b === b)!;
    const A = get(a), B = get(b);
    const FA = A.faces[m.faceA], FB = B.faces[m.faceB];
    const T = j.transformBToA as RigidTransform;
    const row: string[] = [];
    for (const v of variants) {
      const c0 = process.cpuUsage();
      const tr: MatchTrace = { coarse: [], refined: [], kept: [] };
      screenFacePair(A, m.faceA, B, m.faceB, { ...params, ...v.p }, tr);
      const d = process.cpuUsage(c0);
      ms.set(v.name, (ms.get(v.name) ?? 0) + (d.user + d.system) / 1000);
      const near = (x: RigidTransform, deg: number): boolean => rotationErrorDegrees(x, T) < deg && displacementAt(x, T, B.centroid) < 5;
      const st = tr.kept.some((x) => near(x, 5)) ? 'K' : tr.refined.some((x) => near(x.transform, 5)) ? 'R' : tr.coarse.some((x) => near(x, 10)) ? 'C' : '-';
      hits.set(v.name + st, (hits.get(v.name + st) ?? 0) + 1);
      row.push(`${v.name} ${st} (${tr.coarse.length} hyps)`);
    }
    console.log(`${dir.split('/').pop()} ${m.join} nA ${m.nA} nB ${m.nB} shareA ${m.shareA.toFixed(2)} shareB ${m.shareB.toFixed(2)}: ${row.join(', ')}`);
  }
}
for (const v of variants) console.log(`${v.name}: kept ${hits.get(v.name + 'K') ?? 0}, refined ${hits.get(v.name + 'R') ?? 0}, coarse ${hits.get(v.name + 'C') ?? 0}, none ${hits.get(v.name + '-') ?? 0} of ${misses.length}; CPU ${(ms.get(v.name) ?? 0).toFixed(0)} ms`);
