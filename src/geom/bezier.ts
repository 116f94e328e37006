/**
 * Flatness bounds for Bézier curves flattened at uniform parameter steps.
 *
 * Bound used (linear-interpolation error, common practice in numerical
 * analysis; for Bézier curves stated by Filip, Magedson & Markot, "Surface
 * algorithms using bounds on derivatives", CAGD 3 (1986) 295–311, and known as
 * Wang's formula): if a curve B is sampled at t_i = i/n and joined by chords,
 *
 *     |B(t) − L(t)| ≤ (1/8)·(1/n)²·max |B''|   for every t in [0, 1],
 *
 * where L(t) is the chord point at the same parameter (apply the scalar
 * bound to u·B for every unit u). It bounds both directions of the
 * Hausdorff distance: every curve point has a chord point that close and
 * vice versa.
 *
 * - Cubic: B'' = 6·((1−t)·D0 + t·D1), D0 = P0 − 2P1 + P2, D1 = P1 − 2P2 + P3,
 *   so max|B''| ≤ 6·max(|D0|, |D1|) and the bound is (3/4)·max(|D0|, |D1|)/n².
 * - Quadratic: B'' = 2·(P0 − 2P1 + P2) is constant: bound |D|/(4n²). Its
 *   exact cubic form (P0, P0 + ⅔(P1 − P0), P2 + ⅔(P1 − P2), P2) has both
 *   second differences equal to D/3, so the cubic bound gives the same |D|/(4n²).
 *
 * Affine maps commute with Bézier evaluation, so the control points are
 * mapped first and the bound is taken in the target space.
 */

/** Most steps one curve may take; beyond this the tolerance is unreasonable for the geometry. */
export const MAX_CURVE_STEPS = 10_000_000;

/**
 * Flatness constant of a cubic: the chord error after n uniform steps is at
 * most this value / n² (same units as the coordinates).
 */
export function cubicFlatness(
  x0: number, y0: number, x1: number, y1: number,
  x2: number, y2: number, x3: number, y3: number,
): number {
  const d0 = Math.hypot(x0 - 2 * x1 + x2, y0 - 2 * y1 + y2);
  const d1 = Math.hypot(x1 - 2 * x2 + x3, y1 - 2 * y2 + y3);
  return 0.75 * (d0 > d1 ? d0 : d1);
}

/** Flatness constant of a quadratic: the chord error after n uniform steps is at most this value / n². */
export function quadFlatness(x0: number, y0: number, x1: number, y1: number, x2: number, y2: number): number {
  return 0.25 * Math.hypot(x0 - 2 * x1 + x2, y0 - 2 * y1 + y2);
}

/**
 * Fewest uniform steps n ≥ 1 with flatness / n² ≤ maxError.
 * @param flatness from cubicFlatness / quadFlatness
 * @param maxError allowed deviation, > 0, same units
 * @throws RangeError when more than MAX_CURVE_STEPS would be needed
 */
export function stepsForFlatness(flatness: number, maxError: number): number {
  if (!(flatness > 0)) return 1;
  let n = Math.ceil(Math.sqrt(flatness / maxError));
  if (!(n >= 1)) n = 1;
  // sqrt and ceil round; make the inequality hold as computed.
  while (flatness / (n * n) > maxError) n++;
  if (!(n <= MAX_CURVE_STEPS)) {
    throw new RangeError(`a curve would need ${n} steps to stay within ${maxError} (flatness ${flatness})`);
  }
  return n;
}
