import type { Side } from '../refits/observation';
import { minimumNumberOfElements } from './mne';

export interface MniUnit {
  side: Side | null;
  zones: ReadonlySet<string>;
  fusion: ReadonlySet<string>;
}

/**
 * MNI from one specific element (Lyman 2008, chapter 2; design.md section 5):
 * - paired elements: the larger of mneLeft and mneRight, at least 1 when the element has
 *   any unit, sided or not;
 * - unpaired elements: ceil(mne / number of that element in one skeleton).
 * Where fusion of an end is recorded, fused and unfused units of the same element and side
 * cannot be one animal, so the element gives the sum over fusion states of that figure for
 * each state (common practice), if that is larger. Units with no fusion recorded could
 * belong to any animal and only enter the plain figure.
 */
export function mniFromElement(units: readonly MniUnit[], scheme: readonly string[] | null, paired: boolean, countPerSkeleton: number | null): number {
  const plain = mniOf(units, scheme, paired, countPerSkeleton);
  const states = new Set<string>();
  for (const u of units) if (u.fusion.size === 1) states.add([...u.fusion][0]);
  if (states.size < 2) return plain;
  let sum = 0;
  for (const state of states) {
    sum += mniOf(units.filter((u) => u.fusion.size === 1 && u.fusion.has(state)), scheme, paired, countPerSkeleton);
  }
  return Math.max(plain, sum);
}

function mniOf(units: readonly MniUnit[], scheme: readonly string[] | null, paired: boolean, count: number | null): number {
  if (units.length === 0) return 0;
  const mne = minimumNumberOfElements(units, scheme, paired);
  if (paired) return Math.max(1, mne.mneLeft, mne.mneRight);
  return Math.ceil(mne.mne / Math.max(1, count ?? 1));
}
