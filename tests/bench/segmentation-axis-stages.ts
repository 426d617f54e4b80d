/**
 * The shaft axis fit stage by stage for chosen fragments (issue 5 study): after the consensus
 * fit, the side check, the section segment / point search, the medial segment and the elliptic
 * section, the axis angle and centre offset from the generator's axis, the radius and support;
 * then the per-triangle agreement with the fitted axis and with the generator's axis imposed
 * (analyseFragment's study-only axisOverride). The generator's axis is its bowed centre line at
 * the fragment's area-weighted z (BoneShape.center and tangent), as in segmentation-ellipse-study.ts;
 * segmentation-axis-study.ts and segmentation-section-study.ts take the bone's straight z axis,
 * which on a long piece of a bowed bone lies several mm off (s362 QS-10053: the straight axis
 * reads 69.7 % with the pipeline, the bowed centre line 98.2 %). Also the wall-crossing share
 * (wall-crossing.ts) and the consensus score split by truth class at the fitted, final and
 * generator's centres (which surface supports each centre).
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
import { wallCrossingShare, wallSegments } from '../../core/geometry/wall-crossing';
import { acrossAxisBasis } from '../../core/geometry/shaft-axis';
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
  const keptPart = comps.sizes.length > 1 ? keepTriangles(welded.mesh, (f) => comps.component[f] === 0) : undefined;
  const mesh = keptPart ? keptPart.mesh : welded.mesh;
  const srcOf = (f: number): number => welded.sourceTriangle[keptPart ? keptPart.kept[f] : f];
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
    { rays, shareMax: settings.shaftCentreWallShareMax, tolerance: settings.shaftCentreWallToleranceMm, supportMin: settings.shaftCentreWallSupportMin, strictShareMax: settings.shaftCentreWallStrictShareMax, strictSupportMin: settings.shaftCentreWallStrictSupportMin });
  describe('consensus', fitted);
  const settled = settleAxisSide(fitted, centroids, filtered, areas, triMean, { areaRatio: settings.axisSideAreaRatio, facingShare: settings.axisSideFacingShare });
  describe('side', settled);
  const sectioned = fitSectionSegment(settled, centroids, filtered, areas, rays, {
    reaches: settings.sectionSegmentReaches, directions: settings.sectionSegmentDirections, gain: settings.sectionSegmentGain, headOnCosineMin: settings.headOnCosineMin,
    neitherWeight: settings.sectionSegmentNeitherWeight, neitherLossMax: settings.sectionSegmentNeitherLossMax,
    supportMin: settings.sectionSegmentSupportMin, maxRows: settings.sectionSegmentMaxRays, pointGain: settings.sectionPointGain, pointSupportMin: settings.sectionPointSupportMin, pointLineShareMin: settings.sectionPointLineShareMin, centreTolerance: settings.shaftCentreTolerance,
  }, { rays, shareMax: settings.shaftCentreWallShareMax, tolerance: settings.shaftCentreWallToleranceMm, supportMin: settings.shaftCentreWallSupportMin, strictShareMax: settings.shaftCentreWallStrictShareMax, strictSupportMin: settings.shaftCentreWallStrictSupportMin });
  describe('segment', sectioned);
  const round = sectioned.medial ? sectioned : fitMedialSegment(sectioned, centroids, filtered, areas, settings.medialSegmentLengths, settings.medialSegmentGain);
  describe('medial', round);
  const ell = fitEllipseSection(round, centroids, filtered, areas, rays, ellipseFitOptions(settings),
    { rays, shareMax: settings.shaftCentreWallShareMax, tolerance: settings.shaftCentreWallToleranceMm, supportMin: settings.shaftCentreWallSupportMin, strictShareMax: settings.shaftCentreWallStrictShareMax, strictSupportMin: settings.shaftCentreWallStrictSupportMin });
  describe('ellipse', ell);
  describe('generator', { direction: zb as [number, number, number], point: org as [number, number, number], radius: 0, support: 1 });
  // The consensus score (area whose normal line passes within shaftCentreTolerance times its
  // distance, biweight, triangles within 20 degrees of perpendicular to the fitted direction),
  // split by truth class (outer / medullary / damage / break), at the fitted centre and the generator's.
  const consensusSplit = (pt: readonly number[]): string => {
    const d = fitted.direction;
    const sp = [0, 0, 0, 0], face = [0, 0], dsum = [0, 0], bins = new Array<number>(24).fill(0);
    const [[ux, uy, uz], [vx, vy, vz]] = ((): number[][] => { const e = Math.abs(d[0]) < 0.9 ? [1, 0, 0] : [0, 1, 0]; const u0 = [d[1] * e[2] - d[2] * e[1], d[2] * e[0] - d[0] * e[2], d[0] * e[1] - d[1] * e[0]]; const ul = Math.hypot(u0[0], u0[1], u0[2]); const u1 = u0.map((x) => x / ul); return [u1, [d[1] * u1[2] - d[2] * u1[1], d[2] * u1[0] - d[0] * u1[2], d[0] * u1[1] - d[1] * u1[0]]]; })();
    for (let f = 0; f < areas.length; f++) {
      const nx = filtered[3 * f], ny = filtered[3 * f + 1], nz = filtered[3 * f + 2];
      const al = nx * d[0] + ny * d[1] + nz * d[2];
      if (Math.abs(al) > 0.342) continue;
      const rx0 = centroids[3 * f] - pt[0], ry0 = centroids[3 * f + 1] - pt[1], rz0 = centroids[3 * f + 2] - pt[2];
      const ra = rx0 * d[0] + ry0 * d[1] + rz0 * d[2];
      const rx = rx0 - ra * d[0], ry = ry0 - ra * d[1], rz = rz0 - ra * d[2];
      const mx = nx - al * d[0], my = ny - al * d[1], mz = nz - al * d[2];
      const ml = Math.hypot(mx, my, mz) || 1, dist = Math.hypot(rx, ry, rz);
      // miss = |r x m| / |m|
      const cx = ry * mz - rz * my, cy = rz * mx - rx * mz, cz = rx * my - ry * mx;
      const x = Math.hypot(cx, cy, cz) / ml / (settings.shaftCentreTolerance * dist + 1e-9);
      if (x < 1) {
        const l = labels[srcOf(f)]; sp[l >= 10 ? 3 : Math.min(l, 3)] += areas[f] * (1 - x * x);
        const b = Math.floor(((Math.atan2(rx * vx + ry * vy + rz * vz, rx * ux + ry * uy + rz * uz) + Math.PI) / (2 * Math.PI)) * 24) % 24; bins[b] += areas[f] * (1 - x * x);
        const k = rx * mx + ry * my + rz * mz > 0 ? 0 : 1; face[k] += areas[f] * (1 - x * x); dsum[k] += areas[f] * (1 - x * x) * dist;
      }
    }
    return `${sp.map((v) => v.toFixed(0)).join(' / ')} (away ${face[0].toFixed(0)} at ${(dsum[0] / (face[0] || 1)).toFixed(1)} mm, towards ${face[1].toFixed(0)} at ${(dsum[1] / (face[1] || 1)).toFixed(1)} mm) bins ${((bins.reduce((a, x) => a + x, 0) ** 2) / (bins.reduce((a, x) => a + x * x, 0) || 1)).toFixed(1)} [${bins.map((x) => x.toFixed(0)).join(' ')}]`;
  };
  const genOnFitted = ((): number[] => { const r = [org[0] - fitted.point[0], org[1] - fitted.point[1], org[2] - fitted.point[2]]; return [org[0], org[1], org[2]].map((v, i) => v + 0 * r[i]); })();
  const [bu, bv] = acrossAxisBasis(fitted.direction);
  const segs = wallSegments(rays, centroids, filtered, areas, fitted.direction, bu, bv);
  const share = (pt: readonly number[]): string => wallCrossingShare(segs, pt[0] * bu[0] + pt[1] * bu[1] + pt[2] * bu[2], pt[0] * bv[0] + pt[1] * bv[1] + pt[2] * bv[2], settings.shaftCentreWallToleranceMm).toFixed(2);
  console.log(`  wall crossing share: fitted ${share(fitted.point)} final ${share(ell.point)} generator ${share(org)}`);
  console.log(`  consensus score out/med/dmg/brk: fitted ${consensusSplit(fitted.point)};
    final ${consensusSplit(ell.point)};
    generator ${consensusSplit(genOnFitted)}`);
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
