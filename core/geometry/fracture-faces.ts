import type { TriangleMesh } from './mesh';
import type { SurfaceSamples } from './resample';
import type { AnalysisSettings } from './settings';
import type { ShaftAxis } from './shaft-axis';
import { SURFACE_CLASSES, type SurfaceClass } from './surface-classes';

/** Villa & Mahieu 1991 fracture angle category of a face. */
export type AngleClass = 'oblique' | 'right' | 'mixed' | 'indeterminate';
/** Villa & Mahieu 1991 fracture outline category: curved (incl. V-shaped), transverse, intermediate. */
export type OutlineClass = 'curved' | 'transverse' | 'intermediate' | 'indeterminate';
export type BreakAge = 'fresh' | 'dry' | 'indeterminate';

export interface FractureFace {
  id: number;
  /** Triangles of the analysed (welded) mesh that form the face. */
  triangleIds: Uint32Array;
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
}

const FRACTURE = 0;
const OUTER = SURFACE_CLASSES.indexOf('outer-cortical');

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
  const angleSamples: number[] = [];
  const step = settings.anglePlaneRadiusMm;
  for (const [, startList] of nextOf) {
    while (startList.length) {
      const pts: number[] = [];
      const across: number[] = [];
      let h = startList.pop()!;
      let sinceSample = step; // sample at the first edge
      let chordStart = -1;
      for (let guard = 0; guard < 4 * tris.length + 8; guard++) {
        const f = Math.floor(h / 3), j = h % 3;
        const a = t[3 * f + j], b = t[3 * f + ((j + 1) % 3)];
        pts.push(p[3 * a], p[3 * a + 1], p[3 * a + 2]);
        const g = neighbours[h];
        const cls = g >= 0 ? ctx.triClass[g] : 255;
        across.push(cls);
        const ex = p[3 * b] - p[3 * a], ey = p[3 * b + 1] - p[3 * a + 1], ez = p[3 * b + 2] - p[3 * a + 2];
        const len = Math.hypot(ex, ey, ez);
        outlineLength += len;
        // Outline direction along the outer edge, on chords about one plane radius long so
        // that the small-scale jaggedness of a rough break does not count as shape.
        if (cls === OUTER) {
          if (chordStart < 0) chordStart = a;
          const cx = p[3 * b] - p[3 * chordStart], cy = p[3 * b + 1] - p[3 * chordStart + 1], cz = p[3 * b + 2] - p[3 * chordStart + 2];
          const cl = Math.hypot(cx, cy, cz);
          if (cl >= step) {
            alignSum += Math.abs(cx * ax + cy * ay + cz * az);
            alignLen += cl;
            chordStart = b;
          }
        } else {
          chordStart = -1;
        }
        sinceSample += len;
        if (g >= 0 && cls !== FRACTURE && sinceSample >= step) {
          const angle = edgeAngle(ctx, f, g, id, (p[3 * a] + p[3 * b]) / 2, (p[3 * a + 1] + p[3 * b + 1]) / 2, (p[3 * a + 2] + p[3 * b + 2]) / 2);
          if (angle !== undefined && (cls === OUTER || !hasOuter(ctx))) { angleSamples.push(angle); sinceSample = 0; }
        }
        const cont = nextOf.get(b);
        if (!cont || cont.length === 0) break;
        h = cont.pop()!;
      }
      outlines.push(Float32Array.from(pts));
      outlineNeighbours.push(Uint8Array.from(across));
    }
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
  if (folded.length >= 3) {
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

const outerPresent = new WeakMap<Uint8Array, boolean>();
function hasOuter(ctx: FaceContext): boolean {
  let v = outerPresent.get(ctx.triClass);
  if (v === undefined) {
    v = ctx.triClass.includes(OUTER);
    outerPresent.set(ctx.triClass, v);
  }
  return v;
}

/**
 * Interior angle (degrees) at a break edge between the fracture face and the bone surface
 * across it: fit a plane to each side within anglePlaneRadiusMm of the edge midpoint (the
 * area-weighted mean normal of the side's triangles), then angle = 180 - angle between the
 * two outward normals. 90 is a right-angled break; below or above is oblique.
 */
function edgeAngle(ctx: FaceContext, f: number, g: number, faceId: number, mx: number, my: number, mz: number): number | undefined {
  const r2 = ctx.settings.anglePlaneRadiusMm ** 2;
  const skip2 = ctx.settings.anglePlaneSkipMm ** 2;
  const otherClass = ctx.triClass[g];
  const seen = new Set<number>([f, g]);
  const queue = [f, g];
  let fx = 0, fy = 0, fz = 0, ox = 0, oy = 0, oz = 0, fa = 0, oa = 0;
  for (let k = 0; k < queue.length && queue.length < 4000; k++) {
    const h = queue[k];
    const w = ctx.areas[h];
    const cls = ctx.triClass[h];
    const hx = ctx.centroids[3 * h] - mx, hy = ctx.centroids[3 * h + 1] - my, hz = ctx.centroids[3 * h + 2] - mz;
    // Leave out the worn crease itself: only triangles at least anglePlaneSkipMm from the edge.
    if (hx * hx + hy * hy + hz * hz < skip2) {
      // still walk through it
    } else if (cls === FRACTURE) {
      fx += w * ctx.triNormals[3 * h]; fy += w * ctx.triNormals[3 * h + 1]; fz += w * ctx.triNormals[3 * h + 2]; fa += w;
    } else if (cls === otherClass) {
      ox += w * ctx.triNormals[3 * h]; oy += w * ctx.triNormals[3 * h + 1]; oz += w * ctx.triNormals[3 * h + 2]; oa += w;
    }
    for (let j = 0; j < 3; j++) {
      const e = ctx.neighbours[3 * h + j];
      if (e < 0 || seen.has(e)) continue;
      seen.add(e);
      const dx = ctx.centroids[3 * e] - mx, dy = ctx.centroids[3 * e + 1] - my, dz = ctx.centroids[3 * e + 2] - mz;
      if (dx * dx + dy * dy + dz * dz > r2) continue;
      queue.push(e);
    }
  }
  void faceId;
  const fl = Math.hypot(fx, fy, fz), ol = Math.hypot(ox, oy, oz);
  if (fa === 0 || oa === 0 || fl === 0 || ol === 0) return undefined;
  const dot = (fx * ox + fy * oy + fz * oz) / (fl * ol);
  return 180 - (Math.acos(Math.max(-1, Math.min(1, dot))) * 180) / Math.PI;
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
