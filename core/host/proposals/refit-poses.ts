/**
 * `proposals.poses`: for each refit set formed by accepted conjoins, every member's pose in the
 * frame of one member (issue 6, item 4), from the pose graph of the accepted joins' transforms
 * (spanning tree, then relaxation so cycles agree), with how well each join agrees.
 */
import { withCatalogue } from '../../catalogue/catalogue';
import { solvePoses } from '../../geometry/proposals/pose-graph';

export interface RefitSetPoses {
  /** Specimen ids and catalogue numbers of the set; poses map each member's scan frame into the root's (mm, row-major). */
  root: { specimenId: number; catalogueNo: string };
  members: Array<{ specimenId: number; catalogueNo: string; pose: number[] }>;
  joins: Array<{ joinId: number; rotationDeg: number; translationMm: number; inTree: boolean }>;
}

export function refitSetPoses(catalogue: string): Promise<RefitSetPoses[]> {
  return withCatalogue(catalogue, (cat) => {
    const numbers = new Map(cat.specimens.list().map((s) => [s.id, s.catalogueNo]));
    const accepted = cat.joins.list({ status: 'accepted' }).filter((j) => j.transform && (j.type === 'conjoin' || j.type === null));
    const edges = accepted.map((j) => ({ a: String(j.specimenA), b: String(j.specimenB), transform: j.transform!, weight: j.score ?? 1, id: j.id }));
    const out: RefitSetPoses[] = [];
    const seen = new Set<string>();
    const ordered = [...new Set(edges.flatMap((e) => [e.a, e.b]))].sort((p, q) => Number(p) - Number(q));
    for (const start of ordered) {
      if (seen.has(start)) continue;
      const sol = solvePoses(edges, { root: start });
      for (const k of sol.poses.keys()) seen.add(k);
      const members = [...sol.poses.entries()].map(([id, pose]) => ({ specimenId: Number(id), catalogueNo: numbers.get(Number(id)) ?? id, pose }));
      const joins = sol.residuals.map((r) => {
        const e = edges.find((x) => x.a === r.a && x.b === r.b)!;
        return { joinId: e.id, rotationDeg: r.rotationDeg, translationMm: r.translationMm, inTree: r.inTree };
      });
      out.push({ root: { specimenId: Number(sol.root), catalogueNo: numbers.get(Number(sol.root)) ?? sol.root }, members, joins });
    }
    return out;
  });
}
