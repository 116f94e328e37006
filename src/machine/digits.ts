/**
 * Decimals for machine files (mm): the tolerance budget's split (../budget.ts)
 * for coordinates written in mm (mmPerUnit 1), never below 3 decimals. With
 * end points rounded first and the centre put on the rounded chord's bisector
 * before I, J are rounded, the two radii of a written arc differ by at most
 * √2·10^−d mm (../../shared/REFERENCES.md §12.1 G5), 0.0014 mm at d = 3, inside
 * the 0.002 mm a RS274/NGC interpreter accepts (NIST RS274NGC v3 §3.5.3.2).
 */
import { splitTolerance, type ToleranceSplit } from '../budget.js';

/** Fewest decimals written to a machine file. */
export const MIN_MACHINE_DIGITS = 3;

/**
 * An element's budget for machine output: the budget's split in mm, its digits raised to MIN_MACHINE_DIGITS.
 * @param tolMm the element's tolerance, mm (> 0)
 * @param curved whether it has curves to flatten
 * @param digits fixed decimals, or null for the fewest the budget allows (at least MIN_MACHINE_DIGITS)
 */
export function machineSplit(tolMm: number, curved: boolean, digits: number | null = null): ToleranceSplit {
  const d = digits ?? Math.max(MIN_MACHINE_DIGITS, splitTolerance(tolMm, { curved, mmPerUnit: 1 }).digits);
  return splitTolerance(tolMm, { curved, mmPerUnit: 1, digits: d });
}

/** Decimals for a whole machine file whose tightest element tolerance is `tolMm`. */
export function machineDigits(tolMm: number): number {
  return machineSplit(tolMm, true).digits;
}
