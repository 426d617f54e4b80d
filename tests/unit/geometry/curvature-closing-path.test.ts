import { describe, expect, it } from 'vitest';
import { vertexRings } from '../../../core/geometry/adjacency';
import { cheapestClosingPath, createClosingPathSpace, vertexBendOf, type ClosingPathMesh } from '../../../core/geometry/curvature-closing-path';
import type { TriangleMesh } from '../../../core/geometry/mesh';

/**
 * A flat square grid, spacing h, each square cut into two triangles along the same diagonal
 * direction. Along a row the mesh edges are a straight line, so the cheapest path between two
 * vertices of one row on a flat (bend 0) sheet is that row and costs exactly its length, the
 * plane's geodesic distance (analytic geometry). Where one row bends (curvature k), an edge
 * touching it costs length / (1 + w k h) (the metric of curvature-closing-path.ts, after
 * Kimmel & Sethian 1998), and the path moves onto that row.
 */
function grid(cols: number, rows: number, h: number): TriangleMesh {
  const positions = new Float32Array(3 * cols * rows);
  for (let y = 0; y < rows; y++) for (let x = 0; x < cols; x++) positions.set([x * h, y * h, 0], 3 * (y * cols + x));
  const tris: number[] = [];
  for (let y = 0; y + 1 < rows; y++) {
    for (let x = 0; x + 1 < cols; x++) {
      const a = y * cols + x, b = a + 1, c = a + cols, d = c + 1;
      tris.push(a, b, d, a, d, c);
    }
  }
  return { positions, triangles: Uint32Array.from(tris) };
}

const cols = 11, rows = 5, h = 0.5;
const at = (x: number, y: number): number => y * cols + x;

function closingMesh(bendRow: number | null, k: number): ClosingPathMesh {
  const mesh = grid(cols, rows, h);
  const k1 = new Float32Array(cols * rows), k2 = new Float32Array(cols * rows);
  if (bendRow !== null) for (let x = 0; x < cols; x++) { k1[at(x, bendRow)] = -k; k2[at(x, bendRow)] = 0; }
  return { positions: mesh.positions, rings: vertexRings(mesh), vertexBend: vertexBendOf(k1, k2), meanEdge: h };
}

function pathOf(space: ReturnType<typeof createClosingPathSpace>, target: number): number[] {
  const out: number[] = [];
  for (let v = target; v >= 0; v = space.prev[v]) out.push(v);
  return out.reverse();
}

describe('cheapest closing path over a curvature metric', () => {
  it('on a flat sheet runs straight along the row and costs its length (plane geodesic)', () => {
    const mesh = closingMesh(null, 0);
    const space = createClosingPathSpace(cols * rows);
    const goal = at(8, 2);
    const target = cheapestClosingPath(mesh, at(2, 2), 10, 4, (v) => v === goal, null, space);
    expect(target).toBe(goal);
    expect(space.dist[goal]).toBeCloseTo(6 * h, 6);
    expect(pathOf(space, goal)).toEqual([2, 3, 4, 5, 6, 7, 8].map((x) => at(x, 2)));
  });

  it('moves onto a strongly bent row when that is cheaper, at the cost the metric gives', () => {
    // Row 3 bends with k = 2/mm; w = 4, h = 0.5: an edge touching it costs length / 5.
    const mesh = closingMesh(3, 2);
    const space = createClosingPathSpace(cols * rows);
    const goal = at(8, 2);
    const target = cheapestClosingPath(mesh, at(2, 2), 10, 4, (v) => v === goal, null, space);
    expect(target).toBe(goal);
    const path = pathOf(space, goal);
    expect(path.some((v) => Math.floor(v / cols) === 3)).toBe(true);
    // The best path by hand: the diagonals join (x, y) to (x + 1, y + 1), so the cheapest way
    // up is the diagonal (2,2)-(3,3) (h sqrt 2 / 5), then five edges along the bent row to (8,3)
    // (5h / 5) and the vertical edge down (h / 5): (6 + sqrt 2) h / 5, against 6h straight.
    expect(space.dist[goal]).toBeCloseTo(((6 + Math.SQRT2) * h) / 5, 6);
    expect(path).toEqual([at(2, 2), at(3, 3), at(4, 3), at(5, 3), at(6, 3), at(7, 3), at(8, 3), at(8, 2)]);
  });

  it('stays within the reach and the allowed vertices, and reports no target when it cannot get there', () => {
    const mesh = closingMesh(null, 0);
    const space = createClosingPathSpace(cols * rows);
    const goal = at(10, 2);
    expect(cheapestClosingPath(mesh, at(2, 2), 3 * h, 4, (v) => v === goal, null, space)).toBe(-1);
    // A wall at column 5 that the search may not enter.
    expect(cheapestClosingPath(mesh, at(2, 2), 10, 4, (v) => v === goal, (v) => v % cols !== 5, space)).toBe(-1);
    // The space is reset by the next search: the same search without limits finds the goal.
    expect(cheapestClosingPath(mesh, at(2, 2), 10, 4, (v) => v === goal, null, space)).toBe(goal);
    expect(space.dist[goal]).toBeCloseTo(8 * h, 6);
  });
});
