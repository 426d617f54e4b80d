/**
 * The relief of a break across its own plane (face-traits.ts `extents[2]`, the smallest
 * principal spread of the face's samples; log extent 3 in face-descriptor.ts), which the
 * candidate weights refitted at 1,000 fragments weigh twice as much as before. Fixtures from
 * manifold-3d (broken-tube.ts): a tube of outer radius 12 mm and inner radius 7 mm broken across
 * at z = 0, the cut roughened by a smooth displacement along its normal whose amplitude is the
 * fixture's `roughness`. Truth by construction: the two pieces on either side of one cut carry
 * the same displaced surface (one relief, normals reversed), while a cut roughened with another
 * amplitude is another break.
 */
import { describe, expect, it } from 'vitest';
import { brokenTube, type Cut } from '../broken-tube';
import { breakFaceFromLabels } from '../../../support/break-face-from-labels';
import { candidateFacePairs, type IndexedFace } from '../../../../core/geometry/proposals/candidate-index';
import { describeFace, partnerCost } from '../../../../core/geometry/proposals/face-descriptor';
import { fragmentFaceTraits, type FaceTraits } from '../../../../core/geometry/proposals/face-traits';
import { prepareFragment } from '../../../../core/geometry/proposals/prepared-fragment';

const spacing = 1;
const zAxis = { direction: [0, 0, 1] as [number, number, number], point: [0, 0, 0] as [number, number, number], support: 1 };

/** Traits of the first cut's break face of a broken tube (the face from the construction's labels). */
async function firstBreakFace(cuts: Cut[], roughness: number): Promise<FaceTraits> {
  const tube = await brokenTube({ cuts, roughness });
  const { positions, triangles } = tube.mesh;
  const label = Uint8Array.from(tube.cutOf, (c) => (c === 0 ? 1 : 0));
  const ids: number[] = [];
  label.forEach((v, t) => { if (v) ids.push(t); });
  const input = { positions, triangles, faces: [{ ...breakFaceFromLabels(positions, triangles, label, spacing), triangleIds: Uint32Array.from(ids) }] };
  return fragmentFaceTraits(input, prepareFragment(input, { spacing, fpfhRadiusSpacings: 5, patches: false }), zAxis)[0];
}

const above: Cut = { normal: [0, 0, 1], offset: 0 };
const below: Cut = { normal: [0, 0, -1], offset: 0 };

describe('the relief of a break across the shaft', () => {
  it('is the same on both sides of one break, and the face ranks its partner, met only in part, ahead of whole breaks of another relief', async () => {
    const r = 0.5;
    const face = await firstBreakFace([above], r);
    // the other side of the same break, split lengthwise: half and three quarters of the ring remain
    const half = await firstBreakFace([below, { normal: [0, 1, 0], offset: 0 }], r);
    const most = await firstBreakFace([below, { normal: [0, 1, 0], offset: -6 }], r);
    // whole rings of other breaks across the shaft, their relief 1.5 times larger and smaller
    const rougher = await firstBreakFace([below], 1.5 * r);
    const smoother = await firstBreakFace([below], r / 1.5);
    const logRelief = (t: FaceTraits): number => Math.log(t.extents[2]);
    // one break, one relief: within 0.05 in log (about 5%) on a part of the ring, while the other breaks differ by more than 0.3
    for (const p of [half, most]) expect(Math.abs(logRelief(p) - logRelief(face))).toBeLessThan(0.05);
    for (const d of [rougher, smoother]) expect(Math.abs(logRelief(d) - logRelief(face))).toBeGreaterThan(0.3);
    for (const partner of [half, most]) {
      const faces: IndexedFace[] = [face, partner, rougher, smoother].map((traits, fragment) => ({ fragment, face: 0, traits }));
      const pairs = candidateFacePairs(faces, { k: 1 });
      expect(pairs.some((p) => p.a === 0 && p.b === 1)).toBe(true);
      // the face's own list ranks the partner first (a decoy's list may still hold the face, as the union keeps it)
      for (const d of [rougher, smoother]) expect(partnerCost(describeFace(face), describeFace(partner))).toBeLessThan(partnerCost(describeFace(face), describeFace(d)));
    }
  }, 120_000);
});
