/**
 * roundHalfUp (core/geometry/round-half-up.ts) against ECMAScript's Math.round (ECMA-262,
 * Math.round: the integer closest to x, halves rounded towards +Infinity), compared as values
 * (Math.round's -0 for x in [-0.5, 0) equals 0): at every half-integer and the doubles either side
 * of it (where floor(x + 0.5) alone goes wrong: 0.5 - 2^-54), and on random values of every scale
 * up to 2^50.
 */
import { describe, expect, it } from 'vitest';
import { roundHalfUp } from '../../../core/geometry/round-half-up';
import { mulberry32 } from '../../../core/geometry/seeded-random';

/** The next double towards +Infinity (dir 1) or -Infinity (dir -1) of a finite x. */
function nextDouble(x: number, dir: 1 | -1): number {
  if (x === 0) return dir * Number.MIN_VALUE;
  const f = new Float64Array([x]), u = new BigInt64Array(f.buffer);
  u[0] += (x > 0) === (dir > 0) ? 1n : -1n;
  return f[0];
}

describe('roundHalfUp', () => {
  it('is Math.round at the halves and the doubles either side of them', () => {
    const values: number[] = [0.49999999999999994, -0.49999999999999994, 0, -0];
    for (let n = -300; n <= 300; n++) {
      const h = n + 0.5;
      values.push(h, nextDouble(h, 1), nextDouble(h, -1), n, nextDouble(n, 1), nextDouble(n, -1));
    }
    for (const big of [2 ** 30 + 0.5, 2 ** 40 + 0.5, 2 ** 51 + 0.5, -(2 ** 51) - 0.5]) values.push(big, nextDouble(big, 1), nextDouble(big, -1));
    for (const x of values) expect([x, roundHalfUp(x) === Math.round(x)]).toEqual([x, true]);
    // the one value floor(x + 0.5) gets wrong
    expect(Math.floor(0.49999999999999994 + 0.5)).toBe(1);
    expect(roundHalfUp(0.49999999999999994)).toBe(0);
  });

  it('is Math.round on random values of every scale', () => {
    const rand = mulberry32(11);
    for (let i = 0; i < 200_000; i++) {
      const x = (rand() - 0.5) * 2 ** Math.floor(rand() * 52 - 2);
      if (roundHalfUp(x) !== Math.round(x)) expect([x, roundHalfUp(x)]).toEqual([x, Math.round(x)]);
    }
  });
});
