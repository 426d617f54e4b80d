/**
 * How a break runs across the shaft, as the candidate index compares it (face-traits.ts
 * `axisCosine` and `radialLean`). Fixtures from manifold-3d (broken-tube.ts): a tube of outer
 * radius 12 mm and inner radius 7 mm (axis z) broken by a cone about its axis, whose surface
 * meets the wall at the cone's half angle a all round. Analytic geometry: the cone's outward
 * normal is cos(a) straight out from the axis plus sin(a) along it, so on the piece inside the
 * cone every break normal has |cosine| sin(a) with the axis and leans out by cos(a); the piece
 * outside the cone holds the same surface with the normals reversed (lean -cos(a)). Truth by
 * construction: the triangles on the cone are the break, and the two pieces are its two sides.
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

/** Traits of each cut's break face of a broken tube (faces from the construction's labels), in the order of `cuts`. */
async function breakFaces(cuts: Cut[], roughness = 0.25): Promise<FaceTraits[]> {
  const tube = await brokenTube({ cuts, roughness });
  const { positions, triangles } = tube.mesh;
  const faces = cuts.map((_, i) => {
    const label = Uint8Array.from(tube.cutOf, (c) => (c === i ? 1 : 0));
    const ids: number[] = [];
    label.forEach((v, t) => { if (v) ids.push(t); });
    return { ...breakFaceFromLabels(positions, triangles, label, spacing), triangleIds: Uint32Array.from(ids) };
  });
  const input = { positions, triangles, faces };
  return fragmentFaceTraits(input, prepareFragment(input, { spacing, fpfhRadiusSpacings: 5, patches: false }), zAxis);
}

// a cone from below the tube's end (z = -40) whose surface crosses the wall near z = 0
const cone = (baseRadius: number, halfAngleDeg: number, keepOutside = false): Cut => ({ baseZ: -45, baseRadius, halfAngleDeg, keepOutside });

describe('the course of a break across the shaft', () => {
  it('is the cone angle on both sides of a conical break (analytic geometry: the normal of a cone of half angle a)', async () => {
    for (const deg of [30, 60]) {
      const a = (deg * Math.PI) / 180;
      // the cone crosses the wall where its radius is 7-12 mm: base radius 57 mm shrinking tan(a) per mm from z = -45
      const base = 12 + 45 * Math.tan(a);
      const [inside] = await breakFaces([cone(base, deg)], 0);
      const [outside] = await breakFaces([cone(base, deg, true)], 0);
      // within 0.06: a few percent of the labelled triangles are slivers of the wall whose three
      // corners all lie on the ring where the cone meets it (labelled break by the construction)
      expect(Math.abs(inside.tube!.axisCosine! - Math.sin(a))).toBeLessThan(0.06);
      expect(Math.abs(outside.tube!.axisCosine! - Math.sin(a))).toBeLessThan(0.06);
      expect(Math.abs(inside.tube!.radialLean! - Math.cos(a))).toBeLessThan(0.06);
      expect(Math.abs(outside.tube!.radialLean! + Math.cos(a))).toBeLessThan(0.06);
    }
  }, 60_000);

  it("keep a face's true partner, met only in part, ahead of a face of another break that crosses the wall leaning the same way as the face itself", async () => {
    // A tube split lengthwise by the plane x = 4 mm, off the axis: the break crosses the wall
    // obliquely, the piece on x >= 4 looking in towards the axis (normal -x, lean -4/rho at
    // distance rho from the axis) and the piece on x <= 4 out (lean +4/rho). Smooth cuts (no
    // roughening): every face is a flat strip whose texture (mean FPFH) cannot tell them apart.
    const [face] = await breakFaces([{ normal: [1, 0, 0], offset: 4 }], 0);
    // its partner, the piece on x <= 4, broken again across at z = 28: it meets 85% of the face's length
    const [partner] = await breakFaces([{ normal: [-1, 0, 0], offset: -4 }, { normal: [0, 0, -1], offset: -28 }], 0);
    // a tube of the same size split by the plane x = -4 (piece on x <= -4): a strip of the full
    // length, the mirror image of the face, leaning in towards the axis like the face itself
    const [mirror] = await breakFaces([{ normal: [-1, 0, 0], offset: 4 }], 0);
    expect(face.tube!.radialLean!).toBeLessThan(-0.3);
    expect(partner.tube!.radialLean!).toBeGreaterThan(0.3);
    expect(mirror.tube!.radialLean!).toBeLessThan(-0.3);
    const faces: IndexedFace[] = [
      { fragment: 0, face: 0, traits: face },
      { fragment: 1, face: 0, traits: partner },
      { fragment: 2, face: 0, traits: mirror },
    ];
    const pairs = candidateFacePairs(faces, { k: 1 });
    // the face's best partner is fragment 1, not the mirror image (fragment 2), although the mirror image's length matches better
    expect(pairs.some((p) => p.a === 0 && p.b === 1)).toBe(true);
    expect(pairs.some((p) => p.a === 0 && p.b === 2)).toBe(false);
  }, 60_000);
  it("weighs the lean through the wall above a difference in length: a partner met along three quarters of the face ranks ahead of a whole strip leaning half as much", async () => {
    // The face: a tube split lengthwise by the plane x = 4 mm (piece x >= 4), as above; its
    // normal -x makes cosine -4/rho with the direction out from the axis at distance rho
    // (analytic geometry), so the face leans in by about 0.44 (rho 7-12 mm). Its partner, the
    // piece x <= 4, broken again across at z = 20 mm: 60 of the tube's 80 mm (75% of the
    // face's length; the generator's assemblages at 200 fragments are full of such partners).
    // The decoy: a tube of the same size split by the plane x = 2 (piece x <= 2): a whole strip,
    // of the same length as the face, leaning out by 2/rho, about half the partner's lean.
    // Smooth cuts, so texture cannot tell them apart. The weights were fitted on generated
    // assemblages (face-descriptor.ts); before, the length outweighed the lean and the decoy won.
    const [face] = await breakFaces([{ normal: [1, 0, 0], offset: 4 }], 0);
    const [partner] = await breakFaces([{ normal: [-1, 0, 0], offset: -4 }, { normal: [0, 0, -1], offset: -20 }], 0);
    const [decoy] = await breakFaces([{ normal: [-1, 0, 0], offset: -2 }], 0);
    expect(partner.tube!.radialLean!).toBeGreaterThan(0.35);
    expect(decoy.tube!.radialLean!).toBeGreaterThan(0.15);
    expect(decoy.tube!.radialLean!).toBeLessThan(0.3);
    // the face's own list ranks the partner first (the decoy's list may still hold the face)
    expect(partnerCost(describeFace(face), describeFace(partner))).toBeLessThan(partnerCost(describeFace(face), describeFace(decoy)));
  }, 60_000);

  it("ranks a partner met along only half the break ahead of whole faces of breaks a few degrees steeper or shallower", async () => {
    // The face: the piece inside a cone of half angle 60 degrees about the tube's axis. Its
    // partner: the piece outside that cone, split lengthwise by the plane y = 0 (half of it
    // kept), so it meets half of the face (at 200 fragments and more a break is often shared
    // between two or more pieces on one side). The decoys: the pieces outside cones of half
    // angle 63 and 56 degrees, whole: the face's size and arc, but their normals make cosine
    // sin(63) = 0.89 and sin(56) = 0.83 with the axis instead of sin(60) = 0.87, and lean out by
    // cos(63) = 0.45 and cos(56) = 0.56 instead of 0.5 (analytic geometry, as in the first test).
    // Smooth cuts, so texture cannot tell them apart. With the weights fitted before the current
    // segmentation (the course of the break compared on a scale of 0.05, the arc share and area
    // weighing twice as much) both decoys ranked ahead of the partner.
    const at = (deg: number): number => 12 + 45 * Math.tan((deg * Math.PI) / 180);
    const [face] = await breakFaces([cone(at(60), 60)], 0);
    const [partner] = await breakFaces([cone(at(60), 60, true), { normal: [0, 1, 0], offset: 0 }], 0);
    const decoys = [(await breakFaces([cone(at(63), 63, true)], 0))[0], (await breakFaces([cone(at(56), 56, true)], 0))[0]];
    expect(partner.tube!.arcShare).toBeLessThan(0.6);
    for (const d of decoys) expect(d.tube!.arcShare).toBeGreaterThan(0.9);
    const toPartner = partnerCost(describeFace(face), describeFace(partner));
    for (const d of decoys) expect(toPartner).toBeLessThan(partnerCost(describeFace(face), describeFace(d)));
    const faces: IndexedFace[] = [face, partner, ...decoys].map((traits, fragment) => ({ fragment, face: 0, traits }));
    const pairs = candidateFacePairs(faces, { k: 1 });
    expect(pairs.some((p) => p.a === 0 && p.b === 1)).toBe(true);
  }, 60_000);
});
