import { describe, expect, it } from 'vitest';
import { analyseRefits } from '../../../core/spatial/analyse';
import { spatialReport } from '../../../core/spatial/report';
import { noSiteDefinitions, type SiteDefinitions } from '../../../core/spatial/types';
import { join, specimen } from './fixtures';

// Hand-worked cases: every expected value below is worked out by hand in the comment beside
// it from the coordinates given (analytic geometry, arithmetic means and medians).

const site: SiteDefinitions = {
  units: [{ unit: 'N1E1', xMin: 1, yMin: 1, xMax: 2, yMax: 2 }],
  levels: [
    { unit: null, level: '3', topZ: 1.3, bottomZ: 1.2 },
    { unit: 'N1E1', level: '4', topZ: 1.2, bottomZ: 1.0 },
  ],
  layerBoundaries: [],
};

describe('analyseRefits', () => {
  it('hand-worked case (issue 8): measures one piece-plotted join', () => {
    const s = [
      specimen(1, { x: 0, y: 0, z: 1.2, unit: 'N0E0', level: '3', layer: 'B' }),
      specimen(2, { x: 3, y: 4, z: 1.05, unit: 'N4E3', level: '4', layer: 'B' }),
    ];
    const r = spatialReport(analyseRefits(s, [join(1, 2, 'conjoin-dry', 7)], noSiteDefinitions));
    expect(r.joins).toEqual([
      {
        id: 7,
        a: 'S-1',
        b: 'S-2',
        type: 'conjoin',
        breakAge: 'dry',
        horizontalM: 5, // 3-4-5 triangle
        verticalM: 0.15, // 1.20 - 1.05
        distance3dM: 5.002, // sqrt(25.0225) = 5.00225
        bearingDeg: 36.87, // atan(3/4)
        crossesUnit: true,
        crossesLevel: true,
        crossesLayer: false,
        approximate: false,
      },
    ]);
  });

  it('hand-worked case: a specimen with unit and level only takes the unit centre and level mid-depth', () => {
    const s = [
      specimen(1, { x: 0, y: 0, z: 1.2, level: '3' }),
      // Unit N1E1 spans x 1..2, y 1..2: centre (1.5, 1.5). Level 4 in N1E1: 1.20..1.00, mid 1.10.
      specimen(2, { unit: 'N1E1', level: '4' }),
    ];
    const a = analyseRefits(s, [join(1, 2)], site);
    expect(a.joins).toHaveLength(1);
    const j = a.joins[0];
    expect(j.approximate).toBe(true);
    expect(j.to).toMatchObject({ x: 1.5, y: 1.5, approximate: true });
    expect(j.to.z).toBeCloseTo(1.1, 10);
    expect(j.horizontalM).toBeCloseTo(Math.SQRT2 * 1.5, 10); // sqrt(1.5^2 + 1.5^2) = 2.1213
    expect(j.verticalM).toBeCloseTo(0.1, 10); // 1.20 - 1.10
    expect(j.bearingDeg).toBeCloseTo(45, 10); // equal steps east and north
    expect(a.summary.approximateCount).toBe(1);
  });

  it('uses a site-wide level where the unit has none of its own', () => {
    // Level 3 site-wide: 1.30..1.20, mid 1.25.
    const s = [specimen(1, { x: 1.5, y: 1.5, z: 1.25 }), specimen(2, { unit: 'N1E1', level: '3' })];
    const j = analyseRefits(s, [join(1, 2)], site).joins[0];
    expect(j.horizontalM).toBeCloseTo(0, 10);
    expect(j.verticalM).toBeCloseTo(0, 10);
    expect(j.bearingDeg).toBeNull();
  });

  it('leaves out and counts joins whose specimens have no position and no defined unit or level', () => {
    const s = [
      specimen(1, { x: 0, y: 0, z: 1 }),
      specimen(2, { x: 1, y: 0, z: 1 }),
      specimen(3), // nothing recorded
      specimen(4, { unit: 'N9E9', level: '3' }), // unit not defined
      specimen(5, { unit: 'N1E1', level: '99' }), // level not defined
      specimen(6, { x: 1, y: 1 }), // no z and no level
    ];
    const a = analyseRefits(s, [join(1, 2, 'pair', 1), join(1, 3, 'pair', 2), join(1, 4, 'pair', 3), join(2, 5, 'pair', 4), join(2, 6, 'pair', 5), join(1, 99, 'pair', 6)], site);
    expect(a.joins.map((j) => j.id)).toEqual([1]);
    expect(a.summary.count).toBe(1);
    expect(a.summary.excludedCount).toBe(5);
    expect(a.excluded.map((e) => e.id)).toEqual([2, 3, 4, 5, 6]);
    expect(a.excluded[0].reason).toMatch(/S-3 has no x, y and no unit/);
    expect(a.excluded[1].reason).toMatch(/unit N9E9 is not defined/);
    expect(a.excluded[2].reason).toMatch(/level 99 is not defined/);
    expect(a.excluded[3].reason).toMatch(/S-6 has no z and no level/);
    expect(a.excluded[4].reason).toMatch(/not in the catalogue/);
  });

  it('hand-worked summary over three joins', () => {
    const s = [
      specimen(1, { x: 0, y: 0, z: 2.0, level: '1', layer: 'A' }),
      specimen(2, { x: 5, y: 0, z: 1.6, level: '3', layer: 'B' }), // 5 m, 0.4 m
      specimen(3, { x: 0, y: 1, z: 2.0, level: '1', layer: 'A' }), // from 1: 1 m, 0 m
      specimen(4, { x: 0, y: 2, z: 1.9, level: '2', layer: 'A' }), // from 1: 2 m, 0.1 m
    ];
    const a = analyseRefits(s, [join(1, 2), join(1, 3), join(1, 4)], noSiteDefinitions);
    const m = a.summary;
    expect(m.count).toBe(3);
    expect(m.meanHorizontalM).toBeCloseTo(8 / 3, 10); // (5 + 1 + 2) / 3
    expect(m.medianHorizontalM).toBeCloseTo(2, 10); // middle of 1, 2, 5
    expect(m.maxHorizontalM).toBeCloseTo(5, 10);
    expect(m.meanVerticalM).toBeCloseTo(0.5 / 3, 10); // (0.4 + 0 + 0.1) / 3
    expect(m.medianVerticalM).toBeCloseTo(0.1, 10);
    expect(m.maxVerticalM).toBeCloseTo(0.4, 10);
    expect(m.shareCrossingLevel).toBeCloseTo(2 / 3, 10); // 1->2 (level 1 to 3) and 1->4 (1 to 2) cross; 1->3 stays in level 1
    expect(m.shareCrossingLayer).toBeCloseTo(1 / 3, 10); // only 1->2 leaves layer A
  });

  it('hand-worked layer-to-layer matrix and per-layer crossing shares', () => {
    // Joins: A-A, A-B, A-B, B-C, C-C, and one with an unknown layer (B-?).
    const s = [
      specimen(1, { x: 0, y: 0, z: 0, layer: 'A', level: '1' }),
      specimen(2, { x: 1, y: 0, z: 0, layer: 'A', level: '1' }),
      specimen(3, { x: 2, y: 0, z: 0, layer: 'B', level: '2' }),
      specimen(4, { x: 3, y: 0, z: 0, layer: 'B', level: '2' }),
      specimen(5, { x: 4, y: 0, z: 0, layer: 'C', level: '3' }),
      specimen(6, { x: 5, y: 0, z: 0, layer: 'C', level: '3' }),
      specimen(7, { x: 6, y: 0, z: 0 }),
    ];
    const joins = [join(1, 2), join(1, 3), join(2, 4), join(4, 5), join(5, 6), join(3, 7)];
    const a = analyseRefits(s, joins, noSiteDefinitions);
    expect(a.layerMatrix).toEqual({
      A: { A: 1, B: 2, C: 0 },
      B: { A: 2, B: 0, C: 1 },
      C: { A: 0, B: 1, C: 1 },
    });
    // Layer A: joins 1-2 (within), 1-3, 2-4 (to B): 2 of 3 leave.
    expect(a.perLayer.A).toEqual({ joins: 3, withinLayer: 1, toOtherLayers: 2, shareCrossingLayer: 2 / 3, shareCrossingLevel: 2 / 3 });
    // Layer B: 1-3, 2-4, 4-5 leave; 3-7 reaches B but 7's layer is unknown: 3 of 3 known leave.
    expect(a.perLayer.B).toMatchObject({ joins: 4, withinLayer: 0, toOtherLayers: 3, shareCrossingLayer: 1 });
    // Layer C: 4-5 leaves, 5-6 stays: 1 of 2.
    expect(a.perLayer.C).toMatchObject({ joins: 2, withinLayer: 1, toOtherLayers: 1, shareCrossingLayer: 0.5 });
    // Site: of 5 joins with both layers known, 3 cross.
    expect(a.summary.shareCrossingLayer).toBeCloseTo(3 / 5, 10);
  });

  it('keeps layers in reading order, numbers numerically: 2, 3a, 3b, 4, 10', () => {
    const names = ['10', '3b', '4', '2', '3a'];
    const s = names.map((layer, i) => specimen(i + 1, { x: i, y: 0, z: 0, layer }));
    const joins = names.map((_, i) => join(i + 1, ((i + 1) % names.length) + 1));
    const a = analyseRefits(s, joins, noSiteDefinitions);
    expect(a.layers).toEqual(['2', '3a', '3b', '4', '10']);
    expect(spatialReport(a).layers).toEqual(['2', '3a', '3b', '4', '10']);
  });

  it('filters by join type family, taxon and layer (either end matches)', () => {
    const s = [
      specimen(1, { x: 0, y: 0, z: 0, layer: 'A', taxon: 'Cervus elaphus' }),
      specimen(2, { x: 1, y: 0, z: 0, layer: 'A', taxon: 'Cervus elaphus' }),
      specimen(3, { x: 2, y: 0, z: 0, layer: 'B', taxon: 'Bos taurus' }),
      specimen(4, { x: 3, y: 0, z: 0, layer: 'C', taxon: 'Bos taurus' }),
    ];
    const joins = [join(1, 2, 'conjoin-fresh', 1), join(3, 4, 'conjoin-dry', 2), join(2, 3, 'articulation', 3), join(1, 4, 'pair', 4)];
    const ids = (f: Parameters<typeof analyseRefits>[3]) => analyseRefits(s, joins, noSiteDefinitions, f).joins.map((j) => j.id);
    expect(ids({})).toEqual([1, 2, 3, 4]);
    expect(ids({ types: ['conjoin'] })).toEqual([1, 2]);
    expect(ids({ types: ['conjoin-dry'] })).toEqual([2]);
    expect(ids({ types: ['conjoin-green'] })).toEqual([1]); // green break = fresh break (common practice)
    expect(ids({ types: ['conj'] })).toEqual([]);
    expect(ids({ taxa: ['Bos taurus'] })).toEqual([2, 3, 4]);
    expect(ids({ layers: ['C'] })).toEqual([2, 4]);
    expect(ids({ types: ['conjoin'], layers: ['B'] })).toEqual([2]);
  });

  it('reports nulls, not zeros, when there is nothing to measure', () => {
    const a = analyseRefits([], [], noSiteDefinitions);
    expect(a.summary).toMatchObject({ count: 0, meanHorizontalM: null, medianVerticalM: null, shareCrossingLayer: null });
    expect(a.layerMatrix).toEqual({});
  });
});
