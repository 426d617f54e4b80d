/**
 * The candidate index on a break shared by more than two pieces (issue 6, item 3: pruning from
 * face descriptors). Fixtures from manifold-3d (tests/support/tube-splinter.ts): a tube of outer
 * radius 12 mm and inner radius 7 mm split along its length into a shaft piece and a splinter,
 * the splinter then cut across at mid-length, so the half kept meets only half of the shaft
 * piece's rough break (a face against part of a larger one). An unrelated tube of another size
 * (outer radius 14 mm, inner 7.5 mm) is split the same way at full length, so its break faces
 * are as long as the shaft piece's. Truth by construction: the shaft piece's rough break face
 * and the half splinter's rough break face are the two sides of one break.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { splitTube, INNER_RADIUS, OUTER_RADIUS, type SplitPiece } from '../../../support/tube-splinter';
import { breakFaceFromLabels } from '../../../support/break-face-from-labels';
import { candidateFacePairs, type IndexedFace } from '../../../../core/geometry/proposals/candidate-index';
import { fragmentFaceTraits, type FaceTraits } from '../../../../core/geometry/proposals/face-traits';
import { prepareFragment } from '../../../../core/geometry/proposals/prepared-fragment';

const spacing = 1;
const zAxis = { direction: [0, 0, 1] as [number, number, number], point: [0, 0, 0] as [number, number, number], support: 1 };

/** Traits of the piece's labelled breaks (1 rough, 2 plane, 3 the cut across), each face given by its triangles as segmentation gives them. */
function traitsOf(piece: SplitPiece, labels: number[]): FaceTraits[] {
  const faces = labels.map((k) => {
    const label = Uint8Array.from(piece.breakOf, (b) => (b === k ? 1 : 0));
    const ids: number[] = [];
    label.forEach((v, t) => { if (v) ids.push(t); });
    return { ...breakFaceFromLabels(piece.positions, piece.triangles, label, spacing), triangleIds: Uint32Array.from(ids) };
  });
  const input = { positions: piece.positions, triangles: piece.triangles, faces };
  return fragmentFaceTraits(input, prepareFragment(input, { spacing, fpfhRadiusSpacings: 5, patches: false }), zAxis);
}

let shaft: FaceTraits[], half: FaceTraits[], otherSplinter: FaceTraits[], otherShaft: FaceTraits[];

beforeAll(async () => {
  const a = await splitTube({ seed: 1 });
  const h = await splitTube({ seed: 2, halveSplinter: true });
  const u = await splitTube({ seed: 3, outerRadius: 14, innerRadius: 7.5 });
  shaft = traitsOf(a.shaft, [1, 2]);
  half = traitsOf(h.splinter, [1, 2, 3]);
  otherSplinter = traitsOf(u.splinter, [1, 2]);
  otherShaft = traitsOf(u.shaft, [1, 2]);
}, 60_000);

describe('wall thickness along a break face rim', () => {
  it('is the wall of the tube on both sides of a radial break (analytic geometry: R - r across a tube wall)', () => {
    for (const t of [shaft[0], shaft[1], half[0], half[1]]) expect(t.rimThickness).toBeCloseTo(OUTER_RADIUS - INNER_RADIUS, 1);
    expect(otherSplinter[0].rimThickness).toBeCloseTo(14 - 7.5, 1);
  });
});

describe('candidate face pairs on a break met by part of a face', () => {
  it("keep the half splinter's face as the shaft piece's best partner, not a face of a thicker tube of the same length", () => {
    const faces: IndexedFace[] = [];
    [shaft, half, otherSplinter, otherShaft].forEach((list, fragment) => list.forEach((traits, face) => faces.push({ fragment, face, traits })));
    const pairs = candidateFacePairs(faces, { k: 1 });
    // fragment 0 face 0 (shaft, rough break) with fragment 1 face 0 (half splinter, rough break): the truth
    expect(pairs.some((p) => p.a === 0 && p.faceA === 0 && p.b === 1 && p.faceB === 0)).toBe(true);
    // the unrelated tube's rough faces (fragments 2 and 3, face 0) are as long as the shaft piece's but their wall is 6.5 mm, not 5
    expect(pairs.some((p) => p.a === 0 && p.faceA === 0 && (p.b === 2 || p.b === 3) && p.faceB === 0)).toBe(false);
  });
});
