/**
 * SVG/CSS lengths → user units (px of the current user coordinate system).
 *
 * Absolute units per CSS Values 3 §5.2 `#absolute-lengths` (REFERENCES.md
 * §4.1): 1in = 2.54cm = 96px, 1cm = 10mm = 40Q, 1in = 72pt = 6pc. Unit
 * identifiers are case-insensitive. `Q` is accepted although SVG 1.1 lacked it.
 *
 * Assumption (documented, not from a standard): there is no CSS cascade
 * here, so font-relative units use the usual initial font size of 16px:
 * 1em = 16px and 1ex = 8px (ex taken as em/2, the CSS fallback when no
 * x-height is known).
 */
import { scanNumber, skipWsp, type NumberScan } from './numbers.js';

/** Millimetres per CSS px (= per user unit before any viewBox scaling): 25.4/96. */
export const mmPerPx = 25.4 / 96;

/** px per unit, keyed by lower-case unit identifier; '' = unitless = px. */
const PX_PER: Readonly<Record<string, number>> = Object.freeze({
  '': 1,
  px: 1,
  in: 96,
  cm: 96 / 2.54,
  mm: 96 / 25.4,
  q: 96 / 101.6,
  pt: 96 / 72,
  pc: 16,
  em: 16,
  ex: 8,
});

/** A parsed length: the number and its lower-case unit ('' unitless, '%' percent). */
export interface Length {
  value: number;
  /** Lower-case unit identifier: '', 'px', 'in', 'cm', 'mm', 'q', 'pt', 'pc', 'em', 'ex' or '%'. */
  unit: string;
}

/**
 * px per one of `unit` (lower- or upper-case), or `undefined` for '%' and
 * unknown units.
 */
export function pxPerUnit(unit: string): number | undefined {
  const k = unit.toLowerCase();
  return Object.prototype.hasOwnProperty.call(PX_PER, k) ? PX_PER[k] : undefined;
}

/**
 * Parse `number unit?` with optional surrounding whitespace.
 * @returns the value and lower-case unit, or `null` when the text is not a
 *   finite length with a known unit (e.g. `auto`, `10 px`, `5furlong`).
 */
export function parseLength(text: string): Length | null {
  const scan: NumberScan = { value: 0, end: 0 };
  const s = text;
  const i = skipWsp(s, 0);
  if (!scanNumber(s, i, scan) || !Number.isFinite(scan.value)) return null;
  let j = scan.end;
  if (j < s.length && s.charCodeAt(j) === 37) { // '%'
    return skipWsp(s, j + 1) === s.length ? { value: scan.value, unit: '%' } : null;
  }
  const u0 = j;
  while (j < s.length) {
    const c = s.charCodeAt(j) | 0x20; // ASCII lower-case
    if (c >= 97 && c <= 122) j++;
    else break;
  }
  const unit = s.slice(u0, j).toLowerCase();
  if (skipWsp(s, j) !== s.length) return null;
  if (!Object.prototype.hasOwnProperty.call(PX_PER, unit)) return null;
  return { value: scan.value, unit };
}

/**
 * An element attribute length in user units.
 * @param text attribute value; `undefined`, empty, `auto` or invalid → `fallback`
 * @param percentBase the user-unit length that 100% refers to: the viewport
 *   width for x-like attributes, height for y-like ones, and
 *   {@link viewportDiagonal} for others such as `r` (S2 §8.9)
 * @param fallback value returned when the text is not a valid length
 * @returns length in user units
 */
export function lengthToUser(text: string | undefined, percentBase: number, fallback: number): number {
  if (text === undefined) return fallback;
  const len = parseLength(text);
  if (len === null) return fallback;
  if (len.unit === '%') return (len.value / 100) * percentBase;
  return len.value * PX_PER[len.unit];
}

/**
 * The "normalised diagonal" that percentages of non-directional lengths
 * refer to: sqrt(w² + h²)/sqrt(2) (S2 §8.9 `#Units`).
 * @param w viewport width, user units
 * @param h viewport height, user units
 */
export function viewportDiagonal(w: number, h: number): number {
  return Math.sqrt(w * w + h * h) / Math.SQRT2;
}
