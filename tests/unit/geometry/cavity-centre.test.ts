/**
 * The shaft centre read from the medullary cavity (cavity-centre.ts, and analyse-fragment.ts's
 * second classification about it, settings cavityCentre*).
 * - On synthetic regions with analytic truth: the normal lines of a circular arc all pass its
 *   centre, so the least-squares point is the centre exactly; a flat face's normals are
 *   parallel (spread 0) and an arc of angle Δ spreads by (Δ - sin Δ) / 2Δ (the eigenvalues of
 *   the scatter of the unit vectors along the arc, ∫ p pᵀ dθ, elementary integration).
 * - On thick-walled three-lobed tube pieces whose truth comes from their construction
 *   (broken-tube.ts, manifold-3d): a tube of outer radius 18 mm and cavity 7.5 mm (the
 *   proportions of a cattle tibia's shaft wall, common practice) cut along two chords off the
 *   axis and across at both ends, then scaled across the axis by 1 + 0.13 cos 3(θ - φ) (three
 *   lobes, as the generator's tibia, demo-data/skeleton.ts tri 0.13) and, for the spiral
 *   piece, turned about the axis by 0.05 rad per mm of radius from the outer surface in (the
 *   generator's splinter faces, demo-data/shatter.ts). The axis is the z axis.
 */
import { describe, expect, it } from 'vitest';
import { analyseFragment } from '../../../core/geometry/analyse-fragment';
import { cavityCentre } from '../../../core/geometry/cavity-centre';
import { triangleNormalsAndAreas } from '../../../core/geometry/mesh';
import type { ShaftAxis } from '../../../core/geometry/shaft-axis';
import { brokenTube, fractureAgreement, offAxis, type BrokenTube } from './broken-tube';

/** Triangle-like rows (centroid, normal, area, region) on arcs and flat strips in the plane z = 0, axis along z. */
function rows(parts: Array<{ region: number; points: Array<[number, number, number, number]> }>) {
  const all = parts.flatMap((p) => p.points.map((q) => ({ region: p.region, q })));
  const centroids = new Float32Array(3 * all.length), normals = new Float32Array(3 * all.length), areas = new Float64Array(all.length);
  const region = new Uint32Array(all.length);
  all.forEach(({ region: r, q }, i) => {
    centroids[3 * i] = q[0]; centroids[3 * i + 1] = q[1];
    normals[3 * i] = q[2]; normals[3 * i + 1] = q[3];
    areas[i] = 1; region[i] = r;
  });
  return { centroids, normals, areas, region };
}

/** Points of a cavity arc about (cx, cy), radius r, from a0 to a1 (radians), normals pointing at the centre. */
function cavityArc(cx: number, cy: number, r: number, a0: number, a1: number, n = 60): Array<[number, number, number, number]> {
  return Array.from({ length: n }, (_, k) => {
    const a = a0 + ((a1 - a0) * (k + 0.5)) / n;
    return [cx + r * Math.cos(a), cy + r * Math.sin(a), -Math.cos(a), -Math.sin(a)];
  });
}

const axis: ShaftAxis = { direction: [0, 0, 1], point: [20, -5, 0], radius: 18, support: 0.9 };
const options = { spreadMin: 0.1, concaveShare: 0.8 };

describe('cavityCentre on analytic regions', () => {
  it('puts the centre at the centre of a concave arc and leaves a flat face out', () => {
    // Region 0: 120 degrees of a cavity of radius 7.5 about (3, 4); region 1: a flat strip
    // (normals all along +y, spread 0) that would pull a pooled fit off if it were used.
    const flat: Array<[number, number, number, number]> = Array.from({ length: 80 }, (_, k) => [10 + k * 0.3, -10, 0, 1]);
    const r = rows([{ region: 0, points: cavityArc(3, 4, 7.5, -1, 1.094) }, { region: 1, points: flat }]);
    const c = cavityCentre(axis, r.region, () => true, r.centroids, r.normals, r.areas, options)!;
    expect(c[0]).toBeCloseTo(3, 4);
    expect(c[1]).toBeCloseTo(4, 4);
    // The axis point's station along the axis is kept.
    expect(c[2]).toBeCloseTo(0, 6);
  });

  it('needs the arc to spread by (Δ - sin Δ) / 2Δ of at least spreadMin', () => {
    // Δ = 50 degrees spreads by (0.873 - 0.766) / 1.745 = 0.061, under 0.1; Δ = 80 degrees by (1.396 - 0.985) / 2.793 = 0.147.
    const narrow = rows([{ region: 0, points: cavityArc(0, 0, 8, 0, (50 * Math.PI) / 180, 200) }]);
    const wide = rows([{ region: 0, points: cavityArc(0, 0, 8, 0, (80 * Math.PI) / 180, 200) }]);
    expect(cavityCentre(axis, narrow.region, () => true, narrow.centroids, narrow.normals, narrow.areas, options)).toBeUndefined();
    expect(cavityCentre(axis, narrow.region, () => true, narrow.centroids, narrow.normals, narrow.areas, { ...options, spreadMin: 0.05 })).toBeDefined();
    expect(cavityCentre(axis, wide.region, () => true, wide.centroids, wide.normals, wide.areas, options)).toBeDefined();
  });

  it('leaves out a convex arc (normals facing away from its centre) and regions not classed medullary', () => {
    const convex = cavityArc(0, 0, 18, 0, 2).map(([x, y, nx, ny]): [number, number, number, number] => [x, y, -nx, -ny]);
    const r = rows([{ region: 0, points: convex }, { region: 1, points: cavityArc(30, 0, 7, 0, 2) }]);
    expect(cavityCentre(axis, r.region, (id) => id === 0, r.centroids, r.normals, r.areas, options)).toBeUndefined();
    expect(cavityCentre(axis, r.region, () => true, r.centroids, r.normals, r.areas, options)![0]).toBeCloseTo(30, 4);
  });
});

/** A piece of the lobed thick-walled tube between two chords (bearings a1 < a2, each plane shifted sideways by s1, s2 mm). */
function chordPiece(o: { phaseDeg: number; twist: number; a1: number; a2: number; s1: number; s2: number }): Promise<BrokenTube> {
  const R = 18, ph = (o.phaseDeg * Math.PI) / 180;
  const warp = (x: number, y: number, z: number): [number, number, number] => {
    const a = o.twist * (Math.hypot(x, y) - R);
    const X = x * Math.cos(a) - y * Math.sin(a), Y = x * Math.sin(a) + y * Math.cos(a);
    const f = 1 + 0.13 * Math.cos(3 * (Math.atan2(Y, X) - ph));
    return [f * X, f * Y, z];
  };
  const b1 = (o.a1 * Math.PI) / 180, b2 = (o.a2 * Math.PI) / 180;
  return brokenTube({
    outerRadius: R, innerRadius: 7.5, length: 80, roughness: 0.3, warp,
    cuts: [
      { normal: [-Math.sin(b1), Math.cos(b1), 0], offset: -o.s1 }, { normal: [Math.sin(b2), -Math.cos(b2), 0], offset: -o.s2 },
      { normal: [0, 0, 1], offset: -30 }, { normal: [0, 0, -1], offset: -30 },
    ],
  });
}

describe('a thick-walled three-lobed shaft piece between two chords', () => {
  for (const [name, o, offBefore] of [
    ['spiral breaks, 120 degrees of wall', { phaseDeg: 60, twist: 0.05, a1: -60, a2: 60, s1: 4, s2: -4 }, 8],
    ['plane breaks, 120 degrees of wall', { phaseDeg: 60, twist: 0, a1: -60, a2: 60, s1: -3, s2: 6 }, 3.5],
  ] as const) {
    it(`gets its centre from the cavity (${name})`, async () => {
      const piece = await chordPiece(o);
      const areas = triangleNormalsAndAreas(piece.mesh).areas;
      const before = analyseFragment(piece.mesh, { cavityCentreSpreadMin: 0 });
      const after = analyseFragment(piece.mesh);
      // Truth: the z axis (construction). Measured: spiral piece 14.5 -> 2.8 mm off, agreement
      // 0.861 -> 0.973; plane piece 4.6 -> 0.5 mm, 0.948 -> 0.983.
      expect(offAxis(before.axis.point, before.axis.direction)).toBeGreaterThan(offBefore);
      expect(offAxis(after.axis.point, after.axis.direction)).toBeLessThan(3.5);
      expect(fractureAgreement(after, piece.truth, areas)).toBeGreaterThan(fractureAgreement(before, piece.truth, areas) + 0.02);
      expect(fractureAgreement(after, piece.truth, areas)).toBeGreaterThan(0.96);
    }, 60_000);
  }

  it('leaves the same piece of a round tube as it was', async () => {
    const round = await brokenTube({ outerRadius: 18, innerRadius: 7.5, length: 80, roughness: 0.3, cuts: [
      { normal: [-Math.sin(-Math.PI / 3), Math.cos(-Math.PI / 3), 0], offset: -4 }, { normal: [Math.sin(Math.PI / 3), -Math.cos(Math.PI / 3), 0], offset: 4 },
      { normal: [0, 0, 1], offset: -30 }, { normal: [0, 0, -1], offset: -30 }] });
    const a = analyseFragment(round.mesh);
    const b = analyseFragment(round.mesh, { cavityCentreSpreadMin: 0 });
    expect(a.axis.point).toEqual(b.axis.point);
    expect(offAxis(a.axis.point, a.axis.direction)).toBeLessThan(3);
  }, 60_000);
});
