import type { SurfaceClass } from './surface-classes';

/**
 * Fracture patches too small to be a break face: connected sets of fracture regions whose
 * area is under `minArea` (mm²) are given the original class they share most border with.
 * They are scanner noise, a rough spot, or a sliver of crease: too small to measure a
 * fracture angle on or to match, and they would otherwise be reported as faces of their own.
 * Works on the program's own classes (the analyst's corrections go on top afterwards, so a
 * correction changes only the region corrected). Returns the new class of each region.
 */
export function absorbSmallFractureRegions(
  region: Uint32Array,
  neighbours: Int32Array,
  areas: Float64Array,
  classes: SurfaceClass[],
  minArea: number,
): SurfaceClass[] {
  const out = [...classes];
  const n = classes.length;
  if (minArea <= 0) return out;
  // Region adjacency with shared edge counts.
  const shared: Array<Map<number, number>> = Array.from({ length: n }, () => new Map());
  const regionArea = new Float64Array(n);
  for (let f = 0; f < region.length; f++) {
    const r = region[f];
    regionArea[r] += areas[f];
    for (let j = 0; j < 3; j++) {
      const g = neighbours[3 * f + j];
      if (g < 0 || region[g] === r) continue;
      const m = shared[r];
      m.set(region[g], (m.get(region[g]) ?? 0) + 1);
    }
  }
  const seen = new Uint8Array(n);
  for (let s = 0; s < n; s++) {
    if (seen[s] || classes[s] !== 'fracture') continue;
    const group = [s];
    seen[s] = 1;
    for (let k = 0; k < group.length; k++) {
      for (const r of shared[group[k]].keys()) {
        if (!seen[r] && classes[r] === 'fracture') { seen[r] = 1; group.push(r); }
      }
    }
    const area = group.reduce((sum, r) => sum + regionArea[r], 0);
    if (area >= minArea) continue;
    const votes = new Map<SurfaceClass, number>();
    for (const r of group) {
      for (const [o, c] of shared[r]) if (classes[o] !== 'fracture') votes.set(classes[o], (votes.get(classes[o]) ?? 0) + c);
    }
    if (votes.size === 0) continue;
    const best = [...votes.entries()].sort((x, y) => y[1] - x[1])[0][0];
    for (const r of group) out[r] = best;
  }
  return out;
}
