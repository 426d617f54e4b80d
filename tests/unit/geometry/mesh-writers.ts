/**
 * Writers for test files, following the published layouts: PLY (Turk 1994, "The PLY polygon
 * file format"), STL (3D Systems' StereoLithography Interface Specification, 1989: 80-byte
 * header, uint32 count, 50 bytes per facet, little-endian) and Wavefront OBJ (1-based "v"/"f").
 */
import type { TriangleMesh } from '../../../core/geometry/mesh';

export function plyAscii(m: TriangleMesh): Uint8Array {
  const nv = m.positions.length / 3, nt = m.triangles.length / 3;
  const lines = ['ply', 'format ascii 1.0', 'comment test', `element vertex ${nv}`, 'property float x', 'property float y', 'property float z',
    `element face ${nt}`, 'property list uchar int vertex_indices', 'end_header'];
  for (let v = 0; v < nv; v++) lines.push(`${m.positions[3 * v]} ${m.positions[3 * v + 1]} ${m.positions[3 * v + 2]}`);
  for (let f = 0; f < nt; f++) lines.push(`3 ${m.triangles[3 * f]} ${m.triangles[3 * f + 1]} ${m.triangles[3 * f + 2]}`);
  return new TextEncoder().encode(lines.join('\n') + '\n');
}

export function plyBinary(m: TriangleMesh, littleEndian: boolean): Uint8Array {
  const nv = m.positions.length / 3, nt = m.triangles.length / 3;
  const header = ['ply', `format ${littleEndian ? 'binary_little_endian' : 'binary_big_endian'} 1.0`, `element vertex ${nv}`,
    'property float x', 'property float y', 'property float z', `element face ${nt}`, 'property list uchar int vertex_indices', 'end_header', ''].join('\n');
  const head = new TextEncoder().encode(header);
  const out = new Uint8Array(head.length + nv * 12 + nt * 13);
  out.set(head);
  const view = new DataView(out.buffer);
  let at = head.length;
  for (let i = 0; i < nv * 3; i++, at += 4) view.setFloat32(at, m.positions[i], littleEndian);
  for (let f = 0; f < nt; f++) {
    view.setUint8(at++, 3);
    for (let j = 0; j < 3; j++, at += 4) view.setInt32(at, m.triangles[3 * f + j], littleEndian);
  }
  return out;
}

export function stlBinary(m: TriangleMesh): Uint8Array {
  const nt = m.triangles.length / 3;
  const out = new Uint8Array(84 + 50 * nt);
  const view = new DataView(out.buffer);
  view.setUint32(80, nt, true);
  let at = 84;
  for (let f = 0; f < nt; f++) {
    at += 12; // normal left zero: readers recompute it
    for (let j = 0; j < 3; j++) for (let k = 0; k < 3; k++, at += 4) view.setFloat32(at, m.positions[3 * m.triangles[3 * f + j] + k], true);
    at += 2;
  }
  return out;
}

export function stlAscii(m: TriangleMesh): Uint8Array {
  const nt = m.triangles.length / 3;
  const lines = ['solid test'];
  for (let f = 0; f < nt; f++) {
    lines.push('  facet normal 0 0 0', '    outer loop');
    for (let j = 0; j < 3; j++) {
      const v = m.triangles[3 * f + j];
      lines.push(`      vertex ${m.positions[3 * v]} ${m.positions[3 * v + 1]} ${m.positions[3 * v + 2]}`);
    }
    lines.push('    endloop', '  endfacet');
  }
  lines.push('endsolid test');
  return new TextEncoder().encode(lines.join('\n') + '\n');
}

export function obj(m: TriangleMesh): Uint8Array {
  const nv = m.positions.length / 3, nt = m.triangles.length / 3;
  const lines = ['# test', 'o piece'];
  for (let v = 0; v < nv; v++) lines.push(`v ${m.positions[3 * v]} ${m.positions[3 * v + 1]} ${m.positions[3 * v + 2]}`);
  for (let f = 0; f < nt; f++) lines.push(`f ${m.triangles[3 * f] + 1} ${m.triangles[3 * f + 1] + 1} ${m.triangles[3 * f + 2] + 1}`);
  return new TextEncoder().encode(lines.join('\n') + '\n');
}
