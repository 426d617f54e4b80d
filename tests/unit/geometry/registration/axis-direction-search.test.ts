/**
 * The search along the two pieces' axis directions, checked on a shaft piece with analytic
 * truth: a tube (outer radius 12 mm, inner 7 mm, built by manifold-3d) cut in two by a rough
 * surface (tests/support/bunny-cut.ts), one piece moved by a known rigid motion. The truth is
 * the inverse of that motion (analytic geometry), and the axis directions handed to the search
 * are the tube's own, exact by construction, with a deliberate error: the search must not need
 * the axis points at all, and must absorb a few degrees of disagreement between the directions.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { cutTube, type CutPiece } from '../../../support/bunny-cut';
import { breakFaceFromLabels } from '../../../support/break-face-from-labels';
import { searchAlongAxisDirections } from '../../../../core/geometry/registration/axis-direction-search';
import { applyToDirections, applyToPoints, displacementAt, invert, rotationAboutAxis, rotationErrorDegrees, transformFrom } from '../../../../core/geometry/registration/rigid-transform';

const spacing = 1;
let lower: CutPiece, upper: CutPiece;

function face(piece: CutPiece, motion: number[]) {
  const positions = applyToPoints(motion, piece.positions) as Float32Array;
  return breakFaceFromLabels(positions, piece.triangles, piece.onCut, spacing);
}

function tilted(d: [number, number, number], about: [number, number, number], deg: number): [number, number, number] {
  const R = rotationAboutAxis(about, (deg * Math.PI) / 180);
  return [R[0] * d[0] + R[1] * d[1] + R[2] * d[2], R[3] * d[0] + R[4] * d[1] + R[5] * d[2], R[6] * d[0] + R[7] * d[1] + R[8] * d[2]];
}

beforeAll(async () => {
  // an oblique rough break (amplitude 2 mm) through a 90 mm tube along y
  ({ lower, upper } = await cutTube({ amplitude: 2, seed: 3 }));
});

describe('the search along the two axis directions', () => {
  const identity = transformFrom([1, 0, 0, 0, 1, 0, 0, 0, 1], [0, 0, 0]);
  const M = transformFrom(rotationAboutAxis([1, -2, 0.5], 2.1), [40, 10, -25]);
  const truth = invert(M);

  it('finds the turn and the free translation from exact directions (either way along the axis)', () => {
    const A = face(lower, identity), B = face(upper, M);
    const dB = Array.from(applyToDirections(M, Float32Array.from([0, -1, 0]))) as [number, number, number];
    const [h] = searchAlongAxisDirections([0, 1, 0], A.points, A.normals, dB, B.points, B.normals, { spacing });
    expect(rotationErrorDegrees(h.transform, truth)).toBeLessThan(6);
    expect(displacementAt(h.transform, truth, [0, 0, 0])).toBeLessThan(3 * spacing);
  });

  it('absorbs a 5 degree disagreement between the directions through its tilts', () => {
    const A = face(lower, identity), B = face(upper, M);
    const dB = Array.from(applyToDirections(M, Float32Array.from(tilted([0, 1, 0], [1, 0, 0], 5)))) as [number, number, number];
    const [untilted] = searchAlongAxisDirections([0, 1, 0], A.points, A.normals, dB, B.points, B.normals, { spacing, tiltsDeg: [0] });
    const [h] = searchAlongAxisDirections([0, 1, 0], A.points, A.normals, dB, B.points, B.normals, { spacing, tiltsDeg: [-5, 0, 5] });
    expect(rotationErrorDegrees(h.transform, truth)).toBeLessThan(4);
    expect(rotationErrorDegrees(h.transform, truth)).toBeLessThan(rotationErrorDegrees(untilted.transform, truth));
    expect(h.tiltDeg.some((t) => t !== 0)).toBe(true);
  });

  it('answers the same after other searches have used its vote tables (each search leaves them empty)', () => {
    const A = face(lower, identity), B = face(upper, M);
    const dB = Array.from(applyToDirections(M, Float32Array.from([0, -1, 0]))) as [number, number, number];
    const first = searchAlongAxisDirections([0, 1, 0], A.points, A.normals, dB, B.points, B.normals, { spacing });
    // a search of the other piece against itself, of the same table size, then a smaller one
    searchAlongAxisDirections([0, 1, 0], B.points, B.normals, dB, A.points, A.normals, { spacing, tiltsDeg: [-5, 0, 5] });
    searchAlongAxisDirections([0, 1, 0], A.points, A.normals, dB, B.points, B.normals, { spacing, maxSamples: 20 });
    const again = searchAlongAxisDirections([0, 1, 0], A.points, A.normals, dB, B.points, B.normals, { spacing });
    expect(again.map((h) => h.votes)).toEqual(first.map((h) => h.votes));
    again.forEach((h, k) => h.transform.forEach((v, i) => expect(v).toBe(first[k].transform[i])));
    expect(rotationErrorDegrees(again[0].transform, truth)).toBeLessThan(6);
  });

  it('gives the same best motion when asked for more peaks than three (each peak the mean of its own votes)', () => {
    const A = face(lower, identity), B = face(upper, M);
    const dB = Array.from(applyToDirections(M, Float32Array.from([0, -1, 0]))) as [number, number, number];
    const three = searchAlongAxisDirections([0, 1, 0], A.points, A.normals, dB, B.points, B.normals, { spacing });
    const six = searchAlongAxisDirections([0, 1, 0], A.points, A.normals, dB, B.points, B.normals, { spacing, peaks: 6 });
    expect(six.length).toBe(6);
    for (let k = 1; k < six.length; k++) expect(six[k].votes).toBeLessThanOrEqual(six[k - 1].votes);
    expect(six[0].votes).toBe(three[0].votes);
    six[0].transform.forEach((v, i) => expect(v).toBe(three[0].transform[i]));
    // distinct bins give distinct motions
    expect(rotationErrorDegrees(six[4].transform, six[0].transform) + displacementAt(six[4].transform, six[0].transform, [0, 0, 0])).toBeGreaterThan(0.5);
  });

  it('finds the same motions, turned round, when the two faces are exchanged (no tilt)', () => {
    // the matcher's screen may move either face onto the other (screenWays): what it is given must not depend on which
    const A = face(lower, identity), B = face(upper, M);
    const dA: [number, number, number] = [0, 1, 0];
    const dB = Array.from(applyToDirections(M, Float32Array.from([0, -1, 0]))) as [number, number, number];
    const forward = searchAlongAxisDirections(dA, A.points, A.normals, dB, B.points, B.normals, { spacing });
    const back = searchAlongAxisDirections(dB, B.points, B.normals, dA, A.points, A.normals, { spacing });
    expect(forward.length).toBe(3);
    expect(back.map((h) => h.votes)).toEqual(forward.map((h) => h.votes));
    back.forEach((h, k) => {
      const turned = invert(h.transform);
      expect(rotationErrorDegrees(turned, forward[k].transform)).toBeLessThan(1e-3);
      expect(displacementAt(turned, forward[k].transform, [0, 0, 0])).toBeLessThan(1e-3 * spacing);
    });
    expect(rotationErrorDegrees(forward[0].transform, truth)).toBeLessThan(6);
    expect(displacementAt(forward[0].transform, truth, [0, 0, 0])).toBeLessThan(3 * spacing);
  });
});
