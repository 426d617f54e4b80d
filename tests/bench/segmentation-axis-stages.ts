/**
 * The shaft axis fit stage by stage for chosen fragments (issue 5 study): after the consensus
 * fit, the side check, the section segment / point search, the medial segment and the elliptic
 * section, the axis angle and centre offset from the generator's axis, the radius and support;
 * then the per-triangle agreement with the fitted axis and with the generator's axis imposed
 * (analyseFragment's study-only axisOverride). The generator's axis is its bowed centre line at
 * the fragment's area-weighted z (BoneShape.center and tangent), as in segmentation-ellipse-study.ts;
 * segmentation-axis-study.ts and segmentation-section-study.ts take the bone's straight z axis,
 * which on a long piece of a bowed bone lies several mm off (s362 QS-10053: the straight axis
 * reads 69.7 % with the pipeline, the bowed centre line 98.2 %).
 * Run: npx tsx tests/bench/segmentation-axis-stages.ts DIR QS-1,QS-2 [settings JSON]
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { analyseFragment } from '../../core/geometry/analyse-fragment';
import { triangleNormalsAndAreas } from '../../core/geometry/mesh';
import { bilateralNormalFilter, triangleCentroids } from '../../core/geometry/normal-filter';
import { parseMeshFile } from '../../core/geometry/parse/index';
import { analysisSettings } from '../../core/geometry/settings';
import { fitMedialSegment, fitSectionSegment, fitShaftAxis, settleAxisSide, type ShaftAxis } from '../../core/geometry/shaft-axis';
import { ellipseFitOptions, fitEllipseSection } from '../../core/geometry/shaft-section';
import { castWallRays } from '../../core/geometry/wall-rays';
import { buildTopology, triangleComponents } from '../../core/geometry/topology';
import { keepTriangles, weldVertices } from '../../core/geometry/weld';
import { principalCurvatures } from '../../core/geometry/curvature';
import { vertexNormals } from '../../core/geometry/mesh';
import { vertexRings } from '../../core/geometry/adjacency';
import { BoneShape } from '../../demo-data/bone-shape';
import { ELEMENTS } from '../../demo-data/skeleton';
import { generatorAxis, type TruthFragment } from './generator-axis';

interface Truth { fragments: TruthFragment[] }
const [dir, nos, json] = process.argv.slice(2);
const overrides = JSON.parse(json ?? '{}') as Record<string, unknown>;
const settings = analysisSettings(overrides);
const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as Truth;
for (const no of nos.split(',')) {
  const frag = truth.fragments.find((f) => f.catalogueNo === no)!;
  const parsed = parseMeshFile(readFileSync(join(dir, frag.scanFile)), frag.scanFile);
  const labels = Buffer.from(frag.triangleLabels, 'base64');
  const welded = weldVertices(parsed.mesh, settings.weldToleranceMm);
  const comps = triangleComponents(welded.mesh);
  const mesh = comps.sizes.length > 1 ? keepTriangles(welded.mesh, (f) => comps.component[f] === 0).mesh : welded.mesh;
  const topo = buildTopology(mesh);
  const { normals, areas } = triangleNormalsAndAreas(mesh);
  const centroids = triangleCentroids(mesh.positions, mesh.triangles);
  const filtered = bilateralNormalFilter(normals, areas, centroids, topo.neighbours, settings.normalFilterIterations, settings.normalFilterRange);
  const rings = vertexRings(mesh);
  const curv = principalCurvatures(mesh, vertexNormals(mesh), rings);
  const t = mesh.triangles;
  const triMean = new Float32Array(areas.length);
  for (let f = 0; f < areas.length; f++) triMean[f] = (curv.k1[t[3 * f]] + curv.k1[t[3 * f + 1]] + curv.k1[t[3 * f + 2]] + curv.k2[t[3 * f]] + curv.k2[t[3 * f + 1]] + curv.k2[t[3 * f + 2]]) / 6;
  const rays = castWallRays(mesh, filtered, centroids, settings.maxWallRays, undefined, settings.outwardHitWeight > 0);
  // The generator's axis at the fragment: the bone's bowed centre line at the area centroid's z (bone frame).
  const gen = generatorAxis(frag, mesh);
  if (!gen) throw new Error(`${no}: element ${frag.element} of ${frag.taxon} is not in the demo skeleton`);
  const spec = ELEMENTS.find((e) => e.element === frag.element && e.taxon === frag.taxon)!;
  const shape = new BoneShape(spec, frag.side);
  const zMid = gen.zBone, zb = gen.direction, org = gen.point;
  console.log(`  generator: z ${zMid.toFixed(0)} of ${spec.length}, mean outer radius ${shape.shaftRadius(zMid).toFixed(1)}, cortical ${shape.cortical(zMid).toFixed(1)}`);
  const describe = (name: string, a: ShaftAxis): void => {
    const ang = (Math.acos(Math.min(1, Math.abs(zb[0] * a.direction[0] + zb[1] * a.direction[1] + zb[2] * a.direction[2]))) * 180) / Math.PI;
    const r = [a.point[0] - org[0], a.point[1] - org[1], a.point[2] - org[2]];
    const tt = r[0] * zb[0] + r[1] * zb[1] + r[2] * zb[2];
    const off = Math.hypot(r[0] - tt * zb[0], r[1] - tt * zb[1], r[2] - tt * zb[2]);
    console.log(`  ${name.padEnd(10)} axis ${ang.toFixed(1).padStart(5)} deg off ${off.toFixed(1).padStart(5)} mm R ${a.radius.toFixed(1)} support ${a.support.toFixed(2)}${a.medial ? ` medial ${a.medial.length.toFixed(1)}` : ''}${a.section ? ` section ${JSON.stringify(a.section, (k, v) => (typeof v === 'number' ? +v.toFixed(2) : v))}` : ''}`);
  };
  // Truth area split.
  const split = [0, 0, 0, 0];
  const { areas: inAreas } = triangleNormalsAndAreas(parsed.mesh);
  for (let f = 0; f < labels.length; f++) split[labels[f] >= 10 ? 3 : Math.min(labels[f], 3)] += inAreas[f];
  console.log(`${no} ${frag.element} outer ${split[0].toFixed(0)} medullary ${split[1].toFixed(0)} damage ${split[2].toFixed(0)} break ${split[3].toFixed(0)} mm2`);
  const fitted = fitShaftAxis(centroids, filtered, areas, settings.shaftCentreTolerance, { gain: settings.shaftDirectionSearchGain, count: settings.shaftDirectionSearchCount, supportMin: settings.shaftDirectionSearchSupportMin },
    { rays, shareMax: settings.shaftCentreWallShareMax, tolerance: settings.shaftCentreWallToleranceMm, supportMin: settings.shaftCentreWallSupportMin });
  describe('consensus', fitted);
  const settled = settleAxisSide(fitted, centroids, filtered, areas, triMean, { areaRatio: settings.axisSideAreaRatio, facingShare: settings.axisSideFacingShare });
  describe('side', settled);
  const sectioned = fitSectionSegment(settled, centroids, filtered, areas, rays, {
    reaches: settings.sectionSegmentReaches, directions: settings.sectionSegmentDirections, gain: settings.sectionSegmentGain, headOnCosineMin: settings.headOnCosineMin,
    neitherWeight: settings.sectionSegmentNeitherWeight, neitherLossMax: settings.sectionSegmentNeitherLossMax,
    supportMin: settings.sectionSegmentSupportMin, maxRows: settings.sectionSegmentMaxRays, pointGain: settings.sectionPointGain, pointSupportMin: settings.sectionPointSupportMin, pointLineShareMin: settings.sectionPointLineShareMin, centreTolerance: settings.shaftCentreTolerance,
  });
  describe('segment', sectioned);
  const round = sectioned.medial ? sectioned : fitMedialSegment(sectioned, centroids, filtered, areas, settings.medialSegmentLengths, settings.medialSegmentGain);
  describe('medial', round);
  const ell = fitEllipseSection(round, centroids, filtered, areas, rays, ellipseFitOptions(settings));
  describe('ellipse', ell);
  describe('generator', { direction: zb as [number, number, number], point: org as [number, number, number], radius: 0, support: 1 });
  const agreement = (override?: (a: ShaftAxis) => ShaftAxis): number => {
    const a = analyseFragment(parsed.mesh, overrides, new Map(), override);
    let ok = 0, all = 0;
    for (let f = 0; f < a.triangleClass.length; f++) {
      const s = a.sourceTriangle[f];
      all += inAreas[s];
      if ((a.triangleClass[f] === 0) === (labels[s] >= 2)) ok += inAreas[s];
    }
    return ok / all;
  };
  const trueAxis = (a: ShaftAxis): ShaftAxis => ({ direction: [zb[0], zb[1], zb[2]], point: [org[0], org[1], org[2]], radius: a.radius, support: a.support });
  console.log(`  agreement fitted ${(100 * agreement()).toFixed(1)} generator's axis ${(100 * agreement(trueAxis)).toFixed(1)}`);
}
