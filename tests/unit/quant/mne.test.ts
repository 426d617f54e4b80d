import { describe, expect, it } from 'vitest';
import { minimumNumberOfElements } from '../../../core/quant/mne';
import type { Side } from '../../../core/refits/observation';

const ZONES = ['proximal-end', 'proximal-shaft', 'midshaft', 'distal-shaft', 'distal-end'];
const u = (side: Side | null, ...zones: string[]) => ({ side, zones: new Set(zones) });

// The overlap approach (Dobney & Rielly 1988 zones; Marean et al. 2001): fragments that each
// cover more than half of the same zone must come from different bones.
describe('MNE by zone overlap', () => {
  it('two left femur fragments sharing a zone make MNE 2 (issue 3 worked example)', () => {
    const r = minimumNumberOfElements([u('left', 'midshaft', 'distal-shaft'), u('left', 'distal-shaft', 'distal-end')], ZONES, true);
    expect(r).toEqual({ mneLeft: 2, mneRight: 0, mne: 2 });
  });

  it('two left femur fragments covering different zones make MNE 1', () => {
    const r = minimumNumberOfElements([u('left', 'proximal-end'), u('left', 'distal-end')], ZONES, true);
    expect(r).toEqual({ mneLeft: 1, mneRight: 0, mne: 1 });
  });

  it('lefts and rights add; indeterminate fragments raise MNE only when they outnumber them on a zone', () => {
    expect(minimumNumberOfElements([u('left', 'midshaft'), u('right', 'midshaft')], ZONES, true).mne).toBe(2);
    const r = minimumNumberOfElements(
      [u('left', 'distal-end'), u('indeterminate', 'midshaft'), u('indeterminate', 'midshaft'), u(null, 'midshaft')],
      ZONES,
      true,
    );
    expect(r).toEqual({ mneLeft: 1, mneRight: 0, mne: 3 });
  });

  it('a unit with no zones still makes its side at least 1', () => {
    expect(minimumNumberOfElements([u('right')], ZONES, true)).toEqual({ mneLeft: 0, mneRight: 1, mne: 1 });
    expect(minimumNumberOfElements([u(null)], ZONES, true)).toEqual({ mneLeft: 0, mneRight: 0, mne: 1 });
  });

  it('unpaired elements take the largest number covering one zone; no scheme counts each unit once', () => {
    expect(minimumNumberOfElements([u('axial', 'a'), u('axial', 'a'), u('axial', 'b')], ['a', 'b'], false).mne).toBe(2);
    expect(minimumNumberOfElements([u('left'), u('left'), u('right')], null, true)).toEqual({ mneLeft: 2, mneRight: 1, mne: 3 });
  });
});
