/**
 * Break faces cut at corners of their rim against the outer surface (face-corner-split.ts).
 * Test pieces are flat grids (1 mm cells, analytic geometry) on which a band of triangles
 * stands for a break face through the wall: on one side of the band lies "outer surface", on
 * the other side the other rim. An L-shaped band turns by 90 degrees at its outer corner
 * (10, 10); the shortest cut across the band from there runs along the diagonal (grid edges)
 * to the inner corner (16, 16), so the two arms become two faces, each holding only its own
 * arm. A straight band and a band
 * that bends by 20 degrees (under the 35 degree corner angle) stay one face.
 */
import { describe, expect, it } from 'vitest';
import { splitFacesAtCorners, type CornerSplitSettings } from '../../../core/geometry/face-corner-split';
import { triangleNormalsAndAreas, type TriangleMesh } from '../../../core/geometry/mesh';
import { prepareFragment } from '../../../core/geometry/proposals/prepared-fragment';
import { buildTopology } from '../../../core/geometry/topology';

const SIZE = 40;

function grid(): TriangleMesh {
  const positions: number[] = [];
  for (let j = 0; j <= SIZE; j++) for (let i = 0; i <= SIZE; i++) positions.push(i, j, 0);
  const triangles: number[] = [];
  const v = (i: number, j: number): number => j * (SIZE + 1) + i;
  for (let j = 0; j < SIZE; j++) for (let i = 0; i < SIZE; i++) triangles.push(v(i, j), v(i + 1, j), v(i + 1, j + 1), v(i, j), v(i + 1, j + 1), v(i, j + 1));
  return { positions: Float32Array.from(positions), triangles: Uint32Array.from(triangles) };
}

function centroid(mesh: TriangleMesh, f: number): [number, number] {
  const t = mesh.triangles, p = mesh.positions;
  let x = 0, y = 0;
  for (let k = 0; k < 3; k++) { x += p[3 * t[3 * f + k]] / 3; y += p[3 * t[3 * f + k] + 1] / 3; }
  return [x, y];
}

const settings: CornerSplitSettings = { cornerAngleDeg: 35, windowMm: 4, minFaceArea: 60, minOuterEdge: 12, minNormalDeg: 0, maxCuts: 3 };

/** Faces (groups) of the band after splitting; the band is `inBand`, outer surface is `isOuterAt`. */
function split(inBand: (x: number, y: number) => boolean, isOuterAt: (x: number, y: number) => boolean, options = settings): { mesh: TriangleMesh; group: Int32Array } {
  const mesh = grid();
  const { neighbours } = buildTopology(mesh);
  const { normals, areas } = triangleNormalsAndAreas(mesh);
  const nt = areas.length;
  const group = new Int32Array(nt).fill(-1);
  const outer = new Uint8Array(nt);
  for (let f = 0; f < nt; f++) {
    const [x, y] = centroid(mesh, f);
    if (inBand(x, y)) group[f] = 0;
    else if (isOuterAt(x, y)) outer[f] = 1;
  }
  return { mesh, group: splitFacesAtCorners(mesh, neighbours, normals, areas, group, (f) => outer[f] === 1, options) };
}

describe('break faces cut at corners of the outer rim', () => {
  // L-shaped band: arm A along x (y 10-16, x 10-36), arm B along y (x 10-16, y 10-36); outer
  // surface below y = 10 and left of x = 10.
  const inL = (x: number, y: number): boolean => (y > 10 && y < 16 && x > 10 && x < 36) || (x > 10 && x < 16 && y > 10 && y < 36);
  const outsideL = (x: number, y: number): boolean => y < 10 || x < 10;

  it('an L-shaped face is cut at its corner into its two arms', () => {
    const { mesh, group } = split(inL, outsideL);
    const groups = new Set([...group].filter((g) => g >= 0));
    expect(groups.size).toBe(2);
    // Far end of each arm: arm A beyond x > 22, arm B beyond y > 22 (clear of the cut from (10, 10) to (16, 16)).
    const armA = new Set<number>(), armB = new Set<number>();
    for (let f = 0; f < group.length; f++) {
      if (group[f] < 0) continue;
      const [x, y] = centroid(mesh, f);
      if (x > 22) armA.add(group[f]);
      if (y > 22) armB.add(group[f]);
    }
    expect(armA.size).toBe(1);
    expect(armB.size).toBe(1);
    expect([...armA][0]).not.toBe([...armB][0]);
    // The cut runs from the outer corner to the inner corner along x = y: every triangle
    // below that line belongs to arm A's face, every one above it to arm B's.
    const a = [...armA][0];
    for (let f = 0; f < group.length; f++) {
      if (group[f] < 0) continue;
      const [x, y] = centroid(mesh, f);
      expect(group[f] === a).toBe(x > y);
    }
  });

  it('switched off (corner angle 180) or with pieces required larger than an arm, it stays one face', () => {
    expect(new Set([...split(inL, outsideL, { ...settings, cornerAngleDeg: 180 }).group].filter((g) => g >= 0)).size).toBe(1);
    expect(new Set([...split(inL, outsideL, { ...settings, minFaceArea: 200 }).group].filter((g) => g >= 0)).size).toBe(1);
  });

  it('a straight band and a band bending by 20 degrees stay one face', () => {
    const straight = split((x, y) => y > 10 && y < 16 && x > 2 && x < 38, (_x, y) => y < 10);
    expect(new Set([...straight.group].filter((g) => g >= 0)).size).toBe(1);
    // Bend at x = 20: the lower edge rises at tan(20 degrees) beyond it.
    const k = Math.tan((20 * Math.PI) / 180);
    const low = (x: number): number => 8 + Math.max(0, x - 20) * k;
    const bent = split((x, y) => y > low(x) && y < low(x) + 6 && x > 2 && x < 38, (x, y) => y < low(x));
    expect(new Set([...bent.group].filter((g) => g >= 0)).size).toBe(1);
  });
});

describe('the matcher matches corner pieces besides the whole face', () => {
  it('prepareFragment adds one patch per piece, sampled from that piece only', () => {
    const inL = (x: number, y: number): boolean => (y > 10 && y < 16 && x > 10 && x < 36) || (x > 10 && x < 16 && y > 10 && y < 36);
    const { mesh, group } = split(inL, (x, y) => y < 10 || x < 10);
    const face: number[] = [];
    const byGroup = new Map<number, number[]>();
    for (let f = 0; f < group.length; f++) {
      if (group[f] < 0) continue;
      face.push(f);
      (byGroup.get(group[f]) ?? byGroup.set(group[f], []).get(group[f])!).push(f);
    }
    const pieces = [...byGroup.values()].map((x) => Uint32Array.from(x));
    expect(pieces.length).toBe(2);
    const input = { positions: mesh.positions, triangles: mesh.triangles, faces: [{ points: new Float32Array(0), normals: new Float32Array(0), triangleIds: Uint32Array.from(face), area: face.length / 2, pieces }] };
    const sampling = { spacing: 0.5, fpfhRadiusSpacings: 5 };
    const withPieces = prepareFragment(input, sampling);
    const without = prepareFragment({ ...input, faces: [{ ...input.faces[0], pieces: undefined }] }, sampling);
    expect(withPieces.faces.length).toBe(without.faces.length + 2);
    // The added faces: every sample on its own arm's side of the cut x = y (within half a cell).
    const added = withPieces.faces.slice(without.faces.length);
    const sides = added.map((f) => {
      let below = 0, above = 0;
      for (let i = 0; i < f.points.length; i += 3) { if (f.points[i] - f.points[i + 1] > 0.5) below++; else if (f.points[i + 1] - f.points[i] > 0.5) above++; }
      expect(f.parent).toBe(0);
      expect(Math.min(below, above)).toBe(0);
      return below > above ? 'A' : 'B';
    });
    expect(new Set(sides).size).toBe(2);
  });
});
