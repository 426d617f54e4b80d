import type { Manifold, ManifoldToplevel } from 'manifold-3d';
import type { BoneShape } from './bone-shape';
import { boneOuterMesh, medullaryCavityMesh } from './bone-mesh';
import { type BreakAge, type BreakPattern, type BreakPlan, type PlannedRingBreak, wrap } from './break-plan';
import { type AxisFrame, axisFrame, ringBreakBody, wedgeBody } from './fracture-bodies';
import { frameDirections, framePoint, outerNormal, outerRadiusOnRay, slopeForRimAngle } from './rim-angle';
import { solidFromMesh } from './manifold-kernel';

/** Per-triangle surface labels (truth.json legend). Fracture faces are FRACTURE_BASE + break id. */
export const LABEL_ORIGINAL = 0;
export const LABEL_MEDULLARY = 1;
export const LABEL_DAMAGE = 2;
export const FRACTURE_BASE = 10;

export interface BreakRecord {
  id: number;
  age: BreakAge;
  pattern: BreakPattern;
  /** Nominal angle of the face to the cortical surface implied by the bevel (degrees). */
  nominalBevelDeg: number;
}

export interface Piece {
  solid: Manifold;
  /** Which side of each break this piece lies on. */
  sides: Map<number, 'in' | 'out'>;
}

export interface ShatteredBone {
  pieces: Piece[];
  breaks: BreakRecord[];
  /** original id -> label */
  labelOf: Map<number, number>;
  /** Volume (mm³) of the unbroken bone. */
  boneVolume: number;
  /** Crumbs too small to keep (mm³ each). */
  crumbs: number[];
}

const MIN_PIECE_VOLUME = 40;

/**
 * Build the bone and break it as planned: ring breaks across the shaft first, then splinters
 * from hollow shaft segments, then a modern break. Every split uses one cut body, so both
 * sides of a break carry the same surface; labels follow each triangle's original mesh.
 */
export function shatterBone(wasm: ManifoldToplevel, shape: BoneShape, plan: BreakPlan, resolution: number, boneResolution: number): ShatteredBone {
  const labelOf = new Map<number, number>();
  const outer = solidFromMesh(wasm, boneOuterMesh(shape, boneResolution));
  const cavity = solidFromMesh(wasm, medullaryCavityMesh(shape, boneResolution));
  labelOf.set(outer.originalID(), LABEL_ORIGINAL);
  labelOf.set(cavity.originalID(), LABEL_MEDULLARY);
  const bone = outer.subtract(cavity);
  outer.delete();
  cavity.delete();
  const boneVolume = bone.volume();
  const breaks: BreakRecord[] = [];
  const crumbs: number[] = [];
  let pieces: Piece[] = [{ solid: bone, sides: new Map() }];

  const ring = (b: PlannedRingBreak) => {
    const body = solidFromMesh(wasm, ringBreakBody(shape, b.geometry, resolution));
    labelOf.set(body.originalID(), FRACTURE_BASE + b.id);
    breaks.push({ id: b.id, age: b.age, pattern: b.pattern, nominalBevelDeg: (Math.atan(Math.abs(b.geometry.bevel)) * 180) / Math.PI });
    // a face sloped to its rim angle reaches further through the wall than its outline's range
    const margin = b.geometry.rimBevel !== undefined ? 32 : 12;
    const lo = b.geometry.z + b.geometry.outlineMin - margin;
    const hi = b.geometry.z + b.geometry.outlineMax + margin;
    pieces = pieces.flatMap((p) => {
      const box = p.solid.boundingBox();
      if (box.max[2] < lo || box.min[2] > hi) return [p];
      return splitPiece(p, body, b.id, crumbs);
    });
    body.delete();
  };

  for (const b of plan.rings) ring(b);

  // splinters from each hollow segment of shaft
  let nextId = plan.rings.length + (plan.modern ? 1 : 0);
  const segments = pieces.slice();
  segments.forEach((seg, index) => {
    const sp = plan.splintering(index);
    if (!sp) return;
    const box = seg.solid.boundingBox();
    // the hollow stretch of this segment; where the segment runs on into a solid end, the
    // splinters end in a rough break across the shaft
    const hollowLo = shape.cavityStart + 4;
    const hollowHi = shape.cavityEnd - 4;
    const openLo = box.min[2] < hollowLo;
    const openHi = box.max[2] > hollowHi;
    const z0 = Math.max(box.min[2], hollowLo);
    const z1 = Math.min(box.max[2], hollowHi);
    if (z1 - z0 < 30) return;
    const zm = (z0 + z1) / 2;
    const c = shape.center(zm);
    const frame = axisFrame([c[0], c[1], zm], shape.tangent(zm));
    const rIn = shape.minInnerRadius(z0, z1);
    const rOut = shape.maxOuterRadius(z0, z1);
    const rMean = (rIn + rOut) / 2;
    const len = z1 - z0;
    const base: number[] = [];
    let acc = sp.startAngle;
    for (const w of sp.widths) {
      base.push(acc);
      acc += w;
    }
    const rBand = [Math.max(rIn * 0.6 + 0.5, rIn - 1.5), rOut + 2] as const;
    // Each splinter face meets the real (lobed, tapering, flaring) outer surface at 90 degrees
    // minus its bevel at its rim: its slope through the wall is taken from that surface (a
    // half-plane through the axis, or a bevel about the frame's axis, meets a lobed section at
    // other angles: right-angled in places on a bevelled fresh face, oblique on a dry one).
    const rimTables = base.map((b0, i) => sideRimTable(shape, frame, b0, sp.twist / len, Math.atan(sp.bevels[i]), z0 - zm - 12, z1 - zm + 12, rOut + 10));
    const smooth = (i: number) => (r: number, zeta: number) => {
      const [rim, k] = rimTables[i](zeta);
      return base[i] + (sp.twist * zeta) / len + (k / rim) * (Math.min(rBand[1], Math.max(rBand[0], r)) - rim);
    };
    const rough = (i: number) => (r: number, zeta: number) => smooth(i)(r, zeta) + sp.roughness[i].at(zeta, sp.roughness[i].acrossWall(r, rMean)) / rMean;
    const common = {
      frame,
      zetaLo: z0 - zm - (openLo ? 0 : 6),
      zetaHi: z1 - zm + (openHi ? 0 : 6),
      capRoughness: sp.roughness[0],
      rInside: rIn * 0.6,
      rBand,
      rOutside: rOut + 12,
    };
    // Where the splinters end inside the bone (the segment runs on into a solid end, where the
    // shaft flares), the wedge's ends cross the shaft and carry the label of the wedge's face:
    // they meet the real outer surface at 90 degrees minus that face's bevel, as a ring front does
    // (they were square to the frame's axis: oblique on the flare, right-angled on a fresh face).
    const capTables = new Map<string, (phi: number) => [number, number]>();
    const capSlope = (i: number) => (end: 0 | 1, r: number, phi: number): number => {
      if (!(end === 0 ? openLo : openHi)) return 0;
      const zeta = end === 0 ? z0 - zm : z1 - zm;
      const key = `${end} ${i}`;
      let table = capTables.get(key);
      if (!table) capTables.set(key, (table = capRimTable(shape, frame, zeta, Math.atan(sp.bevels[i]), rOut + 10)));
      const [rim, k] = table(phi);
      return k * (Math.min(rBand[1], Math.max(rBand[0], r)) - rim);
    };
    const boundaryIds: number[] = [];
    for (let i = 0; i < sp.sectors; i++) {
      boundaryIds.push(nextId++);
      const bevel = sp.bevels[i];
      breaks.push({ id: boundaryIds[i], age: sp.age, pattern: 'longitudinal', nominalBevelDeg: (Math.atan(Math.abs(bevel)) * 180) / Math.PI });
    }
    let remainder: Piece[] = [seg];
    pieces = pieces.filter((p) => p !== seg);
    for (let cut = 0; cut < sp.cuts; cut++) {
      const next = cut + 1;
      const w = sp.widths;
      let body: Manifold;
      if (cut === 0) {
        const a = solidFromMesh(wasm, wedgeBody({ ...common, capSlope: capSlope(0), face: 'lower', lower: rough(0), upper: (r, z) => smooth(1)(r, z) + 0.5 * w[1] }, resolution));
        // Each wedge's other side stands half a sector beyond the neighbouring break and follows
        // its slope through the wall, so it never crosses bone inside the freed sector.
        // The second wedge reaches past the first one's inner and outer walls and its ends, so
        // the two bodies share no surface: only their rough sides cross. (Coincident walls and
        // ends make the intersection cut every triangle against every neighbour: slow.)
        const wider = {
          ...common,
          zetaLo: common.zetaLo - 2,
          zetaHi: common.zetaHi + 2,
          capRoughness: undefined,
          rInside: common.rInside * 0.8,
          rOutside: common.rOutside + 4,
        };
        const bb = solidFromMesh(wasm, wedgeBody({ ...wider, face: 'upper', lower: (r, z) => smooth(0)(r, z) - 0.5 * w[w.length - 1], upper: rough(1) }, resolution));
        labelOf.set(a.originalID(), FRACTURE_BASE + boundaryIds[0]);
        labelOf.set(bb.originalID(), FRACTURE_BASE + boundaryIds[1]);
        body = a.intersect(bb);
        a.delete();
        bb.delete();
      } else {
        const upperIndex = next % sp.sectors;
        const upper = upperIndex === 0 ? (r: number, z: number) => rough(0)(r, z) + 2 * Math.PI : rough(upperIndex);
        body = solidFromMesh(wasm, wedgeBody({ ...common, capSlope: capSlope(upperIndex), face: 'upper', lower: (r, z) => smooth(cut)(r, z) - 0.5 * w[cut - 1], upper }, resolution));
        labelOf.set(body.originalID(), FRACTURE_BASE + boundaryIds[upperIndex]);
      }
      const cutId = boundaryIds[next % sp.sectors];
      const freed: Piece[] = [];
      const rest: Piece[] = [];
      for (const p of remainder) {
        for (const q of splitPiece(p, body, cut === 0 ? -1 : cutId, crumbs)) {
          (q.sides.get(cut === 0 ? -1 : cutId) === 'in' ? freed : rest).push(q);
        }
      }
      body.delete();
      // the first body has two faces: record sides against each boundary
      for (const q of [...freed, ...rest]) {
        if (cut === 0 && q.sides.has(-1)) {
          const side = q.sides.get(-1)!;
          q.sides.delete(-1);
          q.sides.set(boundaryIds[0], side);
          q.sides.set(boundaryIds[1], side);
        }
      }
      pieces.push(...freed);
      remainder = rest;
    }
    pieces.push(...remainder);
  });

  if (plan.modern) ring(plan.modern);
  return { pieces, breaks, labelOf, boneVolume, crumbs };
}

/** Split one piece by a cut body; both sides are kept as separate pieces (and components). */
function splitPiece(p: Piece, body: Manifold, breakId: number, crumbs: number[]): Piece[] {
  const [inside, outside] = p.solid.split(body);
  const vin = inside.volume();
  const vout = outside.volume();
  if (vin < 1e-6 || vout < 1e-6) {
    inside.delete();
    outside.delete();
    return [p];
  }
  p.solid.delete();
  const result: Piece[] = [];
  for (const [solid, side] of [[inside, 'in'], [outside, 'out']] as const) {
    const parts = solid.decompose();
    solid.delete();
    for (const part of parts) {
      const v = part.volume();
      if (v < MIN_PIECE_VOLUME) {
        crumbs.push(v);
        part.delete();
        continue;
      }
      const sides = new Map(p.sides);
      sides.set(breakId, side);
      result.push({ solid: part, sides });
    }
  }
  return result;
}

export { wrap };

/**
 * Along a longitudinal break about `frame` (angle phi0 + twist zeta at the rim), the rim radius
 * and the rate k = r dphi/dr that makes the face meet the outer bone surface at 90 - bevel
 * degrees there: tabulated every 0.5 mm of zeta between zLo and zHi, read by linear interpolation.
 */
function sideRimTable(shape: BoneShape, frame: AxisFrame, phi0: number, twist: number, bevelRad: number, zLo: number, zHi: number, rMax: number): (zeta: number) => [number, number] {
  const step = 0.5;
  const n = Math.ceil((zHi - zLo) / step) + 1;
  const rimPoint = (zeta: number) => {
    const phi = phi0 + twist * zeta;
    const r = outerRadiusOnRay(shape, frame, phi, zeta, rMax);
    return { phi, r, p: framePoint(frame, r, phi, zeta) };
  };
  return rimTable(n, (i) => {
    const zeta = zLo + i * step;
    const here = rimPoint(zeta);
    const a = rimPoint(zeta - 0.25).p;
    const b = rimPoint(zeta + 0.25).p;
    const { eR, ePhi } = frameDirections(frame, here.phi);
    return [here.r, slopeForRimAngle(outerNormal(shape, here.p), [b[0] - a[0], b[1] - a[1], b[2] - a[2]], bevelRad, eR, ePhi, 1.5)];
  }, (zeta) => Math.max(0, Math.min(n - 1, (zeta - zLo) / step)), false);
}

/**
 * Around the end of a splinter wedge (the plane zeta of the frame, all the way round), the rim
 * radius and the slope dzeta/dr that makes the end meet the outer surface at 90 - bevel degrees:
 * tabulated every degree of the angle.
 */
function capRimTable(shape: BoneShape, frame: AxisFrame, zeta: number, bevelRad: number, rMax: number): (phi: number) => [number, number] {
  const n = 360;
  const rimPoint = (phi: number) => framePoint(frame, outerRadiusOnRay(shape, frame, phi, zeta, rMax), phi, zeta);
  return rimTable(n, (i) => {
    const phi = (2 * Math.PI * i) / n;
    const r = outerRadiusOnRay(shape, frame, phi, zeta, rMax);
    const a = rimPoint(phi - 0.005);
    const b = rimPoint(phi + 0.005);
    const { eR } = frameDirections(frame, phi);
    return [r, slopeForRimAngle(outerNormal(shape, framePoint(frame, r, phi, zeta)), [b[0] - a[0], b[1] - a[1], b[2] - a[2]], bevelRad, eR, frame.t, 1.5)];
  }, (phi) => ((((phi / (2 * Math.PI)) % 1) + 1) % 1) * n, true);
}

/** n tabulated [radius, slope] pairs read by linear interpolation at a fractional index (periodic or clamped). */
function rimTable(n: number, entry: (i: number) => [number, number], index: (x: number) => number, periodic: boolean): (x: number) => [number, number] {
  const rim = new Float64Array(n);
  const slope = new Float64Array(n);
  for (let i = 0; i < n; i++) [rim[i], slope[i]] = entry(i);
  return (x: number) => {
    const xi = index(x);
    const i = periodic ? Math.floor(xi) % n : Math.min(n - 2, Math.floor(xi));
    const j = periodic ? (i + 1) % n : i + 1;
    const f = xi - Math.floor(xi) + (periodic ? 0 : Math.floor(xi) - i);
    return [rim[i] * (1 - f) + rim[j] * f, slope[i] * (1 - f) + slope[j] * f];
  };
}
