/**
 * How unevenly an elliptic section model (shaft-section.ts: outer semi-axes A >= B, cavity
 * semi-axes Ai, Bi along the same axes) spreads its wall: the larger of the wall thicknesses
 * at the ends of the major axis (A - Ai) and of the minor axis (B - Bi) over the smaller, so
 * 1 for an even wall and above 1 either way. A wall of even thickness c about an elliptic
 * outline has for its inner face the outline's parallel curve at distance c, which meets the
 * axes at A - c and B - c (the normal of an ellipse at an axis vertex runs along the axis), so
 * the generator's shafts and a cortex of near-even thickness read near 1; a model that takes
 * a break face through the wall for cavity or outer surface leaves the wall thin at one axis
 * and thick at the other. Infinity where either thickness is not positive.
 */
export function sectionWallRatio(A: number, B: number, Ai: number, Bi: number): number {
  const tMajor = A - Ai, tMinor = B - Bi;
  if (!(tMajor > 0 && tMinor > 0)) return Infinity;
  return tMajor >= tMinor ? tMajor / tMinor : tMinor / tMajor;
}
