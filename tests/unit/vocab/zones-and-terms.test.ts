import { describe, expect, it } from 'vitest';
import { zonesCovered, PORTION_ZONES, SIZE_CLASSES, ZONE_PRESENCE_THRESHOLD, builtInVocabulary as v, parseSizeClass, resolveZone, sidesCompatible, editDistance } from '../../../core/vocab';

describe('portion zones (Dobney & Rielly 1988 presence convention)', () => {
  it('has five long-bone zones from proximal to distal and the more-than-half rule', () => {
    expect(PORTION_ZONES).toEqual(['proximal-end', 'proximal-shaft', 'midshaft', 'distal-shaft', 'distal-end']);
    expect(ZONE_PRESENCE_THRESHOLD).toBe(0.5);
    expect(resolveZone('Prox. end')).toBe('proximal-end');
    expect(resolveZone('MS')).toBe('midshaft');
    expect(resolveZone('distal epiphysis')).toBe('distal-end');
    expect(resolveZone('elbow')).toBeUndefined();
  });

  it('counts a zone only when more than half of it is present', () => {
    // Dobney & Rielly 1988: a zone is recorded when more than 50% of it survives; exactly half does not count.
    expect(zonesCovered({ 'proximal-shaft': 0.8, midshaft: 0.5, 'distal-shaft': 0.51, 'distal-end': 0.1 })).toEqual(['proximal-shaft', 'distal-shaft']);
    expect(zonesCovered({})).toEqual([]);
  });
});

describe('flat term lists', () => {
  it('normalises sides, break ages, fusion and modifications', () => {
    expect(v.sides.resolve('L')).toBe('left');
    expect(v.sides.resolve(' r. ')).toBe('right');
    expect(v.sides.resolve('?')).toBe('indeterminate');
    expect(v.breakAges.resolve('Green')).toBe('fresh');
    expect(v.fusion.resolve('UF')).toBe('unfused');
    expect(v.modifications.resolve('cutmarks')).toBe('cut-mark');
    expect(v.modifications.resolve('WS3')).toBe('weathering-3');
    expect(sidesCompatible('left', 'indeterminate')).toBe(true);
    expect(sidesCompatible('left', 'right')).toBe(false);
  });

  it('has size classes 1-6 with contiguous weight bands (after Brain 1981 and Bunn 1982, from memory)', () => {
    expect(SIZE_CLASSES.map((s) => s.sizeClass)).toEqual([1, 2, 3, 4, 5, 6]);
    for (let i = 1; i < SIZE_CLASSES.length; i++) expect(SIZE_CLASSES[i].minKg).toBe(SIZE_CLASSES[i - 1].maxKg);
    expect(parseSizeClass('III')).toBe(3);
    expect(parseSizeClass('size 4')).toBe(4);
    expect(parseSizeClass('7')).toBeUndefined();
  });

  it('measures edit distance like the textbook examples (Levenshtein 1966; Damerau 1964)', () => {
    // kitten -> sitting is 3 (the standard worked example); a swap of two neighbours is 1.
    expect(editDistance('kitten', 'sitting')).toBe(3);
    expect(editDistance('ca', 'ac')).toBe(1);
    expect(editDistance('', 'abc')).toBe(3);
  });
});
