import { describe, expect, it } from 'vitest';
import { enclosedVolume } from '../../../core/geometry/measure';
import { triangleNormalsAndAreas } from '../../../core/geometry/mesh';
import { brokenTube } from './broken-tube';

/**
 * The lens-shaped medullary cavity of the broken-tube helper (a flattened cavity with pointed
 * ends, as in a flattened shaft), checked against closed forms of plane geometry: the lens is
 * the intersection of two discs of radius rho = (w² + h²) / 2h whose centres lie d = rho - h
 * either side of the chord, so its area is 2 (rho² acos(d / rho) - d sqrt(rho² - d²)) (area of
 * a circular segment: rho² acos(d / rho) - d sqrt(rho² - d²), any geometry handbook, e.g.
 * Bronstein & Semendjajew, Taschenbuch der Mathematik, circle segment).
 */
const R = 12, L = 60, w = 9, h = 2.5;
const rho = (w * w + h * h) / (2 * h), d = rho - h;
const lensArea = 2 * (rho * rho * Math.acos(d / rho) - d * Math.sqrt(rho * rho - d * d));
/** The outer cylinder is a regular 96-gon of circumradius R (manifold-3d's cylinder). */
const outerArea = 48 * R * R * Math.sin((2 * Math.PI) / 96);

describe('broken tube with a lens-shaped cavity (closed forms)', () => {
  it('encloses the wall volume (outer section less the lens) times the length', async () => {
    const tube = await brokenTube({ outerRadius: R, length: L, lensCavity: { halfWidth: w, halfHeight: h }, cuts: [] });
    // The lens arcs are 192-gons: their chords cut off under 0.1 % of the lens.
    expect(enclosedVolume(tube.mesh) / ((outerArea - lensArea) * L)).toBeCloseTo(1, 2);
  });

  it('labels exactly the transverse cut as break face: area of the section less the lens', async () => {
    const tube = await brokenTube({ outerRadius: R, length: L, lensCavity: { halfWidth: w, halfHeight: h }, cuts: [{ normal: [0, 0, 1], offset: -10 }], roughness: 0 });
    const { areas } = triangleNormalsAndAreas(tube.mesh);
    let onCut = 0;
    for (let f = 0; f < areas.length; f++) if (tube.truth[f]) onCut += areas[f];
    expect(onCut / (outerArea - lensArea)).toBeCloseTo(1, 2);
  });
});
