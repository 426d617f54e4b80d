/**
 * An invented excavation for spatial benchmarks: a grid of 2 m units, three layers whose
 * tops slope gently, piece-plotted specimens scattered in clusters, and joins mostly between
 * near neighbours with a few long and cross-layer ones. Deterministic for a given seed.
 */
import type { SiteDefinitions, SpatialJoin, SpatialSpecimen } from '../../core/spatial/types';
import { mulberry32 } from '../../core/geometry/seeded-random';

export interface InventedSite {
  specimens: SpatialSpecimen[];
  joins: SpatialJoin[];
  site: SiteDefinitions;
}

const KINDS: [string, string | null][] = [
  ['conjoin', 'fresh'], ['conjoin', 'fresh'], ['conjoin', 'dry'], ['conjoin', 'dry'], ['conjoin', 'modern'], ['articulation', null], ['pair', null],
];

export function inventedSite(specimenCount: number, joinCount: number, seed = 7, unitsPerSide = 10): InventedSite {
  const rand = mulberry32(seed);
  const gauss = () => Math.sqrt(-2 * Math.log(1 - rand())) * Math.cos(2 * Math.PI * rand());
  const side = 2;
  const units = [];
  for (let i = 0; i < unitsPerSide; i++) {
    for (let j = 0; j < unitsPerSide; j++) {
      units.push({ unit: `N${j * side}E${i * side}`, xMin: 100 + i * side, yMin: 200 + j * side, xMax: 100 + (i + 1) * side, yMax: 200 + (j + 1) * side });
    }
  }
  const extent = unitsPerSide * side;
  // Layer tops: A from 10.0 m down to B at 9.6 and C at 9.1, sloping 1 cm per metre east.
  const top = (layer: number, x: number) => [10.0, 9.6, 9.1][layer] - 0.01 * (x - 100);
  const layerBoundaries = [];
  for (let layer = 0; layer < 3; layer++) {
    for (let i = 0; i <= unitsPerSide; i++) {
      const x = 100 + i * side;
      layerBoundaries.push({ layer: 'ABC'[layer], x, y: 200 + extent / 2, z: top(layer, x) + 0.03 * Math.sin(i) });
    }
  }
  const levels = [];
  for (let l = 1; l <= 12; l++) levels.push({ unit: null, level: String(l), topZ: 10.0 - (l - 1) * 0.1, bottomZ: 10.0 - l * 0.1 });

  const clusters = Array.from({ length: 25 }, () => ({ x: 100 + rand() * extent, y: 200 + rand() * extent, r: 0.5 + rand() * 2 }));
  const specimens: SpatialSpecimen[] = [];
  const clusterOf: number[] = [];
  for (let id = 1; id <= specimenCount; id++) {
    const ci = Math.floor(rand() * clusters.length);
    clusterOf.push(ci);
    const c = clusters[ci];
    // Scatter around the cluster centre, drawing again whatever falls outside the excavation.
    let x = c.x + gauss() * c.r;
    let y = c.y + gauss() * c.r;
    while (x < 100 || x >= 100 + extent || y < 200 || y >= 200 + extent) {
      x = c.x + gauss() * c.r;
      y = c.y + gauss() * c.r;
    }
    const z = 10.0 - 0.02 - rand() * 1.15 - 0.01 * (x - 100);
    const layer = z > top(1, x) ? 'A' : z > top(2, x) ? 'B' : 'C';
    const level = String(Math.min(12, Math.max(1, Math.ceil((10.0 - z) / 0.1))));
    const unit = `N${Math.floor((y - 200) / side) * side}E${Math.floor((x - 100) / side) * side}`;
    const unplotted = rand() < 0.03; // a few sieved finds: unit and level only
    specimens.push({
      id,
      catalogueNo: `K-${String(id).padStart(5, '0')}`,
      unit,
      level,
      layer,
      x: unplotted ? null : Math.round(x * 1000) / 1000,
      y: unplotted ? null : Math.round(y * 1000) / 1000,
      z: unplotted ? null : Math.round(z * 1000) / 1000,
      taxon: rand() < 0.6 ? 'Cervus elaphus' : rand() < 0.5 ? 'Bos primigenius' : 'Sus scrofa',
    });
  }
  // Joins: the partner is the nearest (in space, with elevation weighted up) of a few specimens
  // drawn from the same cluster, so most joins are short and within a layer; some reach far.
  const members = clusters.map(() => [] as SpatialSpecimen[]);
  specimens.forEach((s, i) => members[clusterOf[i]].push(s));
  const place = (s: SpatialSpecimen) => ({ x: s.x ?? 0, y: s.y ?? 0, z: s.z ?? 0 });
  const joins: SpatialJoin[] = [];
  for (let id = 1; id <= joinCount; id++) {
    const a = specimens[Math.floor(rand() * specimens.length)];
    const pool = rand() < 0.06 ? specimens : members[clusterOf[a.id - 1]];
    let best: SpatialSpecimen | undefined;
    let bestD = Infinity;
    for (let t = 0; t < 12; t++) {
      const c = pool[Math.floor(rand() * pool.length)];
      if (c.id === a.id) continue;
      const p = place(a);
      const q = place(c);
      const d = Math.hypot(p.x - q.x, p.y - q.y, 4 * (p.z - q.z));
      if (d < bestD) {
        bestD = d;
        best = c;
      }
    }
    const b = best ?? specimens[(a.id) % specimens.length];
    const [type, breakAge] = KINDS[Math.floor(rand() * KINDS.length)];
    joins.push({ id, a: a.id, b: b.id, type, breakAge });
  }
  return { specimens, joins, site: { units, levels, layerBoundaries } };
}
