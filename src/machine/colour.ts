/**
 * The group key of an element for machine output: its stroke colour as
 * `#rrggbb` (lower case), so one colour is one layer, one power, one feed
 * whichever way the file spells it. The reader's computed style already
 * normalises paints (src/svg/style/colour.ts); this only accepts any other
 * spelling a library caller passes through the same normaliser, and drops
 * alpha (a translucent red cuts as red). `none`, an unset stroke and
 * anything that is not a colour (a gradient `url(#…)`, `currentColor`
 * unresolved) give `none`.
 */
import { normaliseColour } from '../svg/style/colour.js';

/**
 * Group key of a stroke value.
 * @param stroke the computed stroke, or null when not set
 * @returns `#rrggbb` or `none`
 */
export function strokeKey(stroke: string | null): string {
  if (stroke === null) return 'none';
  const hex = normaliseColour(stroke);
  return hex === null ? 'none' : hex.slice(0, 7);
}
