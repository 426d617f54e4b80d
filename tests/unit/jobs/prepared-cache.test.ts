/**
 * A fragment prepared by one propose worker and taken by another from the match cache
 * (fragment-cache.ts writePrepared / readPrepared, prepared-fragment.ts assemblePrepared): on the
 * Stanford bunny (open data in the npm package `bunny`) cut in two by a rough surface
 * (tests/support/bunny-cut.ts), the fragment built from the stored parts is the prepared fragment
 * itself (every sample, feature, tree and the axis; IEEE 754 float32 arrays survive a byte copy
 * unchanged) and matches the other piece exactly as the freshly prepared one does; a file cut
 * short, or one for another spacing, is a miss.
 */
import { mkdtempSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { cutBunny, type CutPiece } from '../../support/bunny-cut';
import { breakFaceFromLabels } from '../../support/break-face-from-labels';
import { assemblePrepared, DEFAULT_FPFH_RADIUS_SPACINGS, defaultSpacing, prepareFragment, preparedParts, type FragmentInput } from '../../../core/geometry/proposals/prepared-fragment';
import { matchFragments } from '../../../core/geometry/proposals/pairwise-match';
import { applyToPoints, rotationAboutAxis, transformFrom } from '../../../core/geometry/registration/rigid-transform';
import { readPrepared, writePrepared } from '../../../core/jobs/fragment-cache';

let inputA: FragmentInput, inputB: FragmentInput, spacing: number;

function input(piece: CutPiece, motion: number[]): FragmentInput {
  const positions = applyToPoints(motion, piece.positions) as Float32Array;
  const face = breakFaceFromLabels(positions, piece.triangles, piece.onCut, spacing);
  // a second face given by its samples only (resampled rather than sampled from triangles): several faces, both paths
  return { positions, triangles: piece.triangles, faces: [face, { points: face.points, normals: face.normals, outline: face.outline, area: face.area }] };
}

beforeAll(async () => {
  const { lower, upper, diagonal } = await cutBunny();
  spacing = defaultSpacing([diagonal]);
  inputA = input(lower, transformFrom([1, 0, 0, 0, 1, 0, 0, 0, 1], [0, 0, 0]));
  inputB = input(upper, transformFrom(rotationAboutAxis([1, 2, -1], 2.2), [60, -30, 90]));
});

describe('prepared fragments in the match cache', () => {
  it('the fragment built from stored parts is the prepared fragment, and matches the same', () => {
    const dir = mkdtempSync(join(tmpdir(), 'knitbone-prepared-'));
    const sampling = { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS };
    const A = prepareFragment(inputA, sampling), B = prepareFragment(inputB, sampling);
    expect(A.faces.length).toBeGreaterThan(1);
    writePrepared(dir, 'a', sampling, preparedParts(A));
    writePrepared(dir, 'b', sampling, preparedParts(B));
    const A2 = assemblePrepared(inputA, readPrepared(dir, 'a', sampling)!);
    const B2 = assemblePrepared(inputB, readPrepared(dir, 'b', sampling)!);
    expect(A2).toEqual(A);
    expect(B2).toEqual(B);
    expect(matchFragments(A2, B2)).toEqual(matchFragments(A, B));
  });

  it('a file cut short or for another spacing is a miss', () => {
    const dir = mkdtempSync(join(tmpdir(), 'knitbone-prepared-'));
    const sampling = { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS };
    writePrepared(dir, 'a', sampling, preparedParts(prepareFragment(inputA, sampling)));
    expect(readPrepared(dir, 'a', { ...sampling, spacing: 2 * spacing })).toBeUndefined();
    const [file] = readdirSync(dir);
    writeFileSync(join(dir, file), readFileSync(join(dir, file)).subarray(0, 1000));
    expect(readPrepared(dir, 'a', sampling)).toBeUndefined();
  });
});
