/**
 * The fine step's adaptive trim (icp-point-to-plane.ts autoTrimKeep): the share of ICP pairs
 * kept is the one that minimises the root mean squared distance of the kept pairs over the
 * share to a power (the fractional RMSD of Phillips, Liu & Tomasi 2007; the overlap estimate of
 * the trimmed ICP, Chetverikov et al. 2005; both recalled from memory). Checked on distances
 * whose answer follows from the rule by hand: a contact that covers all pairs keeps them all
 * (a fixed trim of 0.7 drops the farthest 30%, which close a face opened like a book), and a
 * contact that covers 60% of the pairs, with the rest an order of magnitude farther, keeps 60%.
 */
import { describe, expect, it } from 'vitest';
import { autoTrimKeep } from '../../../../core/geometry/registration/icp-point-to-plane';

function sortedOrder(dist: number[]): Int32Array {
  return Int32Array.from(dist.map((_, i) => i).sort((a, b) => dist[a] - dist[b]));
}

describe('autoTrimKeep', () => {
  it('keeps every pair when all lie within the same spread (uniform distances 0..0.5 mm)', () => {
    // RMS of the k nearest of m uniform distances grows like k/m, so RMS / (k/m)^2 falls to k = m
    const dist = Array.from({ length: 100 }, (_, i) => (0.5 * (i + 0.5)) / 100);
    expect(autoTrimKeep(sortedOrder(dist), dist.length, dist, 0.5, 2)).toBe(100);
  });

  it('keeps the 60 pairs in contact when the other 40 lie ten times farther', () => {
    const dist = [...Array.from({ length: 60 }, (_, i) => 0.1 + (0.1 * i) / 60), ...Array.from({ length: 40 }, (_, i) => 2 + (0.5 * i) / 40)];
    // 60 kept: RMS about 0.15 / 0.6^2 = 0.42; all 100: RMS about 1.4 / 1 = 1.4
    expect(autoTrimKeep(sortedOrder(dist), dist.length, dist, 0.4, 2)).toBe(60);
  });

  it('never keeps fewer than the minimum share', () => {
    const dist = [...Array.from({ length: 20 }, () => 0.05), ...Array.from({ length: 80 }, () => 3)];
    expect(autoTrimKeep(sortedOrder(dist), dist.length, dist, 0.5, 2)).toBeGreaterThanOrEqual(50);
  });
});
