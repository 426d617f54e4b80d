import { acrossAxisBasis, type ShaftAxis } from './shaft-axis';
import { hypot } from './hypot';

/** Cut-offs of cavityCentre (settings.ts, cavityCentre*). */
export interface CavityCentreOptions {
  /**
   * Least spread of a region's normal directions across the axis: the smaller eigenvalue of
   * the area-weighted scatter of the normal lines' perpendiculars over its trace (0 for a flat
   * face, whose normals are parallel; 0.5 for normals spread evenly all round).
   */
  spreadMin: number;
  /** Least area share of a region whose normal points towards the region's own centre (a concave arc). */
  concaveShare: number;
}

/**
 * The shaft centre read from the medullary cavity alone: the point across the axis that the
 * normal lines of the regions classed medullary pass most closely (least squares, as the
 * axis point of fitShaftAxis: minimise Σ w ((c - q) × m)², m the normal across the axis), on
 * the regions that are curved and concave about their own such point. On a thick-walled
 * three-lobed shaft (a tibia's: wall 10-11 mm of an 18-20 mm radius, section r = ρ (1 + e cos
 * 3θ)) the normal lines of the whole fragment meet where a flat outer face and break faces
 * cut through the wall happen to agree, up to 10-36 mm off the axis; the classes that follow
 * still read the cavity right (it faces the misplaced centre obliquely but inwards), and the
 * cavity's arc, concave about the axis, says where the axis is. A region whose normals do not
 * spread across at least `spreadMin` (a flat break face that faced the misplaced centre
 * squarely and so passed for cavity) or that is not concave about its own centre
 * (`concaveShare` of its area facing it) is left out: a circular arc of angle Δ spreads by
 * (Δ - sin Δ) / 2Δ (the eigenvalues of ∫ p pᵀ over the arc), 0.1 at about 63 degrees.
 * Undefined when no region qualifies or the pooled lines do not spread either. Returns the
 * point at the axis point's station along the axis.
 */
export function cavityCentre(
  axis: ShaftAxis, region: ArrayLike<number>, medullary: (region: number) => boolean,
  centroids: Float32Array, normals: Float32Array, areas: Float64Array, options: CavityCentreOptions,
): [number, number, number] | undefined {
  const d = axis.direction;
  const [u, v] = acrossAxisBasis(d);
  const byRegion = new Map<number, number[]>();
  for (let f = 0; f < areas.length; f++) {
    const r = region[f];
    if (!medullary(r)) continue;
    if (Math.abs(normals[3 * f] * d[0] + normals[3 * f + 1] * d[1] + normals[3 * f + 2] * d[2]) > 0.342) continue;
    const list = byRegion.get(r);
    if (list) list.push(f); else byRegion.set(r, [f]);
  }
  const spread = (s11: number, s12: number, s22: number): number => {
    const tr = s11 + s22;
    if (!(tr > 0)) return 0;
    const det = s11 * s22 - s12 * s12;
    return (tr / 2 - Math.sqrt(Math.max(0, (tr * tr) / 4 - det))) / tr;
  };
  let S11 = 0, S12 = 0, S22 = 0, B1 = 0, B2 = 0;
  for (const tris of byRegion.values()) {
    let s11 = 0, s12 = 0, s22 = 0, b1 = 0, b2 = 0;
    const rows: number[] = [];
    for (const f of tris) {
      const mu = normals[3 * f] * u[0] + normals[3 * f + 1] * u[1] + normals[3 * f + 2] * u[2];
      const mv = normals[3 * f] * v[0] + normals[3 * f + 1] * v[1] + normals[3 * f + 2] * v[2];
      const ml = hypot(mu, mv) || 1;
      const pu = -mv / ml, pv = mu / ml;
      const qu = centroids[3 * f] * u[0] + centroids[3 * f + 1] * u[1] + centroids[3 * f + 2] * u[2];
      const qv = centroids[3 * f] * v[0] + centroids[3 * f + 1] * v[1] + centroids[3 * f + 2] * v[2];
      const r = qu * pu + qv * pv, w = areas[f];
      s11 += w * pu * pu; s12 += w * pu * pv; s22 += w * pv * pv; b1 += w * pu * r; b2 += w * pv * r;
      rows.push(qu, qv, mu / ml, mv / ml, w);
    }
    if (!(spread(s11, s12, s22) >= options.spreadMin)) continue;
    const det = s11 * s22 - s12 * s12;
    const cu = (b1 * s22 - b2 * s12) / det, cv = (s11 * b2 - s12 * b1) / det;
    let concave = 0, all = 0;
    for (let k = 0; k < rows.length; k += 5) {
      all += rows[k + 4];
      if ((cu - rows[k]) * rows[k + 2] + (cv - rows[k + 1]) * rows[k + 3] > 0) concave += rows[k + 4];
    }
    if (!(concave >= options.concaveShare * all)) continue;
    S11 += s11; S12 += s12; S22 += s22; B1 += b1; B2 += b2;
  }
  if (!(spread(S11, S12, S22) >= options.spreadMin)) return undefined;
  const det = S11 * S22 - S12 * S12;
  const cu = (B1 * S22 - B2 * S12) / det, cv = (S11 * B2 - S12 * B1) / det;
  const t = axis.point[0] * d[0] + axis.point[1] * d[1] + axis.point[2] * d[2];
  return [cu * u[0] + cv * v[0] + t * d[0], cu * u[1] + cv * v[1] + t * d[1], cu * u[2] + cv * v[2] + t * d[2]];
}
