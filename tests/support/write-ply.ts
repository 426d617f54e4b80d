import { writeFileSync } from 'node:fs';

/** Write an ASCII PLY (vertices and triangles): the open format every scanner exports. */
export function writePly(path: string, positions: ArrayLike<number>, triangles: ArrayLike<number>): void {
  const nv = positions.length / 3, nt = triangles.length / 3;
  const lines = ['ply', 'format ascii 1.0', `element vertex ${nv}`, 'property float x', 'property float y', 'property float z', `element face ${nt}`, 'property list uchar int vertex_indices', 'end_header'];
  for (let i = 0; i < nv; i++) lines.push(`${positions[3 * i]} ${positions[3 * i + 1]} ${positions[3 * i + 2]}`);
  for (let t = 0; t < nt; t++) lines.push(`3 ${triangles[3 * t]} ${triangles[3 * t + 1]} ${triangles[3 * t + 2]}`);
  writeFileSync(path, lines.join('\n') + '\n');
}
