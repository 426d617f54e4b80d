/**
 * One fragment's regions in detail (issue 5 study): per region its class, truth split
 * (outer / medullary / damage / break), figures and neighbours with the crease and smooth
 * border lengths. Run: npx tsx tests/bench/segmentation-fragment-study.ts DIR CATALOGUE_NO [settings JSON]
 * (STUDY_GENERATOR_AXIS=1: with the generator's axis imposed, generator-axis.ts).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { analyseFragment } from '../../core/geometry/analyse-fragment';
import { fractureEvidence } from '../../core/geometry/classify-regions';
import { contextTerms } from '../../core/geometry/region-context';
import { triangleNormalsAndAreas } from '../../core/geometry/mesh';
import { parseMeshFile } from '../../core/geometry/parse/index';
import { buildTopology } from '../../core/geometry/topology';
import { generatorAxisOverride, type TruthFragment } from './generator-axis';

interface Truth { fragments: TruthFragment[] }
const [dir, no, json] = process.argv.slice(2);
const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as Truth;
const frag = truth.fragments.find((f) => f.catalogueNo === no);
if (!frag) throw new Error(`No fragment ${no} in ${join(dir, 'truth.json')}: give a catalogue number listed there.`);
const parsed = parseMeshFile(readFileSync(join(dir, frag.scanFile)), frag.scanFile);
const labels = Buffer.from(frag.triangleLabels, 'base64');
const a = analyseFragment(parsed.mesh, JSON.parse(json ?? '{}'), new Map(), process.env.STUDY_GENERATOR_AXIS === '1' ? generatorAxisOverride(frag, parsed.mesh) : undefined);
const { areas } = triangleNormalsAndAreas(parsed.mesh);
const nr = a.regions.length;
const split = Array.from({ length: nr }, () => [0, 0, 0, 0]);
for (let f = 0; f < a.regionOfTriangle.length; f++) {
  const l = labels[a.sourceTriangle[f]];
  split[a.regionOfTriangle[f]][l >= 10 ? 3 : l] += areas[a.sourceTriangle[f]];
}
const topo = buildTopology(a.mesh);
const nb: Array<Map<number, number>> = Array.from({ length: nr }, () => new Map());
for (let f = 0; f < a.regionOfTriangle.length; f++) for (let j = 0; j < 3; j++) {
  const g = topo.neighbours[3 * f + j];
  if (g < 0 || a.regionOfTriangle[g] === a.regionOfTriangle[f]) continue;
  const m = nb[a.regionOfTriangle[f]];
  m.set(a.regionOfTriangle[g], (m.get(a.regionOfTriangle[g]) ?? 0) + 1);
}
console.log(frag.element, 'axis', a.axis.direction.map((x) => x.toFixed(2)), a.axis.point.map((x) => x.toFixed(1)), 'R', a.axis.radius.toFixed(1), 'support', a.axis.support.toFixed(2));
console.table(a.regions.filter((r) => r.area > 20).map((r) => ({
  r: r.id, cls: r.surfaceClass, area: +r.area.toFixed(0),
  out: +(split[r.id][0] / r.area).toFixed(2), med: +(split[r.id][1] / r.area).toFixed(2), dmg: +(split[r.id][2] / r.area).toFixed(2), brk: +(split[r.id][3] / r.area).toFixed(2),
  ev: +fractureEvidence(r, a.settings).toFixed(2), ctx: +contextTerms(r, a.axis.support >= 0.5, a.settings).toFixed(2),
  headOn: +r.headOnShare.toFixed(2), oHit: +r.outwardHitShare.toFixed(2), depth: +r.rayDepth.toFixed(1), sharp: +r.sharpBorderShare.toFixed(2), bOut: +r.outwardBorderShare.toFixed(2), bIn: +r.inwardBorderShare.toFixed(2),
  rough: +r.roughnessRatio.toFixed(2), curvd: +r.curvedness.toFixed(3), H: +r.meanCurvature.toFixed(3), radial: +r.radial.toFixed(2), axial: +r.axial.toFixed(2),
  oCrease: +r.originalCreaseBorderShare.toFixed(2), bExit: +r.breakExitShare.toFixed(2), thin: +r.thinCrossingShare.toFixed(2), tPart: +r.thinPartnerShare.toFixed(2),
  nb: [...nb[r.id].entries()].sort((x, y) => y[1] - x[1]).slice(0, 5).map(([k, v]) => `${k}:${v}`).join(' '),
})));
console.log('faces', a.fractureFaces.map((f) => `${f.id}:${f.area.toFixed(0)}mm2 ${f.angleClass} med${f.medianAngleDeg.toFixed(0)} n${f.anglesDeg.length}`).join(' | '));
