/**
 * The tolerance budget: how one element's tolerance (mm on the machine) is
 * split between the stages that each move the drawing a little. This file is
 * the only place that decides the split; the stages take their share as a
 * plain distance and add no factors of their own.
 *
 * The written result differs from the original by at most the sum of what
 * each stage may move it (triangle inequality), so the shares must add up to
 * no more than the tolerance:
 *
 *   tolerance = flatten + round + fit
 *
 * - flatten: curves (Bézier, elliptical arcs) become polylines before fitting.
 *   5 % of the tolerance for a curved element, 0 for one of lines only (its
 *   polyline is exact).
 * - round: written coordinates have `digits` decimals. A point moves by at most
 *   √2·½·10^−digits user units when both coordinates are rounded; a written arc
 *   rebuilt by a reader from rounded end points and radius may be off by up to
 *   ARC_ROUNDING_FACTOR times that (a 270° arc amplifies end-point rounding
 *   about 2.4×; the writer, src/write/emit.ts, checks every arc against this
 *   bound and splits those that miss it). The digits are the fewest that keep
 *   this bound within 5 % of the tolerance, unless the caller fixes them.
 * - fit: the rest goes to the fitter (src/fit/fitPolyline.ts), which spends
 *   FIT_THIN_SHARE of it on thinning its input and fits the arcs within
 *   FIT_ARC_SHARE − FIT_THIN_SHARE of it; the remaining 3 % is margin for
 *   floating-point rounding in its own checks. Where the thinning dropped no
 *   vertex the arcs take FIT_ARC_SHARE whole; straight moves through input
 *   vertices (the never-worse alternative) take FIT_LINES_SHARE.
 *
 * When fixed digits leave the fit less than MIN_FIT_SHARE of the tolerance, the
 * element is not refitted (reason 'too-few-digits'): a fit squeezed that thin
 * gives many tiny pieces, not a better file.
 *
 * A copy drawn larger by <use> magnifies every deviation: callers pass the
 * tolerance divided by that factor. Writers of other formats in mm (G-code,
 * DXF) pass mmPerUnit 1.
 */
import { digitsForRounding, roundingErrorMm } from './write/numbers.js';

/** Share of the tolerance for flattening curves into polylines. */
export const FLATTEN_SHARE = 0.05;
/** Share of the tolerance for rounding the written numbers. */
export const ROUNDING_SHARE = 0.05;
/** A written arc may be off by this many point-rounding bounds (end points and radius rounded). */
export const ARC_ROUNDING_FACTOR = 3;
/** Smallest share of the tolerance left to the fit before an element is left as written. */
export const MIN_FIT_SHARE = 0.5;
/** Share of the fit's own budget spent on thinning its input polyline. */
export const FIT_THIN_SHARE = 0.05;
/**
 * Share of the fit's own budget the thinned polyline plus arcs may use (the rest: margin for checks). Raised
 * from 0.94: 0.97 keeps every fitter test (counts invariant under rigid motions, tangents continuous to
 * 1e-9) and is the most that does; 0.99 let the ellipse's count change under a rigid motion.
 */
export const FIT_ARC_SHARE = 0.97;
/**
 * Share of the fit's own budget the straight-move alternative to the arcs (src/fit/thinLines.ts) uses: it is
 * proven within it, so all of it but the independent measurement's own overestimate (at most 0.5 % of the
 * tolerance, src/measure/measure.ts), which must not take a proven fit over.
 */
export const FIT_LINES_SHARE = 0.995;
/** Straight runs: input vertices lie this close to the run's line, as a share of the fit's budget. */
export const RUN_STRAIGHTNESS_SHARE = 0.02;
/** Straight runs: towards their ends (outer quarters) input vertices may reach into the bends by the thinning's share, and a little. */
export const RUN_END_SLACK_SHARE = 1.2 * FIT_THIN_SHARE;
/** Straight runs: shortest run, in fit budgets (a length, not an error: no share of the sum above). */
export const RUN_MIN_LENGTH_TOLERANCES = 4;

/** What each stage of one element may move the drawing, in mm. */
export interface ToleranceSplit {
  /** Decimal places of the written coordinates. */
  digits: number;
  /** Flattening curves into polylines (0 for an element of lines only). */
  flattenMm: number;
  /** Bound on the written result's rounding (arcs included), mm. */
  roundMm: number;
  /** What the fitter may use: tolerance − flattenMm − roundMm. */
  fitMm: number;
  /** False when the fit is left less than MIN_FIT_SHARE of the tolerance (too few digits). */
  fits: boolean;
}

/** Bound (mm) on a written line or arc's distance from the fitted one with `digits` decimals. */
export function writtenRoundingMm(digits: number, mmPerUnit: number): number {
  return ARC_ROUNDING_FACTOR * roundingErrorMm(digits, mmPerUnit);
}

/**
 * Split one element's tolerance between flattening, rounding and fitting.
 * @param tolMm the element's tolerance, mm (> 0)
 * @param opts.curved whether the element has curves to flatten
 * @param opts.mmPerUnit mm per written user unit (largest scale of the written coordinates; 1 for output in mm)
 * @param opts.digits fixed decimals; omitted or null: the fewest that fit ROUNDING_SHARE
 */
export function splitTolerance(tolMm: number, opts: { curved: boolean; mmPerUnit: number; digits?: number | null }): ToleranceSplit {
  if (!(tolMm > 0) || !Number.isFinite(tolMm)) throw new RangeError(`tolerance must be a positive number of mm, got ${tolMm}`);
  const digits = opts.digits ?? digitsForRounding((tolMm * ROUNDING_SHARE) / ARC_ROUNDING_FACTOR, opts.mmPerUnit);
  const roundMm = writtenRoundingMm(digits, 1) * opts.mmPerUnit;
  const flattenMm = opts.curved ? FLATTEN_SHARE * tolMm : 0;
  const fitMm = tolMm - flattenMm - roundMm;
  return { digits, flattenMm, roundMm, fitMm, fits: fitMm > MIN_FIT_SHARE * tolMm };
}
