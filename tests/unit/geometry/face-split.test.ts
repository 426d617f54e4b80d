/**
 * Fracture faces where two breaks meet (face-split.ts). Test pieces are tubes (outer radius
 * 12 mm, inner 7 mm) cut by planes with manifold-3d (broken-tube.ts); the truth is the
 * construction (analytic geometry): which cut plane each fracture triangle lies on.
 * - A "roof" end: two planes tilted 40 degrees either way from the cross-section meet in a
 *   crease across the wall (an 80 degree turn of the normal); with a transverse cut at the
 *   other end the tube has three break surfaces, so three faces, each lying on one plane.
 * - A single break, even curved (a cone meeting the wall at 45 degrees all round) or tilted,
 *   stays one face (segmentation.test.ts checks two faces for two single cuts).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { analyseFragment, type FragmentAnalysis } from '../../../core/geometry/analyse-fragment';
import { brokenTube, type BrokenTube } from './broken-tube';

const tilt = (40 * Math.PI) / 180;

/** Which plane a triangle's centroid lies on (index into planes), or -1. */
function planeOf(a: FragmentAnalysis, t: number, planes: Array<{ normal: number[]; offset: number }>): number {
  const p = a.mesh.positions, tri = a.mesh.triangles;
  const c = [0, 1, 2].map((i) => (p[3 * tri[3 * t] + i] + p[3 * tri[3 * t + 1] + i] + p[3 * tri[3 * t + 2] + i]) / 3);
  let best = -1, bestD = 1; // within 1 mm (the cut faces are roughened by 0.25 mm)
  planes.forEach((pl, i) => {
    const d = Math.abs(pl.normal[0] * c[0] + pl.normal[1] * c[1] + pl.normal[2] * c[2] - pl.offset);
    if (d < bestD) { bestD = d; best = i; }
  });
  return best;
}

describe('fracture faces split where two breaks meet at a crease', () => {
  let roof: BrokenTube;
  let a: FragmentAnalysis;
  const planes = [
    { normal: [Math.sin(tilt), 0, Math.cos(tilt)], offset: -25 },
    { normal: [-Math.sin(tilt), 0, Math.cos(tilt)], offset: -25 },
    { normal: [0, 0, -1], offset: -30 },
  ];
  beforeAll(async () => {
    roof = await brokenTube({ cuts: planes.map((p) => ({ normal: p.normal as [number, number, number], offset: p.offset })) });
    a = analyseFragment(roof.mesh);
  });

  it('a roof-shaped end and a transverse end give three faces, each on one plane', () => {
    expect(a.fractureFaces.length).toBe(3);
    const seen = new Set<number>();
    for (const face of a.fractureFaces) {
      const count = [0, 0, 0];
      let total = 0;
      for (const t of face.triangleIds) {
        const k = planeOf(a, t, planes);
        if (k >= 0) count[k]++;
        total++;
      }
      const dominant = count.indexOf(Math.max(...count));
      seen.add(dominant);
      // Purity: at least 90 % of the face's triangles on its own plane.
      expect(count[dominant] / total).toBeGreaterThan(0.9);
    }
    expect(seen.size).toBe(3);
  });

  it('with splitting switched off the two roof planes are one face', () => {
    const off = analyseFragment(roof.mesh, { faceSplitCreaseShare: 2, faceSplitMeanAngleDeg: 180 });
    expect(off.fractureFaces.length).toBe(2);
  });
});
