/**
 * The propose worker's view of the true joins, for variants of the matching parameters side by
 * side: for every true join of each generated assemblage, is the best motion of the fragment
 * pair through the fine shortlist (matchFragments) within 5 degrees and 5 mm of the truth, and
 * what CPU did it take. Joins on which the variants differ are listed.
 *
 *   npx tsx tests/bench/shortlist-ab.ts <demo-dir>[,<demo-dir>...] '[{...params}, {...params}]'
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { matchFragments, DEFAULT_MATCH_PARAMETERS, type FaceMatch } from '../../core/geometry/proposals/pairwise-match';
import { prepareFragment, runSpacing, DEFAULT_FPFH_RADIUS_SPACINGS, type PreparedFragment } from '../../core/geometry/proposals/prepared-fragment';
import { displacementAt, rotationErrorDegrees } from '../../core/geometry/registration/rigid-transform';
import { studied, type TruthFragment, type TruthJoin } from './face-pair-study';
const variants = JSON.parse(process.argv[3]) as Array<Record<string, unknown>>;
const tot = variants.map(() => ({ ok: 0, cpu: 0 }));
let n = 0;
for (const dir of process.argv[2].split(',')) {
  const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { fragments: TruthFragment[]; joins: TruthJoin[] };
  const frags = new Map(truth.fragments.map((f) => [f.catalogueNo, studied(dir, f)]));
  const spacing = runSpacing([...frags.values()].flatMap((f) => (f ? f.input.faces.map((x) => x.area ?? 0) : [])));
  const prepared = new Map<string, PreparedFragment>();
  const prep = (no: string): PreparedFragment => prepared.get(no) ?? prepared.set(no, prepareFragment(frags.get(no)!.input, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS })).get(no)!;
  const eligible = truth.joins.filter((j) => j.type === 'conjoin' && j.survivingFraction >= 0.3 && frags.get(j.a) && frags.get(j.b));
  const ok = (m: FaceMatch | undefined, t: number[], c: [number, number, number]): boolean => !!m && rotationErrorDegrees(m.transform, t) < 5 && displacementAt(m.transform, t, c) < 5;
  for (const j of eligible) {
    n++;
    const A = prep(j.a), B = prep(j.b);
    const row: string[] = [];
    variants.forEach((v, vi) => {
      const c0 = process.cpuUsage();
      const best = matchFragments(A, B, { ...DEFAULT_MATCH_PARAMETERS, ...v })[0];
      const c1 = process.cpuUsage(c0);
      tot[vi].cpu += (c1.user + c1.system) / 1e6;
      const good = ok(best, j.transformBToA, B.centroid);
      tot[vi].ok += +good;
      row.push(good ? 'ok' : '--');
    });
    if (new Set(row).size > 1) console.log(`${dir.split('/').pop()} ${j.a}|${j.b} ${j.pattern} ${row.join(' ')}`);
  }
}
variants.forEach((v, vi) => console.log(`${JSON.stringify(v)}: best of fragment pair (shortlist) correct ${tot[vi].ok}/${n}, CPU ${tot[vi].cpu.toFixed(1)} s`));
