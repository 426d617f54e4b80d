import type { Side } from '../refits/observation';

/** What MNE needs of a unit: its side and the zones it covers. */
export interface ZonedUnit {
  side: Side | null;
  zones: ReadonlySet<string>;
}

export interface MneCount {
  mneLeft: number;
  mneRight: number;
  mne: number;
}

/**
 * MNE, the minimum number of elements, of one taxon and specific element, by the overlap
 * approach (Dobney & Rielly 1988 zones; Marean et al. 2001): units that each cover more
 * than half of the same zone must be different bones, so the count for a side is the
 * largest number of units of that side covering any one zone.
 *
 * - mneLeft / mneRight: the largest number of left (right) units covering one zone; a unit
 *   with no zones recorded still makes its side at least 1.
 * - paired elements: mne = max(mneLeft + mneRight, largest number of units of any side,
 *   indeterminate included, covering one zone), and at least 1 when there is any unit.
 * - unpaired elements: the largest number of units covering one zone (at least 1).
 * - elements without a zone scheme (scheme null): every unit counts once.
 */
export function minimumNumberOfElements(units: readonly ZonedUnit[], scheme: readonly string[] | null, paired: boolean): MneCount {
  if (units.length === 0) return { mneLeft: 0, mneRight: 0, mne: 0 };
  if (scheme === null) {
    const left = units.filter((u) => u.side === 'left').length;
    const right = units.filter((u) => u.side === 'right').length;
    return paired ? { mneLeft: left, mneRight: right, mne: units.length } : { mneLeft: 0, mneRight: 0, mne: units.length };
  }
  const sideMax = (side: 'left' | 'right'): number => {
    const ofSide = units.filter((u) => u.side === side);
    if (ofSide.length === 0) return 0;
    return Math.max(1, largestCover(ofSide, scheme));
  };
  const any = Math.max(1, largestCover(units, scheme));
  if (!paired) return { mneLeft: 0, mneRight: 0, mne: any };
  const mneLeft = sideMax('left');
  const mneRight = sideMax('right');
  return { mneLeft, mneRight, mne: Math.max(mneLeft + mneRight, any) };
}

/** The largest number of units that cover any one zone of the scheme. */
export function largestCover(units: readonly ZonedUnit[], scheme: readonly string[]): number {
  let best = 0;
  for (const zone of scheme) {
    let n = 0;
    for (const u of units) if (u.zones.has(zone)) n++;
    if (n > best) best = n;
  }
  return best;
}
