/**
 * Border refinement between break faces and bone surface (border-refine.ts). The test piece
 * is a tube (outer radius 12 mm, inner 7 mm) cut by a transverse plane and by a plane along
 * the shaft 4 mm off the axis, built with manifold-3d (broken-tube.ts); the truth is the
 * construction (analytic geometry): a triangle is a break triangle when its corners lay on a
 * cut plane. The border is then put in the wrong place on purpose, two triangles into the bone
 * surface or two triangles into the break face (as ridges found from filtered normals misplace
 * it), and the refinement must bring it back to the rim.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { refineFractureBorder } from '../../../core/geometry/border-refine';
import { triangleNormalsAndAreas } from '../../../core/geometry/mesh';
import { buildTopology } from '../../../core/geometry/topology';
import { brokenTube, type BrokenTube } from './broken-tube';

/** Grows the triangles of kind `grow` (1 break, 0 bone surface) by `steps` edge steps into the other kind. */
function shifted(truth: Uint8Array, neighbours: Int32Array, grow: number, steps: number): Uint8Array {
  const out = truth.slice();
  for (let s = 0; s < steps; s++) {
    const next = out.slice();
    for (let f = 0; f < out.length; f++) {
      if (out[f] === grow) continue;
      for (let j = 0; j < 3; j++) { const g = neighbours[3 * f + j]; if (g >= 0 && out[g] === grow) { next[f] = grow; break; } }
    }
    out.set(next);
  }
  return out;
}

function agreement(kind: ArrayLike<number>, truth: Uint8Array, areas: Float64Array): number {
  let ok = 0, total = 0;
  for (let f = 0; f < truth.length; f++) { total += areas[f]; if (kind[f] === truth[f]) ok += areas[f]; }
  return ok / total;
}

describe('border refinement between break face and bone surface', () => {
  let tube: BrokenTube;
  let neighbours: Int32Array, normals: Float32Array, areas: Float64Array;
  const options = { rings: 7, referenceRing: 2, passes: 5, minPatchArea: 10 };
  beforeAll(async () => {
    tube = await brokenTube({ cuts: [{ normal: [0, 0, -1], offset: -20 }, { normal: [1, 0, 0], offset: 4 }], edgeLength: 1 });
    neighbours = buildTopology(tube.mesh).neighbours;
    ({ normals, areas } = triangleNormalsAndAreas(tube.mesh));
  });

  for (const [name, grow] of [['break face grown into the bone surface', 1], ['bone surface grown into the break face', 0]] as const) {
    it(`moves a border misplaced by two triangles back to the rim (${name})`, () => {
      const start = shifted(tube.truth, neighbours, grow, 2);
      // Region 0: bone surface, region 1: break faces.
      const region = Uint32Array.from(start);
      const before = agreement(start, tube.truth, areas);
      const refined = refineFractureBorder(neighbours, normals, areas, region, [false, true], options);
      const after = agreement(refined, tube.truth, areas);
      expect(before).toBeLessThan(0.975);
      expect(after).toBeGreaterThan(0.995);
      // The input is left as it was.
      expect(agreement(region, tube.truth, areas)).toBe(before);
    });
  }

  it('leaves a correct border where it is', () => {
    const region = Uint32Array.from(tube.truth);
    const refined = refineFractureBorder(neighbours, normals, areas, region, [false, true], options);
    expect(agreement(refined, tube.truth, areas)).toBeGreaterThan(0.995);
  });
});
