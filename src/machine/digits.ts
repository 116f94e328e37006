/**
 * Decimals for machine files (mm), from the tolerance. Stand-in until the
 * tolerance budget module lands; the one place that decides this for G-code
 * and DXF.
 *
 * Rule: the same rounding share as the SVG writer (5 % of the tolerance for
 * the written arc's rounding error, ../write/emit.ts writtenArcErrorBound at 1
 * mm per unit), and never fewer than 3 decimals: with end points rounded first
 * and the centre put on the rounded chord's bisector before I, J are rounded,
 * the two radii of a written arc differ by at most √2·10^−d mm
 * (../../shared/REFERENCES.md §12.1 G5), 0.0014 mm at d = 3, inside the
 * 0.002 mm a RS274/NGC interpreter accepts (NIST RS274NGC v3 §3.5.3.2).
 */
import { writtenArcErrorBound } from '../write/emit.js';
import { digitsForTolerance } from '../write/numbers.js';

/** Fewest decimals written to a machine file. */
export const MIN_MACHINE_DIGITS = 3;
/** Share of the tolerance given to rounding the written numbers (as for SVG output). */
export const MACHINE_ROUNDING_SHARE = 0.05;

/**
 * Decimals for coordinates in mm.
 * @param tolMm tolerance in mm (> 0)
 */
export function machineDigits(tolMm: number): number {
  // digitsForTolerance keeps √2/2·10^−d ≤ t/20; the written arc error is 3× that (emit.ts), so ask for t·share·20/3.
  return Math.max(MIN_MACHINE_DIGITS, digitsForTolerance((tolMm * MACHINE_ROUNDING_SHARE * 20) / 3, 1));
}

/** mm: the rounding error allowed for written arcs and lines at `digits` decimals (the fit gets the tolerance less this). */
export function machineRoundingMm(digits: number): number {
  return writtenArcErrorBound(digits);
}
