/**
 * Which fragments an axis-fit setting moves, and by how much (issue 5 study): for each fragment
 * the shaft axis is fitted as analyse-fragment.ts does up to the section segment / point search
 * under two settings; only where the two axes differ is the whole analysis run under both, and
 * the per-triangle agreement of those fragments and the change of each folder's area-weighted
 * figure are printed. A fast screen of a change confined to those stages (an axis setting that
 * moves no fragment's centre cannot move the figures). With SCREEN_ELLIPSE=1 the medial segment
 * and the elliptic section (with its wall check) are fitted too and compared.
 * Run: npx tsx tests/bench/segmentation-axis-screen.ts DIR[,DIR...] '{settings A}' '{settings B}'
 */
import { analyseFragment } from '../../core/geometry/analyse-fragment';
import { triangleNormalsAndAreas, vertexNormals } from '../../core/geometry/mesh';
import { bilateralNormalFilter, triangleCentroids } from '../../core/geometry/normal-filter';
import { analysisSettings, type AnalysisSettings } from '../../core/geometry/settings';
import { fitMedialSegment, fitSectionSegment, fitShaftAxis, settleAxisSide, type ShaftAxis } from '../../core/geometry/shaft-axis';
import { ellipseFitOptions, fitEllipseSection } from '../../core/geometry/shaft-section';
import { castWallRays } from '../../core/geometry/wall-rays';
import { buildTopology, triangleComponents } from '../../core/geometry/topology';
import { keepTriangles, weldVertices } from '../../core/geometry/weld';
import { principalCurvatures } from '../../core/geometry/curvature';
import { vertexRings } from '../../core/geometry/adjacency';
import { labelAgreement, labelledScans } from './segmentation-study-fragments';

const dirs = (process.argv[2] ?? '').split(',').filter(Boolean);
const jsons = [process.argv[3] ?? '{}', process.argv[4] ?? '{}'];
const variants = jsons.map((j) => analysisSettings(JSON.parse(j) as Record<string, unknown>));

const stagedAxis = (settings: AnalysisSettings, mesh: ReturnType<typeof weldVertices>['mesh']): ShaftAxis => {
  const topo = buildTopology(mesh);
  const { normals, areas } = triangleNormalsAndAreas(mesh);
  const centroids = triangleCentroids(mesh.positions, mesh.triangles);
  const filtered = bilateralNormalFilter(normals, areas, centroids, topo.neighbours, settings.normalFilterIterations, settings.normalFilterRange);
  const curv = principalCurvatures(mesh, vertexNormals(mesh), vertexRings(mesh));
  const t = mesh.triangles;
  const triMean = new Float32Array(areas.length);
  for (let f = 0; f < areas.length; f++) triMean[f] = (curv.k1[t[3 * f]] + curv.k1[t[3 * f + 1]] + curv.k1[t[3 * f + 2]] + curv.k2[t[3 * f]] + curv.k2[t[3 * f + 1]] + curv.k2[t[3 * f + 2]]) / 6;
  const rays = castWallRays(mesh, filtered, centroids, settings.maxWallRays, undefined, settings.outwardHitWeight > 0);
  const wall = { rays, shareMax: settings.shaftCentreWallShareMax, tolerance: settings.shaftCentreWallToleranceMm, supportMin: settings.shaftCentreWallSupportMin, strictShareMax: settings.shaftCentreWallStrictShareMax, strictSupportMin: settings.shaftCentreWallStrictSupportMin };
  const settled = settleAxisSide(fitShaftAxis(centroids, filtered, areas, settings.shaftCentreTolerance, { gain: settings.shaftDirectionSearchGain, count: settings.shaftDirectionSearchCount, supportMin: settings.shaftDirectionSearchSupportMin },
    wall), centroids, filtered, areas, triMean, { areaRatio: settings.axisSideAreaRatio, facingShare: settings.axisSideFacingShare });
  const sectioned = settings.sectionSegmentReaches.length > 0
    ? fitSectionSegment(settled, centroids, filtered, areas, rays, {
      reaches: settings.sectionSegmentReaches, directions: settings.sectionSegmentDirections, gain: settings.sectionSegmentGain, headOnCosineMin: settings.headOnCosineMin,
      neitherWeight: settings.sectionSegmentNeitherWeight, neitherLossMax: settings.sectionSegmentNeitherLossMax,
      supportMin: settings.sectionSegmentSupportMin, maxRows: settings.sectionSegmentMaxRays, pointGain: settings.sectionPointGain, pointSupportMin: settings.sectionPointSupportMin, pointLineShareMin: settings.sectionPointLineShareMin, centreTolerance: settings.shaftCentreTolerance,
    }, wall)
    : settled;
  if (!process.env.SCREEN_ELLIPSE) return sectioned;
  const roundAxis = sectioned.medial ? sectioned : fitMedialSegment(sectioned, centroids, filtered, areas, settings.medialSegmentLengths, settings.medialSegmentGain);
  return fitEllipseSection(roundAxis, centroids, filtered, areas, rays, ellipseFitOptions(settings), wall);
};
const same = (a: ShaftAxis, b: ShaftAxis): boolean => Math.hypot(a.point[0] - b.point[0], a.point[1] - b.point[1], a.point[2] - b.point[2]) < 1e-6
  && !!a.medial === !!b.medial && (!a.medial || !b.medial || Math.abs(a.medial.length - b.medial.length) < 1e-6)
  && !!a.section === !!b.section && (!a.section || !b.section || Math.abs(a.section.outer[0] - b.section.outer[0]) < 1e-6);

for (const dir of dirs) {
  let all = 0, delta = 0, moved = 0;
  const lines: string[] = [];
  for (const scan of labelledScans(dir)) {
    const { frag, total } = scan;
    all += total;
    const welded = weldVertices(scan.source, variants[0].weldToleranceMm);
    const comps = triangleComponents(welded.mesh);
    const mesh = comps.sizes.length > 1 ? keepTriangles(welded.mesh, (f) => comps.component[f] === 0).mesh : welded.mesh;
    const axes = variants.map((s) => stagedAxis(s, mesh));
    if (same(axes[0], axes[1])) continue;
    moved++;
    const agree = jsons.map((j) => labelAgreement(analyseFragment(scan.source, JSON.parse(j) as Record<string, unknown>), scan));
    delta += total * (agree[1] - agree[0]);
    lines.push(`  ${frag.catalogueNo} ${frag.element.padEnd(12)} ${total.toFixed(0).padStart(6)} mm2 ${agree.map((x) => (100 * x).toFixed(1)).join(' -> ')}  support ${axes[0].support.toFixed(2)} section ${axes.map((x) => (x.section ? `${x.section.outer.map((v) => v.toFixed(1)).join('x')}/${x.section.inner.map((v) => v.toFixed(1)).join('x')}` : 'none')).join(' -> ')}`);
  }
  console.log(`${dir}: ${moved} fragments moved, figure change ${(100 * delta / all).toFixed(2)} points`);
  for (const l of lines) console.log(l);
}
