import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { MeshFileError, parseMeshFile } from '../../../core/geometry/parse/index';
import { obj, plyAscii, plyBinary, stlAscii, stlBinary } from './mesh-writers';
import { box } from './shapes';

/**
 * Mutated files (bytes flipped, cut, inserted, duplicated) fed to every reader: each run
 * ends with a MeshFileError that says something, or with a valid mesh (finite coordinates,
 * indices in range, at least one triangle). Never another exception, never a hang.
 */
const seedMesh = box(2, 3, 4);
const seeds: Array<[string, Uint8Array]> = [
  ['a.ply', plyAscii(seedMesh)],
  ['b.ply', plyBinary(seedMesh, true)],
  ['c.ply', plyBinary(seedMesh, false)],
  ['d.stl', stlAscii(seedMesh)],
  ['e.stl', stlBinary(seedMesh)],
  ['f.obj', obj(seedMesh)],
];

const mutation = fc.oneof(
  fc.record({ kind: fc.constant('flip' as const), at: fc.nat(), value: fc.integer({ min: 0, max: 255 }) }),
  fc.record({ kind: fc.constant('cut' as const), at: fc.nat(), value: fc.constant(0) }),
  fc.record({ kind: fc.constant('insert' as const), at: fc.nat(), value: fc.integer({ min: 0, max: 255 }) }),
  fc.record({ kind: fc.constant('digit' as const), at: fc.nat(), value: fc.integer({ min: 48, max: 57 }) }),
);

function mutate(bytes: Uint8Array, ms: Array<{ kind: string; at: number; value: number }>): Uint8Array {
  let b = Uint8Array.from(bytes);
  for (const m of ms) {
    const at = b.length ? m.at % b.length : 0;
    if (m.kind === 'flip' || m.kind === 'digit') b[at] = m.value;
    else if (m.kind === 'cut') b = b.slice(0, at);
    else {
      const c = new Uint8Array(b.length + 1);
      c.set(b.subarray(0, at));
      c[at] = m.value;
      c.set(b.subarray(at), at + 1);
      b = c;
    }
  }
  return b;
}

describe('fuzzing every reader with mutated files', () => {
  for (const [name, bytes] of seeds) {
    it(`${name}: a clear error or a valid mesh`, () => {
      fc.assert(
        fc.property(fc.array(mutation, { minLength: 1, maxLength: 4 }), (ms) => {
          const input = mutate(bytes, ms);
          try {
            const r = parseMeshFile(input, name);
            const nv = r.mesh.positions.length / 3;
            expect(r.mesh.triangles.length).toBeGreaterThan(0);
            expect(r.mesh.triangles.length % 3).toBe(0);
            for (const x of r.mesh.positions) expect(Number.isFinite(x)).toBe(true);
            for (const i of r.mesh.triangles) expect(i).toBeLessThan(nv);
          } catch (e) {
            if (!(e instanceof MeshFileError)) throw e;
            expect(e.message.length).toBeGreaterThan(10);
          }
        }),
        { numRuns: 150, seed: 5 },
      );
    });
  }
});
