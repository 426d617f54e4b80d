import type { TriangleMesh } from './mesh';
import type { SurfaceSamples } from './resample';
import type { AnalysisSettings } from './settings';
import { offsetFromAxis, type ShaftAxis } from './shaft-axis';
import { SURFACE_CLASSES, type SurfaceClass } from './surface-classes';
import { hypot } from './hypot';

/** Villa & Mahieu 1991 fracture angle category of a face. */
export type AngleClass = 'oblique' | 'right' | 'mixed' | 'indeterminate';
/** Villa & Mahieu 1991 fracture outline category: curved (incl. V-shaped), transverse, intermediate. */
export type OutlineClass = 'curved' | 'transverse' | 'intermediate' | 'indeterminate';
export type BreakAge = 'fresh' | 'dry' | 'indeterminate';

export interface FractureFace {
  id: number;
  /** Triangles of the analysed (welded) mesh that form the face. */
  triangleIds: Uint32Array;
  /** Pieces of the face cut at corners of its outer rim (face-corner-split.ts, facePieceCornerAngleDeg), for the matcher; absent when not cut. */
  pieces?: Uint32Array[];
  /** Resampled points on the face (fixed spacing) and their normals, xyz each. */
  points: Float32Array;
  normals: Float32Array;
  /** Closed outline loops, xyz per point, in the face's winding order. */
  outlines: Float32Array[];
  /** For each outline point i, the class code of the surface across the edge from point i to i+1 (255 = open boundary). */
  outlineNeighbours: Uint8Array[];
  area: number;
  /** Width of the band, from area and outline length treated as a rectangle. */
  meanWidth: number;
  outlineLength: number;
  /** Face roughness divided by the fragment's median roughness. */
  roughnessRatio: number;
  /** Interior angles (degrees, 0-180) between the face and the bone surface, sampled along the outline. */
  anglesDeg: Float32Array;
  /** Mean of the samples folded to 0-90 degrees (90 = right angle). */
  meanAngleDeg: number;
  /** Median of the folded samples: what the angle class is decided on. */
  medianAngleDeg: number;
  /** Share of the samples within rightAngleToleranceDeg of 90. */
  rightShare: number;
  angleClass: AngleClass;
  /** Length-weighted mean |outline chord . shaft axis| along the outer cortical edge (chords ~anglePlaneRadiusMm). */
  outlineAxisAlignment: number;
  outlineClass: OutlineClass;
  breakAge: { suggestion: BreakAge; evidence: string[] };
}

interface FaceContext {
  mesh: TriangleMesh;
  neighbours: Int32Array;
  triNormals: Float32Array;
  areas: Float64Array;
  centroids: Float32Array;
  triClass: Uint8Array;
  triRoughness: Float32Array;
  medianRoughness: number;
  axis: ShaftAxis;
  samples: SurfaceSamples;
  settings: AnalysisSettings;
  /** Face group per triangle (face-split.ts): fracture triangles of different groups are different faces. */
  faceGroup?: Int32Array;
  /** Studies only: called with each angle sample's parts (tests/bench/fracture-angle-study.ts). */
  angleTrace?: (sample: AngleSampleTrace) => void;
}

/** One angle sample's parts, for studies: the edge point, the two normals it was read from, the angle. */
export interface AngleSampleTrace {
  face: number;
  point: Vec3;
  /** The break face's normal used (outward). */
  faceNormal: Vec3;
  /** The bone surface's fitted normal at the edge, and the one used after the shaft check. */
  surfaceFit: Vec3;
  surfaceUsed: Vec3;
  /** The mean normal of the triangles the fit kept, and that mean carried to the edge by the shaft's radial turn (undefined off the shaft). */
  surfaceMean: Vec3;
  surfaceTurned?: Vec3;
  angleDeg: number;
}

const FRACTURE = 0;
const OUTER = SURFACE_CLASSES.indexOf('outer-cortical');
const ARTICULAR = SURFACE_CLASSES.indexOf('articular');

/** Fracture faces are the connected sets of fracture triangles of one face group (face-split.ts); measure each one. */
export function fractureFaces(ctx: FaceContext): FractureFace[] {
  const nt = ctx.areas.length;
  const face = new Int32Array(nt).fill(-1);
  const lists: number[][] = [];
  for (let s = 0; s < nt; s++) {
    if (ctx.triClass[s] !== FRACTURE || face[s] >= 0) continue;
    const id = lists.length;
    const list = [s];
    face[s] = id;
    for (let k = 0; k < list.length; k++) {
      const f = list[k];
      for (let j = 0; j < 3; j++) {
        const g = ctx.neighbours[3 * f + j];
        if (g >= 0 && face[g] < 0 && ctx.triClass[g] === FRACTURE && (!ctx.faceGroup || ctx.faceGroup[g] === ctx.faceGroup[f])) { face[g] = id; list.push(g); }
      }
    }
    lists.push(list);
  }
  const sampleFace = new Int32Array(ctx.samples.triangle.length);
  for (let i = 0; i < sampleFace.length; i++) sampleFace[i] = face[ctx.samples.triangle[i]];
  return lists.map((list, id) => describeFace(ctx, id, Uint32Array.from(list), face, sampleFace));
}

function describeFace(ctx: FaceContext, id: number, tris: Uint32Array, face: Int32Array, sampleFace: Int32Array): FractureFace {
  const { mesh, neighbours, settings } = ctx;
  const t = mesh.triangles, p = mesh.positions;
  let area = 0, rough = 0;
  for (const f of tris) { area += ctx.areas[f]; rough += ctx.areas[f] * ctx.triRoughness[f]; }
  // Outline: half-edges of face triangles whose neighbour is not in this face.
  const nextOf = new Map<number, number[]>(); // start vertex -> half-edges
  for (const f of tris) {
    for (let j = 0; j < 3; j++) {
      const g = neighbours[3 * f + j];
      if (g >= 0 && face[g] === id) continue;
      const a = t[3 * f + j];
      const arr = nextOf.get(a);
      if (arr) arr.push(3 * f + j); else nextOf.set(a, [3 * f + j]);
    }
  }
  const outlines: Float32Array[] = [];
  const outlineNeighbours: Uint8Array[] = [];
  let outlineLength = 0;
  let alignSum = 0, alignLen = 0;
  const [ax, ay, az] = ctx.axis.direction;
  const step = settings.anglePlaneRadiusMm;
  // The edges where the angle may be read, in outline order: loop, face triangle, triangle across, midpoint xyz.
  const rim: number[] = [];
  let loop = 0;
  for (const [, startList] of nextOf) {
    while (startList.length) {
      const pts: number[] = [];
      const across: number[] = [];
      let h = startList.pop()!;
      let chordStart = -1;
      loop++;
      for (let guard = 0; guard < 4 * tris.length + 8; guard++) {
        const f = Math.floor(h / 3), j = h % 3;
        const a = t[3 * f + j], b = t[3 * f + ((j + 1) % 3)];
        pts.push(p[3 * a], p[3 * a + 1], p[3 * a + 2]);
        const g = neighbours[h];
        const cls = g >= 0 ? ctx.triClass[g] : 255;
        across.push(cls);
        const ex = p[3 * b] - p[3 * a], ey = p[3 * b + 1] - p[3 * a + 1], ez = p[3 * b + 2] - p[3 * a + 2];
        const len = hypot(ex, ey, ez);
        outlineLength += len;
        // Outline direction along the outer edge, on chords about one plane radius long so
        // that the small-scale jaggedness of a rough break does not count as shape.
        if (cls === OUTER) {
          if (chordStart < 0) chordStart = a;
          const cx = p[3 * b] - p[3 * chordStart], cy = p[3 * b + 1] - p[3 * chordStart + 1], cz = p[3 * b + 2] - p[3 * chordStart + 2];
          const cl = hypot(cx, cy, cz);
          if (cl >= step) {
            alignSum += Math.abs(cx * ax + cy * ay + cz * az);
            alignLen += cl;
            chordStart = b;
          }
        } else {
          chordStart = -1;
        }
        // The angle is read against the bone's outer surface (periosteal or articular), or
        // against any original surface on a fragment that has no outer surface left.
        if (g >= 0 && cls !== FRACTURE && (cls === OUTER || cls === ARTICULAR || !hasOuter(ctx))) {
          rim.push(loop, f, g, (p[3 * a] + p[3 * b]) / 2, (p[3 * a + 1] + p[3 * b + 1]) / 2, (p[3 * a + 2] + p[3 * b + 2]) / 2);
        }
        const cont = nextOf.get(b);
        if (!cont || cont.length === 0) break;
        h = cont.pop()!;
      }
      outlines.push(Float32Array.from(pts));
      outlineNeighbours.push(Uint8Array.from(across));
    }
  }
  const angleSamples = rimAngles(ctx, id, rim, step);
  // Too few samples for a class at that spacing (a short rim against the outer surface): the
  // rim is sampled again more densely, down to angleMinSpacingMm, rather than left unread.
  for (let spacing = step / 2; angleSamples.length < settings.angleMinSamples && spacing >= settings.angleMinSpacingMm; spacing /= 2) {
    const denser = rimAngles(ctx, id, rim, spacing);
    if (denser.length > angleSamples.length) angleSamples.splice(0, angleSamples.length, ...denser);
  }
  // Width of a band with this area and perimeter (rectangle: P = 2L + 2w, A = L w).
  const disc = outlineLength * outlineLength - 16 * area;
  const meanWidth = disc > 0 ? (outlineLength - Math.sqrt(disc)) / 4 : outlineLength / 4;
  const folded = angleSamples.map((a) => Math.min(a, 180 - a));
  const meanAngleDeg = folded.length ? folded.reduce((s, x) => s + x, 0) / folded.length : NaN;
  const right = folded.filter((a) => 90 - a <= settings.rightAngleToleranceDeg).length;
  const rightShare = folded.length ? right / folded.length : NaN;
  // Villa & Mahieu's categories are judged on the face as a whole: the median sample decides
  // (robust to the few samples at corners and chips); a face whose median is just oblique
  // but with many right-angled samples is mixed.
  const medianAngleDeg = folded.length ? [...folded].sort((x, y) => x - y)[Math.floor(folded.length / 2)] : NaN;
  let angleClass: AngleClass = 'indeterminate';
  if (folded.length >= settings.angleMinSamples) {
    if (90 - medianAngleDeg <= settings.rightAngleToleranceDeg) angleClass = 'right';
    else if (rightShare <= settings.obliqueShareMax) angleClass = 'oblique';
    else angleClass = 'mixed';
  }
  const outlineAxisAlignment = alignLen > 0 ? alignSum / alignLen : NaN;
  let outlineClass: OutlineClass = 'indeterminate';
  if (alignLen > 0 && ctx.axis.support >= 0.5) {
    outlineClass = outlineAxisAlignment <= settings.outlineTransverseMax ? 'transverse'
      : outlineAxisAlignment >= settings.outlineCurvedMin ? 'curved' : 'intermediate';
  }
  const roughnessRatio = area > 0 ? rough / area / ctx.medianRoughness : NaN;
  // Sampled points of this face.
  let n = 0;
  for (let i = 0; i < sampleFace.length; i++) if (sampleFace[i] === id) n++;
  const points = new Float32Array(3 * n), normals = new Float32Array(3 * n);
  let k = 0;
  for (let i = 0; i < sampleFace.length; i++) {
    if (sampleFace[i] !== id) continue;
    points.set(ctx.samples.points.subarray(3 * i, 3 * i + 3), 3 * k);
    normals.set(ctx.samples.normals.subarray(3 * i, 3 * i + 3), 3 * k);
    k++;
  }
  return {
    id,
    triangleIds: tris,
    points,
    normals,
    outlines,
    outlineNeighbours,
    area,
    meanWidth,
    outlineLength,
    roughnessRatio,
    anglesDeg: Float32Array.from(angleSamples),
    meanAngleDeg,
    medianAngleDeg,
    rightShare,
    angleClass,
    outlineAxisAlignment,
    outlineClass,
    breakAge: suggestBreakAge(angleClass, outlineClass, meanAngleDeg),
  };
}

/**
 * Angles read at rim edges (rim: loop, face triangle, triangle across, midpoint xyz per edge,
 * in outline order) at least `spacing` apart in space from the last sample of the same loop
 * (in space, not along the boundary path, which zigzags over the triangles by more or less
 * depending on how the outline crosses them).
 */
function rimAngles(ctx: FaceContext, id: number, rim: number[], spacing: number): number[] {
  const out: number[] = [];
  let lastLoop = -1, lastX = NaN, lastY = NaN, lastZ = NaN;
  for (let i = 0; i < rim.length; i += 6) {
    const [loop, f, g, mx, my, mz] = [rim[i], rim[i + 1], rim[i + 2], rim[i + 3], rim[i + 4], rim[i + 5]];
    if (loop !== lastLoop) { lastLoop = loop; lastX = NaN; lastY = NaN; lastZ = NaN; }
    if (hypot(mx - lastX, my - lastY, mz - lastZ) < spacing) continue;
    const angle = edgeAngle(ctx, id, f, g, mx, my, mz);
    if (angle !== undefined) { out.push(angle); lastX = mx; lastY = my; lastZ = mz; }
  }
  return out;
}

const outerPresent = new WeakMap<Uint8Array, boolean>();
/** Whether the fragment has any outer surface (periosteal or articular) left. */
function hasOuter(ctx: FaceContext): boolean {
  let v = outerPresent.get(ctx.triClass);
  if (v === undefined) {
    v = ctx.triClass.includes(OUTER) || ctx.triClass.includes(ARTICULAR);
    outerPresent.set(ctx.triClass, v);
  }
  return v;
}

const visited = new WeakMap<Int32Array, { mark: Int32Array; stamp: number }>();
/** Per mesh (keyed by its neighbour table), a mark per triangle for edgeAngle's searches: a triangle is seen when its mark is the search's stamp. */
function visitMarks(ctx: FaceContext): { mark: Int32Array; stamp: number } {
  let v = visited.get(ctx.neighbours);
  if (!v) {
    v = { mark: new Int32Array(ctx.neighbours.length / 3), stamp: 0 };
    visited.set(ctx.neighbours, v);
  }
  return v;
}

/**
 * Interior angle (degrees) at a break edge between the fracture face and the bone surface
 * across it, from the normals of the two sides at the edge point m: 180 - the angle between
 * the two outward normals (their cross product is the edge direction, so this is the dihedral
 * angle in the plane across the edge). 90 is a right-angled break; below or above is oblique.
 * Each side uses its triangles within anglePlaneRadiusMm of m, leaving out those closer than
 * anglePlaneSkipMm to the edge line (the worn crease and the rim along it).
 * - Fracture side: the area-weighted mean normal (a plane fit) of its triangles within
 *   angleFaceRadiusMm (2.5 mm) of m: the face is a narrow, rough band, nominally flat across it
 *   at this scale, but a front that turns through the wall (a splinter face whose slope about
 *   the axis per mm of radius is constant runs nearer radial deeper in) is read nearer the rim.
 * - Bone surface side: the normal field fitted as linear in position over the side's tangent
 *   plane and evaluated at m (sideNormalAtEdge). A mean normal would be the normal some
 *   2 mm away from the edge: on a shaft of radius R that leans by about 2/R radians (7 to 8
 *   degrees on a 12 mm shaft wherever the edge runs along the shaft), which made bevelled
 *   splinter edges read nearer to 90 than they are. Where the edge runs across the shaft
 *   (|edge direction . axis| at most angleMeanEdgeAxisMax) and the shaft model holds there,
 *   the mean normal of the triangles the fit kept, turned by the shaft's radial turn from
 *   their centroid to m (radialTurn), is used instead: across the shaft the wall hardly
 *   curves in the direction across the edge, so the fit's extrapolation adds nothing but the
 *   scatter of 10-20 triangles at a jagged rim times its lever (1-3.5 mm out to 0), which made
 *   right-angled transverse faces read oblique.
 */
function edgeAngle(ctx: FaceContext, faceId: number, f: number, g: number, mx: number, my: number, mz: number): number | undefined {
  const r2 = ctx.settings.anglePlaneRadiusMm ** 2;
  const otherClass = ctx.triClass[g];
  const marks = visitMarks(ctx);
  const seen = ++marks.stamp;
  marks.mark[f] = seen;
  marks.mark[g] = seen;
  const queue = [f, g];
  const fractureSide: number[] = [], surfaceSide: number[] = [];
  for (let k = 0; k < queue.length && queue.length < 4000; k++) {
    const h = queue[k];
    const cls = ctx.triClass[h];
    // The fracture side is this face's own break (face-split.ts): not a neighbouring break across a crease.
    if (cls === FRACTURE) { if (!ctx.faceGroup || ctx.faceGroup[h] === ctx.faceGroup[f]) fractureSide.push(h); }
    else if (cls === otherClass) surfaceSide.push(h);
    for (let j = 0; j < 3; j++) {
      const e = ctx.neighbours[3 * h + j];
      if (e < 0 || marks.mark[e] === seen) continue;
      marks.mark[e] = seen;
      const dx = ctx.centroids[3 * e] - mx, dy = ctx.centroids[3 * e + 1] - my, dz = ctx.centroids[3 * e + 2] - mz;
      if (dx * dx + dy * dy + dz * dz > r2) continue;
      queue.push(e);
    }
  }
  // Leave out the worn crease itself: triangles within anglePlaneSkipMm of the edge line
  // (through m, along the cross product of the two sides' mean normals: the edge runs in both
  // surfaces). Measured from the line, not from m, so that the rim along the edge is left out
  // too: the fit at the edge would otherwise lean on the rounded or chipped rim.
  const f0 = meanNormal(ctx, fractureSide), s0 = meanNormal(ctx, surfaceSide);
  if (!f0 || !s0) return undefined;
  let tx = f0[1] * s0[2] - f0[2] * s0[1], ty = f0[2] * s0[0] - f0[0] * s0[2], tz = f0[0] * s0[1] - f0[1] * s0[0];
  const tl = hypot(tx, ty, tz);
  if (tl > 0.05) { tx /= tl; ty /= tl; tz /= tl; } else { tx = 0; ty = 0; tz = 0; }
  const skip2 = ctx.settings.anglePlaneSkipMm ** 2;
  const away = (h: number): boolean => {
    const dx = ctx.centroids[3 * h] - mx, dy = ctx.centroids[3 * h + 1] - my, dz = ctx.centroids[3 * h + 2] - mz;
    const along = dx * tx + dy * ty + dz * tz;
    return dx * dx + dy * dy + dz * dz - along * along >= skip2;
  };
  // The break face's side only out to angleFaceRadiusMm: a front that turns through the wall is read near the rim.
  const face2 = ctx.settings.angleFaceRadiusMm ** 2;
  const near = (h: number): boolean => (ctx.centroids[3 * h] - mx) ** 2 + (ctx.centroids[3 * h + 1] - my) ** 2 + (ctx.centroids[3 * h + 2] - mz) ** 2 <= face2;
  const nf = meanNormal(ctx, fractureSide.filter((h) => away(h) && near(h)));
  const side = sideNormalAtEdge(ctx, surfaceSide.filter(away), mx, my, mz, [tx, ty, tz]);
  if (!nf || !side) return undefined;
  let ns = side.fit;
  // Across the shaft, the mean normal carried to the edge by the shaft model (see above).
  const [ax, ay, az] = ctx.axis.direction;
  if (otherClass === OUTER && tl > 0.05 && ctx.settings.angleMeanEdgeAxisMax > 0 && Math.abs(tx * ax + ty * ay + tz * az) <= ctx.settings.angleMeanEdgeAxisMax) {
    ns = radialTurn(ctx, side.mean, side.centroid, mx, my, mz) ?? ns;
  }
  if (otherClass === OUTER) ns = shaftCheckedNormal(ctx, ns, mx, my, mz);
  const dot = nf[0] * ns[0] + nf[1] * ns[1] + nf[2] * ns[2];
  const angle = 180 - (Math.acos(Math.max(-1, Math.min(1, dot))) * 180) / Math.PI;
  if (ctx.angleTrace) {
    const surfaceTurned = otherClass === OUTER ? radialTurn(ctx, side.mean, side.centroid, mx, my, mz) : undefined;
    ctx.angleTrace({ face: faceId, point: [mx, my, mz], faceNormal: nf, surfaceFit: side.fit, surfaceUsed: ns, surfaceMean: side.mean, surfaceTurned, angleDeg: angle });
  }
  return angle;
}

type Vec3 = [number, number, number];

/**
 * The fitted bone-surface normal n at the edge point m, or the shaft's radial direction there
 * when the fit has failed: on a fragment whose axis fit holds (support >= angleShaftSupportMin),
 * at a point on the fitted shaft (|distance from the axis / radius - 1| <=
 * angleShaftRadiusTolerance), a fit further than angleFitShaftMaxDeg from radial is not the
 * cortical surface (settings.ts).
 */
function shaftCheckedNormal(ctx: FaceContext, n: Vec3, mx: number, my: number, mz: number): Vec3 {
  const { axis, settings } = ctx;
  if (!(axis.support >= settings.angleShaftSupportMin) || !(axis.radius > 0)) return n;
  const [ax, ay, az] = axis.direction;
  const dx = mx - axis.point[0], dy = my - axis.point[1], dz = mz - axis.point[2];
  const along = dx * ax + dy * ay + dz * az;
  let rx = dx - along * ax, ry = dy - along * ay, rz = dz - along * az;
  // Under an elliptic section the shaft's surface normal is the ellipse's, not the radial direction.
  if (axis.section) [rx, ry, rz] = offsetFromAxis(axis, mx, my, mz, [0, 0, 0]);
  const rl = hypot(rx, ry, rz);
  if (!(rl > 0) || Math.abs(rl / axis.radius - 1) > settings.angleShaftRadiusTolerance) return n;
  const cos = (n[0] * rx + n[1] * ry + n[2] * rz) / rl;
  if (cos >= Math.cos((settings.angleFitShaftMaxDeg * Math.PI) / 180)) return n;
  return [rx / rl, ry / rl, rz / rl];
}

/** Area-weighted mean of the triangles' unit normals, normalised (undefined when empty). */
function meanNormal(ctx: FaceContext, tris: number[]): Vec3 | undefined {
  let sx = 0, sy = 0, sz = 0;
  for (const h of tris) {
    const w = ctx.areas[h];
    sx += w * ctx.triNormals[3 * h]; sy += w * ctx.triNormals[3 * h + 1]; sz += w * ctx.triNormals[3 * h + 2];
  }
  const l = hypot(sx, sy, sz);
  return l > 0 ? [sx / l, sy / l, sz / l] : undefined;
}

interface SideNormal {
  /** The fitted normal at the edge point. */
  fit: Vec3;
  /** Area-weighted mean normal and centroid of the triangles the fit kept. */
  mean: Vec3;
  centroid: Vec3;
}

/** The bone surface's fitted normal at the edge point m (fittedSideNormal), with the mean normal and centroid of the triangles the fit kept. */
function sideNormalAtEdge(ctx: FaceContext, tris: number[], mx: number, my: number, mz: number, t: Vec3): SideNormal | undefined {
  const n = meanNormal(ctx, tris);
  if (!n) return undefined;
  const { fit, keep } = fittedSideNormal(ctx, tris, n, mx, my, mz, t);
  const kept = keep ? tris.filter((_, i) => keep[i]) : tris;
  const mean = (kept.length ? meanNormal(ctx, kept) : undefined) ?? n;
  const centroid = areaCentroid(ctx, kept.length ? kept : tris);
  return { fit, mean, centroid };
}

function areaCentroid(ctx: FaceContext, tris: number[]): Vec3 {
  let sx = 0, sy = 0, sz = 0, sw = 0;
  for (const h of tris) {
    const w = ctx.areas[h];
    sx += w * ctx.centroids[3 * h]; sy += w * ctx.centroids[3 * h + 1]; sz += w * ctx.centroids[3 * h + 2]; sw += w;
  }
  return sw > 0 ? [sx / sw, sy / sw, sz / sw] : [NaN, NaN, NaN];
}

/**
 * The mean normal n of a patch of shaft surface centred at c, carried to the edge point m by the
 * turn of the shaft's radial direction from c to m (a cylinder's normal is radial): undefined
 * where the shaft model does not hold (axis support under angleShaftSupportMin, or c or m off
 * the fitted shaft by more than angleShaftRadiusTolerance).
 */
function radialTurn(ctx: FaceContext, n: Vec3, c: Vec3, mx: number, my: number, mz: number): Vec3 | undefined {
  const { axis, settings } = ctx;
  if (!(axis.support >= settings.angleShaftSupportMin) || !(axis.radius > 0)) return undefined;
  const a = offsetFromAxis(axis, c[0], c[1], c[2], [0, 0, 0]);
  const b = offsetFromAxis(axis, mx, my, mz, [0, 0, 0]);
  const al = hypot(a[0], a[1], a[2]), bl = hypot(b[0], b[1], b[2]);
  if (!(al > 0 && bl > 0)) return undefined;
  if (Math.abs(al / axis.radius - 1) > settings.angleShaftRadiusTolerance || Math.abs(bl / axis.radius - 1) > settings.angleShaftRadiusTolerance) return undefined;
  const u: Vec3 = [a[0] / al, a[1] / al, a[2] / al], v: Vec3 = [b[0] / bl, b[1] / bl, b[2] / bl];
  return rotateLike(n, u, v);
}

/** n turned by the smallest rotation that takes the unit vector u to the unit vector v (Rodrigues). */
function rotateLike(n: Vec3, u: Vec3, v: Vec3): Vec3 {
  const kx = u[1] * v[2] - u[2] * v[1], ky = u[2] * v[0] - u[0] * v[2], kz = u[0] * v[1] - u[1] * v[0];
  const s = hypot(kx, ky, kz), c = u[0] * v[0] + u[1] * v[1] + u[2] * v[2];
  if (!(s > 1e-9)) return n;
  const ex = kx / s, ey = ky / s, ez = kz / s;
  const dot = ex * n[0] + ey * n[1] + ez * n[2];
  const cx = ey * n[2] - ez * n[1], cy = ez * n[0] - ex * n[2], cz = ex * n[1] - ey * n[0];
  return [n[0] * c + cx * s + ex * dot * (1 - c), n[1] * c + cy * s + ey * dot * (1 - c), n[2] * c + cz * s + ez * dot * (1 - c)];
}

/**
 * Unit normal of a smooth surface at the point m (an edge point, not inside the patch):
 * weighted least squares fit of each normal component as a + b s1 + c s2 over the triangles'
 * centroids (s1, s2: offsets from m in the patch's tangent plane, weights: areas), evaluated
 * at s = 0. This is the first-order Taylor expansion of the normal field, i.e. the normal at m
 * of a quadric fitted to the patch, so a constant curvature between m and the patch does not
 * tilt it (a sphere or cylinder gives its exact normal at m). The fit is made twice: first on
 * the far part of the patch, then on every triangle within angleFitOutlierDeg of that fit, so
 * that pieces of the break face left on this side by the segmentation, and chips, which a fit
 * that extrapolates would follow, are left out. Falls back to the mean normal when the patch is
 * too small or degenerate (all centroids on a line). t: the edge direction (unit, or zero).
 */
function fittedSideNormal(ctx: FaceContext, tris: number[], n: Vec3, mx: number, my: number, mz: number, [tx, ty, tz]: Vec3): { fit: Vec3; keep?: Uint8Array } {
  if (tris.length < 6) return { fit: n };
  const [nx, ny, nz] = n;
  // Tangent basis (e1, e2) of the patch.
  let e1x: number, e1y: number, e1z: number;
  if (Math.abs(nx) < 0.9) { e1x = 0; e1y = -nz; e1z = ny; } else { e1x = -nz; e1y = 0; e1z = nx; }
  const e1l = hypot(e1x, e1y, e1z);
  e1x /= e1l; e1y /= e1l; e1z /= e1l;
  const e2x = ny * e1z - nz * e1y, e2y = nz * e1x - nx * e1z, e2z = nx * e1y - ny * e1x;
  const s1 = new Float64Array(tris.length), s2 = new Float64Array(tris.length);
  tris.forEach((h, i) => {
    const dx = ctx.centroids[3 * h] - mx, dy = ctx.centroids[3 * h + 1] - my, dz = ctx.centroids[3 * h + 2] - mz;
    s1[i] = dx * e1x + dy * e1y + dz * e1z;
    s2[i] = dx * e2x + dy * e2y + dz * e2z;
  });
  const cosMax = Math.cos((ctx.settings.angleFitOutlierDeg * Math.PI) / 180);
  // First fit on the far part of the patch (at least twice anglePlaneSkipMm from the edge
  // line), where a misplaced region border leaves least of the break face; then all triangles
  // within angleFitOutlierDeg of that fit.
  const far2 = (2 * ctx.settings.anglePlaneSkipMm) ** 2;
  const far = Uint8Array.from(tris, (h, i) => {
    const d2 = s1[i] * s1[i] + s2[i] * s2[i];
    const along = (ctx.centroids[3 * h] - mx) * tx + (ctx.centroids[3 * h + 1] - my) * ty + (ctx.centroids[3 * h + 2] - mz) * tz;
    return d2 - along * along >= far2 ? 1 : 0;
  });
  let fit = fitLinearNormals(ctx, tris, s1, s2, far) ?? fitLinearNormals(ctx, tris, s1, s2, new Uint8Array(tris.length).fill(1));
  let kept: Uint8Array | undefined;
  if (fit) {
    const first = fit;
    const keep = Uint8Array.from(tris, (h, i) => {
      const px = first[0] + first[3] * s1[i] + first[6] * s2[i];
      const py = first[1] + first[4] * s1[i] + first[7] * s2[i];
      const pz = first[2] + first[5] * s1[i] + first[8] * s2[i];
      const l = hypot(px, py, pz);
      return l > 0 && (px * ctx.triNormals[3 * h] + py * ctx.triNormals[3 * h + 1] + pz * ctx.triNormals[3 * h + 2]) / l >= cosMax ? 1 : 0;
    });
    fit = fitLinearNormals(ctx, tris, s1, s2, keep) ?? first;
    kept = keep;
  }
  if (!fit) return { fit: n };
  const l = hypot(fit[0], fit[1], fit[2]);
  return { fit: l > 0 ? [fit[0] / l, fit[1] / l, fit[2] / l] : n, keep: kept };
}

/**
 * Weighted least squares normal_c = a_c + b_c s1 + c_c s2 over the kept triangles, for the three
 * components c at once: returns [a_x, a_y, a_z, b_x, b_y, b_z, c_x, c_y, c_z], or undefined
 * when the normal equations are singular (fewer than 6 triangles, or centroids on a line).
 */
function fitLinearNormals(ctx: FaceContext, tris: number[], s1: Float64Array, s2: Float64Array, keep: Uint8Array): number[] | undefined {
  const M = [0, 0, 0, 0, 0, 0, 0, 0, 0];
  const B = [0, 0, 0, 0, 0, 0, 0, 0, 0];
  const u = [1, 0, 0];
  let count = 0;
  for (let i = 0; i < tris.length; i++) {
    if (!keep[i]) continue;
    count++;
    const h = tris[i];
    const w = ctx.areas[h];
    u[1] = s1[i];
    u[2] = s2[i];
    for (let r = 0; r < 3; r++) {
      for (let c = 0; c < 3; c++) M[3 * r + c] += w * u[r] * u[c];
      for (let c = 0; c < 3; c++) B[3 * r + c] += w * u[r] * ctx.triNormals[3 * h + c];
    }
  }
  if (count < 6) return undefined;
  // Inverse of the symmetric M by cofactors.
  const i00 = M[4] * M[8] - M[5] * M[7], i01 = M[2] * M[7] - M[1] * M[8], i02 = M[1] * M[5] - M[2] * M[4];
  const i11 = M[0] * M[8] - M[2] * M[6], i12 = M[2] * M[3] - M[0] * M[5], i22 = M[0] * M[4] - M[1] * M[3];
  const det = M[0] * i00 + M[3] * i01 + M[6] * i02;
  if (!(Math.abs(det) > 1e-6 * Math.abs(M[0] * M[4] * M[8]))) return undefined;
  const inv = [i00, i01, i02, i01, i11, i12, i02, i12, i22];
  const out = new Array<number>(9).fill(0);
  for (let r = 0; r < 3; r++) for (let c = 0; c < 3; c++) out[3 * r + c] = (inv[3 * r] * B[c] + inv[3 * r + 1] * B[3 + c] + inv[3 * r + 2] * B[6 + c]) / det;
  return out;
}

/**
 * Villa & Mahieu 1991: breaks of fresh (green) bone run oblique to the cortical surface with
 * curved or V-shaped outlines; breaks of dry bone meet it at right angles with transverse
 * outlines. Each criterion votes; agreement decides, disagreement leaves it indeterminate.
 */
export function suggestBreakAge(angleClass: AngleClass, outlineClass: OutlineClass, meanAngleDeg: number): { suggestion: BreakAge; evidence: string[] } {
  const evidence: string[] = [];
  let vote = 0;
  const angleText = Number.isFinite(meanAngleDeg) ? ` (mean ${meanAngleDeg.toFixed(0)} degrees from the surface)` : '';
  if (angleClass === 'oblique') { vote += 1; evidence.push(`fracture angle oblique${angleText}: typical of fresh (green) bone`); }
  else if (angleClass === 'right') { vote -= 1; evidence.push(`fracture angle right${angleText}: typical of dry bone`); }
  else if (angleClass === 'mixed') evidence.push(`fracture angle mixed${angleText}: no indication`);
  else evidence.push('fracture angle could not be measured');
  if (outlineClass === 'curved') { vote += 1; evidence.push('outline curved or V-shaped: typical of fresh (green) bone'); }
  else if (outlineClass === 'transverse') { vote -= 1; evidence.push('outline transverse: typical of dry bone'); }
  else if (outlineClass === 'intermediate') evidence.push('outline intermediate: no indication');
  else evidence.push('outline shape could not be measured (no shaft axis or no outer edge)');
  const suggestion: BreakAge = vote >= 1 ? 'fresh' : vote <= -1 ? 'dry' : 'indeterminate';
  return { suggestion, evidence };
}

export type { SurfaceClass };
