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
import type { Cut } from '../broken-tube';
import { firstBreakFaceTraits } from './first-break-face-traits';
import { candidateFacePairs, type IndexedFace } from '../../../../core/geometry/proposals/candidate-index';
import { describeFace, partnerCost } from '../../../../core/geometry/proposals/face-descriptor';
import type { FaceTraits } from '../../../../core/geometry/proposals/face-traits';

const above: Cut = { normal: [0, 0, 1], offset: 0 };
const below: Cut = { normal: [0, 0, -1], offset: 0 };

describe('the relief of a break across the shaft', () => {
  it('is the same on both sides of one break, and the face ranks its partner, met only in part, ahead of whole breaks of another relief', async () => {
    const r = 0.5;
    const face = await firstBreakFaceTraits([above], r);
    // the other side of the same break, split lengthwise: half and three quarters of the ring remain
    const half = await firstBreakFaceTraits([below, { normal: [0, 1, 0], offset: 0 }], r);
    const most = await firstBreakFaceTraits([below, { normal: [0, 1, 0], offset: -6 }], r);
    // whole rings of other breaks across the shaft, their relief 1.5 times larger and smaller
    const rougher = await firstBreakFaceTraits([below], 1.5 * r);
    const smoother = await firstBreakFaceTraits([below], r / 1.5);
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
