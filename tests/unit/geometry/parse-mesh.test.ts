import { describe, expect, it } from 'vitest';
import { surfaceArea } from '../../../core/geometry/measure';
import { MeshFileError, parseMeshFile } from '../../../core/geometry/parse/index';
import { weldVertices } from '../../../core/geometry/weld';
import { obj, plyAscii, plyBinary, stlAscii, stlBinary } from './mesh-writers';
import { box, sphere } from './shapes';

const m = sphere(7, 6);
const area = surfaceArea(m);
const nt = m.triangles.length / 3;

function expectError(bytes: Uint8Array, name: string, pattern: RegExp): void {
  let caught: unknown;
  try {
    parseMeshFile(bytes, name);
  } catch (e) {
    caught = e;
  }
  expect(caught).toBeInstanceOf(MeshFileError);
  expect((caught as Error).message).toMatch(pattern);
}

describe('reading mesh files (three.js loaders plus our checks)', () => {
  const cases: Array<[string, Uint8Array, string, string]> = [
    ['PLY ASCII', plyAscii(m), 'a.ply', 'ply-ascii'],
    ['PLY binary little-endian', plyBinary(m, true), 'a.ply', 'ply-binary-le'],
    ['PLY binary big-endian', plyBinary(m, false), 'a.ply', 'ply-binary-be'],
    ['STL ASCII', stlAscii(m), 'a.stl', 'stl-ascii'],
    ['STL binary', stlBinary(m), 'a.stl', 'stl-binary'],
    ['OBJ', obj(m), 'a.obj', 'obj'],
  ];
  for (const [label, bytes, name, format] of cases) {
    it(`${label}: same triangles and area as written`, () => {
      const r = parseMeshFile(bytes, name);
      expect(r.format).toBe(format);
      expect(r.mesh.triangles.length / 3).toBe(nt);
      const welded = weldVertices(r.mesh, 1e-4).mesh;
      expect(welded.positions.length).toBe(m.positions.length);
      expect(surfaceArea(r.mesh)).toBeCloseTo(area, 3);
    });
  }

  it('finds the format from the first bytes when the extension is unknown', () => {
    expect(parseMeshFile(plyBinary(m, false), 'scan.dat').format).toBe('ply-binary-be');
    expect(parseMeshFile(stlAscii(m), 'scan').format).toBe('stl-ascii');
  });

  it('a truncated binary PLY is refused with the counts', () => {
    const b = plyBinary(m, true);
    expectError(b.subarray(0, b.length - 20), 'a.ply', /truncated/);
    expectError(b.subarray(0, 200), 'a.ply', /truncated/);
  });

  it('a PLY header that lies about its counts is refused', () => {
    const text = new TextDecoder().decode(plyAscii(m));
    const nv = m.positions.length / 3;
    expectError(new TextEncoder().encode(text.replace(`element vertex ${nv}`, `element vertex ${nv + 5}`)), 'a.ply', /vertex|face|values/);
    expectError(new TextEncoder().encode(text.replace(`element face ${nt}`, `element face ${nt - 3}`)), 'a.ply', /more lines than the header/);
    const bin = new TextDecoder('latin1').decode(plyBinary(m, true));
    const fewer = bin.replace(`element face ${nt}`, `element face ${nt - 2}`);
    expectError(Uint8Array.from(fewer, (c) => c.charCodeAt(0)), 'a.ply', /after the last element/);
  });

  it('NaN or infinite coordinates are refused', () => {
    const text = new TextDecoder().decode(plyAscii(box(1, 1, 1)));
    const lines = text.split('\n');
    const first = lines.indexOf('end_header') + 1;
    lines[first] = 'nan 0 0';
    expectError(new TextEncoder().encode(lines.join('\n')), 'a.ply', /not a finite number/);
    const o = new TextDecoder().decode(obj(box(1, 1, 1))).replace(/^v .*$/m, 'v 1 inf 0');
    expectError(new TextEncoder().encode(o), 'a.obj', /not a finite number/);
    const b = stlBinary(box(1, 1, 1));
    new DataView(b.buffer).setFloat32(84 + 12, Number.POSITIVE_INFINITY, true);
    expectError(b, 'a.stl', /not a finite number/);
  });

  it('face indices out of range are refused', () => {
    const text = new TextDecoder().decode(plyAscii(box(1, 1, 1)));
    expectError(new TextEncoder().encode(text.replace(/\n3 (\d+) (\d+) (\d+)\n/, '\n3 $1 $2 99\n')), 'a.ply', /refers to vertex 99/);
    const b = plyBinary(box(1, 1, 1), false);
    new DataView(b.buffer).setInt32(b.length - 4, -7, false);
    expectError(b, 'a.ply', /refers to vertex/);
    const o = new TextDecoder().decode(obj(box(1, 1, 1))).replace(/^f .*$/m, 'f 1 2 40');
    expectError(new TextEncoder().encode(o), 'a.obj', /only 8 vertices/);
  });

  it('files with no triangles, empty files and files over the size limit are refused', () => {
    expectError(new TextEncoder().encode('ply\nformat ascii 1.0\nelement vertex 1\nproperty float x\nproperty float y\nproperty float z\nelement face 0\nproperty list uchar int vertex_indices\nend_header\n0 0 0\n'), 'a.ply', /no triangles/);
    expectError(new TextEncoder().encode('v 0 0 0\nv 1 0 0\n'), 'a.obj', /no triangles/);
    expectError(new TextEncoder().encode('solid x\nendsolid x\n'), 'a.stl', /no triangles|no facets/);
    expectError(new Uint8Array(0), 'a.ply', /empty/);
    let caught: unknown;
    try { parseMeshFile(stlBinary(m), 'a.stl', 1000); } catch (e) { caught = e; }
    expect((caught as Error).message).toMatch(/over the limit of 1000 bytes/);
  });

  it('a truncated binary STL and an unclosed ASCII facet are refused', () => {
    const b = stlBinary(m);
    expectError(b.subarray(0, b.length - 10), 'a.stl', /truncated/);
    const a = new TextDecoder().decode(stlAscii(box(1, 1, 1)));
    expectError(new TextEncoder().encode(a.slice(0, a.lastIndexOf('endfacet'))), 'a.stl', /not closed/);
  });
});
