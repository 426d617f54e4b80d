import { z } from 'zod';

/**
 * Every numeric cut-off of ingest and segmentation, with its default and what it means.
 * Lengths are millimetres, angles degrees. These are settings, not hidden constants: the
 * import request and `knitbone inspect` accept overrides, and every stored result records
 * the settings that produced it.
 */
export const analysisSettingsSchema = z.object({
  /** Vertices closer than this are one vertex (weld). */
  weldToleranceMm: z.number().positive().default(0.001),
  /** Spacing of the resampled working copy used for matching. */
  sampleSpacingMm: z.number().positive().default(0.5),
  /** Iterations of bilateral normal filtering before region growing (Zheng et al. 2011). */
  normalFilterIterations: z.number().int().min(0).max(50).default(6),
  /** Range width of the bilateral filter, as a distance between unit normals (0..2). */
  normalFilterRange: z.number().positive().default(0.45),
  /** Largest angle between the filtered normals of two adjacent triangles in one region. */
  growAngleDeg: z.number().positive().max(90).default(10),
  /** An edge whose filtered normals differ by more than this is a ridge (a candidate break edge). */
  ridgeAngleDeg: z.number().positive().max(180).default(35),
  /** Open ridge ends are joined to another ridge at most this far away (ridges.ts). */
  ridgeGapMm: z.number().min(0).default(3),
  /** How strongly closing paths prefer bent surface: edge cost = length / (1 + weight |k| mean edge). */
  ridgeCurvatureWeight: z.number().min(0).default(10),
  /**
   * Regions split along soft creases (region-crease-split.ts): an edge inside a region whose
   * filtered normals differ by more than this angle is a soft crease (180: off). A break meeting
   * the bone surface at a shallow angle shares a region with it wherever part of the meeting
   * line bends less than growAngleDeg.
   */
  regionSplitCreaseAngleDeg: z.number().positive().max(180).default(15),
  /** Open ends of soft creases are joined to another crease or the region's border at most this far away (mm). */
  regionSplitGapMm: z.number().min(0).default(4),
  /** Each piece of a region split along soft creases keeps at least this area (mm²). */
  regionSplitMinPieceAreaMm2: z.number().min(0).default(150),
  /**
   * Only convex edges are soft creases: where a break meets the bone surface of a solid the rim
   * is convex, while creases inside a rough break face or a lobed cavity are as often concave
   * (dev seeds 13, 16, 21: 2% of creases between break and bone surface concave, 24-33% of those
   * inside bone surface).
   */
  regionSplitConvexOnly: z.boolean().default(true),
  /**
   * Flake scars along the cavity (flake-scar-split.ts): inside a region read medullary, a
   * triangle whose inward ray leaves head-on after less than this share of the region's
   * reference depth (its full wall) lies deeper in the wall than the cavity surface; a patch of
   * such triangles beside a deep part of the region is split off as a break (0: off). A break
   * running along the cavity at a shallow angle meets it without a crease in the filtered
   * normals, so one region holds both.
   */
  flakeScarDepthRatio: z.number().min(0).max(1).default(0.6),
  /** ...the region's reference depth: this area-weighted quantile of its head-on ray depths. */
  flakeScarReferenceQuantile: z.number().min(0).max(1).default(0.75),
  /** ...the scar and the rest of its region each keep at least this area (mm²). */
  flakeScarMinPieceAreaMm2: z.number().min(0).default(150),
  /**
   * ...and a scar is not more concave than this (mean curvature under -this, 1/mm; as
   * contextThinPartnerConcaveMin): the medullary surface curves inwards (-1/2r, do Carmo 1976),
   * so a cavity patch whose rays leave early through a thin bevel over it is not taken.
   */
  flakeScarConcaveMin: z.number().min(0).default(0.03),
  /** ...and a region needs at least this many head-on rays before its reference depth is read. */
  flakeScarMinRays: z.number().int().min(1).default(20),
  /**
   * ...and its reference depth is at least this share of the fragment's typical wall depth
   * (classify-regions.ts typicalWallDepth): a region whose wall is thin all over is a slab
   * between two near-parallel breaks or a cavity patch under a break on the outer side (the
   * thin-crossing terms' kind), not a cavity wall with a scar in it.
   */
  flakeScarWallShareMin: z.number().min(0).default(0.5),
  /**
   * ...only on fragments whose axis support is at least this (as contextThinCrossingSupportMin):
   * where the shaft model is weak (bone ends, flattened pieces read from their narrow edge) a
   * region read medullary may span walls of different thickness, whose rays leave through
   * different outer faces (dev s371 QS-10435, support 0.59: a cavity region whose rays cross
   * 7.5 mm of wall on one side and 18 mm on the other).
   */
  flakeScarSupportMin: z.number().min(0).max(1).default(0.65),
  /**
   * Breaks read as outer surface (shallow-outer-regions.ts): a region read outer cortical whose
   * inward rays leave head-on through regions read medullary after a median depth under this
   * share of the fragment's reference crossing (the median of all such crossings: its cortex)
   * lies inside the wall, a bevel or the step of an outer flake, and is read as break (0: off).
   * Dev (segmentation-outer-step-study.ts, 11 sets, axis support at least 0.65): breaks read
   * outer 0.03-0.44, true outer surface 0.74 and more.
   */
  shallowOuterDepthRatio: z.number().min(0).max(1).default(0.5),
  /** ...a region needs at least this many such crossings (and the fragment as many) before its median is read. */
  shallowOuterMinRays: z.number().int().min(1).default(10),
  /**
   * ...only on fragments whose axis support is at least this (as flakeScarSupportMin): bone
   * ends (support 0.56-0.64 on dev) hold crossings of 17-57 mm beside the shaft's 5-9 mm, and
   * their true outer surface then reads 0.23-0.41.
   */
  shallowOuterSupportMin: z.number().min(0).max(1).default(0.65),
  /** Regions smaller than this share of the fragment's area are merged into a neighbour. */
  minRegionAreaShare: z.number().min(0).max(0.5).default(0.002),
  /**
   * Region growing keeps apart triangles facing out from the fitted shaft axis (radial
   * component of the normal at least this), facing in, and neither. A region whose mean
   * radial component is at least this (at most minus this) counts as facing out (in) when
   * the borders of its neighbours are measured (region-borders.ts).
   */
  corticalRadialMin: z.number().min(0).max(1).default(0.82),
  /**
   * Shaft axis centre (shaft-axis.ts): a triangle's normal line supports a candidate centre
   * when it misses it by at most this share of its distance from it (Tukey biweight). Wide
   * enough for the non-circular cross-section of a real shaft; the consensus start keeps the
   * break faces along a splinter from pulling the centre into the wall.
   */
  shaftCentreTolerance: z.number().positive().max(1).default(0.45),
  /**
   * Shaft axis centre (shaft-axis.ts fitShaftAxis, wall-crossing.ts wallCrossingShare): of the
   * inward wall rays aimed at a candidate centre (seen along the axis, their line within
   * `shaftCentreWallToleranceMm` of it ahead of the shooter), where more than this area share
   * reach it before they leave the material, it lies inside the wall (0 in the cavity, over
   * 0.5 in a wall) and is refused: the consensus start skips it and the reweighting from the
   * start stops before it. A shaft's axis runs through its cavity. 0: off.
   */
  shaftCentreWallShareMax: z.number().min(0).max(1).default(0.5),
  /**
   * Least axis support (share of the area along the axis) for shaftCentreWallShareMax: the
   * axis of a piece holding a bone end runs through the end's solid bone (dev s362 QS-10284,
   * support 0.54, and s372 QS-10101, 0.57, lost 1.6-1.7 points with the check).
   */
  shaftCentreWallSupportMin: z.number().min(0).max(1).default(0.65),
  /**
   * Stricter wall check on clear shaft pieces (axis support at least shaftCentreWallStrictSupportMin:
   * no bone end, so the axis must lie in the cavity or the air about the piece along its whole
   * length): a candidate centre with a wallCrossingShare above this is refused, in fitShaftAxis's
   * consensus and reweighting and in the section segment / point search (fitSectionSegment: a
   * point, or a segment at either end or its middle). 0: off. Why 0.2: a consensus centre
   * landed on the meeting point of a thick tibia slab's break faces (s362 QS-10053, share 0.34,
   * 15 mm off; the generator's centre 0.00) and passed the 0.5 of shaftCentreWallShareMax; a
   * global 0.2 refused true centres of pieces with a bone end (s372 QS-10771: the generator's
   * centre reads 0.38, support 0.74), hence the support gate.
   */
  shaftCentreWallStrictShareMax: z.number().min(0).max(1).default(0.2),
  /** Least axis support for shaftCentreWallStrictShareMax (pieces read as no bone end). */
  shaftCentreWallStrictSupportMin: z.number().min(0).max(1).default(0.85),
  /** How near (mm) a wall ray's line must pass a candidate centre to be aimed at it (shaftCentreWallShareMax). */
  shaftCentreWallToleranceMm: z.number().positive().default(1),
  /**
   * Shaft centre read again from the cavity (cavity-centre.ts, analyse-fragment.ts): after a
   * first classification, the regions classed medullary whose normals spread across the axis
   * by at least this (smaller eigenvalue of their scatter over its trace: 0 flat, 0.1 a
   * circular arc of about 63 degrees, 0.5 all round) and that are concave about their own
   * centre (cavityCentreConcaveShare of the area) give the centre; where it lies at least
   * cavityCentreMoveMinMm from the fitted one, the fragment is classified again about it. 0: off.
   */
  cavityCentreSpreadMin: z.number().min(0).max(0.5).default(0.1),
  /** Least area share of a medullary region facing its own centre for cavityCentreSpreadMin. */
  cavityCentreConcaveShare: z.number().min(0).max(1).default(0.8),
  /** Least distance (mm) of the cavity's centre from the fitted one for a second classification (cavityCentreSpreadMin). */
  cavityCentreMoveMinMm: z.number().min(0).default(3),
  /**
   * Least axis support for cavityCentreSpreadMin, as for shaftCentreWallSupportMin: on a
   * piece holding a bone end the cavity closes and the axis runs through solid bone.
   */
  cavityCentreSupportMin: z.number().min(0).max(1).default(0.65),
  /**
   * Shaft axis direction (shaft-axis.ts, searchShaftDirection): the eigenvector iteration of the
   * normals' scatter can settle across a short or chunky piece (its transverse ends' normals
   * run along the axis and outweigh the narrow in-plane spread of the wall's), so directions
   * spread evenly over the half sphere are scored by the area whose normal is within 20 degrees
   * of perpendicular (biweight); the best restarts the iteration when it scores this share more
   * than the fitted direction. 0 or below: no search.
   */
  shaftDirectionSearchGain: z.number().default(0.1),
  /**
   * ...only where the fitted direction already has this share of the area within 20 degrees
   * of perpendicular (below it the piece is not read as a shaft, and a searched direction that
   * makes it one turned an end piece of a metacarpal, s362 QS-10328, from 97.0 to 92.8 %).
   */
  shaftDirectionSearchSupportMin: z.number().min(0).max(1).default(0.5),
  /** Directions tried by searchShaftDirection (even spiral over the half sphere). */
  shaftDirectionSearchCount: z.number().int().min(0).default(1000),
  /**
   * Which side of a flat wall the shaft centre lies on (shaft-axis.ts, settleAxisSide): the
   * surface facing the fitted centre may be taken for the outer one (and the centre mirrored)
   * only while its area is at least this share of the surface facing away (a break face lying
   * along the medullary face adds to that one's area). Not above about 0.7: a break face
   * bevelled through a thick wall leaves the outer face of a splinter narrower than its
   * medullary face (a round wall of radii 12 and 7 mm broken at 40 degrees off radial: 0.69;
   * tests/unit/geometry/shaft-axis-side-bevel.test.ts).
   */
  axisSideAreaRatio: z.number().min(0).max(10).default(0.5),
  /** A mirrored shaft centre is kept only when at least this share as much surface faces it squarely as faced the fitted one. */
  axisSideFacingShare: z.number().min(0).max(10).default(0.6),
  /**
   * Medial segment of a flattened shaft (shaft-axis.ts, fitMedialSegment): lengths tried, as
   * multiples of the fitted radius (empty: none)...
   */
  medialSegmentLengths: z.array(z.number().positive()).default([0.5, 1, 1.5]),
  /** ...and the least gain in squarely facing area (share of a point centre's) for one to be kept. */
  medialSegmentGain: z.number().min(0).default(0.1),
  /**
   * Medial segment fitted in direction and extent (shaft-axis.ts, fitSectionSegment): reaches
   * tried each way from the start, as multiples of the fragment's width across the axis (empty: off)...
   */
  sectionSegmentReaches: z.array(z.number().min(0)).default([0.15, 0.3, 0.5, 0.75]),
  /** ...directions across the axis tried (over 180 degrees)... */
  sectionSegmentDirections: z.number().int().min(1).default(12),
  /** ...weight of the rays that cross no wall head-on facing neither way (break faces)... */
  sectionSegmentNeitherWeight: z.number().min(0).default(0),
  /** ...refused when it turns more than this share of the rays crossing no wall head-on to face out or in, against the point centre (2: no veto)... */
  sectionSegmentNeitherLossMax: z.number().min(0).default(2),
  /** ...only on fragments whose axis support is at least this (pieces with much of a bone end are left with the point centre)... */
  sectionSegmentSupportMin: z.number().min(0).max(1).default(0.65),
  /** ...scored on an even sample of at most this many wall rays... */
  sectionSegmentMaxRays: z.number().int().positive().default(4000),
  /** ...and the least gain in score (share of the point centre's) for a segment to be kept. */
  sectionSegmentGain: z.number().min(0).default(0.1),
  /**
   * Where no segment is kept: the point centre found by the same wall-ray search replaces the
   * consensus centre when it scores at least this share more (shaft-axis.ts, fitSectionSegment;
   * large: never).
   */
  sectionPointGain: z.number().min(0).default(0.3),
  /** ...on fragments whose axis support is at least this. */
  sectionPointSupportMin: z.number().min(0).max(1).default(0.5),
  /**
   * ...and only when the normal lines passing it (within shaftCentreTolerance of their distance,
   * weight 1 - x²) weigh at least this share of those passing the consensus centre.
   */
  sectionPointLineShareMin: z.number().min(0).default(0.8),
  /**
   * Elliptic section of a flattened shaft (shaft-section.ts, fitEllipseSection): fitted on
   * fragments whose axis support is at least this (large: off)...
   */
  ellipseSectionSupportMin: z.number().min(0).default(0.65),
  /** ...kept only when the outer ellipse's axis ratio (major / minor) is at least this (a round shaft keeps the round model)... */
  ellipseSectionRatioMin: z.number().min(1).default(1.3),
  /**
   * ...and at most this: a long bone's shaft is flattened up to about 2 : 1 (the generator's
   * radius 1.86, common practice); a fit far beyond is a lobe or a bend of the wall, not a section.
   */
  ellipseSectionRatioMax: z.number().min(1).default(2.5),
  /** ...and it explains (shaft-section.ts, explained) at least this share more surface than the round model of the axis fitted before... */
  ellipseSectionGain: z.number().min(0).default(0.1),
  /** ...read on an even sample of at most this many wall rays (and as many triangles)... */
  ellipseSectionMaxRays: z.number().int().positive().default(3000),
  /** ...surface within this distance (mm) of the outer or cavity ellipse, facing as it does, counts as explained by it. */
  ellipseSectionToleranceMm: z.number().positive().default(1.5),
  /** ...centres also tried on a grid of (2 n + 1)² points an eighth of the fragment's width apart about the wall's middle (0: none). */
  ellipseSectionGridSteps: z.number().int().min(0).default(12),
  /**
   * ...and where the closed-form cavity ratio reads the section flattened the other way than the
   * outer one, the cavity ratio is read again as the best of this many steps of a geometric grid
   * of (a/b)² from 1/32 to 32 (shaft-section.ts, robustRatio; 0: closed form only).
   */
  ellipseSectionCavityRatioSteps: z.number().int().min(0).default(40),
  /**
   * ...and where the cavity ellipse sized from the closed-form ratio explains less than this
   * share of what the outer ellipse explains, the cavity ratio is read again as above and the
   * better-explaining model kept (shaft-section.ts, evaluate; 0: off).
   */
  ellipseSectionCavityRetryShare: z.number().min(0).default(0.2),
  /**
   * ...and where the section to be kept has a wall more than this many times thinner at the
   * ends of its major axis than at its minor one (cavity nearly as long as the outer ellipse),
   * the search runs again among models whose wall thickness (A - Ai against B - Bi,
   * section-wall-ratio.ts) differs by at most this ratio either way (0: off).
   */
  ellipseSectionWallRatioMax: z.number().min(0).default(2),
  /**
   * ...and a section whose wall is more than this many times thicker at the ends of its major
   * axis than at those of its minor one (A - Ai against B - Bi, section-wall-ratio.ts) is kept
   * only where it explains `ellipseSectionGain` more surface than the best pair of concentric
   * circles found by the same centre search (shaft-section.ts, fitEllipseSection; 0: off). A
   * cortex of near-even thickness about a flattened outline reads near 1 (the parallel curve
   * meets the axes at A - c and B - c); a cavity ellipse that nearly touches the outer one at
   * the minor ends, on a surface a circle explains as well, is the flat side of a large ellipse
   * laid along a flat face of a lobed (three-sided) shaft, with a break through the wall taken
   * for cavity. 2.25: between the largest ratio of a section that helps on dev (1.96) and the
   * smallest of one that hurts (2.50).
   */
  ellipseSectionMinorWallRatioMax: z.number().min(0).default(2.25),
  /**
   * ...and on a clear shaft piece (axis support at least shaftCentreWallStrictSupportMin) a
   * section whose centre lies inside the wall (wall-crossing share above
   * shaftCentreWallStrictShareMax, wall-crossing.ts) is refused for the round axis fitted before,
   * as the consensus and the section segment / point search refuse such centres (false: off).
   */
  ellipseSectionWallCheck: z.boolean().default(true),
  /**
   * The share above which that check refuses the section's centre: the plain check's share
   * (shaftCentreWallShareMax, more than half the wall crossed) at the strict check's support.
   * The strict share (0.2) also refused a metacarpal's section whose centre read 0.42, for a
   * round axis further off (dev s370 QS-10203: 6.3 -> 15.1 mm off, two faces' angle class lost);
   * the section taken along a break through a thick tibia wall reads 0.81 (s398 QS-10994).
   */
  ellipseSectionWallShareMax: z.number().min(0).max(1).default(0.5),
  /** Most inward rays cast to measure wall depth (a sample of triangles when there are more). */
  maxWallRays: z.number().int().positive().default(20000),
  /** An inward ray that leaves the bone with at least this cosine against the exit surface crossed a wall head-on. */
  headOnCosineMin: z.number().min(0).max(1).default(0.9),
  /** Weight of the share of a region's inward rays that cross a wall head-on (against fracture). */
  headOnWeight: z.number().min(0).default(5.4),
  /**
   * Weight of the share of a region's outward rays (shot into the air along the normal) that
   * meet the fragment again (against fracture): the medullary surface looks across the cavity
   * at its other side where the fragment holds it, as on a splinter from the narrow edge of a
   * flattened shaft, whose flat cavity faces the fitted axis does not tell from break faces.
   * Chosen on dev seeds 11-16, 14 at 1.0 mm and 21 (4: no seed loses over 0.1 point; 6 gains
   * seed 16 a little more but costs seed 12 0.3). 0 switches the outward rays off.
   */
  outwardHitWeight: z.number().min(0).default(4),
  /** An outward ray counts for outwardHitWeight only when the surface it meets faces back at least this squarely (cosine). */
  outwardFacingCosineMin: z.number().min(-1).max(1).default(0.5),
  /**
   * An outward ray counts for outwardHitWeight only when it runs across the shaft axis: |cosine|
   * of the ray with the axis at most this (where the axis fit holds; 0.342 = within 20 degrees
   * of perpendicular). The medullary surface runs along the shaft; break faces that look at
   * each other across a notch or a bevel inside a whole shaft lean along it (dev seed 13
   * without this: 0.5 point of break face read as medullary).
   */
  outwardAxialMax: z.number().min(0).max(1).default(0.342),
  /**
   * ... and only from surface not facing clearly away from the axis: radial component of the
   * normal at most this (where the axis fit holds). Break faces that look at each other across
   * a notch can face out; the medullary surface faces in, or neither way where a poorly fitted
   * centre (a splinter from the narrow edge of a flattened shaft) leaves it oblique.
   */
  outwardRadialMax: z.number().min(-1).max(1).default(0.3),
  /**
   * The outward-ray cue applies only to regions whose mean curvature (1/mm) is at most this:
   * the medullary surface is concave (H = -1/2r about a round cavity, nearly 0 on a flat one;
   * do Carmo 1976), while two break faces of a piece wider than half the shaft can look at
   * each other across the cavity and are convex with their relief. 0.05 = a convex cylinder
   * of 10 mm radius.
   */
  outwardMeanCurvatureMax: z.number().default(0.05),
  /** Weight of the share of a region's border that is a crease (for fracture; creases: ridgeAngleDeg). */
  sharpBorderWeight: z.number().min(0).default(4.4),
  /** Weight of min(share of border with outward-facing regions, with inward-facing regions): a face between the walls. */
  betweenWallsWeight: z.number().min(0).default(7.4),
  /** Weight of (roughness / the fragment's median roughness - 1) in a region's fracture evidence. */
  roughnessWeight: z.number().min(0).default(1.4),
  /** A region whose fracture evidence exceeds this is a fracture face (classify-regions.ts). */
  fractureEvidenceMin: z.number().default(2.35),
  /**
   * Neighbourhood pass (region-context.ts): after the first pass, each region is judged
   * again with the kind of border it has with the regions taken for original surface, in at
   * most this many rounds (0: first pass only; it usually settles in 2-3). The weights below
   * add to the first pass's evidence; they were fitted by area-weighted logistic regression on generated development assemblages (seeds 11-16
   * at 1.5 mm, 14 at 1.0 mm), leaving each seed out in turn to check them.
   */
  contextPasses: z.number().int().min(0).max(20).default(10),
  /** Weight of the region's mean curvedness sqrt((k1² + k2²) / 2), per 1/mm (the relief of a break). */
  contextCurvednessWeight: z.number().default(14.6),
  /**
   * Weight (against fracture) of how squarely a region faces out from or into the fitted shaft
   * axis: (|mean radial component| - corticalRadialMin) / (1 - corticalRadialMin), from 0 to 1,
   * where the axis fit holds (support at least 0.5).
   */
  contextFacingWeight: z.number().default(2.33),
  /** Weight of the crease length against original-surface regions as a share of the region's whole border. */
  contextOriginalCreaseWeight: z.number().default(2.89),
  /**
   * Weight (against fracture) of how concave a region is: max(0, -mean curvature -
   * contextConcaveCurvatureMin) per 1/mm,
   * for regions whose inward rays cross a wall head-on at least `contextConcaveHeadOnMin` of the
   * time. The medullary surface curves inwards (mean curvature -1/2r about a round cavity of
   * radius r; do Carmo 1976, section 3-3), while a break face is rough but not concave as a
   * whole: on dev seeds 11-16 and 21, 2% of break area lies in regions with mean curvature
   * under -0.03/mm against 18% of original surface. Chosen on those seeds (50-80 all give the
   * same figures); 0 switches it off.
   */
  contextConcaveWeight: z.number().min(0).default(60),
  /**
   * ...only for regions with at least this share of head-on inward rays (headOnCosineMin): a
   * wall face. Break faces that curve inwards (a concave spiral or a bevel seen from inside the
   * shaft) send their rays along the wall and seldom cross it head-on (dev seed 13 without the
   * gate: 0.3 point of break face read as medullary).
   */
  contextConcaveHeadOnMin: z.number().min(0).max(1).default(0.2),
  /**
   * ...and only for the curvature beyond this (1/mm): the term is contextConcaveWeight x
   * max(0, -mean curvature - this). 0.01 = a cavity of 50 mm radius; a break face winding
   * round the shaft (tests/unit/geometry/region-context.test.ts: a rough piece of mean curvature
   * -0.006/mm facing the axis squarely) is not concave beyond it. Dev figures are the same from 0 to 0.015.
   */
  contextConcaveCurvatureMin: z.number().min(0).default(0.01),
  /**
   * Weight (towards fracture) of how convex a region is that faces into the fitted shaft axis
   * (mean radial component at most -corticalRadialMin, axis support at least 0.5): max(0, mean
   * curvature - contextInwardConvexCurvatureMin) per 1/mm. The medullary surface, the only
   * original surface that faces the axis, is concave about it (mean curvature -1/2r, do Carmo
   * 1976, section 3-3); a region facing the axis that is convex instead is a break face the
   * axis fit has taken for the wall (a splinter whose two break faces run parallel and
   * outweigh its strips of bone surface). 500: a region 0.013/mm beyond the cut-off gains the
   * 6.6 it needs over a squarely facing region's evidence (dev s107 QS-10237's inward break
   * face: mean curvature 0.07/mm); 200 left that face as medullary (s107 94.27 against 94.80).
   * 0 switches it off.
   */
  contextInwardConvexWeight: z.number().min(0).default(500),
  /** ...only for the mean curvature beyond this (1/mm; 0.05 = a cylinder of 10 mm radius, convex). */
  contextInwardConvexCurvatureMin: z.number().min(0).default(0.05),
  /**
   * Weight (towards fracture) of the share of a region's inward rays that leave the bone
   * head-on (headOnCosineMin) through break regions that face the axis while convex (those the
   * inward-convexity term above reads), beyond `contextBreakExitShareMin`, for regions facing
   * out from or into the fitted axis (|mean radial component| at least corticalRadialMin, axis
   * support at least 0.5). A wall face's rays cross the wall and leave through the other wall
   * face, which on the inside is concave; rays that cross squarely into a convex face facing
   * the axis came from the other break face of a sliver cut by two parallel breaks (dev s107
   * QS-10237, s21 QS-10879). Only such break regions count: where one face of a true wall is
   * misread as a break (a rough cavity patch), its partner must not follow it (counting every
   * break region cost dev s105 QS-10625 89.7 -> 65.9). 30 and 60 read the same on dev seeds 12,
   * 15, 16, 21, 105, 107, 108; the bent plate of tests/unit/geometry/region-inward-convex.test.ts
   * (first evidence -4.9: its face crosses the wall head-on everywhere) needs about 55. 0 switches it off.
   */
  contextBreakExitWeight: z.number().min(0).default(60),
  /** ...counted beyond this share of the region's rays. */
  contextBreakExitShareMin: z.number().min(0).max(1).default(0.3),
  /**
   * Weight (towards fracture) of a region on the medullary side of the fitted shaft axis (mean
   * radial component at most -contextUncrossedInwardRadialMin, axis support at least 0.5) that
   * shows neither mark of the medullary wall: its inward rays seldom cross the wall head-on and
   * it is not concave. The medullary surface is the inner face of the cortex, so the rays shot
   * into the bone from it cross the wall and leave through the outer surface nearly squarely
   * (the shape diameter idea, Shapira et al. 2008), and it curves inwards about the cavity (mean
   * curvature -1/2r, do Carmo 1976, section 3-3); a break face that happens to face the axis
   * (a splinter's inner break, a bevel running along the wall) sends its rays along the wall.
   * The term is this weight x max(0, 1 - head-on share / contextConcaveHeadOnMin), so it works
   * exactly where the concavity term above does not. 0 switches it off.
   */
  contextUncrossedInwardWeight: z.number().min(0).default(8),
  /** ...for regions whose mean radial component is at most minus this (originalClass reads |radial| >= 0.5 as facing). */
  contextUncrossedInwardRadialMin: z.number().min(0).max(1).default(0.5),
  /** ...and not for regions more concave than this (mean curvature under -this, 1/mm; 0.03 = a cavity of about 17 mm radius). */
  contextUncrossedInwardConcaveMin: z.number().min(0).default(0.03),
  /**
   * Weight (towards fracture) of the share of a region's inward rays that cross head-on
   * (headOnCosineMin) to a wall face (surface facing the shaft axis) after a wall thinner than
   * `contextThinCrossingRatioMax` times the ray's start distance from the axis, beyond
   * `contextThinCrossingShareMin`, for regions facing out from the axis (mean radial component at
   * least corticalRadialMin) on fragments whose axis support is at least
   * `contextThinCrossingSupportMin` (thin-wall-crossing.ts). The outer surface of a shaft crosses
   * the whole cortex, which in mammal long bones is 0.3-0.6 of the outer radius (cavity
   * diameter about 0.4-0.7 of the outer one, Currey & Alexander 1985, recalled from memory); a
   * face looking out whose rays reach the cavity side much sooner is a break running along the
   * wall: one face of a slab between two near-parallel breaks (dev s372 QS-10573, 0.3-0.4 mm
   * thick at 11 mm from the axis; s398 QS-10286) or a bevel left along the cavity (s105
   * QS-10360, s371 QS-10963: breaks read outer 0.3-0.9 mm off the cavity). Chosen on dev s372, s398, s362, s371, s399 (per fragment against 0: 10 mended
   * the two slabs, 20 also the thin pieces of s362 and s371, 30 lost s362 QS-10880 53.5 -> 16.1).
   * 0 switches it off.
   */
  contextThinCrossingWeight: z.number().min(0).default(20),
  /** ...a crossing thinner than this share of the ray's start distance from the axis is thin. */
  contextThinCrossingRatioMax: z.number().min(0).max(1).default(0.1),
  /** ...counted beyond this share of the region's rays. */
  contextThinCrossingShareMin: z.number().min(0).max(1).default(0.1),
  /**
   * ...only where the axis fit's support is at least this (the distances from the axis need a
   * shaft model that holds; flattened radius and metacarpal pieces whose fit puts the axis
   * 100 mm and more away have support 0.56-0.64, s362 QS-10467, s15 QS-10937, s105 QS-10375).
   */
  contextThinCrossingSupportMin: z.number().min(0).max(1).default(0.65),
  /**
   * Weight (towards fracture) of the share of a region's inward rays that leave the bone head-on
   * (headOnCosineMin) through regions taken for fracture that face out from the axis and whose
   * own rays cross a thin wall (thinCrossingShare beyond contextThinCrossingShareMin: the regions
   * the thin-crossing term reads), beyond `contextThinPartnerShareMin`, for regions facing the
   * axis (mean radial component at most -corticalRadialMin, axis support at least 0.5) that are
   * not concave (mean curvature at least -`contextThinPartnerConcaveMin`). The medullary surface's
   * rays cross the wall to the outer surface; when the face they leave through is the outer
   * break face of a slab between two near-parallel breaks, this region is the slab's inner break
   * face (dev s398 QS-10286, s372 QS-10573: their inner faces read medullary after the
   * thin-crossing term had found the outer ones). The pair of the break-exit term above, for
   * slabs whose inner face is not convex; 60 as that one (tests/unit/geometry/region-thin-partner.test.ts).
   * 0 switches it off.
   */
  contextThinPartnerWeight: z.number().min(0).default(60),
  /** ...counted beyond this share of the region's rays (as contextBreakExitShareMin). */
  contextThinPartnerShareMin: z.number().min(0).max(1).default(0.3),
  /**
   * ...and not for regions more concave than this (mean curvature under -this, 1/mm; as
   * contextUncrossedInwardConcaveMin): the medullary surface curves inwards (-1/2r, do Carmo
   * 1976), a slab's break face does not, so a true cavity patch lying behind a bevel that runs
   * just off the cavity (dev s371 QS-10963, H -0.106/mm; s399 QS-10803, -0.035/mm) keeps its
   * class. Without this gate those two read 98.6 -> 97.4 and 71.0 -> 60.2.
   */
  contextThinPartnerConcaveMin: z.number().min(0).default(0.03),
  /**
   * Weight (towards original surface) of the share of a region's border that it shares with
   * slab faces, beyond `contextSlabRimShareMin`: regions taken for fracture that the
   * thin-crossing term (facing out) or the thin-partner term (facing the axis) reads, for a
   * region that is not itself such a face, faces out from or into the axis at least
   * `contextSlabRimRadialMin` (|mean radial component|) and across it (|mean axial component| at
   * most `contextSlabRimAxialMax`). A slab between two near-parallel breaks running along the
   * wall meets the bone's outer surface or its cavity along its long rims: a narrow strip
   * between the two slab faces that faces out or in is that bone surface, while a rim facing
   * along the axis is a break across the slab and one facing along the circumference a break
   * through it. The strips are narrow, curved and seldom crossed head-on, so the first pass and
   * the curvedness and uncrossed-inward terms read them as break (dev s398 QS-10286: six strips
   * of cavity surface, 334 mm², first evidence 4.4-7.4, context +2.8 to +10.5; their border
   * shares with the slab's faces 0.68-0.93). Chosen on dev s398, s372, s12, s21, s366 (60 with
   * share 0.5: s398 94.52 -> 94.64); tests/unit/geometry/region-slab-rim.test.ts. 0 switches it off.
   */
  contextSlabRimWeight: z.number().min(0).default(60),
  /** ...counted beyond this share of the region's border length. */
  contextSlabRimShareMin: z.number().min(0).max(1).default(0.5),
  /** ...only for regions whose |mean axial component| is at most this (rims facing along the axis are the slab's ends). */
  contextSlabRimAxialMax: z.number().min(0).max(1).default(0.5),
  /** ...and whose |mean radial component| is at least this (rims facing along the circumference are breaks through the slab). */
  contextSlabRimRadialMin: z.number().min(0).max(1).default(0.3),
  /** A region whose first evidence plus those terms exceeds this is a fracture face. */
  contextEvidenceMin: z.number().default(4.9),
  /**
   * Border refinement (border-refine.ts), after the regions are classed: passes in which a
   * triangle at the border between break face and bone surface changes side when its
   * (filtered) normal is closer to the other side's mean normal nearby; each pass moves the
   * border by at most one triangle. 0 switches it off. Chosen on dev seeds 12, 15, 16, 21
   * (3-8 passes within 0.05 point of each other).
   */
  borderRefinePasses: z.number().int().min(0).max(20).default(5),
  /** ...the mean normals of each side over the triangles within this many edge steps of the border triangle... */
  borderRefineRings: z.number().int().min(1).max(20).default(7),
  /** ...counting only triangles at least this many edge steps inside their own side (the border strip does not vote). */
  borderRefineReferenceRing: z.number().int().min(0).max(10).default(2),
  /** Connected fracture patches smaller than this (mm²) take the class of the surface around them (small-faces.ts). */
  minFaceAreaMm2: z.number().min(0).default(10),
  /**
   * Fracture faces where breaks meet (face-split.ts): two neighbouring fracture regions are
   * different faces when at least this share of their shared border is a crease
   * (ridgeAngleDeg) (above 1: never on this test)...
   */
  faceSplitCreaseShare: z.number().min(0).default(0.5),
  /** ...or when their mean normals differ by more than this (180: never on this test). */
  faceSplitMeanAngleDeg: z.number().positive().max(180).default(45),
  /** A split-off piece smaller than this (mm²) joins the neighbouring face it shares most border with. */
  faceSplitMinAreaMm2: z.number().min(0).default(120),
  /** ...and so does one with less border than this (mm) against outer bone surface, where its fracture angle is read (3 samples at anglePlaneRadiusMm spacing and some). */
  faceSplitMinOuterEdgeMm: z.number().min(0).default(12),
  /**
   * Break faces are also cut at corners of their rim against the outer surface (face-corner-split.ts):
   * where the rim's direction over faceCornerWindowMm before and after a point differs by more
   * than this (180: never), the face is cut from there to its other rim by the shortest path
   * across it. Off by default: at 35 degrees face purity rose 1.6-8.7 points on ten dev seeds
   * but the angle class fell (pooled 93.2 -> 92.0 %) and pairwise recall only held at a fixed
   * spacing (DEVELOPERS.md, face split).
   */
  faceCornerAngleDeg: z.number().positive().max(180).default(180),
  /**
   * The same corner cuts made for the matcher only: pieces matched besides the whole face
   * (prepared-fragment.ts; 180: none). Dev seeds 11 + 13: pairwise top 3 75 -> 77 of 114 for
   * 1.5x the face pairs.
   */
  facePieceCornerAngleDeg: z.number().positive().max(180).default(35),
  /**
   * Pieces for the matcher also where the face split (face-split.ts) parts breaks that meet at a
   * crease, kept down to this area (mm²) and with no minimum rim against the outer surface: a small
   * break (a strip across the wall, a short step) that faceSplitMinAreaMm2 and
   * faceSplitMinOuterEdgeMm fold into a neighbouring break's face, since its fracture angle could
   * not be read, can still meet its partner. The faces themselves (their figures and angle class)
   * do not change. At or above faceSplitMinAreaMm2 with faceSplitMinOuterEdgeMm 0: no such pieces.
   */
  facePieceSplitMinAreaMm2: z.number().min(0).default(20),
  /** Rim length (mm) either side of a point over which its turn is measured. */
  faceCornerWindowMm: z.number().positive().default(4),
  /** A corner cut is kept only when the two pieces' mean normals differ by at least this (degrees). */
  faceCornerMinNormalDeg: z.number().min(0).max(180).default(40),
  /** Each piece of a corner cut keeps at least this area (mm²; 120 like faceSplitMinAreaMm2 left most mixed faces whole)... */
  faceCornerMinAreaMm2: z.number().min(0).default(60),
  /** ...and this much rim (mm) against the outer surface (where its fracture angle is read; 12 or 24 read angle classes no better). */
  faceCornerMinOuterEdgeMm: z.number().min(0).default(18),
  /** At most this many corner cuts per face. */
  faceCornerMaxCuts: z.number().int().min(0).default(3),
  /** Original surface whose rays run this many times deeper than the typical wall: articular end. */
  articularDepthRatio: z.number().positive().default(3),
  /**
   * A face whose median fracture angle (folded to 0-90) is within this many degrees of 90 is
   * "right" (Villa & Mahieu 1991); the samples within it make the face's right-angle share.
   * Plane fits on a rough, stepped break scatter by several degrees, hence not tighter.
   */
  rightAngleToleranceDeg: z.number().positive().max(45).default(12),
  /** A face whose median is oblique is "oblique" when at most this share of its samples is right-angled, else "mixed". */
  obliqueShareMax: z.number().min(0).max(1).default(0.45),
  /** Radius of the plane fits either side of a break edge (also the spacing of the samples). */
  anglePlaneRadiusMm: z.number().positive().default(3.5),
  /** A face needs this many angle samples for a class (fewer: indeterminate)... */
  angleMinSamples: z.number().int().min(1).default(3),
  /**
   * ...and a face with fewer at anglePlaneRadiusMm spacing (a rim against the outer surface under
   * about 3 x 3.5 mm) is sampled again at half, a quarter... of it, down to this spacing (mm;
   * above anglePlaneRadiusMm: never). The samples then share triangles, but a short rim is read.
   * Only faces that had too few samples change: dev seeds 11-16, 14 at 1.0 mm, 21, 101-103 850 ->
   * 856 of 913 faces of the right class, check seeds 120-129 926 -> 930 of 992, none lost.
   */
  angleMinSpacingMm: z.number().positive().default(0.8),
  /**
   * The break face's normal at an angle sample is the mean of its triangles within this distance
   * (mm; at most anglePlaneRadiusMm, which bounds both sides) of the edge point: a front that
   * turns through the wall (bevelled at the rim, squarer deeper in) is read nearer the rim
   * (closed form in fracture-angle.test.ts: 55 degrees at the rim, read 80 with 3.5 mm, 75 with
   * 2.5). Dev seeds 11-16, 14 at 1.0 mm, 21, 101-103: 856 -> 864 of 913 faces of the right class,
   * check seeds 120-129 930 -> 943 of 992 (right-angled faces 296 -> 295 of 332 on both); 2 mm
   * 1807 of 1905 but right-angled 290, 3 mm 1801 (297).
   */
  angleFaceRadiusMm: z.number().positive().default(2.5),
  /** Triangles closer than this to the edge are left out of the plane fits (worn, rounded crease). */
  anglePlaneSkipMm: z.number().min(0).default(1),
  /**
   * The bone surface's normal at a break edge is extrapolated to the edge from a linear fit of
   * its normals (fracture-faces.ts); triangles whose normal is further than this from the first
   * fit (break face or chips left on the surface side by the segmentation) are left out of the
   * second. Wide enough for scanner noise on a 1-1.5 mm mesh.
   */
  angleFitOutlierDeg: z.number().positive().max(90).default(15),
  /**
   * Shaft check on that fit (fracture-faces.ts): on a fragment whose shaft axis fit holds
   * (support at least angleShaftSupportMin), at an edge against outer cortical surface that lies
   * on the fitted shaft (distance from the axis within angleShaftRadiusTolerance of the radius),
   * a fitted normal further than angleFitShaftMaxDeg from the shaft's radial direction there is
   * a failed fit (a chipped or rounded rim, break face left on the surface side: on a coarse
   * scan the fit rests on 10-20 triangles) and the radial direction is used instead. Cortical
   * surface along a shaft leans far less than this from radial; fitted on dev seeds 12, 14-16
   * and the committed sample (segmentation benchmark).
   */
  angleShaftSupportMin: z.number().min(0).max(1).default(0.75),
  angleShaftRadiusTolerance: z.number().min(0).default(0.25),
  angleFitShaftMaxDeg: z.number().positive().max(180).default(40),
  /**
   * At an edge against outer cortical surface that runs across the shaft (|edge direction .
   * shaft axis| at most this: within 30 degrees of square to the axis), on a fragment and at a
   * point where the shaft check above holds, the bone surface's normal at the edge is the mean
   * normal of the fit's triangles turned by the shaft's radial turn from their centroid to the
   * edge point, not the fit extrapolated to the edge: the wall hardly curves across such an
   * edge, and the extrapolation multiplies the scatter of a jagged rim's 10-20 triangles
   * (fracture-faces.ts). 0 switches it off. Dev seeds 11-16, 14 at 1.0 mm, 21 (fracture-angle benchmark).
   */
  angleMeanEdgeAxisMax: z.number().min(0).max(1).default(0.5),
  /** Mean |outline tangent . shaft axis| below this: a transverse outline. */
  outlineTransverseMax: z.number().min(0).max(1).default(0.3),
  /** Mean |outline tangent . shaft axis| above this: a curved / V-shaped outline. */
  outlineCurvedMin: z.number().min(0).max(1).default(0.5),
});

export type AnalysisSettings = z.output<typeof analysisSettingsSchema>;

export function analysisSettings(overrides: Partial<AnalysisSettings> = {}): AnalysisSettings {
  return analysisSettingsSchema.parse(overrides);
}
