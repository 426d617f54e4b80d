/**
 * The proposal run's per-scan cache: what is written is read back bit for bit (IEEE 754 float32
 * and uint32 arrays survive a byte copy unchanged), a different scan content, settings or region
 * correction gives a different key, and a damaged file reads as a miss, never as wrong data.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { fragmentKey, readFragment, readSummary, readTraits, writeFragment, writeProblem, writeTraits, type CachedFragment } from '../../../core/jobs/fragment-cache';

const fragment: CachedFragment = {
  summary: { faceAreas: [12.5, 3], diagonalMm: 41.2, centroid: [1, 2, 3], axis: { direction: [0, 0, 1], point: [4, 5, 6], support: 0.8 } },
  input: {
    positions: Float32Array.of(0, 0, 0, 1, 0, 0, 0, 1, 0, 0, 0, 1.5),
    triangles: Uint32Array.of(0, 1, 2, 0, 2, 3),
    faces: [
      { points: Float32Array.of(0.1, 0.2, 0.3), normals: Float32Array.of(0, 0, -1), outline: Float32Array.of(0, 0, 0, 1, 1, 1), area: 12.5, triangleIds: Uint32Array.of(1) },
      { points: Float32Array.of(-1e-7, 3.4e38, 7), normals: Float32Array.of(1, 0, 0), outline: new Float32Array(0), area: 3 },
    ],
  },
};

describe('fragment cache', () => {
  const dir = mkdtempSync(join(tmpdir(), 'knitbone-cache-'));

  it('reads back what it wrote', () => {
    writeFragment(dir, 'k1', fragment);
    const back = readFragment(dir, 'k1')!;
    expect(back.summary).toEqual(fragment.summary);
    expect(back.input.positions).toEqual(fragment.input.positions);
    expect(back.input.triangles).toEqual(fragment.input.triangles);
    expect(back.input.faces[0]).toEqual(fragment.input.faces[0]);
    expect(back.input.faces[1].points).toEqual(fragment.input.faces[1].points);
    expect(back.input.faces[1].triangleIds).toBeUndefined();
    const sampling = { spacing: 1.2, fpfhRadiusSpacings: 5 };
    writeTraits(dir, 'k1', sampling, { parents: [0], traits: [{ area: 2, extents: [3, 2, 0.1], normalSpread: [0.9, 0.1, 0], meanFpfh: Float32Array.of(1, 2) }] });
    expect(readTraits(dir, 'k1', sampling)!.traits[0].meanFpfh).toEqual(Float32Array.of(1, 2));
    expect(readTraits(dir, 'k1', { ...sampling, spacing: 0.85 })).toBeUndefined();
  });

  it('reads back the pieces of faces cut at rim corners, each with its own face', () => {
    const withPieces: CachedFragment = {
      ...fragment,
      input: {
        ...fragment.input,
        faces: [
          { ...fragment.input.faces[0] },
          { ...fragment.input.faces[1], triangleIds: Uint32Array.of(0, 1), pieces: [Uint32Array.of(0), Uint32Array.of(1)] },
          { ...fragment.input.faces[0], pieces: [Uint32Array.of(1, 0), Uint32Array.of(0)] },
        ],
      },
    };
    writeFragment(dir, 'k-pieces', withPieces);
    const back = readFragment(dir, 'k-pieces')!;
    expect(back.input.faces[0].pieces).toBeUndefined();
    expect(back.input.faces[1].pieces).toEqual([Uint32Array.of(0), Uint32Array.of(1)]);
    expect(back.input.faces[2].pieces).toEqual([Uint32Array.of(1, 0), Uint32Array.of(0)]);
  });

  it('keys change with the scan content, units, settings and region corrections', () => {
    const base = fragmentKey('abc', 'mm', { smoothing: 2 }, [[3, 'fracture']]);
    expect(fragmentKey('abc', 'mm', { smoothing: 2 }, [[3, 'fracture']])).toBe(base);
    expect(fragmentKey('abd', 'mm', { smoothing: 2 }, [[3, 'fracture']])).not.toBe(base);
    expect(fragmentKey('abc', 'cm', { smoothing: 2 }, [[3, 'fracture']])).not.toBe(base);
    expect(fragmentKey('abc', 'mm', { smoothing: 3 }, [[3, 'fracture']])).not.toBe(base);
    expect(fragmentKey('abc', 'mm', { smoothing: 2 }, [[3, 'medullary']])).not.toBe(base);
    expect(fragmentKey('abc', 'mm', { smoothing: 2 }, [])).not.toBe(base);
  });

  it('a damaged or cut-short file is a miss; a scan that cannot be matched keeps its reason', () => {
    writeFragment(dir, 'k2', fragment);
    const file = join(dir, 'k2.bin');
    writeFileSync(file, readFileSync(file).subarray(0, 40));
    expect(readFragment(dir, 'k2')).toBeUndefined();
    writeProblem(dir, 'k3', 'no break face was found');
    expect(readSummary(dir, 'k3')!.problem).toBe('no break face was found');
    expect(readFragment(dir, 'k3')).toBeUndefined();
  });
});
