/**
 * Candidate-index traits (face-traits.ts) of the first cut's break face of a broken tube
 * (broken-tube.ts): the face is taken from the construction's labels, not from segmentation, and
 * described about the tube's own axis (z).
 */
import { brokenTube, type Cut } from '../broken-tube';
import { breakFaceFromLabels } from '../../../support/break-face-from-labels';
import { fragmentFaceTraits, type FaceTraits } from '../../../../core/geometry/proposals/face-traits';
import { prepareFragment } from '../../../../core/geometry/proposals/prepared-fragment';

const zAxis = { direction: [0, 0, 1] as [number, number, number], point: [0, 0, 0] as [number, number, number], support: 1 };

export async function firstBreakFaceTraits(cuts: Cut[], roughness: number, spacing = 1): Promise<FaceTraits> {
  const tube = await brokenTube({ cuts, roughness });
  const { positions, triangles } = tube.mesh;
  const label = Uint8Array.from(tube.cutOf, (c) => (c === 0 ? 1 : 0));
  const ids: number[] = [];
  label.forEach((v, t) => { if (v) ids.push(t); });
  const input = { positions, triangles, faces: [{ ...breakFaceFromLabels(positions, triangles, label, spacing), triangleIds: Uint32Array.from(ids) }] };
  return fragmentFaceTraits(input, prepareFragment(input, { spacing, fpfhRadiusSpacings: 5, patches: false }), zAxis)[0];
}
