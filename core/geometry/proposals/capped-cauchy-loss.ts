/**
 * The robust loss of one descriptor figure in the candidate cost (face-descriptor.ts
 * `partnerCost`): log(1 + z^2) for a difference of z scales, the negative log of a Cauchy
 * density up to a constant (Black & Rangarajan 1996, "On the unification of line processes,
 * outlier rejection, and robust statistics", IJCV 19:57-91, the Lorentzian), which stops growing
 * beyond |z| = cap, as a truncated loss does (Blake & Zisserman 1987, "Visual Reconstruction",
 * the weak string's truncated quadratic): a figure that was measured wrongly on one side (a
 * wall ray that missed the inner surface and crossed the shaft) then costs a pair a bounded
 * amount, instead of outweighing every other figure that agrees. Without a cap (Infinity or
 * undefined) it is the plain Lorentzian.
 */
export function cappedCauchyLoss(z: number, cap?: number): number {
  const z2 = z * z;
  return cap === undefined || !Number.isFinite(cap) ? Math.log1p(z2) : Math.log1p(Math.min(z2, cap * cap));
}
