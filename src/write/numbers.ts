/**
 * Numbers as written into path data: fixed decimals, shortest text.
 *
 * Every written number is the decimal rounding of a double to `digits` places
 * (JavaScript `toFixed`, which rounds the exact binary value), then shortened
 * without changing its value: trailing zeros and a trailing dot go, a leading
 * zero before the point goes (`.5`, `-.5`, allowed by the path grammar, W3C
 * SVG 1.1 §8.3.9), and `-0` is written `0`. Exponent notation is never used.
 */

/** Largest `digits` accepted (doubles carry about 17 significant digits; more is noise). */
export const MAX_DIGITS = 20;

function checkDigits(digits: number): void {
  if (!Number.isInteger(digits) || digits < 0 || digits > MAX_DIGITS) {
    throw new RangeError(`digits must be an integer in [0, ${MAX_DIGITS}], got ${digits}`);
  }
}

/**
 * toFixed switches to exponent form at 1e21 (every double that large is an
 * integer): expand the shortest round-trip digits of `String(v)` ("2.5e+22")
 * with zeros instead, so the value reads back as the same double.
 */
function expandLarge(v: number): string {
  const [mant, exp] = String(v).split('e');
  const neg = mant.charCodeAt(0) === 45;
  const [int, frac = ''] = (neg ? mant.slice(1) : mant).split('.');
  const digits = int + frac;
  const zeros = Number(exp) - frac.length;
  return (neg ? '-' : '') + digits + '0'.repeat(Math.max(0, zeros));
}

/**
 * Shortest text of `v` rounded to `digits` decimal places.
 *
 * @param v any finite number (user units, degrees, …)
 * @param digits decimal places, integer in [0, MAX_DIGITS]
 * @returns e.g. formatNumber(0.5, 3) = ".5", formatNumber(-0.0001, 2) = "0", formatNumber(1e21, 2) = "1000000000000000000000"
 */
export function formatNumber(v: number, digits: number): string {
  if (!Number.isFinite(v)) throw new RangeError(`cannot write a non-finite number: ${v}`);
  checkDigits(digits);
  let s = Math.abs(v) >= 1e21 ? expandLarge(v) : v.toFixed(digits);
  if (s.indexOf('.') >= 0) {
    let end = s.length;
    while (s.charCodeAt(end - 1) === 48) end--; // '0'
    if (s.charCodeAt(end - 1) === 46) end--; // '.'
    s = s.slice(0, end);
  }
  const neg = s.charCodeAt(0) === 45; // '-'
  if (neg) s = s.slice(1);
  if (s === '0') return '0'; // also turns "-0" into "0"
  if (s.charCodeAt(0) === 48 && s.charCodeAt(1) === 46) s = s.slice(1); // "0.5" → ".5"
  return neg ? '-' + s : s;
}

/**
 * The value a reader gets back from {@link formatNumber}: `Number(formatNumber(v, digits))`.
 * Idempotent: rounding an already rounded value changes nothing.
 */
export function roundTo(v: number, digits: number): number {
  return Number(formatNumber(v, digits));
}

/**
 * Largest distance (mm) a point moves when both of its coordinates are
 * rounded to `digits` decimals: √2 · ½·10^−digits user units, times mm per unit.
 *
 * @param digits decimal places written
 * @param mmPerUnit millimetres per user unit of the coordinates being written (1 for "in user units")
 */
export function roundingErrorMm(digits: number, mmPerUnit: number): number {
  return Math.SQRT2 * 0.5 * Math.pow(10, -digits) * mmPerUnit;
}

/**
 * Fewest decimals such that rounding a point's two coordinates moves it by at
 * most `maxMoveMm`: roundingErrorMm(digits, mmPerUnit) ≤ maxMoveMm. How much of
 * the tolerance that may be is the budget's choice (src/budget.ts).
 *
 * @param maxMoveMm largest allowed move of a rounded point, mm, > 0
 * @param mmPerUnit millimetres per user unit, > 0
 * @returns decimals in [0, MAX_DIGITS]; e.g. 0.005 mm at CSS px (25.4/96 mm) → 2
 */
export function digitsForRounding(maxMoveMm: number, mmPerUnit: number): number {
  if (!(maxMoveMm > 0) || !Number.isFinite(maxMoveMm)) throw new RangeError(`rounding allowance must be a positive number of mm, got ${maxMoveMm}`);
  if (!(mmPerUnit > 0) || !Number.isFinite(mmPerUnit)) throw new RangeError(`mm per unit must be positive, got ${mmPerUnit}`);
  const target = maxMoveMm;
  let d = Math.max(0, Math.ceil(Math.log10((Math.SQRT2 * 0.5 * mmPerUnit) / target)));
  // log10 can land one off either way at exact powers of ten; settle on the true minimum.
  while (d > 0 && roundingErrorMm(d - 1, mmPerUnit) <= target) d--;
  while (roundingErrorMm(d, mmPerUnit) > target) d++;
  if (d > MAX_DIGITS) {
    throw new RangeError(`moving a rounded point by at most ${maxMoveMm} mm needs ${d} decimals at ${mmPerUnit} mm per unit (max ${MAX_DIGITS})`);
  }
  return d;
}

/**
 * Decimals for an x-axis rotation (degrees) such that rounding it turns the
 * ellipse — and so moves any point of it — by at most half a unit in the last
 * place of `lengthDigits`: rMax·(π/180)·½·10^−k ≤ ½·10^−lengthDigits.
 *
 * @param lengthDigits decimals used for the lengths (radii, coordinates)
 * @param rMax larger radius, in the same units as the coordinates
 */
export function angleDigits(lengthDigits: number, rMax: number): number {
  const extra = rMax > 0 && Number.isFinite(rMax) ? Math.ceil(Math.log10((rMax * Math.PI) / 180)) : 0;
  return Math.min(MAX_DIGITS, Math.max(0, lengthDigits + extra));
}
