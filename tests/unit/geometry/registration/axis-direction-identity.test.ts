/**
 * The axis-direction vote reads its peaks' votes back from the first pass instead of testing
 * every pair of samples a second time (a speed change of session 18: it must not change a single
 * hypothesis). Checked against the vote as it stood before (tests/support/axis-direction-reference.ts,
 * kept verbatim) on faces with analytic geometry: tubes (outer radius 12 mm, inner 7 mm, built by
 * manifold-3d) cut across and lengthwise by a rough surface, and the Stanford bunny (npm package
 * `bunny`) cut in two, one piece moved by known rigid motions, with exact and tilted axis
 * directions, tilts, several peak counts (more than three peaks take the table path) and sample
 * caps. Every hypothesis must be the same: the same support, flip and tilt, and every entry of
 * its motion to the last bit (Object.is, so even the sign of a zero).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { cutBunny, cutTube, type CutPiece } from '../../../support/bunny-cut';
import { breakFaceFromLabels } from '../../../support/break-face-from-labels';
import { referenceSearchAlongAxisDirections } from '../../../support/axis-direction-reference';
import { searchAlongAxisDirections, type AxisDirectionSearchOptions, type DirectionHypothesis } from '../../../../core/geometry/registration/axis-direction-search';
import { applyToDirections, applyToPoints, rotationAboutAxis, transformFrom } from '../../../../core/geometry/registration/rigid-transform';

type V3 = [number, number, number];
const spacing = 1;
const pieces: Array<{ name: string; lower: CutPiece; upper: CutPiece; axis: V3 }> = [];

function face(piece: CutPiece, motion: number[]) {
  const positions = applyToPoints(motion, piece.positions) as Float32Array;
  return breakFaceFromLabels(positions, piece.triangles, piece.onCut, spacing);
}

function direction(motion: number[], d: V3): V3 {
  return Array.from(applyToDirections(motion, Float32Array.from(d))) as V3;
}

function same(got: DirectionHypothesis[], want: DirectionHypothesis[]): void {
  expect(got.length).toBe(want.length);
  got.forEach((h, k) => {
    expect(h.votes).toBe(want[k].votes);
    expect(h.flip).toBe(want[k].flip);
    expect(h.tiltDeg).toEqual(want[k].tiltDeg);
    expect(h.transform.length).toBe(want[k].transform.length);
    h.transform.forEach((v, i) => expect(Object.is(v, want[k].transform[i])).toBe(true));
  });
}

beforeAll(async () => {
  const across = await cutTube({ amplitude: 2, seed: 3 });
  const lengthwise = await cutTube({ amplitude: 1.5, seed: 5, lengthwise: true });
  const bunny = await cutBunny({ amplitude: 3, seed: 2 });
  pieces.push({ name: 'tube across', ...across, axis: [0, 1, 0] });
  pieces.push({ name: 'tube lengthwise', ...lengthwise, axis: [1, 0, 0] });
  // the bunny has no shaft: any direction will do for the vote, which trusts the directions it is given
  pieces.push({ name: 'bunny', ...bunny, axis: [0.3, 0.9, -0.3] });
}, 60_000);

describe('the axis-direction vote against its previous form', () => {
  const identity = transformFrom([1, 0, 0, 0, 1, 0, 0, 0, 1], [0, 0, 0]);
  const motions = [
    transformFrom(rotationAboutAxis([1, -2, 0.5], 2.1), [40, 10, -25]),
    transformFrom(rotationAboutAxis([0, 0, 1], Math.PI), [0.5, -0.25, 0]),
  ];
  const variants: Array<Partial<AxisDirectionSearchOptions> & { tiltB?: number }> = [
    {},
    { tiltsDeg: [-6, 0, 6] },
    { peaks: 6 },
    { peaks: 1, maxSamples: 60 },
    { maxSamples: 20, minPeakVotes: 2 },
    { tiltB: 5, turnBinDeg: 4, shiftBinSpacings: 1 },
    { maxCandidates: 4, peaks: 5 },
    // translation bins of 0.05 mm: more than 2^31 bin keys (60 turns x 1,000-odd bins cubed), the wide keys' path
    { shiftBinSpacings: 0.05, minPeakVotes: 1 },
  ];

  it('gives the same hypotheses to the last bit on tubes and the bunny, either face moved', () => {
    let compared = 0, hypotheses = 0;
    for (const p of pieces) {
      const A = face(p.lower, identity);
      for (const M of motions) {
        const B = face(p.upper, M);
        for (const v of variants) {
          // B's axis the same line turned by the motion (either way along it), or tilted off it
          const tilt = v.tiltB ? rotationAboutAxis([0, 0, 1], (v.tiltB * Math.PI) / 180) : null;
          const dB0: V3 = tilt ? [tilt[0] * p.axis[0] + tilt[1] * p.axis[1] + tilt[2] * p.axis[2], tilt[3] * p.axis[0] + tilt[4] * p.axis[1] + tilt[5] * p.axis[2], tilt[6] * p.axis[0] + tilt[7] * p.axis[1] + tilt[8] * p.axis[2]] : [-p.axis[0], -p.axis[1], -p.axis[2]];
          const dB = direction(M, dB0);
          const options: AxisDirectionSearchOptions = { spacing, ...v };
          const want = referenceSearchAlongAxisDirections(p.axis, A.points, A.normals, dB, B.points, B.normals, options);
          same(searchAlongAxisDirections(p.axis, A.points, A.normals, dB, B.points, B.normals, options), want);
          // and the other way round (A's face moved onto B's)
          const wantBack = referenceSearchAlongAxisDirections(dB, B.points, B.normals, p.axis, A.points, A.normals, options);
          same(searchAlongAxisDirections(dB, B.points, B.normals, p.axis, A.points, A.normals, options), wantBack);
          compared += 2;
          hypotheses += want.length + wantBack.length;
        }
      }
    }
    expect(compared).toBe(pieces.length * motions.length * variants.length * 2);
    // the comparison is not empty: nearly every search returns its peaks
    expect(hypotheses).toBeGreaterThan(compared * 2);
  });
});
