/**
 * The common refinement of two labellings of a mesh's triangles: two triangles share a label
 * in the result exactly when they share one in both. `byTriangle` labels triangles (-1: not
 * labelled, kept -1); `byRegion` labels regions (-1 counts as one more label), read through
 * `region` (the region of each triangle). Labels are numbered 0, 1, ... in order of first
 * appearance.
 *
 * Worked example: byTriangle [0, 0, 0, 1, -1], region [0, 0, 1, 1, 2], byRegion [5, 6, 6]
 * gives [0, 0, 1, 2, -1]: triangles 0-1 (face 0, group 5), 2 (face 0, group 6), 3 (face 1).
 */
export function refinePartition(byTriangle: Int32Array, byRegion: Int32Array, region: Uint32Array): Int32Array {
  const out = new Int32Array(byTriangle.length);
  let span = 1;
  for (const b of byRegion) if (b + 2 > span) span = b + 2;
  const ids = new Map<number, number>();
  for (let f = 0; f < byTriangle.length; f++) {
    const a = byTriangle[f];
    if (a < 0) { out[f] = -1; continue; }
    const key = a * span + byRegion[region[f]] + 1;
    let id = ids.get(key);
    if (id === undefined) { id = ids.size; ids.set(key, id); }
    out[f] = id;
  }
  return out;
}
