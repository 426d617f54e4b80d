import { closeSync, openSync, writeSync } from 'node:fs';

/**
 * Write a triangle mesh as binary little-endian PLY (the open format of Turk 1994): float
 * x, y, z per vertex and a uchar-counted int list per face. Header comments give the units.
 */
export function writeBinaryPly(path: string, positions: Float32Array, triangles: Uint32Array, comments: string[] = []): number {
  const nv = positions.length / 3;
  const nf = triangles.length / 3;
  const header =
    'ply\nformat binary_little_endian 1.0\n' +
    comments.map((c) => `comment ${c.replace(/\n/g, ' ')}\n`).join('') +
    `element vertex ${nv}\nproperty float x\nproperty float y\nproperty float z\n` +
    `element face ${nf}\nproperty list uchar int vertex_indices\nend_header\n`;
  const head = Buffer.from(header, 'ascii');
  const body = Buffer.alloc(nv * 12 + nf * 13);
  for (let i = 0; i < nv * 3; i++) body.writeFloatLE(positions[i], i * 4);
  let o = nv * 12;
  for (let f = 0; f < nf; f++) {
    body.writeUInt8(3, o);
    body.writeInt32LE(triangles[f * 3], o + 1);
    body.writeInt32LE(triangles[f * 3 + 1], o + 5);
    body.writeInt32LE(triangles[f * 3 + 2], o + 9);
    o += 13;
  }
  const fd = openSync(path, 'w');
  try {
    writeSync(fd, head);
    writeSync(fd, body);
  } finally {
    closeSync(fd);
  }
  return head.length + body.length;
}
