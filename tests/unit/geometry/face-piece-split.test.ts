/**
 * Pieces for the matcher where a small break meets a larger one at a crease
 * (facePieceSplitMinAreaMm2, analyse-fragment.ts with face-split.ts and refine-partition.ts).
 * Test piece: a tube (outer radius 12 mm, inner 7 mm; broken-tube.ts, cut with manifold-3d)
 * with a transverse break at each end and, at the top, a steep plane that shears off the outer
 * part of the wall beyond x = 8 mm at 50 degrees to the transverse break. The truth is the
 * construction (analytic geometry): the small break's area is the circular segment of the outer
 * circle beyond x = 8 (R^2 acos(d/R) - d sqrt(R^2 - d^2) = 49.5 mm^2 for R = 12, d = 8, the
 * segment-area formula of any geometry handbook), divided by cos 50 degrees for its slant:
 * 77.0 mm^2, under faceSplitMinAreaMm2 (120), so the face keeps it (no fracture angle could be
 * read on so short a break), while the matcher should be offered it as a piece of its own.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { analyseFragment, type FragmentAnalysis } from '../../../core/geometry/analyse-fragment';
import { triangleNormalsAndAreas } from '../../../core/geometry/mesh';
import { brokenTube, type BrokenTube } from './broken-tube';

const alpha = (50 * Math.PI) / 180;
const x0 = 8, top = 30;
const smallArea = (144 * Math.acos(x0 / 12) - x0 * Math.sqrt(144 - x0 * x0)) / Math.cos(alpha);

/** Area of the given analysed triangles, and the part of it on cut `cut` of the construction. */
function onCut(a: FragmentAnalysis, tube: BrokenTube, ids: ArrayLike<number>, cut: number): { area: number; on: number } {
  const { areas } = triangleNormalsAndAreas(a.mesh);
  let area = 0, on = 0;
  for (let i = 0; i < ids.length; i++) {
    area += areas[ids[i]];
    if (tube.cutOf[a.sourceTriangle[ids[i]]] === cut) on += areas[ids[i]];
  }
  return { area, on };
}

describe('a small break beside a larger one at a crease', () => {
  let tube: BrokenTube;
  beforeAll(async () => {
    tube = await brokenTube({
      cuts: [
        { normal: [0, 0, -1], offset: -top },
        { normal: [0, 0, 1], offset: -30 },
        // keeps sin(alpha) x + cos(alpha) z <= sin(alpha) x0 + cos(alpha) top
        { normal: [-Math.sin(alpha), 0, -Math.cos(alpha)], offset: -(Math.sin(alpha) * x0 + Math.cos(alpha) * top) },
      ],
    });
  });

  it('the construction: the small break has its analytic area (within 10%)', () => {
    const { areas } = triangleNormalsAndAreas(tube.mesh);
    let a = 0;
    for (let t = 0; t < areas.length; t++) if (tube.cutOf[t] === 2) a += areas[t];
    expect(smallArea).toBeCloseTo(77.0, 0);
    expect(Math.abs(a - smallArea) / smallArea).toBeLessThan(0.1);
  });

  it('stays inside the top face, and is offered as a piece lying on it alone', () => {
    const a = analyseFragment(tube.mesh);
    const host = a.fractureFaces.find((f) => onCut(a, tube, f.triangleIds, 2).on > 0.5 * smallArea)!;
    expect(host).toBeDefined();
    // the face holds the transverse break too (faceSplitMinAreaMm2 folds the small one in)
    expect(onCut(a, tube, host.triangleIds, 0).on).toBeGreaterThan(smallArea);
    const pieces = (host.pieces ?? []).map((p) => onCut(a, tube, p, 2));
    const best = pieces.reduce((b, p) => (p.on / p.area > b.on / b.area ? p : b), { area: 1, on: 0 });
    expect(best.on / best.area).toBeGreaterThan(0.8);
    expect(best.on / smallArea).toBeGreaterThan(0.7);
  });

  it('with the setting at faceSplitMinAreaMm2 no piece lies mostly on the small break', () => {
    const a = analyseFragment(tube.mesh, { facePieceSplitMinAreaMm2: 120 });
    for (const f of a.fractureFaces) {
      for (const p of [f.triangleIds, ...(f.pieces ?? [])]) {
        const r = onCut(a, tube, p, 2);
        expect(r.on / r.area).toBeLessThan(0.5);
      }
    }
  });
});
