import { describe, expect, it } from 'vitest';
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import { analyseRefits } from '../../../core/spatial/analyse';
import { buildFigure, figureKinds } from '../../../core/spatial/figures/build';
import fc from 'fast-check';
import { niceStep } from '../../../core/spatial/figures/axis';
import { binCounts } from '../../../core/spatial/figures/histogram';
import { sectorCounts } from '../../../core/spatial/figures/rose';
import { projectOnAxis } from '../../../core/spatial/figures/section';
import type { SiteDefinitions } from '../../../core/spatial/types';
import { join, specimen } from './fixtures';

// SVG checks use fast-xml-parser (a general-purpose XML reference library): every figure must
// be well-formed XML with an <svg> root in the SVG namespace.

function parse(svg: string) {
  const valid = XMLValidator.validate(svg);
  expect(valid).toBe(true);
  const doc = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: '@', isArray: (name) => name === 'line' || name === 'g' }).parse(svg);
  expect(doc.svg['@xmlns']).toBe('http://www.w3.org/2000/svg');
  return doc;
}
const countTag = (svg: string, tag: string) => (svg.match(new RegExp(`<${tag}[\\s/>]`, 'g')) ?? []).length;

const site: SiteDefinitions = {
  units: [
    { unit: 'N0E0', xMin: 0, yMin: 0, xMax: 2, yMax: 2 },
    { unit: 'N0E2', xMin: 2, yMin: 0, xMax: 4, yMax: 2 },
    { unit: 'N2E0', xMin: 0, yMin: 2, xMax: 2, yMax: 4 },
  ],
  levels: [{ unit: null, level: '2', topZ: 1.2, bottomZ: 1.1 }],
  layerBoundaries: [
    { layer: 'A', x: 0, y: 1, z: 1.3 },
    { layer: 'A', x: 4, y: 1, z: 1.28 },
    { layer: 'B', x: 0, y: 1, z: 1.1 },
    { layer: 'B', x: 4, y: 1, z: 1.05 },
  ],
};
const specimens = [
  specimen(1, { x: 0.5, y: 0.5, z: 1.2, layer: 'A', unit: 'N0E0' }),
  specimen(2, { x: 3.5, y: 4.5, z: 1.05, layer: 'B', unit: 'N0E2' }),
  specimen(3, { x: 1.2, y: 3.1, z: 1.15, layer: 'B', unit: 'N2E0' }),
  specimen(4, { x: 3.1, y: 0.4, z: 1.25, layer: 'A', unit: 'N0E2' }),
  specimen(5, { unit: 'N0E0', level: '2', layer: 'A' }), // placed at unit centre, level mid-depth
  specimen(6, {}), // no position: left out
  specimen(7, { x: 2.5, y: 1.5, z: 1.1, layer: 'B', unit: 'N0E2' }),
  specimen(8, { x: 2.5, y: 1.5, z: 1.1, layer: 'B', unit: 'N0E2' }), // same spot as 7
];
const joins = [
  join(1, 2, 'conjoin-fresh', 1),
  join(3, 4, 'conjoin-dry', 2),
  join(1, 3, 'articulation', 3),
  join(4, 5, 'pair', 4),
  join(2, 6, 'pair', 5),
  join(7, 1, 'refit-unknown-kind', 6),
];
const analysis = analyseRefits(specimens, joins, site);

describe('figures', () => {
  it('every figure parses as XML', () => {
    for (const kind of figureKinds) parse(buildFigure({ kind }, specimens, analysis, site));
  });

  it('the plan has one refit line per measured join, in a group per join type', () => {
    const svg = buildFigure({ kind: 'plan' }, specimens, analysis, site);
    const doc = parse(svg);
    expect(analysis.joins).toHaveLength(5); // join 5 has no position for S-6
    expect(countTag(svg, 'line')).toBe(5);
    const refits = doc.svg.g.find((g: { '@id'?: string }) => g['@id'] === 'refits');
    const types = refits.g.map((g: { '@data-type': string; line?: unknown[] }) => [g['@data-type'], g.line?.length]);
    expect(types).toEqual([
      ['conjoin-fresh', 1],
      ['conjoin-dry', 1],
      ['articulation', 1],
      ['pair', 1],
      ['refit-unknown-kind', 1],
    ]);
    // Every type is drawn with its own dash pattern, so the plan reads without colour.
    const dashes = refits.g.map((g: { '@stroke-dasharray'?: string }) => g['@stroke-dasharray'] ?? 'solid');
    expect(new Set(dashes).size).toBe(5);
    // Units, a north arrow, a scale bar and both axis titles are there.
    const units = /<path id="units" d="([^"]*)"/.exec(svg)?.[1] ?? '';
    expect(units.match(/M/g)).toHaveLength(3); // one closed outline per unit
    expect(svg).toContain('id="north-arrow"');
    expect(svg).toContain('id="scale-bar"');
    expect(svg).toContain('Easting (m)');
    expect(svg).toContain('Northing (m)');
  });

  it('the plan draws north up and east right: a join due north-east rises to the right', () => {
    const s = [specimen(1, { x: 0, y: 0, z: 0 }), specimen(2, { x: 10, y: 10, z: 0 })];
    const a = analyseRefits(s, [join(1, 2)], { units: [], levels: [], layerBoundaries: [] });
    const doc = parse(buildFigure({ kind: 'plan' }, s, a, { units: [], levels: [], layerBoundaries: [] }));
    const line = doc.svg.g.find((g: { '@id'?: string }) => g['@id'] === 'refits').g[0].line[0];
    const dx = Number(line['@x2']) - Number(line['@x1']);
    const dy = Number(line['@y2']) - Number(line['@y1']);
    expect(dx).toBeGreaterThan(0);
    expect(dy).toBeLessThan(0); // SVG y grows downwards
    expect(Math.abs(dx)).toBeCloseTo(Math.abs(dy), 0); // true scale: 10 m east = 10 m north
  });

  it('the section has one refit line per join and a path per layer top', () => {
    const svg = buildFigure({ kind: 'section', section: { bearingDeg: 90 } }, specimens, analysis, site);
    const doc = parse(svg);
    expect(countTag(svg, 'line')).toBe(5);
    const layers = doc.svg.g.find((g: { '@id'?: string }) => g['@id'] === 'layer-boundaries');
    expect(layers.path).toHaveLength(4); // each top: a white halo and the line
    expect(svg).toContain('Layer A');
    expect(svg).toContain('Elevation (m)');
  });

  it('a section strip keeps only joins with an end near the line', () => {
    // Line along x through y = 0.5, 0.3 m either side: joins 1 (S-1 at y 0.5), 2 (S-4 at y 0.4),
    // 3 (S-1), 4 (S-4) and 6 (S-1) have an end inside; all five measured joins qualify.
    const inside = buildFigure({ kind: 'section', section: { bearingDeg: 90, origin: { x: 0, y: 0.5 }, halfWidthM: 0.3 } }, specimens, analysis, site);
    expect(countTag(inside, 'line')).toBe(5);
    // Through y = 4.5 only join 1 (S-2 at y 4.5) reaches.
    const north = buildFigure({ kind: 'section', section: { bearingDeg: 90, origin: { x: 0, y: 4.5 }, halfWidthM: 0.3 } }, specimens, analysis, site);
    expect(countTag(north, 'line')).toBe(1);
  });

  it('aggregates specimens on the same spot into one dot', () => {
    const many = Array.from({ length: 500 }, (_, i) => specimen(i + 1, { x: 1, y: 1, z: 1 }));
    const a = analyseRefits(many, [], site);
    const svg = buildFigure({ kind: 'plan' }, many, a, site);
    const dots = svg.match(/h0/g) ?? [];
    // 500 specimens at one point: one dot on the plot, plus the three legend samples.
    expect(dots.length).toBe(1 + 3);
  });

  it('escapes text that would break the XML', () => {
    const s = [specimen(1, { x: 0, y: 0, z: 0 }), specimen(2, { x: 1, y: 0, z: 0 })];
    const a = analyseRefits(s, [join(1, 2, 'odd <&> "type"')], { units: [], levels: [], layerBoundaries: [] });
    for (const kind of figureKinds) parse(buildFigure({ kind, title: 'Site <K&B>' }, s, a, { units: [], levels: [], layerBoundaries: [] }));
  });
});

describe('layer matrix figure', () => {
  it('shows the hand-worked matrix: one cell per pair of layers, with the count in it', () => {
    // From the fixture joins: 1-2 A-B, 3-4 B-A, 1-3 A-B, 4-5 A-A (5 placed in layer A), 7-1 B-A;
    // join 2-6 reaches layer B (S-2) but S-6 has no layer: not in the matrix, but it counts
    // among the joins reaching B.
    expect(analysis.layerMatrix).toEqual({ A: { A: 1, B: 4 }, B: { A: 4, B: 0 } });
    const svg = buildFigure({ kind: 'layers' }, specimens, analysis, site);
    const doc = parse(svg);
    const matrix = doc.svg.g.find((g: { '@id'?: string }) => g['@id'] === 'matrix');
    expect(matrix.rect).toHaveLength(4);
    const cells = (matrix.text as { '#text': string | number }[]).map((t) => String(t['#text']));
    // Row A: name, 1, 4, then joins 5 (1, 2, 3, 4, 6), leave 4 of 5 = 80 %, cross levels (none recorded) -;
    // row B: name, 4, 0, then joins 5 (1, 2, 3, 5, 6), leave 4 of the 4 with a known other layer = 100 %, -.
    expect(cells).toEqual(['A', '1', '4', '5', '80 %', '–', 'B', '4', '0', '5', '100 %', '–']);
  });
});

describe('figure arithmetic', () => {
  it('axis steps are 1, 2 or 5 times a power of ten, giving near the asked number of intervals', () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-3, max: 1e6, noNaN: true }), fc.integer({ min: 2, max: 30 }), (span, target) => {
        const step = niceStep(span, target);
        const mantissa = step / 10 ** Math.floor(Math.log10(step) + 1e-9);
        expect([1, 2, 5].some((m) => Math.abs(mantissa - m) < 1e-6)).toBe(true);
        // Rounding to the nearest of 1, 2, 5, 10 (log scale) is off by at most a factor sqrt(5) = 2.24.
        const intervals = span / step;
        expect(intervals).toBeGreaterThan(target / 2.24 - 1e-9);
        expect(intervals).toBeLessThan(target * 2.24 + 1e-9);
      }),
    );
  });

  it('hand-worked histogram bins of 1 m: 0.2, 0.9, 1.0, 2.5, 3.0 -> [2, 1, 2]', () => {
    // [0,1): 0.2, 0.9; [1,2): 1.0; [2,3]: 2.5 and the maximum 3.0 in the last bin.
    expect(binCounts([0.2, 0.9, 1.0, 2.5, 3.0], 1)).toEqual([2, 1, 2]);
  });

  it('hand-worked rose sectors of 90 degrees', () => {
    // Bearings 10 and 100 and 190 and 350: one in each quadrant sector.
    expect(sectorCounts([10, 100, 190, 350], 90, false)).toEqual([1, 1, 1, 1]);
    // Axial: 10 and 190 are the same axis -> sectors 0 and 2 get both; 100 -> 1 and 3.
    expect(sectorCounts([10, 190, 100], 90, true)).toEqual([2, 1, 2, 1]);
  });

  it('projects on the section axis (analytic geometry)', () => {
    // Along bearing 90 (east): distance along = x, offset = -y... to the right looking east is south.
    expect(projectOnAxis({ bearingDeg: 90 }, 3, 4).along).toBeCloseTo(3, 10);
    expect(projectOnAxis({ bearingDeg: 90 }, 3, 4).offset).toBeCloseTo(-4, 10);
    // Along bearing 0 (north): distance along = y.
    expect(projectOnAxis({ bearingDeg: 0 }, 3, 4).along).toBeCloseTo(4, 10);
    // Along the 3-4-5 bearing 36.87 the point (3, 4) is 5 m along and on the line.
    const p = projectOnAxis({ bearingDeg: (Math.atan2(3, 4) * 180) / Math.PI }, 3, 4);
    expect(p.along).toBeCloseTo(5, 10);
    expect(p.offset).toBeCloseTo(0, 10);
  });
});
