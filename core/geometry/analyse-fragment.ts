import { vertexRings } from './adjacency';
import { kthSmallest } from './kth-smallest';
import { headOnExits, originalClass, regionFigures, typicalWallDepth, type RegionFigures } from './classify-regions';
import { principalCurvatures, type SurfaceCurvature } from './curvature';
import { splitFacesAtCorners } from './face-corner-split';
import { fractureFaceGroups } from './face-split';
import { fractureFaces, type FractureFace } from './fracture-faces';
import { enclosedVolume, surfaceArea } from './measure';
import { boundingBox, triangleNormalsAndAreas, vertexNormals, type BoundingBox, type TriangleMesh } from './mesh';
import { bilateralNormalFilter, triangleCentroids } from './normal-filter';
import { regionBorders } from './region-borders';
import { settleFractureRegions } from './region-context';
import { absorbSmallFractureRegions } from './small-faces';
import { growRegions, mergeSmallRegions } from './regions';
import { splitRegionsAtCreases } from './region-crease-split';
import { splitFlakeScars } from './flake-scar-split';
import { shallowOuterRegions } from './shallow-outer-regions';
import { detectAndCloseRidges } from './ridges';
import { resampleSurface, type SurfaceSamples } from './resample';
import { analysisSettings, type AnalysisSettings } from './settings';
import { refineFractureBorder } from './border-refine';
import { facingGroups, fitMedialSegment, fitSectionSegment, fitShaftAxis, outerRadius, settleAxisSide, type ShaftAxis } from './shaft-axis';
import { cavityCentre } from './cavity-centre';
import { hypot } from './hypot';
import { ellipseFitOptions, fitEllipseSection } from './shaft-section';
import { castWallRays } from './wall-rays';
import { thinWallCrossingShare } from './thin-wall-crossing';
import { SURFACE_CLASSES, surfaceClassCode, type SurfaceClass } from './surface-classes';
import { buildTopology, triangleComponents } from './topology';
import { keepTriangles, weldVertices } from './weld';
import { refinePartition } from './refine-partition';

export interface SurfaceRegion extends RegionFigures {
  id: number;
  surfaceClass: SurfaceClass;
  kind: 'fracture' | 'original';
}

export interface MeshStats {
  inputVertices: number;
  inputTriangles: number;
  vertices: number;
  triangles: number;
  area: number;
  volume: number;
  /** Watertight: no open edges, no edge shared by three or more triangles, consistent winding. */
  closed: boolean;
  boundaryEdges: number;
  nonManifoldEdges: number;
  inconsistentEdges: number;
  droppedDegenerate: number;
  /** Components found; only the largest is analysed. */
  components: number;
  droppedComponentTriangles: number;
  bbox: BoundingBox;
}

export interface FragmentAnalysis {
  /** Welded, cleaned mesh of the largest component: every other array indexes into it. */
  mesh: TriangleMesh;
  /** Input triangle index of each analysed triangle (for labels in input order). */
  sourceTriangle: Uint32Array;
  stats: MeshStats;
  vertexNormals: Float32Array;
  triangleNormals: Float32Array;
  curvature: SurfaceCurvature;
  axis: ShaftAxis;
  /** Region id of each triangle, and the regions with their class. */
  regionOfTriangle: Uint32Array;
  regions: SurfaceRegion[];
  /** surfaceClassCode per triangle (0 fracture, 1 outer cortical, 2 medullary, 3 articular). */
  triangleClass: Uint8Array;
  samples: SurfaceSamples;
  fractureFaces: FractureFace[];
  settings: AnalysisSettings;
}

/**
 * Everything the matcher needs from one fragment's scan (design.md section 7, steps 1-4):
 * weld and clean, keep the largest component, measure, curvatures and roughness, resample,
 * segment into regions without seed points, classify each region, and describe every
 * fracture face. `regionClassOverrides` applies the analyst's corrections (region id -> class).
 */
export function analyseFragment(
  input: TriangleMesh,
  overrides: Partial<AnalysisSettings> = {},
  regionClassOverrides: ReadonlyMap<number, SurfaceClass> = new Map(),
  /** Studies only (tests/bench): replaces the fitted shaft axis, e.g. by the generator's. */
  axisOverride?: (fitted: ShaftAxis) => ShaftAxis,
): FragmentAnalysis {
  const settings = analysisSettings(overrides);
  const welded = weldVertices(input, settings.weldToleranceMm);
  const comps = triangleComponents(welded.mesh);
  let mesh = welded.mesh;
  let sourceTriangle = welded.sourceTriangle;
  let dropped = 0;
  if (comps.sizes.length > 1) {
    const kept = keepTriangles(mesh, (f) => comps.component[f] === 0);
    mesh = kept.mesh;
    sourceTriangle = kept.kept.map((f) => welded.sourceTriangle[f]);
    dropped = comps.sizes.slice(1).reduce((s, x) => s + x, 0);
  }
  const topo = buildTopology(mesh);
  const { normals: triNormals, areas } = triangleNormalsAndAreas(mesh);
  const vNormals = vertexNormals(mesh);
  const rings = vertexRings(mesh);
  const curvature = principalCurvatures(mesh, vNormals, rings);
  const centroids = triangleCentroids(mesh.positions, mesh.triangles);
  const nt = areas.length;
  const triRough = new Float32Array(nt), triMean = new Float32Array(nt), triCurvedness = new Float32Array(nt);
  const { k1, k2 } = curvature;
  const t = mesh.triangles;
  for (let f = 0; f < nt; f++) {
    const a = t[3 * f], b = t[3 * f + 1], c = t[3 * f + 2];
    triRough[f] = (curvature.roughness[a] + curvature.roughness[b] + curvature.roughness[c]) / 3;
    triMean[f] = (k1[a] + k1[b] + k1[c] + k2[a] + k2[b] + k2[c]) / 6;
    triCurvedness[f] = (Math.sqrt((k1[a] * k1[a] + k2[a] * k2[a]) / 2) + Math.sqrt((k1[b] * k1[b] + k2[b] * k2[b]) / 2) + Math.sqrt((k1[c] * k1[c] + k2[c] * k2[c]) / 2)) / 3;
  }
  const area = surfaceArea(mesh);
  const filtered = bilateralNormalFilter(triNormals, areas, centroids, topo.neighbours, settings.normalFilterIterations, settings.normalFilterRange);
  const rays = castWallRays(mesh, filtered, centroids, settings.maxWallRays, undefined, settings.outwardHitWeight > 0);
  const settled = settleAxisSide(fitShaftAxis(centroids, filtered, areas, settings.shaftCentreTolerance, { gain: settings.shaftDirectionSearchGain, count: settings.shaftDirectionSearchCount, supportMin: settings.shaftDirectionSearchSupportMin },
    { rays, shareMax: settings.shaftCentreWallShareMax, tolerance: settings.shaftCentreWallToleranceMm, supportMin: settings.shaftCentreWallSupportMin, strictShareMax: settings.shaftCentreWallStrictShareMax, strictSupportMin: settings.shaftCentreWallStrictSupportMin }), centroids, filtered, areas, triMean,
    { areaRatio: settings.axisSideAreaRatio, facingShare: settings.axisSideFacingShare });
  // The segment fitted in direction and extent where it is kept, else the one along the line from the area centroid to the centre.
  const sectioned = settings.sectionSegmentReaches.length > 0
    ? fitSectionSegment(settled, centroids, filtered, areas, rays, {
      reaches: settings.sectionSegmentReaches, directions: settings.sectionSegmentDirections, gain: settings.sectionSegmentGain, headOnCosineMin: settings.headOnCosineMin,
      neitherWeight: settings.sectionSegmentNeitherWeight, neitherLossMax: settings.sectionSegmentNeitherLossMax,
      supportMin: settings.sectionSegmentSupportMin, maxRows: settings.sectionSegmentMaxRays, pointGain: settings.sectionPointGain, pointSupportMin: settings.sectionPointSupportMin, pointLineShareMin: settings.sectionPointLineShareMin, centreTolerance: settings.shaftCentreTolerance,
    }, { rays, shareMax: settings.shaftCentreWallShareMax, tolerance: settings.shaftCentreWallToleranceMm, supportMin: settings.shaftCentreWallSupportMin, strictShareMax: settings.shaftCentreWallStrictShareMax, strictSupportMin: settings.shaftCentreWallStrictSupportMin })
    : settled;
  const roundAxis = sectioned.medial ? sectioned : fitMedialSegment(sectioned, centroids, filtered, areas, settings.medialSegmentLengths, settings.medialSegmentGain);
  // An elliptic section where it explains the wall clearly better than the round model (shaft-section.ts).
  const fittedAxis = fitEllipseSection(roundAxis, centroids, filtered, areas, rays, ellipseFitOptions(settings),
    { rays, shareMax: settings.shaftCentreWallShareMax, tolerance: settings.shaftCentreWallToleranceMm, supportMin: settings.shaftCentreWallSupportMin, strictShareMax: settings.shaftCentreWallStrictShareMax, strictSupportMin: settings.shaftCentreWallStrictSupportMin });
  const ridges = detectAndCloseRidges(mesh, topo.neighbours, filtered, rings, curvature.k1, curvature.k2, settings);
  // Regions and the program's class of each about a shaft axis.
  const classify = (axis: ShaftAxis): { region: Uint32Array; regionCount: number; figures: RegionFigures[]; programClasses: SurfaceClass[] } => {
    const facing = facingGroups(centroids, filtered, axis, settings.corticalRadialMin);
    let region = growRegions(topo.neighbours, filtered, settings.growAngleDeg, facing, ridges.ridge);
    region = mergeSmallRegions(region, topo.neighbours, areas, settings.minRegionAreaShare * area);
    if (settings.regionSplitCreaseAngleDeg < 180) {
      region = splitRegionsAtCreases(mesh, topo.neighbours, filtered, areas, centroids, rings, curvature.k1, curvature.k2, region, {
        creaseAngleDeg: settings.regionSplitCreaseAngleDeg, gapMm: settings.regionSplitGapMm, curvatureWeight: settings.ridgeCurvatureWeight, minPieceArea: settings.regionSplitMinPieceAreaMm2, convexOnly: settings.regionSplitConvexOnly,
      });
    }
    let regionCount = 0;
    for (let f = 0; f < nt; f++) if (region[f] + 1 > regionCount) regionCount = region[f] + 1;
    const figures = regionFigures(region, regionCount, filtered, centroids, areas, triRough, triMean, triCurvedness, axis, rays, settings.headOnCosineMin, settings.outwardFacingCosineMin, settings.outwardAxialMax, settings.outwardRadialMax);
    const regionFacing = Int8Array.from(figures, (r) => (axis.support < 0.5 ? 0 : r.radial >= settings.corticalRadialMin ? 1 : r.radial <= -settings.corticalRadialMin ? -1 : 0));
    const borders = regionBorders(mesh, topo.neighbours, filtered, region, regionCount, regionFacing, settings.ridgeAngleDeg);
    figures.forEach((r, i) => {
      r.sharpBorderShare = borders[i].sharpShare;
      r.outwardBorderShare = borders[i].outwardShare;
      r.inwardBorderShare = borders[i].inwardShare;
    });
    if (settings.contextThinCrossingWeight > 0) {
      const thin = thinWallCrossingShare(region, regionCount, rays, centroids, filtered, axis, {
        headOnCosineMin: settings.headOnCosineMin, depthRatioMax: settings.contextThinCrossingRatioMax, radialMin: settings.corticalRadialMin, supportMin: settings.contextThinCrossingSupportMin,
      });
      figures.forEach((r, i) => { r.thinCrossingShare = thin[i]; });
    }
    const wallDepth = typicalWallDepth(figures);
    // Each region judged by itself, then again with the border it has with original surface
    // (region-context.ts); small fracture patches absorbed; the analyst's corrections on top.
    const fracture = settleFractureRegions(figures, borders, axis, settings,
      settings.contextBreakExitWeight > 0 || settings.contextThinPartnerWeight > 0 ? headOnExits(region, regionCount, rays, settings.headOnCosineMin) : []);
    const firstClasses: SurfaceClass[] = figures.map((fig, id) => (fracture[id] ? 'fracture' : originalClass(fig, axis, settings, wallDepth)));
    // Breaks read outer whose wall to the cavity is thin for this piece (shallow-outer-regions.ts).
    if (settings.shallowOuterDepthRatio > 0 && axis.support >= settings.shallowOuterSupportMin) {
      const shallow = shallowOuterRegions(region, regionCount, (r) => firstClasses[r] === 'outer-cortical', (r) => firstClasses[r] === 'medullary', rays, {
        depthRatio: settings.shallowOuterDepthRatio, headOnCosineMin: settings.headOnCosineMin, minRays: settings.shallowOuterMinRays,
      });
      shallow.forEach((s, r) => { if (s) firstClasses[r] = 'fracture'; });
    }
    const programClasses = absorbSmallFractureRegions(region, topo.neighbours, areas, firstClasses, settings.minFaceAreaMm2);
    // Flake scars split off the regions read medullary (flake-scar-split.ts), as breaks.
    if (settings.flakeScarDepthRatio > 0 && axis.support >= settings.flakeScarSupportMin) {
      const scar = splitFlakeScars(region, regionCount, (r) => programClasses[r] === 'medullary', (r) => programClasses[r] === 'outer-cortical' || programClasses[r] === 'articular', (f) => facing[f] === 2, topo.neighbours, filtered, areas, triMean, rays, {
        depthRatio: settings.flakeScarDepthRatio, referenceQuantile: settings.flakeScarReferenceQuantile, minPieceArea: settings.flakeScarMinPieceAreaMm2,
        concaveMin: settings.flakeScarConcaveMin, headOnCosineMin: settings.headOnCosineMin, minRays: settings.flakeScarMinRays,
        wallShareMin: settings.flakeScarWallShareMin, wallDepth,
      });
      if (scar.scars > 0) {
        const all = regionFigures(scar.region, regionCount + scar.scars, filtered, centroids, areas, triRough, triMean, triCurvedness, axis, rays, settings.headOnCosineMin, settings.outwardFacingCosineMin, settings.outwardAxialMax, settings.outwardRadialMax);
        for (let i = regionCount; i < regionCount + scar.scars; i++) { figures.push(all[i]); programClasses.push('fracture'); }
        return { region: scar.region, regionCount: regionCount + scar.scars, figures, programClasses };
      }
    }
    return { region, regionCount, figures, programClasses };
  };
  let axis = axisOverride ? axisOverride(fittedAxis) : fittedAxis;
  let pass = classify(axis);
  // The centre read again from the cavity as classed (cavity-centre.ts): a round shaft piece
  // (no elliptic section: a flattened cavity's normal lines meet along its major axis, not at
  // the centre) whose cavity arc is concave about a point away from the fitted centre is
  // classified again about that point.
  if (!axisOverride && settings.cavityCentreSpreadMin > 0 && !axis.section && axis.support >= settings.cavityCentreSupportMin) {
    const first = pass;
    const c = cavityCentre(axis, first.region, (r) => first.programClasses[r] === 'medullary', centroids, filtered, areas,
      { spreadMin: settings.cavityCentreSpreadMin, concaveShare: settings.cavityCentreConcaveShare });
    if (c) {
      const [dx, dy, dz] = axis.direction;
      const rx = c[0] - axis.point[0], ry = c[1] - axis.point[1], rz = c[2] - axis.point[2];
      const along = rx * dx + ry * dy + rz * dz;
      if (hypot(rx - along * dx, ry - along * dy, rz - along * dz) >= settings.cavityCentreMoveMinMm) {
        axis = { direction: axis.direction, point: c, radius: outerRadius(centroids, filtered, areas, axis.direction, c), support: axis.support };
        pass = classify(axis);
      }
    }
  }
  let region = pass.region;
  const { figures, programClasses } = pass;
  const classes = programClasses.map((c, id) => regionClassOverrides.get(id) ?? c);
  // Border triangles to the side whose normals they share (border-refine.ts), by the program's
  // classes, so that a region is the same set of triangles whether or not the analyst corrected it.
  region = refineFractureBorder(topo.neighbours, filtered, areas, region, programClasses.map((c) => c === 'fracture'), {
    rings: settings.borderRefineRings, referenceRing: settings.borderRefineReferenceRing, passes: settings.borderRefinePasses, minPatchArea: settings.minFaceAreaMm2,
  });
  // Area and triangle count as refined; the other figures are those the regions were classed by.
  for (const fig of figures) { fig.area = 0; fig.triangleCount = 0; }
  for (let f = 0; f < nt; f++) { figures[region[f]].area += areas[f]; figures[region[f]].triangleCount++; }
  const regions: SurfaceRegion[] = figures.map((fig, id) => {
    const surfaceClass = classes[id];
    return { id, ...fig, surfaceClass, kind: surfaceClass === 'fracture' ? 'fracture' : 'original' };
  });
  const triangleClass = new Uint8Array(nt);
  for (let f = 0; f < nt; f++) triangleClass[f] = surfaceClassCode(regions[region[f]].surfaceClass);
  const samples = resampleSurface(mesh, triNormals, settings.sampleSpacingMm);
  // Faces: fracture regions grouped, split where breaks meet at a crease (face-split.ts).
  const groupRegions = (minFaceArea: number, minOuterEdge: number): Int32Array => fractureFaceGroups(mesh, topo.neighbours, filtered, areas, region, regions.map((r) => r.kind === 'fracture'), regions.map((r) => r.surfaceClass === 'outer-cortical'), {
    creaseAngleDeg: settings.ridgeAngleDeg,
    creaseShareMin: settings.faceSplitCreaseShare,
    meanAngleDeg: settings.faceSplitMeanAngleDeg,
    minFaceArea,
    minOuterEdge,
  });
  const groupOfRegion = groupRegions(settings.faceSplitMinAreaMm2, settings.faceSplitMinOuterEdgeMm);
  const regionGroup = new Int32Array(nt);
  for (let f = 0; f < nt; f++) regionGroup[f] = groupOfRegion[region[f]];
  // ...and cut where their rim against the outer surface turns sharply (face-corner-split.ts).
  const outerCode = surfaceClassCode('outer-cortical');
  const isOuter = (f: number): boolean => triangleClass[f] === outerCode;
  const cutAtCorners = (groups: Int32Array, cornerAngleDeg: number): Int32Array => splitFacesAtCorners(mesh, topo.neighbours, filtered, areas, groups, isOuter, {
    cornerAngleDeg,
    windowMm: settings.faceCornerWindowMm,
    minFaceArea: settings.faceCornerMinAreaMm2,
    minOuterEdge: settings.faceCornerMinOuterEdgeMm,
    minNormalDeg: settings.faceCornerMinNormalDeg,
    maxCuts: settings.faceCornerMaxCuts,
  });
  const faceGroup = cutAtCorners(regionGroup, settings.faceCornerAngleDeg);
  // Pieces of each face cut at its outer rim's corners, for the matcher only (matched besides the whole face).
  const cornerPieces = settings.facePieceCornerAngleDeg >= 180 ? faceGroup : cutAtCorners(faceGroup, settings.facePieceCornerAngleDeg);
  // ...and where small breaks meet their neighbours at a crease (kept whole in the faces for want of an angle to read).
  const pieceGroup = settings.facePieceSplitMinAreaMm2 >= settings.faceSplitMinAreaMm2 && settings.faceSplitMinOuterEdgeMm <= 0
    ? cornerPieces
    : refinePartition(cornerPieces, groupRegions(settings.facePieceSplitMinAreaMm2, 0), region);
  const faces = fractureFaces({
    faceGroup,
    mesh,
    neighbours: topo.neighbours,
    triNormals,
    areas,
    centroids,
    triClass: triangleClass,
    triRoughness: triRough,
    medianRoughness: kthSmallest(triRough, Math.floor(nt / 2)) || 1e-9,
    axis,
    samples,
    settings,
  });
  for (const face of faces) {
    const byPiece = new Map<number, number[]>();
    for (const f of face.triangleIds) { const g = pieceGroup[f]; (byPiece.get(g) ?? byPiece.set(g, []).get(g)!).push(f); }
    if (byPiece.size > 1) face.pieces = [...byPiece.values()].map((x) => Uint32Array.from(x));
  }
  return {
    mesh,
    sourceTriangle,
    stats: {
      inputVertices: input.positions.length / 3,
      inputTriangles: input.triangles.length / 3,
      vertices: mesh.positions.length / 3,
      triangles: nt,
      area,
      volume: enclosedVolume(mesh),
      closed: topo.closed,
      boundaryEdges: topo.boundaryEdges,
      nonManifoldEdges: topo.nonManifoldEdges,
      inconsistentEdges: topo.inconsistentEdges,
      droppedDegenerate: welded.droppedDegenerate,
      components: comps.sizes.length,
      droppedComponentTriangles: dropped,
      bbox: boundingBox(mesh.positions),
    },
    vertexNormals: vNormals,
    triangleNormals: triNormals,
    curvature,
    axis,
    regionOfTriangle: region,
    regions,
    triangleClass,
    samples,
    fractureFaces: faces,
    settings,
  };
}

/** One byte per input triangle, in input order: 1 fracture, 0 original (or dropped). */
export function fractureLabelsForInput(analysis: FragmentAnalysis): Uint8Array {
  const labels = new Uint8Array(analysis.stats.inputTriangles);
  for (let f = 0; f < analysis.triangleClass.length; f++) {
    if (analysis.triangleClass[f] === 0) labels[analysis.sourceTriangle[f]] = 1;
  }
  return labels;
}

export { SURFACE_CLASSES };
