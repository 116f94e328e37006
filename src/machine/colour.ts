/**
 * The group key of an element for machine output: its stroke colour as
 * `#rrggbb` (lower case), so one colour is one layer, one power, one feed
 * whichever way the file spells it. Accepted spellings (CSS Color 3 §4.2,
 * the subset cut files use): `#rgb`, `#rrggbb`, `rgb(r, g, b)` with numbers or
 * percentages, and the CSS colour keywords (from the color-name package).
 * `none`, an unset stroke and anything else (a gradient `url(#…)`,
 * `currentColor`) give `none`.
 */
import colorNames from 'color-name';

const hex2 = (v: number): string => Math.max(0, Math.min(255, Math.round(v))).toString(16).padStart(2, '0');

/**
 * Group key of a stroke value.
 * @param stroke the computed stroke as written, or null when not set
 * @returns `#rrggbb` or `none`
 */
export function strokeKey(stroke: string | null): string {
  if (stroke === null) return 'none';
  const s = stroke.trim().toLowerCase();
  let m = /^#([0-9a-f])([0-9a-f])([0-9a-f])$/.exec(s);
  if (m) return `#${m[1]}${m[1]}${m[2]}${m[2]}${m[3]}${m[3]}`;
  if (/^#[0-9a-f]{6}$/.test(s)) return s;
  m = /^rgb\(\s*([\d.]+%?)\s*,\s*([\d.]+%?)\s*,\s*([\d.]+%?)\s*\)$/.exec(s);
  if (m) {
    const ch = (v: string): number => (v.endsWith('%') ? (parseFloat(v) * 255) / 100 : parseFloat(v));
    return `#${hex2(ch(m[1]))}${hex2(ch(m[2]))}${hex2(ch(m[3]))}`;
  }
  const named = Object.prototype.hasOwnProperty.call(colorNames, s) ? colorNames[s] : undefined;
  if (named) return `#${hex2(named[0])}${hex2(named[1])}${hex2(named[2])}`;
  return 'none';
}
