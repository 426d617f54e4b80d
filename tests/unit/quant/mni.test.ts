import { describe, expect, it } from 'vitest';
import { lPlusRMinusP } from '../../../core/quant/lrp';
import { mniFromElement } from '../../../core/quant/mni';
import type { Side } from '../../../core/refits/observation';

const ZONES = ['proximal-end', 'proximal-shaft', 'midshaft', 'distal-shaft', 'distal-end'];
const u = (side: Side | null, fusion: string | null, ...zones: string[]) => ({
  side,
  zones: new Set(zones),
  fusion: new Set(fusion ? [fusion] : []),
});

describe('MNI from one element (Lyman 2008, chapter 2)', () => {
  it('is the larger side of a paired element', () => {
    const units = [u('left', null, 'midshaft'), u('left', null, 'midshaft'), u('right', null, 'midshaft')];
    expect(mniFromElement(units, ZONES, true, 2)).toBe(2);
  });

  it('is at least 1 where an element has only unsided units', () => {
    expect(mniFromElement([u('indeterminate', null)], ZONES, true, 2)).toBe(1);
  });

  it('divides unpaired elements by their count per skeleton, rounded up (13 thoracic: Lyman 2008, Table 6.4)', () => {
    const units = Array.from({ length: 14 }, () => u('axial', null));
    expect(mniFromElement(units, null, false, 13)).toBe(2);
  });

  it('fused and unfused units of one side cannot be one animal (common practice)', () => {
    // 2 left fused, 1 right fused, 1 left unfused, 2 right unfused: fused gives max(2,1)=2,
    // unfused max(1,2)=2, so 4 animals, where ignoring fusion gives 3.
    const units = [
      u('left', 'fused', 'distal-end'),
      u('left', 'fused', 'distal-end'),
      u('right', 'fused', 'distal-end'),
      u('left', 'unfused', 'distal-end'),
      u('right', 'unfused', 'distal-end'),
      u('right', 'unfused', 'distal-end'),
    ];
    expect(mniFromElement(units, ZONES, true, 2)).toBe(4);
    expect(mniFromElement(units.map((x) => ({ ...x, fusion: new Set<string>() })), ZONES, true, 2)).toBe(3);
  });
});

describe('L + R - P (Lyman 2008, chapter 3: more pairs means fewer individuals)', () => {
  it('counts every unmatched left and right as a further individual', () => {
    // By the definition: 5 lefts and 4 rights of which 3 pair -> 3 pairs + 2 lone lefts + 1 lone right.
    expect(lPlusRMinusP(5, 4, 3)).toBe(6);
    // No pairs: every bone is a different animal; all paired: the larger side.
    expect(lPlusRMinusP(5, 4, 0)).toBe(9);
    expect(lPlusRMinusP(4, 4, 4)).toBe(4);
    expect(() => lPlusRMinusP(2, 1, 2)).toThrow(RangeError);
  });
});
